import type { Knex } from 'knex';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { openDatabase, prepareDatabase } from '../db/database';
import { QuotasService } from './quotas-service';

describe('QuotasService.setPlan', () => {
  let db: Knex;
  let quotas: QuotasService;
  beforeEach(async () => {
    db = openDatabase({ sqliteFile: ':memory:' });
    await prepareDatabase(db, { nodeEnv: 'test' });
    quotas = new QuotasService(db, () => Date.parse('2026-12-02T12:00:00Z'));
  });
  afterEach(async () => {
    await quotas.close();
    await db.destroy();
  });

  it('keeps the fields a change leaves out and records one audit event with the plan', async () => {
    const first = await quotas.setPlan(DEMO_TENANT.id, { monthlyUnits: 500, perMinute: 30 }, 'cli');
    const second = await quotas.setPlan(DEMO_TENANT.id, { perMinute: 60 }, 'cli');
    expect(second).toEqual({ ...first, perMinute: 60 });
    const events = await db('audit_events')
      .where({ tenant_id: DEMO_TENANT.id, action: 'quota.set' })
      .orderBy('id');
    expect(events.map((e) => JSON.parse(e.detail))).toEqual([first, second]);
  });

  it('changes nothing when its audit event cannot be written', async () => {
    const before = await quotas.setPlan(DEMO_TENANT.id, { monthlyUnits: 500 }, 'cli');
    // A failure after the plan's write and before the audit's: the transaction rolls back.
    await db.raw(
      "CREATE TRIGGER no_audit BEFORE INSERT ON audit_events BEGIN SELECT RAISE(ABORT, 'audit down'); END",
    );
    await expect(quotas.setPlan(DEMO_TENANT.id, { monthlyUnits: 9 }, 'cli')).rejects.toThrow(
      /audit down/,
    );
    await db.raw('DROP TRIGGER no_audit');
    const row = await db('quota_plans').where({ tenant_id: DEMO_TENANT.id }).first();
    expect(row.monthly_units).toBe(before.monthlyUnits);
  });
});
