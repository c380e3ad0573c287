import type { IncomingMessage, RequestListener, Server, ServerResponse } from 'node:http';
import type { Socket } from 'node:net';

/** What the HTTP server allows a connection before cutting it off (issue 11, slow clients). */
export interface SocketLimits {
  /** The request head must arrive within this, from the first byte (a trickled head). */
  readonly headersTimeoutMs: number;
  /** The whole request, body included (a trickled body). Computing is bounded apart. */
  readonly requestTimeoutMs: number;
  /** A keep-alive connection with no next request is closed after this. */
  readonly keepAliveTimeoutMs: number;
  /**
   * A connection with no traffic either way (a client that stopped reading its answer, so
   * nothing more can be written) is closed after this. Progress streams send a comment every
   * 15 s, so a reading stream stays open.
   */
  readonly idleTimeoutMs: number;
  /** Connections held at once; beyond it new ones are closed on arrival. */
  readonly maxConnections: number;
  /**
   * Answers one connection may have waiting to be sent (HTTP/1.1 pipelining). Node parses every
   * request of a received chunk at once, so a client that pipelines many requests and reads
   * nothing would make the server compute and hold every answer; past this the connection is
   * closed instead.
   */
  readonly maxQueuedAnswers: number;
}

/** The limits when the environment sets none. */
export const DEFAULT_SOCKET_LIMITS: SocketLimits = {
  headersTimeoutMs: 15_000,
  requestTimeoutMs: 60_000,
  keepAliveTimeoutMs: 5_000,
  idleTimeoutMs: 30_000,
  maxConnections: 2_000,
  maxQueuedAnswers: 8,
};

const VARIABLES: Record<keyof SocketLimits, string> = {
  headersTimeoutMs: 'HTTP_HEADERS_TIMEOUT_MS',
  requestTimeoutMs: 'HTTP_REQUEST_TIMEOUT_MS',
  keepAliveTimeoutMs: 'HTTP_KEEP_ALIVE_TIMEOUT_MS',
  idleTimeoutMs: 'HTTP_IDLE_TIMEOUT_MS',
  maxConnections: 'HTTP_MAX_CONNECTIONS',
  maxQueuedAnswers: 'HTTP_MAX_QUEUED_ANSWERS',
};

/**
 * Reads the limits from `HTTP_*` variables (whole numbers ≥ 1), each defaulting to
 * {@link DEFAULT_SOCKET_LIMITS}. `fail(variable, message)` reports a bad value.
 */
export function readSocketLimits(
  env: NodeJS.ProcessEnv,
  fail: (variable: string, message: string) => Error,
): SocketLimits {
  const limits = { ...DEFAULT_SOCKET_LIMITS };
  for (const [field, variable] of Object.entries(VARIABLES) as [keyof SocketLimits, string][]) {
    const raw = env[variable];
    if (raw === undefined || raw === '') continue;
    if (!/^\d+$/.test(raw.trim()) || Number(raw) < 1) {
      throw fail(variable, `must be a whole number ≥ 1, got "${raw}"`);
    }
    limits[field] = Number(raw);
  }
  if (limits.headersTimeoutMs > limits.requestTimeoutMs) {
    throw fail(VARIABLES.headersTimeoutMs, 'must not exceed HTTP_REQUEST_TIMEOUT_MS');
  }
  return limits;
}

/**
 * Options for `http.createServer`: Node checks the head and request timeouts on an interval
 * (30 s by default, which would let a slow client stay that much longer); here a fifth of the
 * shorter timeout, at most a second.
 */
export function serverOptions(limits: SocketLimits) {
  const shorter = Math.min(limits.headersTimeoutMs, limits.requestTimeoutMs);
  return {
    connectionsCheckingInterval: Math.max(50, Math.min(1000, Math.floor(shorter / 5))),
    headersTimeout: limits.headersTimeoutMs,
    requestTimeout: limits.requestTimeoutMs,
    keepAliveTimeout: limits.keepAliveTimeoutMs,
  };
}

/** Applies what `createServer` takes as properties rather than options. */
export function applySocketLimits(server: Server, limits: SocketLimits): void {
  server.keepAliveTimeout = limits.keepAliveTimeoutMs;
  server.timeout = limits.idleTimeoutMs;
  server.maxConnections = limits.maxConnections;
}

const QUEUED = Symbol('queued answers');

/**
 * Wraps the app so each connection holds at most `limits.maxQueuedAnswers` unsent answers: a
 * request beyond that closes the connection before the app sees it (and those after it in the
 * same chunk find the connection closed and are dropped unread).
 */
export function boundPipelining(app: RequestListener, limits: SocketLimits): RequestListener {
  return (req: IncomingMessage, res: ServerResponse) => {
    const socket = req.socket as Socket & { [QUEUED]?: number };
    if (socket.destroyed) return;
    const queued = (socket[QUEUED] ?? 0) + 1;
    if (queued > limits.maxQueuedAnswers) {
      socket.destroy();
      return;
    }
    socket[QUEUED] = queued;
    let done = false;
    const sent = () => {
      if (done) return;
      done = true;
      socket[QUEUED]! -= 1;
    };
    res.once('finish', sent);
    res.once('close', sent);
    app(req, res);
  };
}
