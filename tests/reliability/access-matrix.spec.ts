import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testConfig } from '../../server/config';
import { serve, type RunningServer } from '../../server/serve';
import { contract } from '../api/openapi-contract';
import { buildFixture, runMatrix } from './access-matrix';
import { freshDatabaseFile } from './live-server';
import { accessOf } from './route-access';

// Builds on server/accounts/role-matrix.spec.ts (console routes × roles) and
// tests/api/tenant-isolation.spec.ts (one probe per keyed route): here every operation of the
// spec meets every kind of caller, and each expected answer is derived, never written by hand.
describe('authorization matrix: every route × tenant × role × key kind', () => {
  let running: RunningServer;
  let base: string;
  let built: Awaited<ReturnType<typeof buildFixture>>;
  beforeAll(async () => {
    running = await serve(testConfig({ sqliteFile: freshDatabaseFile('matrix'), port: 0 }));
    base = `http://127.0.0.1:${running.port}`;
    const ctx = running.app.locals.tropline;
    built = await buildFixture(base, ctx.db, ctx.demoKeys!);
  });
  afterAll(() => running.stop());

  it('knows the access rule of every operation in openapi.yaml', () => {
    const missing = contract
      .operations()
      .filter(({ method, template }) => !accessOf(method, template))
      .map(({ method, template }) => `${method} ${template}`);
    expect(missing).toEqual([]);
  });

  it('allows exactly where the role matrix says; otherwise 401, 403 or 404, leaking nothing', async () => {
    const { cells, mismatches } = await runMatrix(base, built.fixture, built.creds);
    expect(mismatches).toEqual([]);
    // 14 kinds of caller over the 50-odd guarded operations.
    expect(built.creds.length).toBe(14);
    expect(cells).toBeGreaterThan(600);
  });
});
