import { mkdtempSync, chmodSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, DEVELOPMENT_MAIL_FROM, loadConfig } from './config';

const base = { NODE_ENV: 'test', SQLITE_FILE: ':memory:' };

describe('loadConfig', () => {
  it('uses the documented defaults', () => {
    const c = loadConfig(base);
    expect(c.port).toBe(3000);
    expect(c.publicUrl).toBe('http://localhost:3000');
  });

  it.each(['abc', '3000x', '-1', '1.5', '70000'])('refuses PORT=%s naming the variable', (p) => {
    expect(() => loadConfig({ ...base, PORT: p })).toThrow(ConfigError);
    expect(() => loadConfig({ ...base, PORT: p })).toThrow(/^PORT: /);
  });

  it('refuses an unwritable SQLITE_FILE naming the variable', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tropline-ro-'));
    chmodSync(dir, 0o500);
    const file = join(dir, 'sub', 'db.sqlite');
    // root bypasses permission bits, so also try a path under a regular file.
    const underFile = join('/etc/hostname', 'db.sqlite');
    for (const f of [file, underFile]) {
      let err: unknown;
      try {
        loadConfig({ ...base, SQLITE_FILE: f });
      } catch (e) {
        err = e;
      }
      if (f === underFile || process.getuid?.() !== 0) {
        expect(err).toBeInstanceOf(ConfigError);
        expect((err as ConfigError).variable).toBe('SQLITE_FILE');
      }
    }
  });

  it('refuses default secrets and the mail catcher in production', () => {
    expect(() => loadConfig({ ...base, NODE_ENV: 'production' })).toThrow(/^SESSION_SECRET/);
    expect(() =>
      loadConfig({ ...base, NODE_ENV: 'production', SESSION_SECRET: 'x'.repeat(40) }),
    ).toThrow(/^SMTP_URL/);
  });

  it('refuses an unknown NODE_ENV and a relative PUBLIC_URL', () => {
    expect(() => loadConfig({ ...base, NODE_ENV: 'staging' })).toThrow(/^NODE_ENV/);
    expect(() => loadConfig({ ...base, PUBLIC_URL: 'portal.example' })).toThrow(/^PUBLIC_URL/);
  });

  it('reads MAIL_FROM: a reserved development sender, the public host in production', () => {
    expect(loadConfig(base).mailFrom).toBe(DEVELOPMENT_MAIL_FROM);
    expect(DEVELOPMENT_MAIL_FROM).toBe('Tropline <no-reply@tropline.localhost>');
    const production = {
      ...base,
      NODE_ENV: 'production',
      SESSION_SECRET: 'x'.repeat(40),
      SMTP_URL: 'smtp://mail.fenmoor.example:587',
      PUBLIC_URL: 'https://tropline.fenmoor.example',
    };
    expect(loadConfig(production).mailFrom).toBe('Tropline <no-reply@tropline.fenmoor.example>');
    const given = '"Fenmoor Drainage Board, Tropline" <tropline@fenmoor.example>';
    expect(loadConfig({ ...production, MAIL_FROM: ` ${given} ` }).mailFrom).toBe(given);
    expect(loadConfig({ ...base, MAIL_FROM: 'tropline@fenmoor.example' }).mailFrom).toBe(
      'tropline@fenmoor.example',
    );
  });

  it.each([
    'nobody',
    'Tropline <nobody>',
    'a@fenmoor.example, b@fenmoor.example',
    'Board: a@fenmoor.example;',
    'tropline@fenmoor.example\r\nBcc: all@elsewhere.example',
    '<>',
  ])('refuses MAIL_FROM=%j naming the variable', (value) => {
    expect(() => loadConfig({ ...base, MAIL_FROM: value })).toThrow(ConfigError);
    expect(() => loadConfig({ ...base, MAIL_FROM: value })).toThrow(/^MAIL_FROM: must /);
  });
});
