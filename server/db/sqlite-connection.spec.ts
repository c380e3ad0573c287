import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bindValues, compileQuery, PreparedRead } from './compiled-query';
import { openDatabase } from './database';

describe('the SQLite connection under Knex', () => {
  let file: string;
  let db: Knex;

  beforeAll(async () => {
    file = join(mkdtempSync(join(tmpdir(), 'tropline-conn-')), 'conn.sqlite');
    db = openDatabase({ sqliteFile: file });
    await db.schema.createTable('notes', (t) => {
      t.string('id').primary();
      t.integer('n').notNullable();
    });
  });
  afterAll(() => db.destroy());

  it('begins each transaction with the write lock held, so no later write finds it stale', async () => {
    const other = new Database(file, { timeout: 0 });
    try {
      await db.transaction(async (trx) => {
        await trx('notes').first(); // reads first: a deferred BEGIN would hold no lock yet
        // SQLite's documented answer to a second writer: SQLITE_BUSY while the lock is held.
        expect(() => other.exec('BEGIN IMMEDIATE')).toThrow(/database is locked/);
        await trx('notes').insert({ id: 'a', n: 1 });
      });
      expect(() => other.exec('BEGIN IMMEDIATE; COMMIT')).not.toThrow();
    } finally {
      other.close();
    }
  });

  it('runs a query compiled once from a builder with named parameters', async () => {
    await db('notes').insert([
      { id: 'b', n: 2 },
      { id: 'c', n: 3 },
    ]);
    const query = compileQuery(db, ['id'], (q, p) => q('notes').where({ id: p.id }).first('n'));
    // Knex bound `limit 1` itself: kept as a constant beside the named parameter.
    expect(query.params).toEqual(['id', { value: 1 }]);
    expect(bindValues(query, { id: 'c' })).toEqual(['c', 1]);
    const read = new PreparedRead<'id', { n: number }>(db, query);
    expect(await read.first({ id: 'b' })).toEqual({ n: 2 });
    expect(await read.first({ id: 'c' })).toEqual({ n: 3 });
    expect(await read.first({ id: 'none' })).toBeUndefined();
  });

  it('refuses a compiled query whose parameter never reached a placeholder', () => {
    expect(() => compileQuery(db, ['id', 'n'], (q, p) => q('notes').where({ id: p.id }))).toThrow(
      /never bound: n/,
    );
  });
});
