import type { ComparisonRequest, SweepRequest } from '@tropline/widgets';
import type { PublishedScenario } from './published-scenario';

/**
 * Analyses an element derives from a published scenario alone, for pages that embed one with
 * nothing but its public id. A published version carries the model, start, horizon and public
 * ranges; which alternatives to compare and what to sweep are derived here from those ranges.
 * (A portal that wants hand-chosen alternatives passes them as its own page content.)
 */

/** Samples of a projection over the published horizon: two per time unit, 201 to 2001. */
export function projectionSamples(s: PublishedScenario): number {
  return Math.min(2001, Math.max(201, Math.round(s.horizon * 2) + 1));
}

/** Shortest readable form of a parameter value (no float noise). */
function shown(value: number): string {
  return String(Number(value.toPrecision(6)));
}

/**
 * The publisher's own ranges as alternatives: each public parameter at the lowest and at the
 * highest value the public may choose, over the published horizon, against the published model.
 */
export function boundsComparison(s: PublishedScenario): ComparisonRequest | undefined {
  const scenarios = s.publicParameters.slice(0, 4).flatMap((p) => {
    const label = p.label ?? p.pointer;
    return [
      {
        name: `${label}: lowest allowed (${shown(p.min)})`,
        changes: [{ pointer: `/model${p.pointer}`, value: p.min }],
      },
      {
        name: `${label}: highest allowed (${shown(p.max)})`,
        changes: [{ pointer: `/model${p.pointer}`, value: p.max }],
      },
    ];
  });
  if (!scenarios.length) return undefined;
  return {
    model: s.model,
    initial: s.initial,
    horizon: s.horizon,
    window: s.horizon / 4,
    samples: projectionSamples(s),
    scenarios,
  };
}

/**
 * A bifurcation sweep across the first public parameter's range, recording the top level's
 * peaks; each value runs twice the published horizon before a horizon-long window is read.
 */
export function boundsSweep(s: PublishedScenario): SweepRequest | undefined {
  const p = s.publicParameters[0];
  const top = s.model.levels.at(-1);
  if (!p || !top) return undefined;
  return {
    model: s.model,
    initial: s.initial,
    parameter: p.pointer,
    from: p.min,
    to: p.max,
    steps: 36,
    observe: top.id,
    transient: s.horizon * 2,
    window: s.horizon,
  };
}
