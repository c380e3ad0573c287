import { describe, expect, it } from 'vitest';
import { LAKE_DEMO, UPLAND_DEMO, type ChainPreset } from '@tropline/core';
import { calibrateChain } from './calibrate-chain';
import { validateCalibrationRequest, type CalibrationRequest } from './calibration-request';
import { syntheticSeries } from './synthetic-series';

function request(
  preset: ChainPreset,
  parameters: { pointer: string; min: number; max: number }[],
  times: number[],
  extra: Record<string, unknown> = {},
): CalibrationRequest {
  const data = syntheticSeries(preset.model, preset.initial, { times, logSigma: 0.1, seed: 7 });
  const checked = validateCalibrationRequest({
    model: preset.model,
    initial: preset.initial,
    observations: { times: data.times, levels: data.levels },
    parameters,
    ...extra,
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.errors));
  return checked.value;
}

describe('calibrateChain on seeded synthetic data whose truth is known', () => {
  // Hobcairn Moor settles (a stable equilibrium through damped oscillations): not chaotic.
  const truth = {
    '/levels/0/growthRate': 0.8,
    '/levels/1/attackRate': 0.08,
    '/levels/1/mortality': 0.3,
  } as const;
  const upland = request(
    UPLAND_DEMO,
    [
      { pointer: '/levels/0/growthRate', min: 0.1, max: 5 },
      { pointer: '/levels/1/attackRate', min: 0.01, max: 1 },
      { pointer: '/levels/1/mortality', min: 0.01, max: 2 },
    ],
    Array.from({ length: 41 }, (_, i) => i),
  );
  const result = calibrateChain(upland);

  it('recovers every true parameter within two reported standard errors', () => {
    for (const e of result.estimates) {
      const value = truth[e.pointer as keyof typeof truth];
      expect(e.standardError, e.pointer).not.toBeNull();
      expect(Math.abs(e.value - value), e.pointer).toBeLessThan(2 * e.standardError!);
      expect(e.atBound).toBe(false);
    }
  });

  it('reports a fit whose log-scale miss matches the 10 % noise it was made with', () => {
    expect(result.fit.rmse).toBeGreaterThan(0.07);
    expect(result.fit.rmse).toBeLessThan(0.13);
    expect(result.fit.points).toBe(123);
    expect(result.residuals).toHaveLength(123);
    expect(result.chaotic).toBe(false);
    expect(result.regime.regime).toBe('equilibrium');
    expect(result.warnings).toEqual([]);
  });

  it('is deterministic and keeps the best of several starts', () => {
    expect(result.starts).toHaveLength(3);
    const best = Math.min(...result.starts.map((s) => s.sumOfSquares));
    expect(result.fit.sumOfSquares).toBeCloseTo(best, 9);
    expect(calibrateChain(upland).estimates).toEqual(result.estimates);
  });

  it('flags the chaotic case and proposes segments, then fits them without the flag', () => {
    const lake = request(
      LAKE_DEMO,
      [{ pointer: '/levels/1/mortality', min: 0.2, max: 2 }],
      Array.from({ length: 101 }, (_, i) => i * 4),
    );
    const chaotic = calibrateChain(lake);
    expect(chaotic.chaotic).toBe(true);
    expect(chaotic.regime.regime).toBe('chaotic');
    expect(chaotic.suggestedSegmentLength).toBeGreaterThan(20);
    expect(chaotic.warnings.join(' ')).toMatch(/chaotic.*segmentLength/);
    const segmented = calibrateChain({ ...lake, segmentLength: 40 });
    expect(segmented.chaotic).toBe(false);
    expect(segmented.trajectory.length).toBeGreaterThan(5);
  });

  it('respects the bounds it was given', () => {
    const tight = calibrateChain({
      ...upland,
      parameters: [{ pointer: '/levels/1/mortality', min: 0.4, max: 0.6 }],
      starts: 1,
    });
    expect(tight.estimates[0]!.value).toBeGreaterThanOrEqual(0.4);
    expect(tight.estimates[0]!.atBound).toBe(true);
    expect(tight.warnings.join(' ')).toMatch(/bound/);
  });
});

describe('validateCalibrationRequest', () => {
  it('names each bad field by its pointer', () => {
    const checked = validateCalibrationRequest({
      model: UPLAND_DEMO.model,
      initial: UPLAND_DEMO.initial,
      observations: { times: [0, 2, 1], levels: { deer: [1, 2, 3], moose: [1, 1, 1] } },
      parameters: [
        { pointer: '/levels/9/attackRate', min: 1, max: 2 },
        { pointer: '/levels/1/mortality', min: -1, max: 2 },
      ],
    });
    expect(checked.ok).toBe(false);
    const pointers = checked.ok ? [] : checked.errors.map((e) => e.pointer);
    expect(pointers).toEqual(
      expect.arrayContaining([
        '/observations/times/2',
        '/observations/levels/moose',
        '/parameters/0/pointer',
        '/parameters/1/min',
      ]),
    );
  });
});
