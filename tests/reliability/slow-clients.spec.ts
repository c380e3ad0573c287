import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KeysService } from '../../server/keys/keys-service';
import { OPEN_REQUESTS_PER_KEY, QuotasService } from '../../server/quotas/quotas-service';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { DEFAULT_SOCKET_LIMITS } from '../../server/socket-limits';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { heavySweep } from './job-flood';
import {
  freshDatabaseFile,
  prepareDatabase,
  problemComplaints,
  send,
  spawnApi,
  type LiveServer,
} from './live-server';
import {
  bystander,
  holdStream,
  idleConnections,
  neverReads,
  rawGet,
  rawProjection,
  trickleBody,
  trickleHead,
  type CutOff,
} from './slow-clients';

// The server's own limits, shortened so each cut-off comes within seconds; production keeps
// the defaults of server/socket-limits.ts. Nothing here asserts how long anything took.
const SHORT_LIMITS = {
  HTTP_HEADERS_TIMEOUT_MS: '1500',
  HTTP_REQUEST_TIMEOUT_MS: '3000',
  HTTP_KEEP_ALIVE_TIMEOUT_MS: '2500',
  HTTP_IDLE_TIMEOUT_MS: '3000',
};
const ORIGIN = 'https://portal.larchmere.example';
const { model, initial } = HASTINGS_POWELL_BENCHMARK;

/** The problem document after the head of a raw answer. */
function problemOf(cut: CutOff): Record<string, unknown> {
  return JSON.parse(cut.received.slice(cut.received.indexOf('\r\n\r\n') + 4)) as never;
}

describe('slow and stuck clients are cut off while other clients are answered', () => {
  let server: LiveServer;
  let serverKey: string;
  let browserKey: string;

  beforeAll(async () => {
    const file = freshDatabaseFile('slow');
    ({ serverKey, browserKey } = await prepareDatabase(file, async ({ db }, demo) => {
      const plan = { monthlyUnits: 1e8, perMinute: 1e6, browserPerMinute: 1e6 };
      await new QuotasService(db).setPlan(DEMO_TENANT.id, plan, 'test');
      const browser = await new KeysService(db).issue(
        { tenantId: DEMO_TENANT.id, kind: 'browser', origins: [ORIGIN] },
        'test',
      );
      return { serverKey: demo.serverKey, browserKey: browser.token };
    }));
    server = await spawnApi(file, SHORT_LIMITS);
  }, 120_000);
  afterAll(() => server?.stop());

  it('answers a request head that trickles in with a 408 problem and closes it', async () => {
    const hostile = trickleHead(server.port);
    const seen = await bystander(server.url, serverKey, hostile);
    const cut = await hostile;
    expect(cut.statusLine).toBe('HTTP/1.1 408 Request Timeout');
    expect(problemOf(cut)).toMatchObject({ status: 408, title: expect.any(String) });
    expect(seen.other).toEqual([]);
    expect(seen.answered).toBeGreaterThan(0);
  });

  it('answers a body that trickles in with a 408 problem and closes it', async () => {
    const hostile = trickleBody(server.port, serverKey);
    const seen = await bystander(server.url, serverKey, hostile);
    const cut = await hostile;
    expect(cut.statusLine).toBe('HTTP/1.1 408 Request Timeout');
    expect(problemOf(cut)).toMatchObject({
      type: 'https://tropline.dev/problems/request-timeout',
      status: 408,
    });
    expect(seen.other).toEqual([]);
    expect(seen.answered).toBeGreaterThan(0);
  });

  it('closes connections that stay silent, before or after a first request', async () => {
    const hostile = idleConnections(server.port, 60);
    const seen = await bystander(server.url, serverKey, hostile);
    expect(await hostile).toBe(60);
    expect(seen.other).toEqual([]);
    expect(seen.answered).toBeGreaterThan(0);
  });

  it('closes a connection whose client stopped reading large answers', async () => {
    // Six projections of 20 001 samples (about 1.2 MB each, so more than the kernel buffers
    // take), none read: the server's writes stall, the connection goes idle and is closed.
    const body = { model, initial, horizon: 2000, samples: 20_001 };
    const one = await send(server.url, 'POST', '/projections', { key: serverKey, body });
    expect(one.status).toBe(200);
    const hostile = neverReads(server.port, rawProjection(serverKey, body).repeat(6));
    const seen = await bystander(server.url, serverKey, hostile);
    expect((await hostile).bytes).toBeLessThan(6 * one.text.length);
    expect(seen.other).toEqual([]);
    expect(seen.answered).toBeGreaterThan(0);
  });

  it('closes a connection that pipelines many requests and reads none', async () => {
    // Node parses a whole chunk of pipelined requests at once; the server answers at most
    // HTTP_MAX_QUEUED_ANSWERS of them and closes the connection at the next.
    const doc = await fetch(`${server.url}/api/openapi.json`);
    const size = (await doc.arrayBuffer()).byteLength + 1024; // the body and a generous head
    const hostile = neverReads(server.port, rawGet('/api/openapi.json').repeat(200));
    const seen = await bystander(server.url, serverKey, hostile);
    expect((await hostile).bytes).toBeLessThanOrEqual(
      DEFAULT_SOCKET_LIMITS.maxQueuedAnswers * size,
    );
    expect(seen.other).toEqual([]);
    expect(seen.answered).toBeGreaterThan(0);
  });

  it('holds a key to its open streams; its other requests and other keys are answered', async () => {
    const cap = OPEN_REQUESTS_PER_KEY.browser;
    const job = await send(server.url, 'POST', '/sweeps', {
      key: browserKey,
      origin: ORIGIN,
      body: heavySweep(1, 1000),
    });
    expect(job.status).toBe(202);
    const events = `/api/v1/jobs/${String(job.json!.id)}/events`;
    const streams = [];
    try {
      for (let i = 0; i < cap; i++) {
        streams.push(await holdStream(server.port, events, browserKey, ORIGIN));
      }
      expect(streams.map((s) => s.statusLine)).toEqual(
        Array.from({ length: cap }, () => 'HTTP/1.1 200 OK'),
      );
      const over = await send(server.url, 'GET', events.replace('/api/v1', ''), {
        key: browserKey,
        origin: ORIGIN,
      });
      expect(over.status).toBe(429);
      expect(problemComplaints(over)).toEqual([]);
      expect(over.json).toMatchObject({ limit: 'open-requests', retryAfter: 1 });
      expect(over.headers['retry-after']).toBe('1');
      // Another key of the same tenant is not held back by this one's streams.
      const other = await send(server.url, 'GET', '/usage', { key: serverKey });
      expect(other.status).toBe(200);
      // Ending the job ends its streams, which frees the key's slots.
      const jobPath = `/jobs/${String(job.json!.id)}`;
      const cancelled = await send(server.url, 'DELETE', jobPath, { key: serverKey });
      expect([200, 202]).toContain(cancelled.status);
      await Promise.all(streams.map((s) => s.drain()));
      const after = await send(server.url, 'GET', jobPath, { key: browserKey, origin: ORIGIN });
      expect(after.status).toBe(200);
    } finally {
      for (const s of streams) s.release();
    }
  });
});
