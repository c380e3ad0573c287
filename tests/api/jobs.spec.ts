import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { benchmarkProjection, startHarness, type Harness } from './api-harness';

const { model, initial } = benchmarkProjection();
const sweep = (steps: number, window = 100) => ({
  model,
  initial,
  parameter: '/levels/1/handlingTime',
  from: 0.5,
  to: 0.7,
  steps,
  observe: 'z',
  transient: 100,
  window,
});

describe('jobs: sweeps on the worker pool, progress, cancellation, idempotency', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  async function finished(id: string) {
    for (;;) {
      const res = await h.call('get', `/jobs/${id}`, h.demo.serverKey).expect(200);
      if (res.body.status === 'succeeded' || res.body.status === 'failed') return res.body;
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  it('answers 202 with Location, then the result the contract describes', async () => {
    const res = await h.call('post', '/sweeps', h.demo.serverKey).send(sweep(4)).expect(202);
    expect(res.headers.location).toBe(`/api/v1/jobs/${res.body.id}`);
    expect(['queued', 'running']).toContain(res.body.status);
    expect(res.headers['tropline-cache']).toBe('miss');
    const job = await finished(res.body.id);
    expect(job.status).toBe('succeeded');
    expect(job.progress).toBe(1);
    expect(job.result.points.map((p: { value: number }) => p.value)).toHaveLength(4);
    for (const p of job.result.points) expect(Array.isArray(p.maxima)).toBe(true);
    // The same request again: answered from the finished job, not recomputed.
    const again = await h.call('post', '/sweeps', h.demo.serverKey).send(sweep(4)).expect(202);
    expect(again.body.id).toBe(res.body.id);
    expect(again.headers['tropline-cache']).toBe('hit');
  });

  it('streams progress as Server-Sent Events until the job finishes', async () => {
    const created = await h.call('post', '/sweeps', h.demo.serverKey).send(sweep(6)).expect(202);
    const res = await request(h.app)
      .get(`/api/v1/jobs/${created.body.id}/events`)
      .set('Authorization', `Bearer ${h.demo.serverKey}`)
      .buffer(true)
      .parse((r, done) => {
        let text = '';
        r.on('data', (d: Buffer) => (text += d));
        r.on('end', () => done(null, text));
      })
      .expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/event-stream/);
    const events = (res.body as string)
      .split('\n\n')
      .filter((e) => e.includes('event: job'))
      .map((e) => JSON.parse(e.split('data: ')[1]!));
    expect(events.at(-1).status).toBe('succeeded');
    const progress = events.map((e) => e.progress);
    expect([...progress].sort((a, b) => a - b)).toEqual(progress); // never goes back
  });

  it('replays an Idempotency-Key with the same body and refuses it with another', async () => {
    const first = await h
      .call('post', '/sweeps', h.demo.serverKey)
      .set('Idempotency-Key', 'nightly-2026-12-15')
      .send(sweep(3))
      .expect(202);
    const replay = await h
      .call('post', '/sweeps', h.demo.serverKey)
      .set('Idempotency-Key', 'nightly-2026-12-15')
      .send(sweep(3))
      .expect(202);
    expect(replay.body.id).toBe(first.body.id);
    expect(replay.headers['idempotent-replayed']).toBe('true');
    const other = await h
      .call('post', '/sweeps', h.demo.serverKey)
      .set('Idempotency-Key', 'nightly-2026-12-15')
      .send(sweep(5))
      .expect(422);
    expect(other.body.type).toMatch(/idempotency-key-reused/);
    await finished(first.body.id);
  });

  it('cancels a running job with DELETE', async () => {
    const created = await h
      .call('post', '/sweeps', h.demo.serverKey)
      .send(sweep(400, 20_000))
      .expect(202);
    const cancel = await h.call('delete', `/jobs/${created.body.id}`, h.demo.serverKey);
    expect([200, 202]).toContain(cancel.status);
    const job = await finished(created.body.id);
    expect(job.status).toBe('failed');
    expect(job.error.type).toMatch(/cancelled/);
  });

  it('refuses a sweep past its bounds before any work, naming the field', async () => {
    const res = await h
      .call('post', '/sweeps', h.demo.serverKey)
      .send(sweep(1000, 100_000))
      .expect(422);
    expect(res.body.errors[0].pointer).toMatch(/^\/(steps|window|transient)$/);
  });

  it('answers /regimes synchronously from the pool', async () => {
    const res = await h
      .call('post', '/regimes', h.demo.serverKey)
      .send({ model, initial, transient: 200, window: 400 })
      .expect(200);
    expect(['equilibrium', 'cycle', 'chaotic', 'collapse']).toContain(res.body.regime);
    expect(Number.isFinite(res.body.lyapunovExponent.value)).toBe(true);
  });
});
