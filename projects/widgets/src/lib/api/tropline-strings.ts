import { InjectionToken } from '@angular/core';
import type { Regime } from './analysis-types';

/**
 * Every word the widgets show, in one place, so a host can translate or reword them with
 * `provideTropline({ strings: { … } })`. Numbers and dates inside are already formatted for the
 * configured locale when these functions are called.
 */
export interface TroplineStrings {
  /** Button that shows a chart's numbers as a table. */
  readonly showTable: string;
  /** Button that hides the table again. */
  readonly hideTable: string;
  /** Export buttons' group label. */
  readonly exportLabel: string;
  /** Export as PNG image. */
  readonly exportPng: string;
  /** Export as SVG drawing. */
  readonly exportSvg: string;
  /** Export as CSV table. */
  readonly exportCsv: string;
  /** Shown while a computation runs. */
  readonly computing: string;
  /** Read with the progress bar of a bifurcation sweep. */
  readonly computingSweep: string;
  /** Read with the progress bar of a scenario comparison. */
  readonly computingComparison: string;
  /** Cancel button of a background job. */
  readonly cancel: string;
  /** Shown when a background job was cancelled. */
  readonly cancelled: string;
  /** Progress of a background job. */
  readonly jobProgress: (percent: string) => string;
  /** Sentence added to a refusal that says when to try again. */
  readonly retryAfter: (when: string) => string;
  /** Shown where there is nothing to draw yet. */
  readonly empty: string;
  /** Label of the time axis. */
  readonly timeAxis: (unit: string) => string;
  /** Name of the band past the predictability horizon. */
  readonly pastHorizon: string;
  /** Legend name of the observed monitoring points. */
  readonly observed: (level: string) => string;
  /** Legend name of an ensemble band. */
  readonly band: (level: string) => string;
  /** Plain name of each regime. */
  readonly regimeName: Readonly<Record<Regime, string>>;
  /** One plain sentence per regime. */
  readonly regimeSentence: Readonly<Record<Regime, string>>;
  /** Whether an equilibrium attracts, in words. */
  readonly stable: string;
  /** The opposite. */
  readonly unstable: string;
  /** Heading of the regime summary. */
  readonly regimeHeading: string;
  /** Label of the largest exponent. */
  readonly exponentLabel: string;
  /** Label of the predictability horizon. */
  readonly horizonLabel: string;
  /** Horizon value when chaos does not limit it. */
  readonly notLimited: string;
  /** Label of the cycle period. */
  readonly periodLabel: string;
  /** An approximate duration, e.g. "about 186 years". */
  readonly about: (duration: string) => string;
  /** Name of the equilibrium with no level present. */
  readonly everyLevelExtinct: string;
  /** Title of a collapse naming the levels, e.g. "Pumpkinseed dies out". */
  readonly collapseTitle: (levels: string, count: number) => string;
  /** Sentence of a collapse naming the levels. */
  readonly collapseSentence: (levels: string, count: number) => string;
  /** Label of the levels that die out, each with its unit. */
  readonly collapsedLabel: string;
  /** A level that dies out, with its unit, e.g. "Pumpkinseed (g C m⁻²)". */
  readonly levelWithUnit: (level: string, unit: string) => string;
  /** Label of the note on weaker evidence behind a verdict. */
  readonly regimeNoteLabel: string;
  /** The engine's notes in plain words (a note not listed here is shown as the API wrote it). */
  readonly regimeNote: {
    /** Levels above their quasi-extinction threshold in the window, declining steadily. */
    readonly dyingOut: (levels: string, count: number) => string;
    /** Irregular peaks with a positive exponent still within its error. */
    readonly shortWindow: string;
    /** Peaks that still rise or fall one way (or too few): the window caught a transient. */
    readonly transient: string;
  };
  /** Heading of the equilibria list. */
  readonly equilibriaHeading: string;
  /** Accessible name of the cautions. */
  readonly cautionsLabel: string;
  /** Reset button of the parameter form. */
  readonly resetToPublished: string;
  /** Legend of the parameter form. */
  readonly parametersHeading: string;
  /** Message under a field below its minimum. */
  readonly tooLow: (min: string, unit: string) => string;
  /** Message under a field above its maximum. */
  readonly tooHigh: (max: string, unit: string) => string;
  /** Message under an empty or non-numeric field. */
  readonly notANumber: string;
  /** Message under a field at or below a bound it must exceed (a rate that must be above 0). */
  readonly mustExceed: (min: string, unit: string) => string;
  /** A field's range under it; `minExclusive` when the lowest value itself is not allowed. */
  readonly rangeHint: (min: string, max: string, minExclusive: boolean) => string;
  /** Ecological name of each model parameter, by its field name. */
  readonly parameterLabel: Readonly<Record<string, string>>;
  /** Role of level `index` in a chain of `count` levels. */
  readonly levelRole: (index: number, count: number) => string;
  /** A rate's unit. */
  readonly perTime: (timeUnit: string) => string;
  /** An attack rate's unit. */
  readonly attackUnit: (preyUnit: string, timeUnit: string) => string;
  /** A conversion efficiency's unit. */
  readonly efficiencyUnit: (unit: string, preyUnit: string) => string;
  /** A harvest quota's or stocking amount's unit. */
  readonly amountUnit: (unit: string, timeUnit: string) => string;
  /** Hint read with a focused chart. */
  readonly zoomKeys: string;
  /** Note beside a value the public may not change. */
  readonly fixedByPublisher: string;
  /** Heading of the comparison metrics table. */
  readonly comparisonHeading: string;
  /** Toggle: one chart per scenario. */
  readonly smallMultiples: string;
  /** Toggle: all scenarios on one chart. */
  readonly overlay: string;
  /** Comparison metric names. */
  readonly metric: {
    readonly atHorizon: string;
    readonly windowMean: string;
    readonly minimum: string;
    readonly thresholdCrossing: string;
  };
  /** Threshold never crossed. */
  readonly never: string;
  /** Marker of the current parameter value on the bifurcation chart. */
  readonly currentValue: string;
  /** Legend name of the bifurcation chart's values where a level dies out without peaks. */
  readonly decliningLegend: string;
  /** Table cell of such a value, in place of its peaks. */
  readonly decliningCell: string;
  /** Sentence of the bifurcation summary on such values (`values` already listed). */
  readonly decliningSummary: (count: number, values: string) => string;
  /** Legend name of the transient part of a phase portrait. */
  readonly transient: string;
  /** Legend name of the long-run part of a phase portrait. */
  readonly longRun: string;
  /** Legend name of a nullcline. */
  readonly nullcline: (level: string) => string;
  /** Legend name of the equilibria with their stability. */
  readonly equilibriumLegend: (stable: boolean) => string;
  /** Accessible name of the phase portrait's choice of view. */
  readonly phaseViewLabel: string;
  /** The phase portrait's view of two levels in the plane. */
  readonly planeView: string;
  /** The phase portrait's view of three levels in a box. */
  readonly boxView: string;
  /** Label of the level on the horizontal axis. */
  readonly acrossAxis: string;
  /** Label of the level on the vertical axis. */
  readonly upAxis: string;
  /** Label of the level on the box's depth axis. */
  readonly depthAxis: string;
  /** Label of the slider that turns the box about its vertical axis. */
  readonly turnLabel: string;
  /** Label of the slider that tilts the box. */
  readonly tiltLabel: string;
  /** Hint read with the focused three-level view. */
  readonly rotateKeys: string;
}

/** Tropline's English wording. */
export const DEFAULT_TROPLINE_STRINGS: TroplineStrings = {
  showTable: 'Show the numbers as a table',
  hideTable: 'Hide the table',
  exportLabel: 'Download',
  exportPng: 'Image (PNG)',
  exportSvg: 'Drawing (SVG)',
  exportCsv: 'Table (CSV)',
  computing: 'Computing…',
  computingSweep: 'Computing the bifurcation diagram',
  computingComparison: 'Comparing the scenarios',
  cancel: 'Cancel',
  cancelled: 'The computation was cancelled.',
  jobProgress: (percent) => `${percent} done`,
  retryAfter: (when) => `You can try again after ${when}.`,
  empty: 'Nothing to show yet.',
  timeAxis: (unit) => `time (${unit})`,
  pastHorizon: 'Past the predictability horizon',
  observed: (level) => `${level} (monitoring)`,
  band: (level) => `${level}, 5–95 % of runs`,
  regimeName: {
    equilibrium: 'Settles',
    cycle: 'Cycles',
    chaotic: 'Irregular (chaotic)',
    collapse: 'A level dies out',
  },
  regimeSentence: {
    equilibrium: 'In the long run every level settles to a steady value.',
    cycle: 'In the long run the levels rise and fall in a repeating cycle.',
    chaotic:
      'In the long run the levels rise and fall irregularly: small differences grow, so ' +
      'projections lose meaning past the predictability horizon.',
    collapse: 'In the long run at least one level falls below its quasi-extinction threshold.',
  },
  stable: 'attracts nearby states',
  unstable: 'does not attract',
  regimeHeading: 'Long-run behaviour',
  exponentLabel: 'Largest Lyapunov exponent',
  horizonLabel: 'Predictability horizon',
  notLimited: 'not limited by chaos',
  periodLabel: 'Cycle period',
  about: (duration) => `about ${duration}`,
  everyLevelExtinct: 'Every level extinct',
  collapseTitle: (levels, count) => `${levels} ${count === 1 ? 'dies' : 'die'} out`,
  collapseSentence: (levels, count) =>
    `In the long run ${levels} ${count === 1 ? 'falls' : 'fall'} toward zero, below ` +
    `${count === 1 ? 'its' : 'their'} quasi-extinction threshold.`,
  collapsedLabel: 'Dying out',
  levelWithUnit: (level, unit) => `${level} (${unit})`,
  regimeNoteLabel: 'Note',
  regimeNote: {
    dyingOut: (levels, count) =>
      `${levels} ${count === 1 ? 'is' : 'are'} still above ${count === 1 ? 'its' : 'their'} ` +
      'quasi-extinction threshold in the measured window, but declining steadily toward it; ' +
      `${count === 1 ? 'its' : 'their'} rises and falls are not a cycle or chaos.`,
    shortWindow:
      'The peaks are irregular and the exponent is positive, but not yet beyond its error; ' +
      'a longer measuring window would settle it.',
    transient:
      'The peaks are still rising or falling from one to the next, or too few to judge: the ' +
      'system is still on its way to its long-run behaviour. A longer measuring window would ' +
      'settle the cycle’s period, or show it settling.',
  },
  equilibriaHeading: 'Equilibria',
  cautionsLabel: 'How to read this projection',
  resetToPublished: 'Reset to the published values',
  parametersHeading: 'Model parameters',
  tooLow: (min, unit) => `Must be at least ${min}${unit ? ' ' + unit : ''}.`,
  tooHigh: (max, unit) => `Must be at most ${max}${unit ? ' ' + unit : ''}.`,
  notANumber: 'Enter a number.',
  mustExceed: (min, unit) => `Must be greater than ${min}${unit ? ' ' + unit : ''}.`,
  rangeHint: (min, max, minExclusive) =>
    minExclusive ? `more than ${min}, up to ${max}` : `${min} – ${max}`,
  parameterLabel: {
    growthRate: 'Growth rate r',
    carryingCapacity: 'Carrying capacity K',
    attackRate: 'Attack rate a',
    handlingTime: 'Handling time h',
    efficiency: 'Conversion efficiency e',
    mortality: 'Mortality m',
    'harvest.rate': 'Harvest effort F',
    'harvest.amount': 'Harvest quota H',
    'stocking.amount': 'Stocking',
  },
  levelRole: (index, count) =>
    index === 0
      ? 'producer'
      : index === count - 1
        ? count > 2
          ? 'top predator'
          : 'consumer'
        : index === 1
          ? 'grazer'
          : 'predator',
  perTime: (t) => `per ${t}`,
  attackUnit: (prey, t) => `per (${prey}) per ${t}`,
  efficiencyUnit: (unit, prey) => `${unit} per ${prey}`,
  amountUnit: (unit, t) => `${unit} per ${t}`,
  zoomKeys:
    'Keys: plus and minus zoom the time axis, left and right arrows move along it, zero shows all.',
  fixedByPublisher: 'Fixed by the publisher',
  comparisonHeading: 'How the scenarios differ',
  smallMultiples: 'One chart per scenario',
  overlay: 'All on one chart',
  metric: {
    atHorizon: 'At the horizon',
    windowMean: 'Mean over the final window',
    minimum: 'Lowest value',
    thresholdCrossing: 'First below threshold',
  },
  never: 'never',
  currentValue: 'Current value',
  decliningLegend: 'Dies out, no peaks (▼ on the zero line)',
  decliningCell: 'none: declines toward zero (▼)',
  decliningSummary: (count, values) =>
    `At ${count === 1 ? 'one value' : `${count} values`} (${values}) the level declines toward ` +
    'zero without peaks; these are marked ▼ on the zero line.',
  transient: 'Transient (early)',
  longRun: 'Long run',
  nullcline: (level) => `${level} unchanging (nullcline)`,
  equilibriumLegend: (stable) => (stable ? 'Equilibrium, stable (●)' : 'Equilibrium, unstable (○)'),
  phaseViewLabel: 'Levels shown',
  planeView: 'Two levels',
  boxView: 'Three levels',
  acrossAxis: 'Across',
  upAxis: 'Up',
  depthAxis: 'Depth',
  turnLabel: 'Turn',
  tiltLabel: 'Tilt',
  rotateKeys:
    'Keys: left and right arrows turn the box, up and down arrows tilt it, Home restores the view.',
};

/** The strings in use; `provideTropline({ strings })` overrides any of them. */
export const TROPLINE_STRINGS = new InjectionToken<TroplineStrings>('TROPLINE_STRINGS', {
  providedIn: 'root',
  factory: () => DEFAULT_TROPLINE_STRINGS,
});
