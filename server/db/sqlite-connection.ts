import type BetterSqlite3 from 'better-sqlite3';

/**
 * Sets up one SQLite connection the way every Tropline connection runs, whichever thread owns
 * it: WAL with `synchronous = FULL`, so a write acknowledged to a client (a key, a ledger row)
 * survives a crash or power loss; `busy_timeout` lets several connections and API processes
 * share one file without SQLITE_BUSY reaching a client.
 */
export function configureConnection(conn: BetterSqlite3.Database, file: string): void {
  if (file !== ':memory:') conn.pragma('journal_mode = WAL');
  conn.pragma('synchronous = FULL');
  conn.pragma('foreign_keys = ON');
  conn.pragma('busy_timeout = 10000');
}

/** Statements kept per connection; Knex's own queries are a few dozen distinct texts. */
const STATEMENT_CACHE_SIZE = 500;

/**
 * Knex prepares every query afresh on better-sqlite3, which costs more than running it. This
 * keeps the prepared statements of a connection by SQL text (least recently used dropped), so
 * repeated builder queries skip SQLite's parser and planner.
 *
 * It also makes each transaction Knex begins take the write lock at once (`BEGIN IMMEDIATE`):
 * with the ledger written on its own connection (`server/quotas/`), a deferred transaction that
 * read first could find its snapshot outdated at its first write and fail with
 * SQLITE_BUSY_SNAPSHOT, which `busy_timeout` does not retry; an immediate one waits its turn.
 */
export function cacheStatements(conn: BetterSqlite3.Database): void {
  const prepare = conn.prepare.bind(conn);
  const cache = new Map<string, BetterSqlite3.Statement>();
  conn.prepare = ((source: string) => {
    const sql = source === 'BEGIN;' ? 'BEGIN IMMEDIATE;' : source;
    let statement = cache.get(sql);
    if (statement) {
      cache.delete(sql);
    } else {
      statement = prepare(sql);
      if (cache.size >= STATEMENT_CACHE_SIZE) cache.delete(cache.keys().next().value!);
    }
    cache.set(sql, statement);
    return statement;
  }) as BetterSqlite3.Database['prepare'];
}
