import type BetterSqlite3 from 'better-sqlite3';
import type { Knex } from 'knex';

/**
 * A query built once with a Knex builder and run many times with different values: the SQL is
 * Knex's for the configured client (portable, no hand-written dialect), the parameters are
 * named. Hot paths use it to skip building and compiling a query on every request.
 */
export interface CompiledQuery<P extends string = string> {
  /** SQL with the client's native placeholders. */
  readonly sql: string;
  /** What each placeholder takes, in order: a parameter name, or a constant Knex bound. */
  readonly params: readonly (P | { readonly value: unknown })[];
}

const MARK = '\u0000param:';

/**
 * Compiles `build` with a marker in place of each named parameter, then records which
 * placeholder takes which parameter. Throws if a name never reached a placeholder.
 */
export function compileQuery<P extends string>(
  db: Knex,
  names: readonly P[],
  build: (q: Knex, p: Readonly<Record<P, string>>) => Knex.QueryBuilder,
): CompiledQuery<P> {
  const marks = Object.fromEntries(names.map((n) => [n, MARK + n])) as Record<P, string>;
  const { sql, bindings } = build(db, marks).toSQL().toNative();
  const params = bindings.map((b) =>
    typeof b === 'string' && b.startsWith(MARK) ? (b.slice(MARK.length) as P) : { value: b },
  );
  const missing = names.filter((n) => !params.includes(n));
  if (missing.length) throw new Error(`query parameters never bound: ${missing.join(', ')}`);
  return { sql, params };
}

/** The values of a compiled query in placeholder order, as better-sqlite3 takes them. */
export function bindValues<P extends string>(
  query: CompiledQuery<P>,
  values: Readonly<Record<P, unknown>>,
): unknown[] {
  return query.params.map((p) => {
    const v = typeof p === 'string' ? values[p] : p.value;
    return typeof v === 'boolean' ? Number(v) : v;
  });
}

/**
 * The better-sqlite3 connection under a Knex instance of {@link openDatabase} (a pool of one),
 * for prepared statements on the very connection Knex uses. Everything better-sqlite3 runs is
 * synchronous, so a statement here never interleaves with one of Knex's.
 */
export async function sqliteHandle(db: Knex): Promise<BetterSqlite3.Database> {
  const conn = (await db.client.acquireConnection()) as BetterSqlite3.Database;
  db.client.releaseConnection(conn);
  return conn;
}

/**
 * A compiled read run as a prepared statement on Knex's own connection. The first call waits
 * for the connection; later ones run without building or preparing anything.
 */
export class PreparedRead<P extends string, Row> {
  private conn: BetterSqlite3.Database | undefined;
  private statement: BetterSqlite3.Statement | undefined;

  constructor(
    private readonly db: Knex,
    private readonly query: CompiledQuery<P>,
  ) {}

  /** The first row, or undefined. */
  async first(values: Readonly<Record<P, unknown>>): Promise<Row | undefined> {
    if (!this.conn?.open || !this.statement) {
      this.conn = await sqliteHandle(this.db);
      this.statement = this.conn.prepare(this.query.sql);
    }
    return this.statement.get(bindValues(this.query, values)) as Row | undefined;
  }
}
