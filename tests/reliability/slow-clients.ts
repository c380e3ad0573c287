import { readFileSync } from 'node:fs';
import { connect, type Socket } from 'node:net';
import { send } from './live-server';

/**
 * Hostile clients over raw sockets (issue 11): each holds a connection the way a slow or stuck
 * client would, and resolves with what it saw once the server cut it off. They never end the
 * connection themselves, so a settled promise means the server closed it.
 */

/** What a cut-off client received before the connection closed. */
export interface CutOff {
  /** The bytes that arrived, as text. */
  readonly received: string;
  /** The first line of the answer (`HTTP/1.1 408 Request Timeout`), or '' if none came. */
  readonly statusLine: string;
}

function open(port: number): Promise<Socket> {
  return new Promise((resolve, reject) => {
    const socket = connect(port, '127.0.0.1', () => resolve(socket));
    socket.once('error', reject);
  });
}

/** Collects what arrives until the server closes the socket; `stop` runs on the first byte. */
function untilClosed(socket: Socket, stop: () => void = () => undefined): Promise<CutOff> {
  return new Promise((resolve) => {
    let received = '';
    socket.on('data', (d) => {
      stop();
      received += d.toString('latin1');
    });
    // A reset after the answer is still the server's doing; what arrived is kept.
    socket.on('error', () => undefined);
    socket.once('close', () => {
      stop();
      resolve({ received, statusLine: received.split('\r\n', 1)[0] ?? '' });
    });
  });
}

/** Sends `head` at once, then one more header line every `everyMs` (a slowloris client). */
export async function trickleHead(port: number, everyMs = 200): Promise<CutOff> {
  const socket = await open(port);
  socket.write('GET /api/v1/health HTTP/1.1\r\nHost: 127.0.0.1\r\n');
  let n = 0;
  const timer = setInterval(() => socket.write(`X-Slow-${++n}: ${'a'.repeat(8)}\r\n`), everyMs);
  return untilClosed(socket, () => clearInterval(timer));
}

/** Sends a complete head announcing a body, then the body one byte every `everyMs`. */
export async function trickleBody(port: number, key: string, everyMs = 200): Promise<CutOff> {
  const socket = await open(port);
  const body = JSON.stringify({ horizon: 10, pad: 'x'.repeat(2000) });
  socket.write(
    `POST /api/v1/projections HTTP/1.1\r\nHost: 127.0.0.1\r\nAuthorization: Bearer ${key}\r\n` +
      `Content-Type: application/json\r\nContent-Length: ${body.length}\r\n\r\n`,
  );
  let i = 0;
  const timer = setInterval(() => socket.write(body[i++] ?? ' '), everyMs);
  return untilClosed(socket, () => clearInterval(timer));
}

/**
 * Opens `n` connections: half send nothing at all, half make one keep-alive request, read its
 * answer and then stay silent. Resolves with how many the server closed (all of them, or the
 * promise never settles).
 */
export async function idleConnections(port: number, n: number): Promise<number> {
  const sockets = await Promise.all(Array.from({ length: n }, () => open(port)));
  const closed = sockets.map((socket, i) => {
    if (i % 2 === 1) socket.write('GET /api/v1/health HTTP/1.1\r\nHost: 127.0.0.1\r\n\r\n');
    return untilClosed(socket);
  });
  return (await Promise.all(closed)).length;
}

/** TCP state of the server's end of a loopback connection (Linux /proc), or undefined if gone. */
function serverSideState(serverPort: number, clientPort: number): string | undefined {
  const hex = (p: number) => p.toString(16).toUpperCase().padStart(4, '0');
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    for (const line of readFileSync(table, 'utf8').split('\n').slice(1)) {
      const [, local, remote, state] = line.trim().split(/\s+/);
      if (local?.endsWith(`:${hex(serverPort)}`) && remote?.endsWith(`:${hex(clientPort)}`)) {
        return state;
      }
    }
  }
  return undefined;
}

/** What a client that stopped reading got, once it read again after the server gave up. */
export interface StalledReader {
  /** Bytes it could still read. */
  readonly bytes: number;
}

/**
 * Sends `requests` (raw HTTP/1.1, pipelined on one connection) and reads nothing, until the
 * server's end of the connection leaves ESTABLISHED (the server closed it). Then reads what
 * the kernel still holds.
 */
export async function neverReads(port: number, requests: string): Promise<StalledReader> {
  const socket = await open(port);
  const localPort = socket.localPort!;
  // A reset (the server closed with requests still unread) ends it too; what arrived counts.
  socket.on('error', () => undefined);
  const closed = new Promise((r) => socket.once('close', r));
  socket.pause();
  socket.write(requests);
  const ESTABLISHED = '01';
  while (!socket.destroyed && serverSideState(port, localPort) === ESTABLISHED) {
    await new Promise((r) => setTimeout(r, 100));
  }
  let bytes = 0;
  socket.on('data', (d) => (bytes += d.length));
  socket.resume();
  await closed;
  return { bytes };
}

/** A raw `POST /api/v1/projections` with `body`, for pipelining. */
export function rawProjection(key: string, body: unknown): string {
  const text = JSON.stringify(body);
  return (
    `POST /api/v1/projections HTTP/1.1\r\nHost: 127.0.0.1\r\nAuthorization: Bearer ${key}\r\n` +
    `Content-Type: application/json\r\nContent-Length: ${Buffer.byteLength(text)}\r\n\r\n${text}`
  );
}

/** A raw `GET path`, for pipelining. */
export const rawGet = (path: string) => `GET ${path} HTTP/1.1\r\nHost: 127.0.0.1\r\n\r\n`;

/** What a well-behaved client got while a hostile one held its connections. */
export interface Bystander {
  readonly answered: number;
  readonly other: number[];
}

/**
 * Sends `GET /usage` with `key` one after another until `hostile` settles; a request that got
 * no answer at all (the connection failed) counts as status 0.
 */
export async function bystander(base: string, key: string, hostile: Promise<unknown>) {
  const seen = { answered: 0, other: [] as number[] };
  let done = false;
  void hostile.finally(() => (done = true));
  do {
    const status = await send(base, 'GET', '/usage', { key }).then(
      (a) => a.status,
      () => 0,
    );
    if (status === 200) seen.answered++;
    else seen.other.push(status);
  } while (!done);
  return seen satisfies Bystander;
}

/** A progress stream opened on a raw socket whose client read its status line, then stopped. */
export interface HeldStream {
  readonly statusLine: string;
  /** Reads again and settles once the server has ended the stream and the connection. */
  drain(): Promise<void>;
  /** The client lets go (test clean-up). */
  release(): void;
}

/** Opens `GET path` as a browser page on `origin` would, reads the status line, then no more. */
export async function holdStream(
  port: number,
  path: string,
  key: string,
  origin: string,
): Promise<HeldStream> {
  const socket = await open(port);
  socket.write(
    `GET ${path} HTTP/1.1\r\nHost: 127.0.0.1\r\nAuthorization: Bearer ${key}\r\n` +
      `Origin: ${origin}\r\nAccept: text/event-stream\r\nConnection: close\r\n\r\n`,
  );
  socket.on('error', () => undefined);
  const ended = new Promise<void>((resolve) => socket.once('close', () => resolve()));
  const first = await new Promise<string>((resolve) =>
    socket.once('data', (d) => resolve(d.toString('latin1'))),
  );
  socket.pause();
  return {
    statusLine: first.split('\r\n', 1)[0] ?? '',
    drain: () => {
      socket.resume();
      return ended;
    },
    release: () => socket.destroy(),
  };
}
