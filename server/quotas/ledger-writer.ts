import type BetterSqlite3 from 'better-sqlite3';
import type { Knex } from 'knex';
import { Worker } from 'node:worker_threads';
import { sqliteHandle } from '../db/compiled-query';
import { databaseFile } from '../db/database';
import {
  LedgerStatements,
  ledgerQueries,
  type LedgerOp,
  type LedgerQueries,
  type LedgerResult,
} from './ledger-statements';
import type { LedgerMessage, LedgerReply, LedgerThreadData } from './ledger-thread';

/** Writes quota ops; each promise settles once its op is durable (or failed, writing nothing). */
export interface LedgerWriter {
  write(op: LedgerOp): Promise<LedgerResult>;
  /** Waits for what was sent, then releases the thread or connection. */
  close(): Promise<void>;
}

/**
 * The writer for a database: a thread of its own for a file (the commit's fsync then never
 * blocks the request thread), the request thread's own connection for `:memory:` (which no
 * other connection can open; nothing there waits for a disk).
 */
export function ledgerWriter(db: Knex): LedgerWriter {
  const file = databaseFile(db);
  return file === ':memory:' ? new InThreadLedger(db) : new LedgerThread(file, ledgerQueries(db));
}

const WORKER = new URL('./ledger-worker.mjs', import.meta.url);

interface Waiting {
  resolve(r: LedgerResult): void;
  reject(e: unknown): void;
}

/** Error the ledger thread reported (its SQLite code kept, e.g. SQLITE_BUSY). */
class LedgerError extends Error {
  override name = 'LedgerError';
  constructor(
    message: string,
    readonly code?: string,
  ) {
    super(message);
  }
}

/**
 * The ledger thread seen from the request thread. Each op is posted at once (so the commit runs
 * while the request thread computes); the thread groups what arrives during a commit. The
 * thread starts on first use and does not keep the process alive while nothing is pending.
 */
class LedgerThread implements LedgerWriter {
  private worker: Worker | undefined;
  private readonly waiting = new Map<number, Waiting>();
  private nextId = 1;
  private drained: (() => void) | undefined;

  constructor(
    private readonly file: string,
    private readonly queries: LedgerQueries,
  ) {}

  write(op: LedgerOp): Promise<LedgerResult> {
    const worker = (this.worker ??= this.start());
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      if (this.waiting.size === 0) worker.ref();
      this.waiting.set(id, { resolve, reject });
      worker.postMessage({ id, op } satisfies LedgerMessage);
    });
  }

  async close(): Promise<void> {
    const worker = this.worker;
    if (!worker) return;
    if (this.waiting.size) await new Promise<void>((done) => (this.drained = done));
    this.worker = undefined;
    worker.ref();
    const exited = new Promise((done) => worker.once('exit', done));
    worker.postMessage('close');
    await exited;
  }

  private start(): Worker {
    const worker = new Worker(WORKER, {
      workerData: { file: this.file, queries: this.queries } satisfies LedgerThreadData,
    });
    worker.unref();
    worker.on('message', (reply: LedgerReply) => {
      reply.ids.forEach((id, i) => {
        const w = this.waiting.get(id);
        this.waiting.delete(id);
        if (!w) return;
        if ('error' in reply) w.reject(new LedgerError(reply.error.message, reply.error.code));
        else w.resolve(reply.results[i] as LedgerResult);
      });
      this.settled();
    });
    const fail = (err: unknown) => {
      // Nothing unanswered was acknowledged; its callers get the error, the next op a new thread.
      if (this.worker === worker) this.worker = undefined;
      for (const w of this.waiting.values()) w.reject(err);
      this.waiting.clear();
      this.settled();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => {
      if (this.waiting.size) fail(new LedgerError(`the ledger thread exited (${code})`));
    });
    return worker;
  }

  private settled(): void {
    if (this.waiting.size) return;
    this.worker?.unref();
    this.drained?.();
    this.drained = undefined;
  }
}

/**
 * The ledger on the request thread's own connection (`:memory:`): each op in its own immediate
 * transaction, run between Knex's transactions (an op must not join one that may roll back).
 */
class InThreadLedger implements LedgerWriter {
  private statements: Promise<{ conn: BetterSqlite3.Database; s: LedgerStatements }> | undefined;
  private pending = Promise.resolve();

  constructor(private readonly db: Knex) {}

  write(op: LedgerOp): Promise<LedgerResult> {
    this.statements ??= sqliteHandle(this.db).then((conn) => ({
      conn,
      s: new LedgerStatements(conn, ledgerQueries(this.db)),
    }));
    const result = this.statements.then(async ({ conn, s }) => {
      while (conn.inTransaction) await new Promise((r) => setImmediate(r));
      return s.run([op])[0]!;
    });
    this.pending = result.then(
      () => undefined,
      () => undefined,
    );
    return result;
  }

  async close(): Promise<void> {
    await this.pending;
  }
}
