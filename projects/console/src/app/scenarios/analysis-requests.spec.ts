import {
  diffDocuments,
  UPLAND_DEMO,
  withParameter,
  validateComparisonRequest,
  validateEnsembleRequest,
  validateSweepRequest,
  type ChainModel,
} from '@tropline/core';
import {
  comparisonRequest,
  defaultSweep,
  ensembleRequest,
  ensembleTrajectory,
  sweepRequest,
  versionComparisonRequest,
} from './analysis-requests';
import type { ScenarioContent } from './scenario-types';

const content: ScenarioContent = {
  name: 'Hobcairn Moor',
  model: UPLAND_DEMO.model,
  initial: UPLAND_DEMO.initial,
  horizon: 80,
};

// Each request is checked with the contract's own validator, the one the API runs.
describe('analysis requests of the scenario page', () => {
  it('sweeps a parameter from half to one and a half times its value', () => {
    const form = defaultSweep(content.model, '/levels/1/attackRate');
    expect(form).toMatchObject({ from: 0.04, to: 0.12, steps: 41, observe: 'wolves' });
    const checked = validateSweepRequest(sweepRequest(content, form));
    expect(checked.ok, JSON.stringify(checked)).toBe(true);
  });

  it('draws uncertain parameters log-normally around their values', () => {
    const body = ensembleRequest(content, {
      pointers: ['/levels/1/mortality'],
      sigma: 0.1,
      members: 50,
      seed: 1,
    });
    expect(body.parameters[0]?.distribution).toEqual({
      kind: 'lognormal',
      median: 0.3,
      sigma: 0.1,
    });
    const checked = validateEnsembleRequest(body);
    expect(checked.ok, JSON.stringify(checked)).toBe(true);
  });

  it('shows an ensemble as the median line with the 5–95 % band', () => {
    const t = [0, 1];
    const band = (v: number) => ({
      p5: [v - 1, v - 1],
      p25: [v, v],
      p50: [v, v],
      p75: [v, v],
      p95: [v + 1, v + 1],
    });
    const data = ensembleTrajectory(content.model, {
      times: t,
      bands: { heather: band(300), deer: band(8), wolves: band(1) },
      belowThreshold: {},
    });
    expect(data.series.map((s) => s.values[0])).toEqual([300, 8, 1]);
    expect(data.bands?.[1]).toEqual({ id: 'deer', lower: [7, 7], upper: [9, 9] });
  });

  it('compares the version with alternatives that change one parameter each', () => {
    const body = comparisonRequest(content, [
      { name: 'More culling', pointer: '/levels/1/mortality', value: 0.4 },
    ]);
    expect(body.scenarios[0]?.changes).toEqual([
      { pointer: '/model/levels/1/mortality', value: 0.4 },
    ]);
    expect(body.window).toBe(20);
    const checked = validateComparisonRequest(body);
    expect(checked.ok, JSON.stringify(checked)).toBe(true);
  });

  it('compares two versions by the numbers that differ, not by names or units', () => {
    const moved = withParameter(content.model, '/levels/1/mortality', 0.35);
    const renamed = moved.levels.map((l, i) => (i === 2 ? { ...l, name: 'Grey wolf (ridge)' } : l));
    const later: ScenarioContent = {
      ...content,
      model: { ...moved, levels: renamed } as ChainModel,
      initial: { ...content.initial, deer: 9.5 },
    };
    // The change list is the server's own (`diffDocuments`, what GET …/comparison answers).
    const body = versionComparisonRequest(content, 2, diffDocuments(content, later));
    expect(body.scenarios).toEqual([
      {
        name: 'Version 2',
        changes: [
          { pointer: '/model/levels/1/mortality', value: 0.35 },
          { pointer: '/initial/deer', value: 9.5 },
        ],
      },
    ]);
    const checked = validateComparisonRequest(body);
    expect(checked.ok, JSON.stringify(checked)).toBe(true);
  });
});
