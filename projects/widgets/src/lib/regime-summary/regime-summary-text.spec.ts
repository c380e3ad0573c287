import { findEquilibria, ROSENZWEIG_MACARTHUR, UPLAND_DEMO } from '@tropline/core';
import type { RegimeResponse } from '../api/analysis-types';
import { regimeSummaryText } from './regime-summary-text';

const chaotic: RegimeResponse = {
  regime: 'chaotic',
  lyapunovExponent: { value: 0.01234, standardError: 0.0011 },
  predictabilityHorizon: 186.4,
};

describe('regimeSummaryText', () => {
  it('states a chaotic regime with its exponent, error and horizon in the time unit', () => {
    const text = regimeSummaryText(UPLAND_DEMO.model, chaotic, [], 'en');
    expect(text.title).toBe('Irregular (chaotic)');
    expect(text.sentence).toContain('predictability horizon');
    expect(text.facts).toEqual([
      { label: 'Largest Lyapunov exponent', value: '0.0123 ± 0.0011 per year' },
      { label: 'Predictability horizon', value: 'about 186 years' },
    ]);
  });

  it('says a settling regime is not limited by chaos and gives a cycle its period', () => {
    const settled = regimeSummaryText(
      UPLAND_DEMO.model,
      { regime: 'equilibrium', lyapunovExponent: { value: -0.2, standardError: 0.01 } },
      [],
      'en',
    );
    expect(settled.facts[1]!.value).toBe('not limited by chaos');
    const cycle = regimeSummaryText(
      UPLAND_DEMO.model,
      { regime: 'cycle', lyapunovExponent: { value: 0, standardError: 0.001 }, period: 12.5 },
      [],
      'de',
    );
    expect(cycle.facts.at(-1)).toEqual({ label: 'Cycle period', value: '12,5 years' });
  });

  it('lists the feasible equilibria from the engine with their stability in words', () => {
    const model = ROSENZWEIG_MACARTHUR.model;
    const equilibria = findEquilibria(model);
    const text = regimeSummaryText(model, chaotic, equilibria, 'en');
    expect(text.equilibria.length).toBe(equilibria.filter((e) => e.feasible).length);
    expect(text.equilibria[0]!.name).toBe('Every level extinct');
    const interior = text.equilibria.at(-1)!;
    expect(interior.name).toContain(' and ');
    expect(interior.stability).toMatch(/(attracts nearby states|does not attract)$/);
  });
});
