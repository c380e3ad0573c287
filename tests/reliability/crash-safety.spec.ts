import { describe, expect, it } from 'vitest';
import { crashCycle, noAcknowledgements, prepareCrashDatabase } from './crash-load';
import { freshDatabaseFile, spawnApi } from './live-server';

// The short form: one SIGKILL into a mixed write load on one database file. `npm run soak`
// chains many cycles; every cycle re-checks the writes of all earlier ones.
describe('crash safety: SIGKILL during writes loses nothing acknowledged', () => {
  it('keeps every acknowledged usage unit, key issue, revocation and scenario save', async () => {
    const file = freshDatabaseFile('crash');
    const { admin } = await prepareCrashDatabase(file);
    const ack = noAcknowledgements();
    let server = await spawnApi(file);
    try {
      for (const killAfterMs of [700]) {
        const cycle = await crashCycle(server, file, admin, ack, { writers: 6, killAfterMs });
        server = cycle.restarted;
        // The kill landed mid-load: this cycle had writes acknowledged before it.
        const why = JSON.stringify(cycle.report);
        expect(cycle.report.acknowledged, why).toBeGreaterThan(0);
        expect(cycle.report.fiveHundreds, why).toBe(0);
        expect(cycle.report.lost).toEqual([]);
        expect(cycle.report.integrity).toBe('ok');
      }
    } finally {
      await server.stop();
    }
    expect(ack.revoked.size).toBeGreaterThan(0);
    expect(ack.versions.length).toBeGreaterThan(0);
    expect(ack.units).toBeGreaterThan(0);
  }, 120_000);
});
