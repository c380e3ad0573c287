import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './config';
import { DEFAULT_SOCKET_LIMITS, serverOptions } from './socket-limits';

const base = { NODE_ENV: 'test', SQLITE_FILE: ':memory:' };

describe('HTTP socket limits from the environment', () => {
  it('defaults when unset, and reads each HTTP_* variable', () => {
    expect(loadConfig(base).socket).toEqual(DEFAULT_SOCKET_LIMITS);
    const socket = loadConfig({
      ...base,
      HTTP_HEADERS_TIMEOUT_MS: '2000',
      HTTP_REQUEST_TIMEOUT_MS: '4000',
      HTTP_KEEP_ALIVE_TIMEOUT_MS: '3000',
      HTTP_IDLE_TIMEOUT_MS: '9000',
      HTTP_MAX_CONNECTIONS: '50',
      HTTP_MAX_QUEUED_ANSWERS: '2',
    }).socket;
    expect(socket).toEqual({
      headersTimeoutMs: 2000,
      requestTimeoutMs: 4000,
      keepAliveTimeoutMs: 3000,
      idleTimeoutMs: 9000,
      maxConnections: 50,
      maxQueuedAnswers: 2,
    });
    // Node checks the head and request timeouts on this interval: a fifth of the shorter.
    expect(serverOptions(socket).connectionsCheckingInterval).toBe(400);
  });

  it('names the variable of a value that is not a whole number ≥ 1', () => {
    for (const bad of ['0', '-5', '1.5', 'soon']) {
      expect(() => loadConfig({ ...base, HTTP_IDLE_TIMEOUT_MS: bad })).toThrow(
        new ConfigError('HTTP_IDLE_TIMEOUT_MS', `must be a whole number ≥ 1, got "${bad}"`),
      );
    }
  });

  it('refuses a head timeout longer than the whole request’s', () => {
    expect(() =>
      loadConfig({ ...base, HTTP_HEADERS_TIMEOUT_MS: '5000', HTTP_REQUEST_TIMEOUT_MS: '4000' }),
    ).toThrow(/HTTP_HEADERS_TIMEOUT_MS: must not exceed HTTP_REQUEST_TIMEOUT_MS/);
  });
});
