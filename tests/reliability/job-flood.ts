import type { Knex } from 'knex';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { KeysService } from '../../server/keys/keys-service';
import { SERVER_SCOPES } from '../../server/keys/key-scopes';
import { QuotasService } from '../../server/quotas/quotas-service';
import { TenantsService } from '../../server/tenants/tenants-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { send } from './live-server';

const { model, initial } = HASTINGS_POWELL_BENCHMARK;

/** A heavy sweep: dozens of long integrations, distinct per `n` so none joins another. */
export function heavySweep(n: number, steps = 40) {
  return {
    model,
    initial,
    parameter: '/levels/1/handlingTime',
    from: 0.5 + n * 1e-7,
    to: 0.7,
    steps,
    observe: 'z',
    transient: 600,
    window: 300,
  };
}

/** The victim's short projection, distinct per `n` so every one is computed. */
export function shortProjection(n: number) {
  return { model, initial, horizon: 40 - n * 1e-6, samples: 41 };
}

/** Keys for a flooding tenant (big plan) and a victim tenant (the demo tenant). */
export async function prepareFlood(db: Knex, victimKey: string) {
  const tenants = new TenantsService(db);
  const flood = await tenants.create('gullmarsh', 'Gullmarsh Estuary Trust');
  const quotas = new QuotasService(db);
  await quotas.setPlan(flood.id, { monthlyUnits: 100_000_000, perMinute: 1_000_000 }, 'test');
  await quotas.setPlan(DEMO_TENANT.id, { monthlyUnits: 100_000_000, perMinute: 1_000_000 }, 't');
  const key = await new KeysService(db).issue(
    { tenantId: flood.id, kind: 'server', scopes: [...SERVER_SCOPES] },
    'test',
  );
  return { floodKey: key.token, floodTenantId: flood.id, victimKey };
}

/** What a flood run saw. */
export interface FloodReport {
  readonly victim: { sent: number; ok: number; other: number[]; latenciesMs: number[] };
  readonly flood: { sent: number; accepted: number; refusedBusy: number; other: number[] };
  /** Most jobs the flooding tenant had queued or running at any sample. */
  readonly maxActive: number;
}

/**
 * For `durationMs`: `flooders` clients submit heavy sweeps as fast as the server takes them
 * (retrying after a refusal), while one victim client sends short projections one after
 * another. `activeJobs` samples the flooding tenant's queued and running jobs.
 */
export async function runFlood(
  base: string,
  keys: { floodKey: string; victimKey: string },
  opts: { durationMs: number; flooders: number; activeJobs?: () => Promise<number> },
): Promise<FloodReport> {
  const victim = { sent: 0, ok: 0, other: [] as number[], latenciesMs: [] as number[] };
  const flood = { sent: 0, accepted: 0, refusedBusy: 0, other: [] as number[] };
  let maxActive = 0;
  const end = Date.now() + opts.durationMs;
  let n = 0;
  const flooder = async () => {
    while (Date.now() < end) {
      const a = await send(base, 'POST', '/sweeps', { key: keys.floodKey, body: heavySweep(++n) });
      flood.sent++;
      if (a.status === 202) flood.accepted++;
      else if (a.status === 429 && a.json?.limit === 'concurrent-jobs') {
        flood.refusedBusy++;
        await new Promise((r) => setTimeout(r, 25));
      } else flood.other.push(a.status);
    }
  };
  const sampler = async () => {
    while (opts.activeJobs && Date.now() < end) {
      maxActive = Math.max(maxActive, await opts.activeJobs());
      await new Promise((r) => setTimeout(r, 50));
    }
  };
  const victimLoop = async () => {
    while (Date.now() < end || victim.sent === 0) {
      const started = performance.now();
      const a = await send(base, 'POST', '/projections', {
        key: keys.victimKey,
        body: shortProjection(++n),
      });
      victim.latenciesMs.push(performance.now() - started);
      victim.sent++;
      if (a.status === 200) victim.ok++;
      else victim.other.push(a.status);
    }
  };
  await Promise.all([...Array.from({ length: opts.flooders }, flooder), sampler(), victimLoop()]);
  return { victim, flood, maxActive };
}

/** The p-th percentile (0–100) of a list of numbers, by nearest rank. */
export function percentile(values: readonly number[], p: number): number {
  if (!values.length) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}
