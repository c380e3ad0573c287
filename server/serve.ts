import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Config } from './config';
import { createApp, type TroplineApp } from './create-app';

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
  const server = app.listen(config.port);
  // Requests that compute are bounded server-side; these stop slow clients holding sockets.
  server.requestTimeout = 60_000;
  server.headersTimeout = 15_000;
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
