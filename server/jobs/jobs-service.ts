import { EventEmitter } from 'node:events';
import { randomUUID } from 'node:crypto';
import type { Response } from 'express';
import type { Knex } from 'knex';
import type { KeyPrincipal } from '../auth/key-principal';
import { ProblemError, validationProblem } from '../http/problem';
import { requestHash } from '../projections/canonical-json';
import { engineProblem } from '../projections/engine-problem';
import { COSTS } from '../quotas/compute-costs';
import type { Admission, QuotasService } from '../quotas/quotas-service';
import { JOB_RETENTION_MS, JOB_STALE_MS, type JobKind } from './job-kind';
import { CANCELLED_PROBLEM, INTERRUPTED_PROBLEM, jobView, type JobView } from './job-view';
import { isUniqueViolation, JobsRepository, type JobRecord } from './jobs-repository';

/** How often running jobs' progress is written (and cancellations from other processes seen). */
const PROGRESS_FLUSH_MS = 200;

/** Bounds on the job machinery. */
export interface JobsOptions {
  /**
   * Jobs this process runs at once. The worker pool interleaves running jobs' chunks tenant by
   * tenant, so this bounds memory (partial results held), not CPU: above one tenant's
   * `perTenantActive`, another tenant's job starts at once instead of waiting behind a flood.
   */
  readonly concurrency: number;
  /** Jobs a tenant may have queued or running at once. */
  readonly perTenantActive: number;
  /** Jobs this process holds in its queue before answering 503. */
  readonly maxQueued: number;
}

/** How a job creation was answered. */
export interface Created {
  readonly job: JobView;
  /** `hit` (an identical job's result), `in-flight` (joined an identical job) or `miss`. */
  readonly cache: 'hit' | 'in-flight' | 'miss';
  /** Whether the Idempotency-Key matched an earlier identical request. */
  readonly replayed: boolean;
}

interface Queued {
  readonly record: JobRecord;
  readonly kind: JobKind;
  readonly request: unknown;
  readonly ticket: Admission;
}

/**
 * Jobs: admission (validate, price, idempotency, cache, quota), a bounded queue run on the
 * worker pool, progress in the database (so any process can answer `GET /jobs/{id}`) and as
 * in-process events (for the SSE stream), cancellation, and retention of results.
 */
export class JobsService {
  private readonly repo: JobsRepository;
  private readonly events = new EventEmitter();
  private readonly queue: Queued[] = [];
  private readonly running = new Map<string, AbortController>();
  private readonly kinds = new Map<string, JobKind>();
  /** Running jobs' progress not yet written, by job id; written together every tick. */
  private readonly progressDue = new Map<
    string,
    { item: Queued; progress: number; controller: AbortController }
  >();
  private progressTimer: NodeJS.Timeout | undefined;
  /** When each tenant last had a job started (a counter), for taking turns from the queue. */
  private readonly lastTurn = new Map<string, number>();
  private turns = 0;
  private timer: NodeJS.Timeout | undefined;
  private closed = false;

  constructor(
    db: Knex,
    private readonly quotas: QuotasService,
    private readonly now: () => number,
    private readonly options: JobsOptions,
  ) {
    this.repo = new JobsRepository(db);
    this.events.setMaxListeners(0);
  }

  /** Registers a kind of job (its route is `POST /<kind>`). */
  register<T>(kind: JobKind<T>): void {
    this.kinds.set(kind.kind, kind as JobKind);
  }

  /** Starts housekeeping: heartbeats, abandoned-job recovery, expiry of old results. */
  start(): void {
    void this.housekeeping();
    this.timer = setInterval(() => void this.housekeeping(), 30_000);
    this.timer.unref();
  }

  private iso(offsetMs = 0): string {
    return new Date(this.now() + offsetMs).toISOString();
  }

  /** Validates, prices and admits a job; answers replays and identical requests from storage. */
  async create(
    principal: KeyPrincipal,
    kindName: string,
    body: unknown,
    idempotencyKey: string | undefined,
    res: Response,
  ): Promise<Created> {
    const kind = this.kinds.get(kindName);
    if (!kind) throw new Error(`no job kind ${kindName}`);
    const checked = kind.validate(body);
    if (!checked.ok) throw validationProblem([...checked.errors]);
    let cost: number;
    try {
      cost = kind.cost(checked.value);
    } catch (err) {
      throw engineProblem(err);
    }
    const hash = requestHash(principal.tenantId, kindName, body);
    if (idempotencyKey !== undefined) {
      const earlier = await this.repo.findByIdempotencyKey(principal.tenantId, idempotencyKey);
      if (earlier) return this.replay(principal, earlier, hash, res);
    }
    const reusable = await this.repo.findReusable(principal.tenantId, kindName, hash, this.iso());
    if (reusable && idempotencyKey === undefined) {
      await this.quotas.admit(principal, kindName, COSTS.cached, res, true);
      return {
        job: jobView(reusable),
        cache: reusable.status === 'succeeded' ? 'hit' : 'in-flight',
        replayed: false,
      };
    }
    if (this.queue.length >= this.options.maxQueued) {
      throw new ProblemError(
        503,
        'busy',
        'Too many jobs waiting',
        'Try again shortly.',
        {},
        {
          'Retry-After': '10',
        },
      );
    }
    // A cheap early refusal; insertBounded below is the check that holds under concurrency.
    if ((await this.repo.countActive(principal.tenantId)) >= this.options.perTenantActive) {
      throw this.tooManyJobs();
    }
    const ticket = await this.quotas.admit(principal, kindName, cost, res);
    const record: JobRecord = {
      id: randomUUID(),
      tenantId: principal.tenantId,
      keyId: principal.keyId,
      kind: kindName,
      status: 'queued',
      progress: 0,
      requestHash: hash,
      idempotencyKey: idempotencyKey ?? null,
      request: body,
      result: null,
      error: null,
      units: cost,
      cancelRequested: false,
      createdAt: this.iso(),
      startedAt: null,
      finishedAt: null,
      expiresAt: this.iso(JOB_RETENTION_MS),
    };
    let stored: boolean;
    try {
      stored = await this.repo.insertBounded(record, this.options.perTenantActive);
    } catch (err) {
      await this.quotas.refund(ticket);
      if (idempotencyKey !== undefined && isUniqueViolation(err)) {
        // A concurrent request with the same key won the insert: answer as its replay.
        const winner = await this.repo.findByIdempotencyKey(principal.tenantId, idempotencyKey);
        if (winner) return this.replay(principal, winner, hash, res);
      }
      throw err;
    }
    if (!stored) {
      await this.quotas.refund(ticket);
      throw this.tooManyJobs();
    }
    this.queue.push({ record, kind, request: checked.value, ticket });
    this.pump();
    return { job: jobView(record), cache: 'miss', replayed: false };
  }

  private tooManyJobs(): ProblemError {
    return new ProblemError(
      429,
      'too-many-jobs',
      'Too many jobs at once',
      `A tenant may have ${this.options.perTenantActive} jobs queued or running; wait for one ` +
        'to finish or cancel one.',
      { limit: 'concurrent-jobs', max: this.options.perTenantActive, retryAfter: 5 },
      { 'Retry-After': '5' },
    );
  }

  private async replay(principal: KeyPrincipal, earlier: JobRecord, hash: string, res: Response) {
    // The hash covers tenant, kind and canonical body, so equal hashes are the same request.
    if (earlier.requestHash !== hash) {
      throw new ProblemError(
        422,
        'idempotency-key-reused',
        'Idempotency-Key reused with another request',
        `This Idempotency-Key was first used for job ${earlier.id} with a different body; ` +
          'use a new key for a new request.',
        { errors: [{ pointer: '', message: 'the body differs from the first use of this key' }] },
      );
    }
    await this.quotas.admit(principal, earlier.kind, 0, res);
    return { job: jobView(earlier), cache: 'miss' as const, replayed: true };
  }

  /** A tenant's job, or 404 (also for another tenant's id). */
  async get(principal: KeyPrincipal, id: string): Promise<JobView> {
    return jobView(await this.require(principal, id));
  }

  private async require(principal: KeyPrincipal, id: string): Promise<JobRecord> {
    const job = await this.repo.find(principal.tenantId, id);
    if (!job || job.expiresAt <= this.iso()) {
      throw new ProblemError(
        404,
        'not-found',
        'No such job',
        `No job ${id} (results are kept for 24 hours).`,
      );
    }
    return job;
  }

  /** Cancels a queued or running job; a finished job is left as it is. */
  async cancel(principal: KeyPrincipal, id: string): Promise<JobView> {
    const job = await this.require(principal, id);
    if (job.status === 'succeeded' || job.status === 'failed') return jobView(job);
    await this.repo.requestCancel(principal.tenantId, id);
    const waiting = this.queue.findIndex((q) => q.record.id === id);
    if (waiting >= 0) {
      this.queue.splice(waiting, 1);
      await this.end(job, { status: 'failed', error: CANCELLED_PROBLEM });
    }
    // Running here: abort it; the run's rejection ends the job. Running in another process:
    // that process sees `cancel_requested` at its next progress report.
    this.running.get(id)?.abort();
    return this.get(principal, id);
  }

  /** Follows a job's updates in this process; returns the unsubscribe function. */
  subscribe(id: string, listener: (job: JobView) => void): () => void {
    this.events.on(id, listener);
    return () => this.events.off(id, listener);
  }

  /** Reads a job again (for streams following jobs run by another process). */
  async refresh(principal: KeyPrincipal, id: string): Promise<JobView | undefined> {
    const job = await this.repo.find(principal.tenantId, id);
    return job ? jobView(job) : undefined;
  }

  private async end(job: JobRecord, outcome: Parameters<JobsRepository['finish']>[1]) {
    await this.repo.finish(job.id, outcome, this.iso(), this.iso(JOB_RETENTION_MS));
    await this.emit(job);
  }

  /** Tells this process's stream listeners the job's current state. */
  private async emit(job: JobRecord): Promise<void> {
    if (this.events.listenerCount(job.id) === 0) return;
    const row = await this.repo.find(job.tenantId, job.id);
    if (row) this.events.emit(job.id, jobView(row));
  }

  private pump(): void {
    while (!this.closed && this.running.size < this.options.concurrency && this.queue.length) {
      void this.execute(this.queue.splice(this.nextTurn(), 1)[0]!);
    }
  }

  /**
   * Index of the queued job to start next: the oldest job of the tenant whose last start is
   * longest ago (a tenant not seen yet first), so tenants take turns however many one queued.
   */
  private nextTurn(): number {
    let best = 0;
    let bestTurn = Infinity;
    this.queue.forEach((q, i) => {
      const turn = this.lastTurn.get(q.record.tenantId) ?? -1;
      if (turn < bestTurn) [best, bestTurn] = [i, turn];
    });
    const tenant = this.queue[best]!.record.tenantId;
    this.lastTurn.delete(tenant); // re-inserted last: the map stays small and in turn order
    this.lastTurn.set(tenant, this.turns++);
    if (this.lastTurn.size > 1000) this.lastTurn.delete(this.lastTurn.keys().next().value!);
    return best;
  }

  private async execute(item: Queued): Promise<void> {
    const { id } = item.record;
    const controller = new AbortController();
    this.running.set(id, controller);
    try {
      if (!(await this.repo.start(id, this.iso()))) return; // cancelled while queued
      await this.emit(item.record);
      const result = await item.kind.run(item.request, {
        owner: item.record.tenantId,
        signal: controller.signal,
        onProgress: (fraction) => this.queueProgress(item, fraction, controller),
      });
      if (controller.signal.aborted) throw controller.signal.reason;
      await this.end(item.record, { status: 'succeeded', result });
    } catch (err) {
      if (controller.signal.aborted) {
        await this.end(item.record, {
          status: 'failed',
          error: this.closed ? INTERRUPTED_PROBLEM : CANCELLED_PROBLEM,
        });
      } else {
        let problem;
        try {
          problem = engineProblem(err).toDocument(`/api/v1/jobs/${id}`);
        } catch {
          problem = {
            type: 'https://tropline.dev/problems/internal',
            title: 'Internal error',
            status: 500,
            detail: 'The job failed on our side.',
          };
        }
        await this.quotas.refund(item.ticket).catch(() => undefined);
        await this.end(item.record, { status: 'failed', error: problem });
      }
    } finally {
      this.running.delete(id);
      this.progressDue.delete(id);
      this.pump();
    }
  }

  /** Notes a running job's progress for the next {@link flushProgress}. */
  private queueProgress(item: Queued, fraction: number, controller: AbortController): void {
    const progress = Math.min(1, Math.max(0, fraction));
    this.progressDue.set(item.record.id, { item, progress, controller });
    this.progressTimer ??= setTimeout(() => void this.flushProgress(), PROGRESS_FLUSH_MS);
  }

  /**
   * Writes every running job's latest progress in one transaction, then aborts the jobs whose
   * cancellation another process requested and tells stream listeners. One commit per tick for
   * all jobs, not one per job: each commit waits for the disk (`synchronous = FULL`) on the
   * request thread, and progress needs no such care (a lost value is rewritten at the next tick).
   */
  private async flushProgress(): Promise<void> {
    this.progressTimer = undefined;
    const due = [...this.progressDue.values()];
    this.progressDue.clear();
    if (!due.length || this.closed) return;
    try {
      const ids = due.map((d) => d.item.record.id);
      await this.repo.progressMany(
        due.map((d) => ({ id: d.item.record.id, progress: d.progress })),
        this.iso(),
      );
      const cancelled = new Set(await this.repo.cancelRequested(ids));
      for (const d of due) {
        const id = d.item.record.id;
        if (cancelled.has(id)) d.controller.abort();
        else await this.emit(d.item.record);
      }
    } catch {
      // Progress is advisory: the next report writes it again; the job's end is what counts.
    }
  }

  private async housekeeping(): Promise<void> {
    try {
      const mine = [...this.running.keys(), ...this.queue.map((q) => q.record.id)];
      await this.repo.heartbeat(mine, this.iso());
      for (const job of await this.repo.abandoned(this.iso(-JOB_STALE_MS))) {
        if (!mine.includes(job.id)) {
          await this.repo.finish(
            job.id,
            { status: 'failed', error: INTERRUPTED_PROBLEM },
            this.iso(),
            this.iso(JOB_RETENTION_MS),
          );
        }
      }
      await this.repo.deleteExpired(this.iso());
    } catch {
      // Housekeeping retries in 30 s; a request never waits on it.
    }
  }

  /** Stops taking jobs, interrupts running ones and waits for them to record it. */
  async close(): Promise<void> {
    this.closed = true;
    if (this.timer) clearInterval(this.timer);
    if (this.progressTimer) clearTimeout(this.progressTimer);
    for (const q of this.queue.splice(0)) {
      await this.end(q.record, { status: 'failed', error: INTERRUPTED_PROBLEM }).catch(
        () => undefined,
      );
    }
    for (const c of this.running.values()) c.abort();
    const deadline = Date.now() + 2000;
    while (this.running.size && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
  }
}
