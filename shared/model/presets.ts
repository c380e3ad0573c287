import type { ChainModel } from './chain-model';
import { parseModel } from './model-validation';

/** A ready-made model with a starting state and a note on where its numbers come from. */
export interface ChainPreset {
  /** Stable slug. */
  readonly id: string;
  /** Title for pickers. */
  readonly title: string;
  /** What it shows. */
  readonly description: string;
  /** Where the numbers come from. */
  readonly source: string;
  /** Whether the system and its numbers are invented (demo data), not published. */
  readonly invented: boolean;
  /** Expected long-run behaviour from its start (checked in tests). */
  readonly behaviour: 'settles' | 'cycles' | 'chaotic';
  /** The model. */
  readonly model: ChainModel;
  /** Starting state by level id. */
  readonly initial: Readonly<Record<string, number>>;
}

const nd = 'dimensionless';

/** Hastings & Powell (1991) three-level benchmark at b1 = 3 (chaotic), start (0.8, 0.2, 9). */
export const HASTINGS_POWELL_BENCHMARK: ChainPreset = Object.freeze({
  id: 'hastings-powell-1991',
  title: 'Hastings–Powell three-level chain (b1 = 3)',
  description:
    'The nondimensional chain of the paper: a1 = 5, b1 = 3, a2 = 0.1, b2 = 2, d1 = 0.4, d2 = 0.01. ' +
    'Chaotic: the "teacup" attractor.',
  source: 'Hastings & Powell (1991), Ecology 72:896–903; b = a·h, d = m, r = K = e = 1.',
  invented: false,
  behaviour: 'chaotic',
  model: parseModel({
    timeUnit: 'producer generation (1/r)',
    levels: [
      { id: 'x', name: 'Producer', unit: nd, growthRate: 1, carryingCapacity: 1 },
      {
        id: 'y',
        name: 'Consumer',
        unit: nd,
        attackRate: 5,
        handlingTime: 0.6,
        efficiency: 1,
        mortality: 0.4,
      },
      {
        id: 'z',
        name: 'Top predator',
        unit: nd,
        attackRate: 0.1,
        handlingTime: 20,
        efficiency: 1,
        mortality: 0.01,
      },
    ],
  }),
  initial: Object.freeze({ x: 0.8, y: 0.2, z: 9 }),
});

/**
 * Two-level Rosenzweig–MacArthur model, nondimensional (r = K = e = 1, a = 5, h = 0.6, m = 0.4):
 * the prey equilibrium x* ≈ 0.105 lies left of the isocline's hump at 1/3, so it cycles.
 */
export const ROSENZWEIG_MACARTHUR: ChainPreset = Object.freeze({
  id: 'rosenzweig-macarthur',
  title: 'Rosenzweig–MacArthur predator and prey',
  description:
    'Logistic prey, type II predator; enriched past the Hopf point, so it cycles (paradox of enrichment).',
  source:
    'Rosenzweig & MacArthur (1963), Am. Nat. 97:209–223; Rosenzweig (1971), Science 171:385–387. Values are the first two levels of the Hastings–Powell benchmark.',
  invented: false,
  behaviour: 'cycles',
  model: parseModel({
    timeUnit: 'prey generation (1/r)',
    levels: [
      { id: 'prey', name: 'Prey', unit: nd, growthRate: 1, carryingCapacity: 1 },
      {
        id: 'predator',
        name: 'Predator',
        unit: nd,
        attackRate: 5,
        handlingTime: 0.6,
        efficiency: 1,
        mortality: 0.4,
      },
    ],
  }),
  initial: Object.freeze({ prey: 0.5, predator: 0.2 }),
});

/**
 * An invented lake in real units whose nondimensional groups are exactly the benchmark's
 * (r = 2 week⁻¹, K = 40 g C m⁻², e₁ = 0.5, e₂ = 0.25): chaotic.
 */
export const LAKE_DEMO: ChainPreset = Object.freeze({
  id: 'brackenlow-mere-demo',
  title: 'Brackenlow Mere plankton chain (invented)',
  description:
    'Invented lake: green algae, Daphnia, juvenile yellow perch. In real units, but its groups are ' +
    'exactly the Hastings–Powell benchmark at b1 = 3, so it is chaotic.',
  source: 'Invented demo system and numbers; species are real, the lake is not.',
  invented: true,
  behaviour: 'chaotic',
  model: parseModel({
    timeUnit: 'week',
    levels: [
      {
        id: 'algae',
        name: 'Green algae (Scenedesmus spp.)',
        unit: 'g C m^-2',
        growthRate: 2,
        carryingCapacity: 40,
      },
      {
        id: 'daphnia',
        name: 'Water flea (Daphnia pulex)',
        unit: 'g C m^-2',
        attackRate: 0.5,
        handlingTime: 0.15,
        efficiency: 0.5,
        mortality: 0.8,
      },
      {
        id: 'perch',
        name: 'Juvenile yellow perch (Perca flavescens)',
        unit: 'g C m^-2',
        attackRate: 0.04,
        handlingTime: 2.5,
        efficiency: 0.25,
        mortality: 0.02,
      },
    ],
  }),
  // The benchmark start (0.8, 0.2, 9) times the state scales (40, 20, 5).
  initial: Object.freeze({ algae: 32, daphnia: 4, perch: 45 }),
});

/** An invented upland in real units; wolves with a type III (prey-switching) response settle it. */
export const UPLAND_DEMO: ChainPreset = Object.freeze({
  id: 'hobcairn-moor-demo',
  title: 'Hobcairn Moor browsing chain (invented)',
  description:
    'Invented upland: heather, red deer, grey wolves with a type III response. Settles to a stable ' +
    'equilibrium through damped oscillations.',
  source: 'Invented demo system and numbers; species are real, the moor is not.',
  invented: true,
  behaviour: 'settles',
  model: parseModel({
    timeUnit: 'year',
    levels: [
      {
        id: 'heather',
        name: 'Heather (Calluna vulgaris)',
        unit: 't dry matter km^-2',
        growthRate: 0.8,
        carryingCapacity: 500,
      },
      {
        id: 'deer',
        name: 'Red deer (Cervus elaphus)',
        unit: 'animals km^-2',
        attackRate: 0.08,
        handlingTime: 0.01,
        efficiency: 0.1,
        mortality: 0.3,
      },
      {
        id: 'wolves',
        name: 'Grey wolf (Canis lupus)',
        unit: 'animals km^-2',
        attackRate: 0.5,
        handlingTime: 0.05,
        efficiency: 0.02,
        mortality: 0.2,
        response: 'type3',
      },
    ],
  }),
  initial: Object.freeze({ heather: 300, deer: 8, wolves: 0.02 }),
});

/** Every preset, published ones first. */
export const CHAIN_PRESETS: readonly ChainPreset[] = Object.freeze([
  HASTINGS_POWELL_BENCHMARK,
  ROSENZWEIG_MACARTHUR,
  LAKE_DEMO,
  UPLAND_DEMO,
]);
