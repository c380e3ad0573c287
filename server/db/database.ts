import knex, { type Knex } from 'knex';
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { resolve } from 'node:path';
import type { Config } from '../config';
import type BetterSqlite3 from 'better-sqlite3';
import { cacheStatements, configureConnection } from './sqlite-connection';

const ROOT = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');

/** Where migrations and seeds live (absolute, so the cwd does not matter). */
export const MIGRATIONS_DIR = resolve(ROOT, 'migrations');
export const SEEDS_DIR = resolve(ROOT, 'seeds');

/**
 * Lists the TypeScript modules of a folder in name order and loads them with our own dynamic
 * `import()`, so the same migrations run under tsx (npm start, the CLI) and under Vitest, whose
 * module runner sees this import but not one made inside Knex.
 */
class FolderSource implements Knex.MigrationSource<string> {
  constructor(private readonly dir: string) {}

  async getMigrations(): Promise<string[]> {
    return readdirSync(this.dir)
      .filter((f) => f.endsWith('.ts') && !f.endsWith('.d.ts') && !f.endsWith('.spec.ts'))
      .sort();
  }

  getMigrationName(name: string): string {
    return name;
  }

  async getMigration(name: string): Promise<Knex.Migration> {
    return (await import(pathToFileURL(resolve(this.dir, name)).href)) as Knex.Migration;
  }

  /** Seeds use the same source shape: `getSeeds` + `getSeed`. */
  async getSeeds(): Promise<string[]> {
    return this.getMigrations();
  }

  async getSeed(name: string): Promise<Knex.Seed> {
    return (await import(pathToFileURL(resolve(this.dir, name)).href)) as Knex.Seed;
  }
}

/**
 * Opens the SQLite database through Knex: one connection per process, set up by
 * {@link configureConnection} (WAL, `synchronous = FULL`, `busy_timeout`), with its prepared
 * statements kept ({@link cacheStatements}).
 */
export function openDatabase(config: Pick<Config, 'sqliteFile'>): Knex {
  return knex({
    client: 'better-sqlite3',
    connection: { filename: config.sqliteFile },
    useNullAsDefault: true,
    pool: {
      min: 1,
      max: 1,
      afterCreate(conn: BetterSqlite3.Database, done: (err: Error | null) => void) {
        try {
          configureConnection(conn, config.sqliteFile);
          cacheStatements(conn);
          done(null);
        } catch (err) {
          done(err as Error);
        }
      },
    },
    migrations: { migrationSource: new FolderSource(MIGRATIONS_DIR), tableName: 'knex_migrations' },
    seeds: { seedSource: new FolderSource(SEEDS_DIR) },
  });
}

/** The file a database opened by {@link openDatabase} lives in (`:memory:` for none). */
export function databaseFile(db: Knex): string {
  return (db.client.config.connection as { filename: string }).filename;
}

/** Result of {@link prepareDatabase}: what happened at start-up. */
export interface PrepareOutcome {
  /** Migration files applied in this run. */
  readonly migrated: string[];
  /** Whether the demo seeds were written (only ever on an empty database). */
  readonly seeded: boolean;
}

/**
 * Brings the schema up to date, then seeds the demo data when the database has no tenant yet.
 * Production never receives demo data (demo keys and sign-ins would be public knowledge).
 */
export async function prepareDatabase(db: Knex, config: Pick<Config, 'nodeEnv'>) {
  const [, applied] = (await db.migrate.latest()) as [number, string[]];
  let seeded = false;
  if (config.nodeEnv !== 'production') {
    const row = await db('tenants').count<{ n: number }[]>({ n: '*' }).first();
    if (Number(row?.n ?? 0) === 0) {
      await db.seed.run();
      seeded = true;
    }
  }
  return { migrated: applied, seeded } satisfies PrepareOutcome;
}
