import { readdirSync, readFileSync, readlinkSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAnalysisPool, type AnalysisPool } from './analysis-pool';
import { runSweepRange } from '../sweep/run-sweep';
import { assembleRegimeMap, runRegimeMapCells } from '../sweep/run-regime-map';
import { runEnsembleMembers } from '../ensemble/run-ensemble-members';
import { summariseEnsemble } from '../ensemble/summarise-ensemble';
import {
  validateSweepRequest,
  validateRegimeMapRequest,
} from '../analyses-contract/sweep-contract';
import { validateEnsembleRequest } from '../analyses-contract/ensemble-contract';
import { validateRegimeRequest } from '../analyses-contract/regime-contract';
import { validateComparisonRequest } from '../analyses-contract/comparison-contract';
import { AnalysisBoundsError } from '../analyses-contract/analysis-limits';
import { ModelValidationError } from '../model/validation-issue';
import { benchmarkChain, BENCHMARK_INITIAL } from '../../tests/reference/analyses-benchmark-chain';

const ok = <T>(v: { ok: true; value: T } | { ok: false; errors: unknown }): T => {
  if (!v.ok) throw new Error(JSON.stringify(v.errors));
  return v.value;
};
const sweep = ok(
  validateSweepRequest({
    model: benchmarkChain(3),
    initial: BENCHMARK_INITIAL,
    parameter: '/levels/1/handlingTime',
    from: 0.44,
    to: 0.6,
    steps: 6,
    observe: 'fish',
    transient: 400,
    window: 400,
  }),
);
const ensemble = ok(
  validateEnsembleRequest({
    model: benchmarkChain(3),
    initial: BENCHMARK_INITIAL,
    horizon: 40,
    samples: 9,
    members: 24,
    seed: 99,
    parameters: [
      {
        pointer: '/levels/1/handlingTime',
        distribution: { kind: 'normal', mean: 0.6, sd: 0.05, min: 0.4, max: 0.8 },
      },
    ],
    initialStates: [{ level: 'fish', distribution: { kind: 'lognormal', median: 9, sigma: 0.2 } }],
    extinction: { fish: 9 },
  }),
);
const map = ok(
  validateRegimeMapRequest({
    model: benchmarkChain(3),
    initial: BENCHMARK_INITIAL,
    x: { parameter: '/levels/1/handlingTime', from: 0.4, to: 0.6, steps: 3 },
    y: { parameter: '/levels/2/mortality', from: 0.01, to: 0.012, steps: 2 },
    transient: 300,
    window: 300,
  }),
);
const regime = ok(
  validateRegimeRequest({
    model: benchmarkChain(3),
    initial: BENCHMARK_INITIAL,
    transient: 200,
    window: 200,
  }),
);
const comparison = ok(
  validateComparisonRequest({
    model: benchmarkChain(3),
    initial: BENCHMARK_INITIAL,
    horizon: 100,
    window: 20,
    samples: 11,
    regimeTransient: 200,
    regimeWindow: 200,
    scenarios: [{ name: 'Fewer fish', changes: [{ pointer: '/initial/fish', value: 5 }] }],
  }),
);

/** Progress starts at 0, never falls and ends at 1. */
function expectRisingToOne(seen: number[]): void {
  expect(seen[0]).toBe(0);
  expect(seen[seen.length - 1]).toBe(1);
  expect(seen.every((f, i) => i === 0 || f >= seen[i - 1]!)).toBe(true);
}

describe('analysis pool', () => {
  let one: AnalysisPool;
  let two: AnalysisPool;
  beforeAll(() => {
    one = createAnalysisPool({ size: 1 });
    two = createAnalysisPool({ size: 2 });
  });
  afterAll(async () => {
    await Promise.all([one.close(), two.close()]);
  });

  // The determinism requirement: pool size 1 and 2 give identical results.
  it('gives identical sweeps, maps, ensembles and comparisons on 1 and 2 workers', async () => {
    const [s1, s2] = await Promise.all([one.runSweep(sweep), two.runSweep(sweep)]);
    expect(s2).toEqual(s1);
    expect(s1.points.map((p) => p.value)).toEqual([0.44, 0.472, 0.504, 0.536, 0.568, 0.6]);
    const [e1, e2] = await Promise.all([one.runEnsemble(ensemble), two.runEnsemble(ensemble)]);
    expect(e2).toEqual(e1);
    expect(e1.belowThreshold['fish']![0]).toBeGreaterThan(0);
    const [m1, m2] = await Promise.all([one.runRegimeMap(map), two.runRegimeMap(map)]);
    expect(m2).toEqual(m1);
    expect(m1.cells).toHaveLength(2);
    expect(m1.cells[0]).toHaveLength(3);
    const [c1, c2] = await Promise.all([
      one.runComparison(comparison),
      two.runComparison(comparison),
    ]);
    expect(c2).toEqual(c1);
    expect(c1.scenarios.map((s) => s.name)).toEqual(['baseline', 'Fewer fish']);
  });

  // Chunks interleave items (chunk c holds c, c + k, …), so the reassembly by index is checked
  // against one in-process run over all items in order.
  it('puts every item back in its place: the same as one in-process run in order', async () => {
    const wide = { ...sweep, steps: 11 };
    const s = await two.runSweep(wide);
    expect(s.points).toEqual(runSweepRange(wide, 0, wide.steps).points);
    const m = await two.runRegimeMap(map);
    expect(m).toEqual(assembleRegimeMap(map, runRegimeMapCells(map, 0, 6)));
    const e = await two.runEnsemble(ensemble);
    const all = runEnsembleMembers(ensemble, 0, ensemble.members);
    expect(e).toEqual(summariseEnsemble(ensemble, all.series, all.crossings));
  });

  // Turn order, with one worker so it is fixed by the rules rather than by timing: a sweep of
  // tenant A is cut into 4 chunks and its first goes out at once; tenant B's sweep (1 chunk)
  // then waits only for A's second chunk (A went to the back of the turn after its first and B
  // joined after it), not for all of A's; an interactive regime goes right after the chunk
  // that is running.
  it('takes turns between owners chunk by chunk, interactive runs first', async () => {
    const events: string[] = [];
    const a = one.runSweep(
      { ...sweep, steps: 8 },
      { owner: 'a', onProgress: (f) => f > 0 && events.push(`a ${f}`) },
    );
    const b = one
      .runSweep({ ...sweep, steps: 1 }, { owner: 'b' })
      .then(() => events.push('b done'));
    await Promise.all([a, b]);
    expect(events).toEqual(['a 0.25', 'a 0.5', 'b done', 'a 0.75', 'a 1']);
    events.length = 0;
    const c = one.runSweep(
      { ...sweep, steps: 8 },
      { owner: 'a', onProgress: (f) => f > 0 && events.push(`a ${f}`) },
    );
    const assessed = one.runRegime(regime).then(() => events.push('regime done'));
    await Promise.all([c, assessed]);
    expect(events).toEqual(['a 0.25', 'regime done', 'a 0.5', 'a 0.75', 'a 1']);
  });

  // Linux keeps a nice value per thread (setpriority(2), NOTES), shown in field 19 of
  // /proc/<pid>/task/<tid>/stat (proc(5)). The workers lower themselves; this thread stays.
  it('runs its workers at nice 10, not the caller', () => {
    const nice = (tid: string) =>
      Number(readFileSync(`/proc/self/task/${tid}/stat`, 'utf8').split(') ')[1]!.split(' ')[16]);
    const me = readlinkSync('/proc/thread-self').split('/').pop()!;
    const niced = readdirSync('/proc/self/task').filter((tid) => nice(tid) === 10);
    expect(nice(me)).toBe(0);
    expect(niced.length).toBeGreaterThanOrEqual(one.size + two.size);
  });

  it('reports progress rising to 1', async () => {
    const seen: number[] = [];
    await two.runSweep(sweep, { onProgress: (f) => seen.push(f) });
    expectRisingToOne(seen);
    expect(seen.length).toBeGreaterThan(2);
  });

  // An ensemble runs in two phases (members, then the bands in the workers): progress still
  // rises to 1 and a cancel during either phase stops it.
  it('reports the progress of an ensemble rising to 1 and cancels it', async () => {
    const seen: number[] = [];
    await two.runEnsemble(ensemble, { onProgress: (f) => seen.push(f) });
    expectRisingToOne(seen);
    expect(seen.some((f) => f > 0 && f < 1)).toBe(true);
    for (const at of [(f: number) => f > 0 && f < 0.95, (f: number) => f >= 0.95]) {
      const stop = new AbortController();
      const run = two.runEnsemble(ensemble, {
        signal: stop.signal,
        onProgress: (f) => at(f) && stop.abort(),
      });
      await expect(run).rejects.toMatchObject({ name: 'AbortError' });
    }
    expect((await two.runEnsemble(ensemble)).members).toBe(ensemble.members);
  });

  it('cancels through an AbortSignal', async () => {
    const before = new AbortController();
    before.abort();
    await expect(two.runSweep(sweep, { signal: before.signal })).rejects.toThrow();
    // Abort once the first chunk reports progress, while the others still run: no reliance on
    // how fast the machine is.
    const during = new AbortController();
    const long = { ...sweep, steps: 40, transient: 4000, window: 4000 };
    const run = two.runSweep(long, { signal: during.signal, onProgress: () => during.abort() });
    await expect(run).rejects.toMatchObject({ name: 'AbortError' });
    // The pool still works afterwards.
    expect((await two.runSweep({ ...sweep, steps: 2 })).points).toHaveLength(2);
  });

  it('refuses oversized requests with a typed error before any work', async () => {
    const huge = { ...sweep, steps: 1000, transient: 60_000, window: 60_000 };
    await expect(two.runSweep(huge)).rejects.toBeInstanceOf(AnalysisBoundsError);
  });

  it('passes typed errors back from the workers', async () => {
    // Validation normally catches a bad value first; the pool still reports it typed.
    const bad = { ...sweep, from: -1 }; // a negative handling time is not a valid model
    await expect(one.runSweep(bad)).rejects.toBeInstanceOf(ModelValidationError);
  });
});
