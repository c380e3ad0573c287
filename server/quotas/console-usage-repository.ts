import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { DEFAULT_PLAN, QuotasRepository, type QuotaPlan } from './quotas-repository';

/** Units charged on one UTC day of the month. */
export interface DayUnits {
  /** `YYYY-MM-DD` (UTC). */
  readonly day: string;
  readonly units: number;
}

/** Units charged to one key this month. */
export interface KeyUnits {
  readonly keyId: string;
  /**
   * The key's name; for a signed-in member's meter (calibrations started in the console) the
   * member's name with "(signed in)"; null when neither exists any more.
   */
  readonly name: string | null;
  readonly units: number;
}

/** Units charged for one endpoint this month. */
export interface EndpointUnits {
  readonly endpoint: string;
  readonly units: number;
}

/** A quota alert mailed to the tenant's owners and admins. */
export interface SentAlert {
  readonly sentAt: string;
  /** Percent of the monthly units: 80 or 100. */
  readonly threshold: number;
}

/** One tenant's month as the console shows it. */
export interface MonthUsage {
  readonly plan: QuotaPlan;
  readonly used: number;
  readonly byDay: readonly DayUnits[];
  readonly byKey: readonly KeyUnits[];
  readonly byEndpoint: readonly EndpointUnits[];
  readonly alerts: readonly SentAlert[];
}

/**
 * The ledger's key id for work a signed-in member started: `u-` + 14 hex of the SHA-256 of the
 * user id, as `server/calibration/calibration-routes.ts` meters console calibrations.
 */
export function memberMeter(userId: string): string {
  return 'u-' + createHash('sha256').update(userId).digest('hex').slice(0, 14);
}

/**
 * Read side of the usage ledger for the console: the month's counter and plan, the ledger
 * grouped by day, key and endpoint, and the alerts sent. Refunds are negative ledger rows, so
 * each sum is what was finally charged. Portable SQL: `at` is a fixed-width ISO string, so its
 * first ten characters are the UTC day on SQLite and PostgreSQL alike.
 */
export class ConsoleUsageRepository {
  private readonly quotas: QuotasRepository;

  constructor(private readonly db: Knex) {
    this.quotas = new QuotasRepository(db);
  }

  /** Everything for `tenantId` in `period` (`YYYY-MM`). */
  async month(tenantId: string, period: string): Promise<MonthUsage> {
    const ledger = () =>
      this.db('usage_ledger as l').where({ 'l.tenant_id': tenantId, 'l.period': period });
    const day = this.db.raw('substr(??, 1, 10)', ['l.at']);
    const [plan, used, days, keys, endpoints, alerts, members] = await Promise.all([
      this.quotas.getPlan(tenantId),
      this.quotas.used({ tenantId, period }),
      ledger().select({ day }).sum({ units: 'l.units' }).groupBy(day).orderBy('day'),
      ledger()
        .leftJoin('api_keys as k', 'k.id', 'l.key_id')
        .select('l.key_id', 'k.name')
        .sum({ units: 'l.units' })
        .groupBy('l.key_id', 'k.name')
        .orderBy([{ column: 'units', order: 'desc' }, 'l.key_id']),
      ledger()
        .select('l.endpoint')
        .sum({ units: 'l.units' })
        .groupBy('l.endpoint')
        .orderBy([{ column: 'units', order: 'desc' }, 'l.endpoint']),
      this.db('quota_alerts')
        .where({ tenant_id: tenantId, period })
        .select('threshold', 'at')
        .orderBy('threshold'),
      this.db('memberships as m')
        .join('users as u', 'u.id', 'm.user_id')
        .where('m.tenant_id', tenantId)
        .select('u.id', 'u.name'),
    ]);
    const meters = new Map(
      (members as { id: string; name: string }[]).map((u) => [memberMeter(u.id), u.name]),
    );
    type Row = Record<string, string | number | null>;
    return {
      plan: plan ?? DEFAULT_PLAN,
      used,
      byDay: (days as Row[]).map((r) => ({ day: String(r.day), units: Number(r.units) })),
      byKey: (keys as Row[]).map((r) => ({
        keyId: String(r.key_id),
        name:
          typeof r.name === 'string'
            ? r.name
            : meters.has(String(r.key_id))
              ? `${meters.get(String(r.key_id))} (signed in)`
              : null,
        units: Number(r.units),
      })),
      byEndpoint: (endpoints as Row[]).map((r) => ({
        endpoint: String(r.endpoint),
        units: Number(r.units),
      })),
      alerts: (alerts as Row[]).map((r) => ({
        sentAt: String(r.at),
        threshold: Number(r.threshold),
      })),
    };
  }
}
