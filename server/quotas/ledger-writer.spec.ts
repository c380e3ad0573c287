import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { openDatabase, prepareDatabase } from '../db/database';
import type { AdmissionOutcome, AdmissionRequest } from './quotas-repository';
import { QuotasRepository } from './quotas-repository';
import { ledgerWriter, type LedgerWriter } from './ledger-writer';

const PERIOD = '2026-12';
const WINDOW = 1_796_000_000;

function request(i: number, over: Partial<AdmissionRequest> = {}): AdmissionRequest {
  return {
    tenantId: DEMO_TENANT.id,
    keyId: `key${i % 3}`,
    endpoint: 'equilibria',
    cost: 1,
    cached: false,
    period: PERIOD,
    windowStart: WINDOW,
    monthlyLimit: 40,
    rateLimit: 1_000_000,
    at: '2026-12-02T00:00:00.000Z',
    ...over,
  };
}

async function fresh(file: string): Promise<Knex> {
  const db = openDatabase({ sqliteFile: file });
  await prepareDatabase(db, { nodeEnv: 'test' });
  return db;
}

const admitted = (outcomes: AdmissionOutcome[]) => outcomes.filter((o) => !o.refused);

// The ledger keeps the rule: one guarded statement per counter, so N concurrent
// admissions against a limit of L < N admit exactly L units, and a refusal writes nothing.
describe.each([
  ['a ledger thread per connection, two connections on one WAL file', 'file'],
  ['the request thread’s own connection (:memory:)', 'memory'],
])('quota ledger: %s', (_label, kind) => {
  let dbs: Knex[];
  let writers: LedgerWriter[];

  beforeAll(async () => {
    if (kind === 'file') {
      const file = join(mkdtempSync(join(tmpdir(), 'tropline-ledger-')), 'ledger.sqlite');
      const first = await fresh(file);
      dbs = [first, openDatabase({ sqliteFile: file })];
    } else {
      dbs = [await fresh(':memory:')];
    }
    writers = dbs.map(ledgerWriter);
  });
  afterAll(async () => {
    for (const w of writers) await w.close();
    for (const db of dbs) await db.destroy();
  });

  it('admits exactly the monthly limit of concurrent requests; counter = ledger', async () => {
    const outcomes = (await Promise.all(
      Array.from({ length: 100 }, (_, i) =>
        writers[i % writers.length]!.write({ kind: 'admit', request: request(i) }),
      ),
    )) as AdmissionOutcome[];
    expect(admitted(outcomes)).toHaveLength(40);
    // Each admission saw its own counter value, 1 … 40, once each.
    const used = admitted(outcomes)
      .map((o) => o.used)
      .sort((a, b) => a - b);
    expect(used).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
    expect(outcomes.filter((o) => o.refused === 'monthly-units')).toHaveLength(60);
    for (const o of outcomes.filter((x) => x.refused)) expect(o.used).toBe(40);
    const repo = new QuotasRepository(dbs[0]!);
    expect(await repo.used({ tenantId: DEMO_TENANT.id, period: PERIOD })).toBe(40);
    expect(await repo.ledgerTotal(DEMO_TENANT.id, PERIOD)).toBe(40);
    const rows = await dbs[0]!('usage_ledger').where({ tenant_id: DEMO_TENANT.id });
    expect(rows).toHaveLength(40); // the refusals left no row
  });

  it('refunds with a negative ledger row, so the counter still equals the ledger', async () => {
    await writers[0]!.write({ kind: 'refund', request: request(0, { cost: 3 }) });
    const repo = new QuotasRepository(dbs[0]!);
    expect(await repo.used({ tenantId: DEMO_TENANT.id, period: PERIOD })).toBe(37);
    expect(await repo.ledgerTotal(DEMO_TENANT.id, PERIOD)).toBe(37);
  });

  it('holds a per-minute rate exactly and drops windows that ended', async () => {
    const minute = (i: number) =>
      request(i, { keyId: 'paced', rateLimit: 7, monthlyLimit: 1e9, period: '2027-01' });
    const outcomes = (await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        writers[i % writers.length]!.write({ kind: 'admit', request: minute(i) }),
      ),
    )) as AdmissionOutcome[];
    expect(
      admitted(outcomes)
        .map((o) => o.requests)
        .sort((a, b) => a - b),
    ).toEqual([1, 2, 3, 4, 5, 6, 7]);
    expect(outcomes.filter((o) => o.refused === 'per-minute')).toHaveLength(13);
    const repo = new QuotasRepository(dbs[0]!);
    expect(await repo.requestsInWindow('paced', WINDOW)).toBe(7);
    await writers[0]!.write({ kind: 'prune', before: WINDOW + 60 });
    expect(await repo.requestsInWindow('paced', WINDOW)).toBe(0);
  });

  it('starts again after close: nothing acknowledged is lost', async () => {
    await writers[0]!.close();
    const outcome = (await writers[0]!.write({
      kind: 'admit',
      request: request(0, { period: '2027-02' }),
    })) as AdmissionOutcome;
    expect(outcome).toEqual({ requests: expect.any(Number), used: 1 });
    const repo = new QuotasRepository(dbs[dbs.length - 1]!);
    expect(await repo.used({ tenantId: DEMO_TENANT.id, period: '2027-02' })).toBe(1);
  });
});
