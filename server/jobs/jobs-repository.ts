import type { Knex } from 'knex';

/** Job states; a cancelled job ends `failed` with a `cancelled` problem (the contract's set). */
export type JobStatus = 'queued' | 'running' | 'succeeded' | 'failed';

/** A job as stored. */
export interface JobRecord {
  readonly id: string;
  readonly tenantId: string;
  readonly keyId: string;
  readonly kind: string;
  readonly status: JobStatus;
  readonly progress: number;
  readonly requestHash: string;
  readonly idempotencyKey: string | null;
  readonly request: unknown;
  readonly result: unknown;
  readonly error: Record<string, unknown> | null;
  readonly units: number;
  readonly cancelRequested: boolean;
  readonly createdAt: string;
  readonly startedAt: string | null;
  readonly finishedAt: string | null;
  readonly expiresAt: string;
}

function toRecord(r: Record<string, unknown>): JobRecord {
  return {
    id: r.id as string,
    tenantId: r.tenant_id as string,
    keyId: r.key_id as string,
    kind: r.kind as string,
    status: r.status as JobStatus,
    progress: Number(r.progress),
    requestHash: r.request_hash as string,
    idempotencyKey: (r.idempotency_key as string | null) ?? null,
    request: JSON.parse(r.request as string),
    result: r.result ? JSON.parse(r.result as string) : null,
    error: r.error ? (JSON.parse(r.error as string) as Record<string, unknown>) : null,
    units: Number(r.units),
    cancelRequested: Boolean(r.cancel_requested),
    createdAt: r.created_at as string,
    startedAt: (r.started_at as string | null) ?? null,
    finishedAt: (r.finished_at as string | null) ?? null,
    expiresAt: r.expires_at as string,
  };
}

/** Whether a database error is a unique-constraint violation (SQLite or PostgreSQL). */
export function isUniqueViolation(err: unknown): boolean {
  const code = (err as { code?: string }).code;
  return (
    code === 'SQLITE_CONSTRAINT_UNIQUE' ||
    code === 'SQLITE_CONSTRAINT_PRIMARYKEY' ||
    code === '23505'
  );
}

/** Storage of jobs. Every read is scoped by tenant: another tenant's job does not exist. */
export class JobsRepository {
  constructor(private readonly db: Knex) {}

  /** Stores a new queued job (throws a unique violation on a reused Idempotency-Key). */
  async insert(job: Omit<JobRecord, 'result' | 'error' | 'startedAt' | 'finishedAt'>) {
    await this.db('jobs').insert({
      id: job.id,
      tenant_id: job.tenantId,
      key_id: job.keyId,
      kind: job.kind,
      status: job.status,
      progress: job.progress,
      request_hash: job.requestHash,
      idempotency_key: job.idempotencyKey,
      request: JSON.stringify(job.request),
      units: job.units,
      cancel_requested: job.cancelRequested,
      created_at: job.createdAt,
      heartbeat_at: job.createdAt,
      expires_at: job.expiresAt,
    });
  }

  /**
   * Stores a new queued job unless the tenant would then have more than `maxActive` queued or
   * running; returns whether it was stored. The insert comes first inside the transaction, so it
   * takes the database's write lock and the count after it sees every concurrent admission: a
   * count-then-insert lets a burst of simultaneous submissions all pass the bound.
   */
  async insertBounded(
    job: Omit<JobRecord, 'result' | 'error' | 'startedAt' | 'finishedAt'>,
    maxActive: number,
  ): Promise<boolean> {
    const over = new Error('over the bound');
    try {
      await this.db.transaction(async (trx) => {
        const repo = new JobsRepository(trx);
        await repo.insert(job);
        if ((await repo.countActive(job.tenantId)) > maxActive) throw over;
      });
      return true;
    } catch (err) {
      if (err === over) return false;
      throw err;
    }
  }

  /** A tenant's job, or undefined. */
  async find(tenantId: string, id: string): Promise<JobRecord | undefined> {
    const row = await this.db('jobs').where({ tenant_id: tenantId, id }).first();
    return row ? toRecord(row) : undefined;
  }

  /** The job created with this Idempotency-Key in this tenant. */
  async findByIdempotencyKey(tenantId: string, key: string): Promise<JobRecord | undefined> {
    const row = await this.db('jobs').where({ tenant_id: tenantId, idempotency_key: key }).first();
    return row ? toRecord(row) : undefined;
  }

  /** The newest live job of the same tenant, kind and request that has not failed. */
  async findReusable(tenantId: string, kind: string, hash: string, now: string) {
    const row = await this.db('jobs')
      .where({ tenant_id: tenantId, kind, request_hash: hash })
      .whereNot('status', 'failed')
      .where('expires_at', '>', now)
      .orderBy('created_at', 'desc')
      .first();
    return row ? toRecord(row) : undefined;
  }

  /** Moves a queued job to running (unless cancelled meanwhile); returns whether it did. */
  async start(id: string, at: string): Promise<boolean> {
    const n = await this.db('jobs')
      .where({ id, status: 'queued', cancel_requested: false })
      .update({ status: 'running', started_at: at, heartbeat_at: at });
    return n > 0;
  }

  /**
   * Records running jobs' progress (and that the process running them is alive), all in one
   * transaction: one commit, so one wait for the disk, however many jobs run.
   */
  async progressMany(
    updates: readonly { readonly id: string; readonly progress: number }[],
    at: string,
  ): Promise<void> {
    await this.db.transaction(async (trx) => {
      for (const { id, progress } of updates) {
        await trx('jobs').where({ id, status: 'running' }).update({ progress, heartbeat_at: at });
      }
    });
  }

  /** Which of these jobs someone asked to cancel (read by the process running them). */
  async cancelRequested(ids: readonly string[]): Promise<string[]> {
    const rows = await this.db('jobs')
      .select('id')
      .whereIn('id', ids)
      .where({ cancel_requested: true });
    return rows.map((r: { id: string }) => r.id);
  }

  /** Keeps a process's jobs from being taken for abandoned. */
  async heartbeat(ids: readonly string[], at: string): Promise<void> {
    if (ids.length) await this.db('jobs').whereIn('id', ids).update({ heartbeat_at: at });
  }

  /** Ends a job; results are kept until `expiresAt`. */
  async finish(
    id: string,
    outcome: { status: 'succeeded'; result: unknown } | { status: 'failed'; error: object },
    at: string,
    expiresAt: string,
  ): Promise<void> {
    await this.db('jobs')
      .where({ id })
      .whereIn('status', ['queued', 'running'])
      .update({
        status: outcome.status,
        progress: outcome.status === 'succeeded' ? 1 : this.db.raw('??', ['progress']),
        result: outcome.status === 'succeeded' ? JSON.stringify(outcome.result) : null,
        error: outcome.status === 'failed' ? JSON.stringify(outcome.error) : null,
        finished_at: at,
        expires_at: expiresAt,
      });
  }

  /** Flags a job for cancellation; returns the job as it now stands. */
  async requestCancel(tenantId: string, id: string): Promise<void> {
    await this.db('jobs')
      .where({ tenant_id: tenantId, id })
      .whereIn('status', ['queued', 'running'])
      .update({ cancel_requested: true });
  }

  /** Jobs left queued or running by a process that stopped beating before `staleBefore`. */
  async abandoned(staleBefore: string): Promise<JobRecord[]> {
    const rows = await this.db('jobs')
      .whereIn('status', ['queued', 'running'])
      .where('heartbeat_at', '<', staleBefore);
    return rows.map(toRecord);
  }

  /** Deletes jobs whose retention ended. */
  async deleteExpired(now: string): Promise<number> {
    return this.db('jobs')
      .where('expires_at', '<=', now)
      .whereNotIn('status', ['queued', 'running'])
      .delete();
  }

  /** Active (queued or running) jobs of a tenant. */
  async countActive(tenantId: string): Promise<number> {
    const row = await this.db('jobs')
      .where({ tenant_id: tenantId })
      .whereIn('status', ['queued', 'running'])
      .count<{ n: number }[]>({ n: '*' })
      .first();
    return Number(row?.n ?? 0);
  }
}
