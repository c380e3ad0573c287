import { afterAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/database';

// The migration that ties datasets to scenario versions, on a real SQLite database holding
// uploads made before it: each gets the version that was the latest when it was uploaded.
describe('migration 20261206000000: datasets learn their scenario version', () => {
  const db = openDatabase({ sqliteFile: ':memory:' });
  afterAll(() => db.destroy());

  it('records the newest version saved at or before each earlier upload', async () => {
    const before = '20261206000000_dataset-scenario-version.ts';
    // Every migration before this one (the source lists them by file name, in order).
    const [, pending] = (await db.migrate.list()) as [unknown[], string[]];
    expect(pending).toContain(before);
    for (const name of pending.slice(0, pending.indexOf(before))) {
      await db.migrate.up({ name });
    }
    await db('tenants').insert({ id: 't1', slug: 'fen', name: 'Fen', created_at: '2026-01-01' });
    await db('scenarios').insert({
      id: 's1',
      tenant_id: 't1',
      latest_version: 2,
      created_by: 'test',
      created_at: '2026-01-01T00:00:00.000Z',
    });
    for (const [version, at] of [
      [1, '2026-01-01T00:00:00.000Z'],
      [2, '2026-03-01T00:00:00.000Z'],
    ] as const) {
      await db('scenario_versions').insert({
        scenario_id: 's1',
        version,
        status: 'draft',
        content: '{}',
        change_note: 'n',
        author: 'test',
        created_at: at,
      });
    }
    const upload = (id: string, version: number, at: string) => ({
      id,
      tenant_id: 't1',
      scenario_id: 's1',
      version,
      filename: `${id}.csv`,
      original: Buffer.from('time,x\n0,1\n'),
      series: '{"times":[0],"levels":{"x":[1]}}',
      rows: 1,
      sha256: '0'.repeat(64),
      change_note: 'n',
      author: 'test',
      created_at: at,
    });
    await db('dataset_versions').insert([
      upload('d1', 1, '2026-02-01T00:00:00.000Z'),
      upload('d2', 2, '2026-03-01T00:00:00.000Z'),
      upload('d3', 3, '2026-04-01T00:00:00.000Z'),
    ]);
    await db.migrate.latest();
    const rows = await db('dataset_versions').orderBy('version').select('id', 'scenario_version');
    expect(rows).toEqual([
      { id: 'd1', scenario_version: 1 },
      { id: 'd2', scenario_version: 2 },
      { id: 'd3', scenario_version: 2 },
    ]);
  });
});
