import { randomUUID } from 'node:crypto';
import type { AddressInfo, Server } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInDemo, type SignedInAgent } from '../../server/accounts/testing/signed-in-agent';
import { JobsRepository } from '../../server/jobs/jobs-repository';
import { KeysService } from '../../server/keys/keys-service';
import { SERVER_SCOPES } from '../../server/keys/key-scopes';
import { TenantsService } from '../../server/tenants/tenants-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { DEMO_SCENARIOS } from '../../seeds/05-demo-scenarios';
import { startHarness, type Harness } from '../api/api-harness';
import { longMereFit, MOOR_FIT } from './fit-requests';

// The seeded scenarios: Brackenlow Mere (chaotic lake) and Hobcairn Moor (settles), each with
// its synthetic dataset version 1.
const MERE = DEMO_SCENARIOS[0]!.id;
const MOOR = DEMO_SCENARIOS[1]!.id;
interface JobEvent {
  readonly id: string;
  readonly kind: string;
  readonly status: string;
  readonly progress: number;
  readonly error?: { type: string };
  readonly result?: { estimates: unknown[] };
}

describe('calibration progress as Server-Sent Events for signed-in members, and cancel', () => {
  let h: Harness;
  let server: Server;
  let base: string;
  let analyst: SignedInAgent;
  beforeAll(async () => {
    h = await startHarness();
    server = h.app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1`;
    analyst = await signInDemo(h.app, 'analyst');
  });
  afterAll(async () => {
    await new Promise((resolve) => server.close(resolve));
    await h.close();
  });

  /** Headers of a member's request: the session cookie, and the CSRF token for changes. */
  const as = (who: SignedInAgent) => ({
    cookie: who.cookies.map((c) => c.split(';')[0]).join('; '),
    'x-csrf-token': who.csrf,
    'content-type': 'application/json',
  });

  /** A job row as the job service stores one (queued, of `kind`), for a tenant. */
  const storeJob = (id: string, tenantId: string, kind: string) =>
    new JobsRepository(h.app.locals.tropline.db).insert({
      id,
      tenantId,
      keyId: 'stored-by-test',
      kind,
      status: 'queued',
      progress: 0,
      requestHash: id.replaceAll('-', '').padEnd(64, '0'),
      idempotencyKey: null,
      request: {},
      units: 1,
      cancelRequested: false,
      createdAt: new Date(h.clock.now()).toISOString(),
      expiresAt: new Date(h.clock.now() + 3600_000).toISOString(),
    });

  async function start(who: SignedInAgent, scenario: string, body: object): Promise<string> {
    const res = await fetch(`${base}/scenarios/${scenario}/calibrations`, {
      method: 'POST',
      headers: as(who),
      body: JSON.stringify(body),
    });
    expect(res.status, await res.clone().text()).toBe(202);
    return ((await res.json()) as { id: string }).id;
  }

  /**
   * Reads an event stream over real HTTP, block by block; `onEvent` may act on each event
   * (return true to stop reading). Returns the raw blocks and the parsed `job` events.
   */
  async function follow(res: Response, onEvent?: (e: JobEvent) => Promise<boolean | void>) {
    const reader = res.body!.getReader();
    const decoder = new TextDecoder();
    const blocks: string[] = [];
    const events: JobEvent[] = [];
    let pending = '';
    for (;;) {
      const { value, done } = await reader.read();
      if (done) break;
      pending += decoder.decode(value, { stream: true });
      let cut: number;
      while ((cut = pending.indexOf('\n\n')) >= 0) {
        const block = pending.slice(0, cut);
        pending = pending.slice(cut + 2);
        blocks.push(block);
        if (!block.includes('event: job')) continue;
        const event = JSON.parse(block.split('data: ')[1]!) as JobEvent;
        events.push(event);
        if (await onEvent?.(event)) {
          await reader.cancel();
          return { blocks, events };
        }
      }
    }
    return { blocks, events };
  }

  it("streams a member's calibration to its result, in the format of /jobs/{id}/events", async () => {
    const id = await start(analyst, MOOR, MOOR_FIT);
    const res = await fetch(`${base}/calibrations/${id}/events`, { headers: as(analyst) });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/event-stream/);
    const { blocks, events } = await follow(res);
    blocks
      .filter((b) => b.includes('event: job'))
      .forEach((b, i) => expect(b).toMatch(new RegExp(`^id: ${i + 1}\nevent: job\ndata: \\{`)));
    expect(events.every((e) => e.id === id && e.kind === 'calibrations')).toBe(true);
    const progress = events.map((e) => e.progress);
    expect([...progress].sort((a, b) => a - b)).toEqual(progress); // never goes back
    const last = events.at(-1)!;
    expect(last.status).toBe('succeeded');
    expect(last.result!.estimates).toHaveLength(2);
    // A key following the same (now finished) job on /jobs/{id}/events gets the same event.
    const keyed = await fetch(`${base}/jobs/${id}/events`, {
      headers: { authorization: `Bearer ${h.demo.serverKey}` },
    });
    expect((await follow(keyed)).events).toEqual([last]);
  });

  it('cancels a running calibration: DELETE stops it and the stream ends on the cancellation', async () => {
    const id = await start(analyst, MERE, longMereFit());
    const res = await fetch(`${base}/calibrations/${id}/events`, { headers: as(analyst) });
    let cancel: Response | undefined;
    const { events } = await follow(res, async (e) => {
      if (!cancel && e.status === 'running' && e.progress > 0) {
        cancel = await fetch(`${base}/calibrations/${id}`, {
          method: 'DELETE',
          headers: as(analyst),
        });
      }
    });
    expect(cancel?.status).toBe(202);
    const last = events.at(-1)!;
    expect(last.status).toBe('failed');
    expect(last.error!.type).toMatch(/cancelled/);
    // Stopped well before its end: the job's progress froze where it was cancelled.
    expect(last.progress).toBeLessThan(0.5);
    const job = await fetch(`${base}/calibrations/${id}`, { headers: as(analyst) });
    expect(((await job.json()) as JobEvent).status).toBe('failed');
    // Cancelling a finished job changes nothing (200).
    const again = await fetch(`${base}/calibrations/${id}`, {
      method: 'DELETE',
      headers: as(analyst),
    });
    expect(again.status).toBe(200);
  });

  it("answers 404, not a stream, for another tenant's calibration or a job of another kind", async () => {
    const { db } = h.app.locals.tropline;
    const fenwick = await new TenantsService(db, h.clock.now).create('fenwick', 'Fenwick Board');
    const theirs = randomUUID();
    await storeJob(theirs, fenwick.id, 'calibrations');
    for (const method of ['GET', 'DELETE']) {
      const path = method === 'GET' ? `/calibrations/${theirs}/events` : `/calibrations/${theirs}`;
      const res = await fetch(`${base}${path}`, { method, headers: as(analyst) });
      expect(res.status, `${method} ${path}`).toBe(404);
      expect(res.headers.get('content-type')).toMatch(/^application\/problem\+json/);
    }
    const stored = await new JobsRepository(db).find(fenwick.id, theirs);
    expect(stored?.cancelRequested).toBe(false);
    // Tenant B's key on one of the demo tenant's calibrations.
    const keyB = (
      await new KeysService(db, h.clock.now).issue(
        { tenantId: fenwick.id, kind: 'server', scopes: [...SERVER_SCOPES] },
        'test',
      )
    ).token;
    const ours = await start(analyst, MOOR, { ...MOOR_FIT, starts: 1 });
    const probe = await fetch(`${base}/calibrations/${ours}/events`, {
      headers: { authorization: `Bearer ${keyB}` },
    });
    expect(probe.status).toBe(404);
    await follow(await fetch(`${base}/calibrations/${ours}/events`, { headers: as(analyst) }));
    // A job that is not a calibration is not one of these routes' objects.
    const other = randomUUID();
    await storeJob(other, DEMO_TENANT.id, 'sweeps');
    const notOne = await fetch(`${base}/calibrations/${other}/events`, { headers: as(analyst) });
    expect(notOne.status).toBe(404);
  });

  it('refuses a viewer, whose role may not run analyses, before any stream', async () => {
    const viewer = await signInDemo(h.app, 'viewer');
    const id = await start(analyst, MOOR, { ...MOOR_FIT, starts: 1, maxIterations: 5 });
    const res = await fetch(`${base}/calibrations/${id}/events`, { headers: as(viewer) });
    expect(res.status).toBe(403);
    const cancel = await fetch(`${base}/calibrations/${id}`, {
      method: 'DELETE',
      headers: as(viewer),
    });
    expect(cancel.status).toBe(403);
    await follow(await fetch(`${base}/calibrations/${id}/events`, { headers: as(analyst) }));
  });
});
