import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { heavySweep } from '../../tests/reliability/job-flood';
import {
  freshDatabaseFile,
  prepareDatabase,
  send,
  spawnApi,
  type LiveServer,
} from '../../tests/reliability/live-server';

// Two API processes on one database file, as in production behind a balancer. A job runs in
// the process that took it; a DELETE that reaches the other process only flags it, and the
// running process must see the flag at its next progress write and stop the job.
describe('jobs across processes', () => {
  let servers: LiveServer[] = [];
  let key: string;
  beforeAll(async () => {
    const file = freshDatabaseFile('jobs-two');
    ({
      demo: { serverKey: key },
    } = await prepareDatabase(file, async () => ({})));
    servers = await Promise.all([spawnApi(file), spawnApi(file)]);
  });
  afterAll(() => Promise.all(servers.map((s) => s.stop())));

  it('stops a job in one process when another process is asked to cancel it', async () => {
    const [runner, other] = servers as [LiveServer, LiveServer];
    // At the work bound (about 240 chunks): it cannot finish before the cancellation lands.
    const body = { ...heavySweep(1, 1000), transient: 30_000, window: 30_000 };
    const created = await send(runner.url, 'POST', '/sweeps', { key, body });
    expect(created.status).toBe(202);
    const id = String(created.json!.id);
    let job = created.json!;
    while (job.status === 'queued') {
      await new Promise((r) => setTimeout(r, 50));
      job = (await send(other.url, 'GET', `/jobs/${id}`, { key })).json!;
    }
    expect(job.status).toBe('running');
    const cancel = await send(other.url, 'DELETE', `/jobs/${id}`, { key });
    expect([200, 202]).toContain(cancel.status);
    while (job.status === 'running') {
      await new Promise((r) => setTimeout(r, 50));
      job = (await send(other.url, 'GET', `/jobs/${id}`, { key })).json!;
    }
    expect(job.status).toBe('failed');
    expect((job.error as { type: string }).type).toMatch(/cancelled/);
  });
});
