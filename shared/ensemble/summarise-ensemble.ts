import type { EnsembleRequest } from '../analyses-contract/ensemble-contract';
import { extinctionThresholds } from '../regime/assess-regime';
import { ensembleTimes } from './run-ensemble-members';

/** The percentiles every band reports. */
export const BAND_PERCENTILES = [5, 25, 50, 75, 95] as const;

/** Percentile bands per level, keyed `p5` … `p95`, one value per sample time. */
export type PercentileBands = Record<'p5' | 'p25' | 'p50' | 'p75' | 'p95', number[]>;

/** An ensemble's summary (the response body). */
export interface EnsembleResult {
  readonly times: number[];
  readonly bands: Record<string, PercentileBands>;
  /** Fraction of members whose level has been below its threshold at or before each time. */
  readonly belowThreshold: Record<string, number[]>;
  readonly thresholds: Record<string, number>;
  readonly members: number;
  readonly seed: number;
}

/**
 * The q-th quantile of sorted values by linear interpolation between order statistics
 * (Hyndman & Fan 1996, Am. Stat. 50:361–365, definition 7; the default of R and NumPy).
 */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

/**
 * Percentile bands (5, 25, 50, 75, 95) per level and sample time, and the probability that each
 * level is below its quasi-extinction threshold at or before each time (population viability
 * practice: Ginzburg et al. 1982, Risk Analysis 2:171–181), from all members in index order.
 */
export function summariseEnsemble(
  req: EnsembleRequest,
  series: Float64Array,
  crossings: Float64Array,
): EnsembleResult {
  return assembleEnsemble(req, bandColumns(req, series, 0, bandColumnCount(req)), crossings);
}

/** Columns of the bands: one per level and sample time, column c = level · samples + sample. */
export function bandColumnCount(req: EnsembleRequest): number {
  return req.model.levels.length * req.samples;
}

/**
 * The band percentiles of columns [from, to): each column's values over all members, sorted,
 * then {@link BAND_PERCENTILES} by {@link quantileSorted}, five values per column in column
 * order. A column needs every member but no other column, so any split of the columns gives
 * the same numbers (the pool computes them in its workers).
 */
export function bandColumns(
  req: EnsembleRequest,
  series: Float64Array,
  from: number,
  to: number,
): Float64Array {
  const S = req.samples;
  const n = req.model.levels.length;
  const M = req.members;
  const column = new Float64Array(M);
  const out = new Float64Array((to - from) * BAND_PERCENTILES.length);
  let k = 0;
  for (let c = from; c < to; c++) {
    const i = Math.floor(c / S);
    const s = c - i * S;
    for (let m = 0; m < M; m++) column[m] = series[(m * S + s) * n + i]!;
    column.sort();
    for (const p of BAND_PERCENTILES) out[k++] = quantileSorted(column, p / 100);
  }
  return out;
}

/** The result from every column's percentiles (column order) and the members' crossing times. */
export function assembleEnsemble(
  req: EnsembleRequest,
  quantiles: Float64Array,
  crossings: Float64Array,
): EnsembleResult {
  const times = ensembleTimes(req.horizon, req.samples);
  const S = times.length;
  const ids = req.model.levels.map((l) => l.id);
  const n = ids.length;
  const M = req.members;
  const P = BAND_PERCENTILES.length;
  const thr = extinctionThresholds(req.model, req.extinction);
  const bands: Record<string, PercentileBands> = {};
  const belowThreshold: Record<string, number[]> = {};
  const thresholds: Record<string, number> = {};
  ids.forEach((id, i) => {
    const b: PercentileBands = { p5: [], p25: [], p50: [], p75: [], p95: [] };
    for (let s = 0; s < S; s++) {
      BAND_PERCENTILES.forEach((p, j) => b[`p${p}`].push(quantiles[(i * S + s) * P + j]!));
    }
    bands[id] = b;
    const first = Float64Array.from({ length: M }, (_, m) => crossings[m * n + i]!).sort();
    let k = 0;
    belowThreshold[id] = times.map((t) => {
      while (k < M && first[k]! <= t) k++;
      return k / M;
    });
    thresholds[id] = thr[i]!;
  });
  return { times, bands, belowThreshold, thresholds, members: M, seed: req.seed };
}
