import { createServer, STATUS_CODES, type Server } from 'node:http';
import type { Duplex } from 'node:stream';
import type { AddressInfo } from 'node:net';
import type { Config } from './config';
import { createApp, type TroplineApp } from './create-app';
import { ProblemError } from './http/problem';
import { applySocketLimits, boundPipelining, serverOptions } from './socket-limits';

/** A listening Tropline server. */
export interface RunningServer {
  readonly app: TroplineApp;
  readonly server: Server;
  /** The port actually bound (useful when PORT=0). */
  readonly port: number;
  /** Stops accepting connections, then releases the database. */
  stop(): Promise<void>;
}

/** Thrown when start-up fails for a reason the operator can fix; printed without a stack. */
export class StartupError extends Error {
  override name = 'StartupError';
}

/**
 * Node answers a request head it cannot parse (too large, malformed) itself, before Express, with
 * a bare status line; this answers the same statuses as problem documents, as every error is.
 */
function answerClientError(err: NodeJS.ErrnoException, socket: Duplex): void {
  if (err.code === 'ECONNRESET' || !socket.writable) {
    socket.destroy();
    return;
  }
  const [status, slug, title, detail] =
    err.code === 'HPE_HEADER_OVERFLOW'
      ? [
          431,
          'headers-too-large',
          'The request head is too large',
          'The URL and headers together exceed 16 KB.',
        ]
      : err.code === 'ERR_HTTP_REQUEST_TIMEOUT'
        ? [
            408,
            'request-timeout',
            'The request took too long to arrive',
            'The request head or body arrived too slowly; the connection is closed.',
          ]
        : [400, 'bad-request', 'The request could not be parsed', 'The request is not valid HTTP.'];
  const body = JSON.stringify(new ProblemError(status, slug, title, detail).toDocument());
  socket.end(
    `HTTP/1.1 ${status} ${STATUS_CODES[status]}\r\nContent-Type: application/problem+json\r\n` +
      `Content-Length: ${Buffer.byteLength(body)}\r\nConnection: close\r\n\r\n${body}`,
  );
  // A client that stops reading must not keep the socket half-open.
  socket.once('finish', () => socket.destroy());
}

/**
 * Prepares the database, then listens on `config.port`. Resolves once the socket is bound.
 */
export async function serve(config: Config): Promise<RunningServer> {
  const app = createApp(config);
  const context = app.locals.tropline;
  try {
    const outcome = await context.ready;
    if (outcome.migrated.length) console.log(`migrated: ${outcome.migrated.join(', ')}`);
    if (outcome.seeded) console.log('seeded the demo tenant');
  } catch (err) {
    await context.close();
    throw new StartupError(`cannot prepare the database ${config.sqliteFile}: ${String(err)}`);
  }
  // Requests that compute are bounded server-side; these stop slow clients holding sockets.
  const server = createServer(serverOptions(config.socket), boundPipelining(app, config.socket));
  applySocketLimits(server, config.socket);
  server.on('clientError', answerClientError);
  server.listen(config.port);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', (err: NodeJS.ErrnoException) => {
      const why = err.code === 'EADDRINUSE' ? 'the port is already in use' : err.message;
      void context.close();
      reject(new StartupError(`PORT: cannot listen on ${config.port}: ${why}`));
    });
  });
  const port = (server.address() as AddressInfo).port;
  return {
    app,
    server,
    port,
    stop: () =>
      new Promise<void>((resolve) => {
        server.close(() => void context.close().then(resolve));
        server.closeAllConnections();
      }),
  };
}
