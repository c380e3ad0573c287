import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { runCli } from '../cli';
import { testConfig } from '../config';
import { createApp } from '../create-app';

const dir = mkdtempSync(join(tmpdir(), 'tropline-cli-'));
const env = { NODE_ENV: 'test', SQLITE_FILE: join(dir, 'cli.sqlite') };

async function cli(args: string[], extra: Record<string, string> = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const stdout = vi.spyOn(process.stdout, 'write').mockImplementation((c) => !!out.push(String(c)));
  const stderr = vi.spyOn(process.stderr, 'write').mockImplementation((c) => !!err.push(String(c)));
  try {
    const code = await runCli(args, { ...env, ...extra });
    return { code, lines: out.join('').trim().split('\n'), err: err.join('') };
  } finally {
    stdout.mockRestore();
    stderr.mockRestore();
  }
}

describe('create-user', () => {
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('creates a member from TROPLINE_PASSWORD and prints the id last', async () => {
    expect(
      (await cli(['create-tenant', '--slug', 'fenwick', '--name', 'Fenwick Basin'])).code,
    ).toBe(0);
    const made = await cli(
      [
        'create-user',
        '--tenant',
        'fenwick',
        '--email',
        'Ola.Brandt@fenwick.example',
        '--role',
        'analyst',
      ],
      { TROPLINE_PASSWORD: 'heron-at-first-light' },
    );
    expect(made.code).toBe(0);
    const id = made.lines.at(-1)!;
    expect(id).toMatch(/^[0-9a-f-]{36}$/);

    const app = createApp(testConfig({ sqliteFile: env.SQLITE_FILE }));
    try {
      const res = await request(app)
        .post('/api/v1/session')
        .send({ email: 'ola.brandt@fenwick.example', password: 'heron-at-first-light' })
        .expect(200);
      expect(res.body.user.id).toBe(id);
      expect(res.body.tenants).toEqual([
        expect.objectContaining({ slug: 'fenwick', role: 'analyst' }),
      ]);
      const row = await app.locals.tropline.db('users').where({ id }).first();
      expect(row.password_hash).toMatch(/^\$argon2id\$/);
      expect(row.password_hash).not.toContain('heron');
    } finally {
      await app.locals.tropline.close();
    }
  });

  it('refuses a missing or weak password and a bad role', async () => {
    const base = ['create-user', '--tenant', 'fenwick', '--email', 'new@fenwick.example'];
    const missing = await cli([...base, '--role', 'viewer']);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('TROPLINE_PASSWORD');
    const weak = await cli([...base, '--role', 'viewer'], { TROPLINE_PASSWORD: 'password1234' });
    expect(weak.code).toBe(1);
    expect(weak.err).toMatch(/most common/);
    const role = await cli([...base, '--role', 'boss'], {
      TROPLINE_PASSWORD: 'long-enough-really',
    });
    expect(role.code).toBe(2);
  });
});
