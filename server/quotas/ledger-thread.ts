import Database from 'better-sqlite3';
import { parentPort, workerData } from 'node:worker_threads';
import { configureConnection } from '../db/sqlite-connection';
import { LedgerStatements, type LedgerOp, type LedgerQueries } from './ledger-statements';

/** What the ledger thread is started with. */
export interface LedgerThreadData {
  readonly file: string;
  readonly queries: LedgerQueries;
}

/** One op sent to the thread. */
export interface LedgerMessage {
  readonly id: number;
  readonly op: LedgerOp;
}

/** The thread's answer for a batch: every id with its result, or one error for them all. */
export type LedgerReply =
  | { readonly ids: number[]; readonly results: unknown[] }
  | { readonly ids: number[]; readonly error: { message: string; code?: string } };

/** Ops per transaction at most; more wait for the next commit. */
const MAX_BATCH = 256;

/**
 * The quota ledger's own thread and connection. Ops that arrive while a commit waits for the
 * disk queue up and go together in the next transaction (group commit); the answer for an op
 * is posted only after its transaction is durable. The request thread never waits for fsync.
 */
function main(port: NonNullable<typeof parentPort>, data: LedgerThreadData): void {
  const conn = new Database(data.file);
  configureConnection(conn, data.file);
  let statements: LedgerStatements | undefined;
  const queue: LedgerMessage[] = [];
  let scheduled = false;

  const flush = () => {
    scheduled = false;
    const batch = queue.splice(0, MAX_BATCH);
    if (queue.length) schedule();
    const ids = batch.map((m) => m.id);
    try {
      // Prepared on first use: by then the request thread has run the migrations.
      statements ??= new LedgerStatements(conn, data.queries);
      port.postMessage({ ids, results: statements.run(batch.map((m) => m.op)) });
    } catch (err) {
      const e = err as { message?: string; code?: string };
      port.postMessage({ ids, error: { message: String(e.message ?? err), code: e.code } });
    }
  };
  const schedule = () => {
    if (scheduled) return;
    scheduled = true;
    setImmediate(flush);
  };
  port.on('message', (m: LedgerMessage | 'close') => {
    if (m === 'close') {
      conn.close();
      port.close();
      return;
    }
    queue.push(m);
    schedule();
  });
}

if (parentPort) main(parentPort, workerData as LedgerThreadData);
