/**
 * Hard bounds on every analysis request. Work is counted in integrated model time units,
 * weighted by the cost of the system integrated (1 for the state alone, 3 with one tangent
 * vector for the Lyapunov exponent, 6 with the full spectrum); past a bound the request is
 * refused with an {@link AnalysisBoundsError} before any work starts.
 */
export const ANALYSIS_LIMITS = {
  /** Longest transient or window, in model time units. */
  maxSpan: 100_000,
  /** Most parameter values in one sweep. */
  maxSweepSteps: 1000,
  /** Most values along one axis of a regime map. */
  maxMapSide: 200,
  /** Most cells in one regime map. */
  maxMapCells: 10_000,
  /** Most members in one ensemble. */
  maxMembers: 10_000,
  /** Most sample times in one ensemble. */
  maxEnsembleSamples: 2001,
  /** Most alternatives beside the baseline in one comparison. */
  maxAlternatives: 5,
  /** Most changes in one scenario. */
  maxChanges: 20,
  /** Most weighted time units one request may integrate. */
  maxWork: 60_000_000,
} as const;

/** Cost weight of a run by what it integrates (see {@link ANALYSIS_LIMITS}). */
export const WORK_WEIGHT = { state: 1, exponent: 3, spectrum: 6 } as const;

/** Which bound a request broke. */
export type AnalysisBound =
  'sweep-steps' | 'map-cells' | 'members' | 'samples' | 'alternatives' | 'span' | 'work';

/**
 * A request too large to run. Thrown before any work; the server answers it as a problem with
 * status 422 and the pointer of the field to shrink.
 */
export class AnalysisBoundsError extends Error {
  override readonly name = 'AnalysisBoundsError';
  constructor(
    /** Which bound. */
    readonly bound: AnalysisBound,
    /** JSON Pointer (RFC 6901) into the request body of the field that sets the size. */
    readonly pointer: string,
    /** What the request asks for. */
    readonly requested: number,
    /** The largest allowed. */
    readonly limit: number,
  ) {
    super(`${pointer || '/'}: ${bound} ${requested} exceeds the limit ${limit}`);
  }
}

/** Throws {@link AnalysisBoundsError} when `requested` exceeds `limit`. */
export function assertBound(
  bound: AnalysisBound,
  pointer: string,
  requested: number,
  limit: number,
): void {
  if (!(requested <= limit)) throw new AnalysisBoundsError(bound, pointer, requested, limit);
}
