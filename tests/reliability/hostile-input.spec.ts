import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testConfig } from '../../server/config';
import { serve, type RunningServer } from '../../server/serve';
import { freshDatabaseFile, problemComplaints, send } from './live-server';
import { everyRouteRequests, fuzzOnce, fuzzTarget, newTally, type FuzzTarget } from './route-fuzz';

// tests/api/hostile-bodies.spec.ts fuzzes the compute and key bodies field by field; this run
// aims at every operation of openapi.yaml at once, with hostile path ids, query strings and
// headers as well as bodies. The short form sends a few hundred; `npm run soak` thousands.
const RUNS = 300;

describe('hostile input on every route of the contract', () => {
  let running: RunningServer;
  let target: FuzzTarget;
  beforeAll(async () => {
    running = await serve(testConfig({ sqliteFile: freshDatabaseFile('fuzz'), port: 0 }));
    const demo = running.app.locals.tropline.demoKeys!;
    const base = `http://127.0.0.1:${running.port}`;
    target = await fuzzTarget(base, demo.serverKey, demo.browserKey);
  });
  afterAll(() => running.stop());

  // Found by this run: a path id that is not valid percent-encoded UTF-8 answered 500, and a
  // request head over Node's 16 KB limit got Node's bare 431 instead of a problem document.
  it('answers an undecodable path id and an oversized request head with problems', async () => {
    const bad = await send(
      target.base,
      'POST',
      `/scenarios/${target.ids.id}/versions/%ED%A0%80/publish`,
      {
        key: target.serverKey,
      },
    );
    expect(problemComplaints(bad)).toEqual([]);
    expect(bad.status).toBe(400);
    const long = await send(target.base, 'GET', `/health?pad=${'x'.repeat(20_000)}`);
    expect(problemComplaints(long)).toEqual([]);
    expect(long.status).toBe(431);
    expect((await send(target.base, 'GET', '/health')).status).toBe(200);
  });

  it(`answers ${RUNS} hostile requests without a 5xx, every error a problem`, async () => {
    const tally = newTally();
    const rssBefore = process.memoryUsage().rss;
    await fc.assert(
      fc.asyncProperty(everyRouteRequests(target), async (r) => {
        await fuzzOnce(target.base, r, tally);
      }),
      { numRuns: RUNS },
    );
    expect(tally.complaints).toEqual([]);
    expect(tally.fiveHundreds).toBe(0);
    expect(tally.noAnswer).toBe(0);
    expect(tally.tried).toBe(RUNS);
    // Not only refusals: the generators reach handlers too, so the run is not just the guards.
    expect([...tally.statuses.keys()].some((s) => s < 300)).toBe(true);
    expect([...tally.statuses.keys()].filter((s) => s >= 400).length).toBeGreaterThan(3);
    // Alive and bounded: it still answers, its session still works, it did not balloon.
    expect((await send(target.base, 'GET', '/health')).status).toBe(200);
    const me = await send(target.base, 'GET', '/session', { cookie: target.operator.cookie });
    expect(me.status).toBe(200);
    expect(process.memoryUsage().rss - rssBefore).toBeLessThan(512 * 2 ** 20);
  }, 90_000);
});
