import type { RequestHandler, Response } from 'express';
import type { Knex } from 'knex';
import { principalOf, type KeyPrincipal } from '../auth/key-principal';
import { AuditRepository } from '../audit/audit-repository';
import type { KeyKind } from '../keys/key-token';
import { ProblemError, validationProblem, type FieldError } from '../http/problem';
import { AdmissionOutlook } from './admission-outlook';
import { ledgerWriter, type LedgerWriter } from './ledger-writer';
import {
  DEFAULT_PLAN,
  QuotasRepository,
  type AdmissionOutcome,
  type AdmissionRequest,
  type QuotaPlan,
} from './quotas-repository';
import { rateLimitHeaders, type LimitState } from './rate-limit-headers';

/** `YYYY-MM` of a UTC instant. */
export function periodOf(ms: number): string {
  return new Date(ms).toISOString().slice(0, 7);
}

/** Start of the next calendar month (UTC), epoch ms. */
export function nextPeriodStart(ms: number): number {
  const d = new Date(ms);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1);
}

function monthSeconds(ms: number): number {
  const d = new Date(ms);
  const start = Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), 1);
  return Math.round((nextPeriodStart(ms) - start) / 1000);
}

/** A ticket for an admitted request: keep it to refund the units if the work fails. */
export type Admission = AdmissionRequest;

/** An admission on its way to the ledger. */
export interface PendingAdmission {
  /**
   * Whether the work may start before {@link decided} (both limits are far off); when false,
   * await `decided` first so a refusal costs no work.
   */
  readonly overlap: boolean;
  /**
   * Waits until the admission is durable, sets `RateLimit` and `RateLimit-Policy` on `res`,
   * and resolves with the ticket; a refusal rejects with the 429 (`Retry-After`, and a body
   * naming the limit). Release nothing of the work before this resolves.
   */
  decided(res: Response): Promise<Admission>;
}

/**
 * Requests one key may have open at once in one API process: answers being computed or
 * streamed (a job's progress stream stays open until the job ends). A client that opens
 * streams and never reads them holds at most this many; browser keys are public, so fewer.
 */
export const OPEN_REQUESTS_PER_KEY: Record<KeyKind, number> = { server: 64, browser: 32 };

/** Metering: per-key request rate and per-tenant monthly compute units. */
export class QuotasService {
  readonly repository: QuotasRepository;
  private readonly open = new Map<string, number>();
  private readonly ledger: LedgerWriter;
  private readonly outlook = new AdmissionOutlook();
  private lastPruned = 0;

  constructor(
    db: Knex,
    private readonly now: () => number = Date.now,
  ) {
    this.repository = new QuotasRepository(db);
    this.ledger = ledgerWriter(db);
  }

  /** Admits a request of `cost` units or throws 429 (see {@link PendingAdmission.decided}). */
  admit(
    principal: KeyPrincipal,
    endpoint: string,
    cost: number,
    res: Response,
    cached = false,
  ): Promise<Admission> {
    return this.begin(principal, endpoint, cost, res, cached).decided(res);
  }

  /**
   * Sends a request of `cost` units to the ledger and returns at once, so the caller can work
   * while the commit waits for the disk. The counters move only in the ledger's guarded
   * statements, so overlapping changes nothing of who is admitted.
   */
  begin(principal: KeyPrincipal, endpoint: string, cost: number, res: Response, cached = false) {
    const nowMs = this.now();
    const windowStart = Math.floor(nowMs / 60_000) * 60;
    const ticket: Admission = {
      tenantId: principal.tenantId,
      keyId: principal.keyId,
      endpoint,
      cost,
      cached,
      period: periodOf(nowMs),
      windowStart,
      monthlyLimit: principal.monthlyUnits,
      rateLimit: principal.perMinute,
      at: new Date(nowMs).toISOString(),
    };
    this.prune(windowStart);
    // Counted once per request (some routes admit twice: a metered guard, then the work).
    const opened = this.open.get(ticket.keyId) ?? 0;
    if (!res.locals.openCounted && opened >= OPEN_REQUESTS_PER_KEY[principal.kind]) {
      // Refused before the ledger: nothing is counted, the headers show the counters as they are.
      const counters = this.counters(ticket);
      counters.catch(() => undefined);
      return {
        overlap: false,
        decided: (r: Response) =>
          counters.then((c) => {
            this.answer(principal, ticket, { ...c, refused: 'open-requests' }, nowMs, r);
            return ticket;
          }),
      } satisfies PendingAdmission;
    }
    if (!res.locals.openCounted) {
      res.locals.openCounted = true;
      this.open.set(ticket.keyId, opened + 1);
      res.once('close', () => {
        const n = (this.open.get(ticket.keyId) ?? 1) - 1;
        if (n > 0) this.open.set(ticket.keyId, n);
        else this.open.delete(ticket.keyId);
      });
    }
    const overlap = this.outlook.mayOverlap(ticket);
    this.outlook.sent(ticket);
    const outcome = this.ledger.write({ kind: 'admit', request: ticket }).then(
      (o) => {
        this.outlook.heard(ticket, o as AdmissionOutcome);
        return o as AdmissionOutcome;
      },
      (err: unknown) => {
        this.outlook.heard(ticket, undefined);
        throw err;
      },
    );
    outcome.catch(() => undefined); // the caller hears of it from `decided`
    let decided: Promise<Admission> | undefined;
    return {
      overlap,
      decided: (res: Response) =>
        (decided ??= outcome.then((o) => {
          this.answer(principal, ticket, o, nowMs, res);
          return ticket;
        })),
    } satisfies PendingAdmission;
  }

  /** The key's requests this minute and the tenant's units this month, as stored now. */
  private async counters(a: Admission): Promise<AdmissionOutcome> {
    const [requests, used] = await Promise.all([
      this.repository.requestsInWindow(a.keyId, a.windowStart),
      this.repository.used(a),
    ]);
    return { requests, used };
  }

  /** Sets the rate-limit fields for an outcome; throws the 429 of a refusal. */
  private answer(
    principal: KeyPrincipal,
    ticket: Admission,
    outcome: AdmissionOutcome,
    nowMs: number,
    res: Response,
  ): void {
    const { windowStart, cost } = ticket;
    const minuteReset = windowStart + 60 - Math.floor(nowMs / 1000);
    const monthReset = Math.ceil((nextPeriodStart(nowMs) - nowMs) / 1000);
    const states: LimitState[] = [
      {
        name: 'per-minute',
        quota: principal.perMinute,
        window: 60,
        remaining: principal.perMinute - outcome.requests,
        reset: minuteReset,
      },
      {
        name: 'monthly-units',
        quota: principal.monthlyUnits,
        window: monthSeconds(nowMs),
        remaining: principal.monthlyUnits - outcome.used,
        reset: monthReset,
      },
    ];
    const headers = rateLimitHeaders(states);
    res.set(headers);
    if (!outcome.refused) return;
    if (outcome.refused === 'open-requests') throw this.tooManyOpen(principal, headers, nowMs);
    const perMinute = outcome.refused === 'per-minute';
    const retryAfter = perMinute ? minuteReset : monthReset;
    const resetsAt = new Date(
      perMinute ? (windowStart + 60) * 1000 : nextPeriodStart(nowMs),
    ).toISOString();
    throw new ProblemError(
      429,
      perMinute ? 'rate-limited' : 'quota-exceeded',
      perMinute ? 'Too many requests' : 'Monthly compute units used up',
      perMinute
        ? `This key may make ${principal.perMinute} requests per minute; the window resets ` +
            `at ${resetsAt}.`
        : `This request costs ${cost} units and ${Math.max(0, principal.monthlyUnits - outcome.used)}` +
            ` of the tenant's ${principal.monthlyUnits} monthly units are left; the quota resets ` +
            `at ${resetsAt}.`,
      { limit: outcome.refused, cost, resetsAt, retryAfter },
      { ...headers, 'Retry-After': String(retryAfter) },
    );
  }

  private tooManyOpen(principal: KeyPrincipal, headers: Record<string, string>, nowMs: number) {
    const cap = OPEN_REQUESTS_PER_KEY[principal.kind];
    return new ProblemError(
      429,
      'too-many-open-requests',
      'Too many open requests',
      `This ${principal.kind} key already has ${cap} requests open on this server (progress ` +
        'streams included); close one, or wait for one to finish, and try again.',
      { limit: 'open-requests', resetsAt: new Date(nowMs + 1000).toISOString(), retryAfter: 1 },
      { ...headers, 'Retry-After': '1' },
    );
  }

  /**
   * Middleware for keyed routes that compute nothing: counts the request against the key's
   * rate (0 units) so the answer carries the rate-limit fields like every keyed response.
   */
  free(endpoint: string): RequestHandler {
    return async (req, res, next) => {
      await this.admit(principalOf(req), endpoint, 0, res);
      next();
    };
  }

  /** Returns an admitted request's units (the computation failed through no fault of quota). */
  async refund(ticket: Admission): Promise<void> {
    const request = { ...ticket, at: new Date(this.now()).toISOString() };
    await this.ledger.write({ kind: 'refund', request });
  }

  /** Waits for the ledger's pending writes, then stops its thread. */
  close(): Promise<void> {
    return this.ledger.close();
  }

  /** Sets a tenant's plan (operator); fields left out keep their current value. */
  async setPlan(tenantId: string, change: Partial<QuotaPlan>, actor: string): Promise<QuotaPlan> {
    const errors: FieldError[] = [];
    for (const [field, value] of Object.entries(change)) {
      if (value === undefined) continue;
      if (!Number.isSafeInteger(value) || value < 0) {
        errors.push({ pointer: `/${field}`, message: `${field} must be a whole number ≥ 0` });
      }
    }
    if (errors.length) throw validationProblem(errors);
    // Read, write and audit in one transaction: two changes at once cannot interleave (each
    // keeps the other's fields), and a plan never changes without its audit event.
    return this.repository.db.transaction(async (trx) => {
      const repository = new QuotasRepository(trx);
      const current = (await repository.getPlan(tenantId)) ?? DEFAULT_PLAN;
      const plan: QuotaPlan = {
        monthlyUnits: change.monthlyUnits ?? current.monthlyUnits,
        perMinute: change.perMinute ?? current.perMinute,
        browserPerMinute: change.browserPerMinute ?? current.browserPerMinute,
      };
      const at = new Date(this.now()).toISOString();
      await repository.setPlan(tenantId, plan, at);
      await new AuditRepository(trx).record({
        tenantId,
        actor,
        action: 'quota.set',
        detail: { ...plan },
        at,
      });
      return plan;
    });
  }

  /** `GET /usage`: the tenant's current month. */
  async usage(principal: KeyPrincipal) {
    const nowMs = this.now();
    const period = periodOf(nowMs);
    const used = await this.repository.used({ tenantId: principal.tenantId, period });
    return {
      period,
      used,
      limit: principal.monthlyUnits,
      resetsAt: new Date(nextPeriodStart(nowMs)).toISOString(),
      perMinute: principal.perMinute,
    };
  }

  private prune(windowStart: number): void {
    if (windowStart - this.lastPruned < 60) return;
    this.lastPruned = windowStart;
    // Old windows limit nothing; dropping them is housekeeping, so a failure only waits for
    // the next minute.
    this.ledger.write({ kind: 'prune', before: windowStart - 120 }).catch(() => undefined);
  }
}
