import {
  assessRegime,
  findEquilibria,
  HASTINGS_POWELL_BENCHMARK,
  LAKE_DEMO,
  ROSENZWEIG_MACARTHUR,
  UPLAND_DEMO,
  withParameter,
} from '@tropline/core';
import type { RegimeResponse } from '../api/analysis-types';
import { DEFAULT_TROPLINE_STRINGS } from '../api/tropline-strings';
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

  // Hastings & Powell's chain at b1 = 1 (h1 = b1/a1 = 0.2) with d2 = 0.0172: the top predator
  // cannot invade the predator-free equilibrium (invasion rate −0.00299 per time unit, derived in
  // shared/regime/assess-regime.spec.ts), so it declines like e^{λt} yet stays far above its
  // 1e-6 threshold over a 1000-unit window — the engine says collapse with its dying-out note.
  it('names the level that dies out, with its unit, and says the dying-out note in words', () => {
    const base = HASTINGS_POWELL_BENCHMARK;
    const model = withParameter(
      withParameter(base.model, '/levels/1/handlingTime', 0.2),
      '/levels/2/mortality',
      0.0172,
    );
    const regime = assessRegime(model, base.initial, { transient: 1000, window: 1000 });
    expect(regime.regime).toBe('collapse');
    expect(regime.collapsedLevels).toEqual(['z']);
    expect(regime.regimeNote).toBeDefined();
    const text = regimeSummaryText(model, regime, [], 'en');
    expect(text.title).toBe('Top predator dies out');
    expect(text.sentence).toBe(
      'In the long run Top predator falls toward zero, below its quasi-extinction threshold.',
    );
    expect(text.facts[0]).toEqual({ label: 'Dying out', value: 'Top predator (dimensionless)' });
    expect(text.facts.at(-1)).toEqual({
      label: 'Note',
      value:
        'Top predator is still above its quasi-extinction threshold in the measured window, but ' +
        'declining steadily toward it; its rises and falls are not a cycle or chaos.',
    });
  });

  it('lists several collapsed levels in the locale and through the host strings', () => {
    const collapse: RegimeResponse = {
      regime: 'collapse',
      lyapunovExponent: { value: -0.05, standardError: 0.002 },
      collapsedLevels: ['daphnia', 'perch'],
    };
    const model = LAKE_DEMO.model;
    const [, grazers, fish] = model.levels;
    const en = regimeSummaryText(model, collapse, [], 'en');
    expect(en.title).toBe(`${grazers!.name} and ${fish!.name} die out`);
    expect(en.facts[0]!.value).toContain(`${fish!.name} (`);
    expect(en.facts.some((f) => f.label === 'Note')).toBe(false);
    const de = regimeSummaryText(model, collapse, [], 'de', {
      ...DEFAULT_TROPLINE_STRINGS,
      collapseTitle: (levels, count) => `${levels} ${count === 1 ? 'stirbt' : 'sterben'} aus`,
    });
    expect(de.title).toBe(`${grazers!.name} und ${fish!.name} sterben aus`);
  });

  it('says the short-window note in words and shows a note it does not know as written', () => {
    // The note as shared/regime/classify-regime.ts (IRREGULAR_NOTE) writes it.
    const irregular =
      'irregular maxima with a positive exponent not yet beyond its error; a longer window settles it';
    const short = regimeSummaryText(
      UPLAND_DEMO.model,
      { ...chaotic, regimeNote: irregular },
      [],
      'en',
    );
    expect(short.facts.at(-1)).toEqual({
      label: 'Note',
      value: DEFAULT_TROPLINE_STRINGS.regimeNote.shortWindow,
    });
    // TRANSIENT_NOTE of shared/regime/classify-regime.ts, as the API writes it.
    const transient =
      'the maxima still drift one way or are too few to show chaos (the orbit is still on its ' +
      'way to its long-run state); a longer window settles it';
    const drifting = regimeSummaryText(
      UPLAND_DEMO.model,
      { ...chaotic, regime: 'cycle', regimeNote: transient },
      [],
      'en',
    );
    expect(drifting.facts.at(-1)).toEqual({
      label: 'Note',
      value: DEFAULT_TROPLINE_STRINGS.regimeNote.transient,
    });
    const other = regimeSummaryText(
      UPLAND_DEMO.model,
      { ...chaotic, regimeNote: 'a new note' },
      [],
      'en',
    );
    expect(other.facts.at(-1)!.value).toBe('a new note');
  });
});
