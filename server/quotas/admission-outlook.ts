import type { AdmissionOutcome, AdmissionRequest } from './quotas-repository';

/**
 * What this process last heard of each tenant's monthly counter and each key's rate window,
 * plus what it has sent and not yet heard back. It only advises when work may start before
 * its admission is decided (the admission itself stays the ledger's guarded statements, and a
 * result is never released before its admission is durable): far from both limits the work
 * overlaps the commit; near one, or knowing nothing yet, the admission comes first, so a
 * request that will be refused burns no CPU.
 */
export class AdmissionOutlook {
  private readonly units = new Map<string, { period: string; used: number }>();
  private readonly rate = new Map<string, { window: number; requests: number }>();
  private readonly unitsInFlight = new Map<string, number>();
  private readonly requestsInFlight = new Map<string, number>();

  /**
   * Whether work of `a.cost` units may start now: at least two such requests' worth of units
   * and two requests of the key's rate are left beyond everything still in flight. Other
   * processes sharing the database may have used some of it; the margin and the exact
   * admission cover that, at worst with one wasted computation.
   */
  mayOverlap(a: AdmissionRequest): boolean {
    const units = this.units.get(a.tenantId);
    if (!units || units.period !== a.period) return false;
    const rate = this.rate.get(a.keyId);
    const requests = rate?.window === a.windowStart ? rate.requests : 0;
    const unitsLeft = a.monthlyLimit - units.used - (this.unitsInFlight.get(a.tenantId) ?? 0);
    const requestsLeft = a.rateLimit - requests - (this.requestsInFlight.get(a.keyId) ?? 0);
    return unitsLeft >= 2 * a.cost && requestsLeft >= 2;
  }

  /** An admission was sent. */
  sent(a: AdmissionRequest): void {
    add(this.unitsInFlight, a.tenantId, a.cost);
    add(this.requestsInFlight, a.keyId, 1);
  }

  /** Its outcome arrived (`undefined` when the write failed). */
  heard(a: AdmissionRequest, outcome: AdmissionOutcome | undefined): void {
    add(this.unitsInFlight, a.tenantId, -a.cost);
    add(this.requestsInFlight, a.keyId, -1);
    if (!outcome) return;
    const units = this.units.get(a.tenantId);
    // Answers can arrive out of order across batches; counters only grow within a period.
    if (!units || units.period !== a.period || units.used < outcome.used) {
      this.units.set(a.tenantId, { period: a.period, used: outcome.used });
    }
    const rate = this.rate.get(a.keyId);
    if (!rate || rate.window !== a.windowStart || rate.requests < outcome.requests) {
      this.rate.set(a.keyId, { window: a.windowStart, requests: outcome.requests });
    }
  }
}

function add(map: Map<string, number>, key: string, by: number): void {
  const n = (map.get(key) ?? 0) + by;
  if (n === 0) map.delete(key);
  else map.set(key, n);
}
