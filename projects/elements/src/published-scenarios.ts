import { type ChainModel, LAKE_DEMO, UPLAND_DEMO } from '@tropline/core';
import type { ComparisonRequest, ParameterBounds, SweepRequest } from '@tropline/widgets';

/**
 * A scenario as the Larchmere authority publishes it: the vetted model and start, how far ahead
 * the public sees it, which parameters the public may change and within what bounds, and the
 * analyses its pages show. This is the shape a published scenario's public read gives the
 * widgets; until the scenarios API serves it, the two demo scenarios are defined here.
 */
export interface PublishedScenario {
  /** Stable public id, as a page names it (`scenario="brackenlow-mere"`). */
  readonly id: string;
  /** Title for the public. */
  readonly title: string;
  /** The vetted model. */
  readonly model: ChainModel;
  /** Starting value of each level, by id. */
  readonly initial: Readonly<Record<string, number>>;
  /** End of the public projection, in the model's time unit. */
  readonly horizon: number;
  /** Samples of the public projection. */
  readonly samples: number;
  /** What the public may change, and within what bounds. */
  readonly bounds: readonly ParameterBounds[];
  /** The long-run sweep the publisher chose, if any. */
  readonly sweep?: Omit<SweepRequest, 'model' | 'initial'>;
  /** The management alternatives the publisher compares, if any. */
  readonly comparison?: Omit<ComparisonRequest, 'model' | 'initial'>;
}

/** Brackenlow Mere: algae, water fleas and young perch, week by week. */
const BRACKENLOW_MERE: PublishedScenario = {
  id: 'brackenlow-mere',
  title: 'Brackenlow Mere plankton chain',
  model: LAKE_DEMO.model,
  initial: LAKE_DEMO.initial,
  horizon: 208,
  samples: 833,
  bounds: [
    {
      pointer: '/levels/0/carryingCapacity',
      min: 20,
      max: 60,
      step: 1,
      label: 'Nutrients: most algae the water can hold',
    },
    {
      pointer: '/levels/2/mortality',
      min: 0.01,
      max: 0.05,
      step: 0.001,
      label: 'Perch natural death rate',
    },
  ],
  // The water fleas' handling time sets the benchmark's b1 (b1 = 20·h here): 0.1–0.31 week
  // spans b1 = 2.0–6.2. Transient and window are the benchmark's 2000 and 1000 time units
  // at half length, in weeks (the lake's time scale is 1/r = half a week).
  sweep: {
    parameter: '/levels/1/handlingTime',
    from: 0.1,
    to: 0.31,
    steps: 36,
    observe: 'perch',
    transient: 500,
    window: 250,
  },
};

/** Hobcairn Moor with a deer cull whose yearly share the public may change. */
const MOOR_MODEL: ChainModel = {
  ...UPLAND_DEMO.model,
  harvest: [{ level: 'deer', kind: 'effort', rate: 0 }],
};

/** Hobcairn Moor: heather, red deer and grey wolves, year by year. */
const HOBCAIRN_MOOR: PublishedScenario = {
  id: 'hobcairn-moor',
  title: 'Hobcairn Moor heather, deer and wolves',
  model: MOOR_MODEL,
  initial: UPLAND_DEMO.initial,
  horizon: 40,
  samples: 161,
  bounds: [
    {
      pointer: '/harvest/0/rate',
      min: 0,
      max: 0.3,
      step: 0.01,
      label: 'Share of deer culled each year',
    },
  ],
  comparison: {
    horizon: 40,
    window: 10,
    samples: 161,
    regimeTransient: 400,
    regimeWindow: 400,
    scenarios: [
      {
        name: 'Cull 5 % of deer a year',
        changes: [{ pointer: '/model/harvest/0/rate', value: 0.05 }],
      },
      {
        name: 'Cull 15 % of deer a year',
        changes: [{ pointer: '/model/harvest/0/rate', value: 0.15 }],
      },
      { name: 'No wolves return', changes: [{ pointer: '/initial/wolves', value: 0 }] },
    ],
  },
};

/** Every published demo scenario, by public id. */
export const PUBLISHED_SCENARIOS: ReadonlyMap<string, PublishedScenario> = new Map(
  [BRACKENLOW_MERE, HOBCAIRN_MOOR].map((s) => [s.id, s]),
);

/** The published scenario with this public id, or undefined. */
export function findPublishedScenario(
  id: string | null | undefined,
): PublishedScenario | undefined {
  return id ? PUBLISHED_SCENARIOS.get(id.trim()) : undefined;
}

/** The sweep request of a scenario's long-run analysis. */
export function sweepRequest(s: PublishedScenario): SweepRequest | undefined {
  return s.sweep && { ...s.sweep, model: s.model, initial: s.initial };
}

/** The comparison request of a scenario's management alternatives. */
export function comparisonRequest(s: PublishedScenario): ComparisonRequest | undefined {
  return s.comparison && { ...s.comparison, model: s.model, initial: s.initial };
}
