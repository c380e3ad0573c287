import type { Dop853 } from '../integrate/dop853';

/** Each level's exponential trend over a window: d(ln N)/dt fitted, with its standard error. */
export interface LevelTrends {
  /** Least-squares slope of the parts' mean ln N against time, per model time unit. */
  readonly rates: number[];
  /** Standard error of each slope from the fit's residuals. */
  readonly standardErrors: number[];
  /** Length of the window the slopes were fitted over. */
  readonly window: number;
}

/** Equal parts of the window whose mean logarithms are fitted; see {@link LevelTrend}. */
export const TREND_PARTS = 10;

/**
 * Measures whether each level is dying out over a window. A level that persists on a bounded
 * attractor away from 0 has a bounded logarithm, so the long-run mean of d(ln N)/dt is 0; a level
 * whose attractor lies on N = 0 declines at the boundary attractor's invasion rate (its
 * per-capita growth rate averaged along that attractor; common practice in invasion analysis),
 * a negative constant. The estimate: the mean of ln N over each of {@link TREND_PARTS} equal
 * parts of the window (integrated by the trapezoid rule over the accepted steps, a step split
 * where it crosses a part's end), then the least-squares slope of those means against the parts'
 * midpoints. Averaging over parts removes the oscillation's phase, which decides the naive
 * ln N(T) − ln N(0); a damped oscillation around a positive level has means that stay put.
 * Call {@link observe} from a step callback on a run from t = 0 to `window`; no allocation.
 */
export class LevelTrend {
  private readonly sums: Float64Array;
  private readonly logOld: Float64Array;
  private readonly part: number;
  private started = false;

  constructor(
    readonly dimension: number,
    readonly window: number,
  ) {
    this.sums = new Float64Array(TREND_PARTS * dimension);
    this.logOld = new Float64Array(dimension);
    this.part = window / TREND_PARTS;
  }

  /** Adds the step just accepted (times relative to the window's start). */
  observe(step: Dop853): void {
    const n = this.dimension;
    const t0 = step.tOld;
    const t1 = step.tNew;
    const logOld = this.logOld;
    if (!this.started) {
      for (let i = 0; i < n; i++) logOld[i] = safeLog(step.yOld[i]!);
      this.started = true;
    }
    const yNew = step.yNew;
    const h = t1 - t0;
    let a = t0;
    while (a < t1) {
      const k = Math.min(TREND_PARTS - 1, Math.floor(a / this.part));
      let b = k === TREND_PARTS - 1 ? t1 : Math.min(t1, (k + 1) * this.part);
      if (b <= a) b = t1; // a part's end rounded onto a: the rest of the step stays in part k
      // ln N taken linear across the step: the trapezoid of the piece [a, b].
      const wa = (a - t0) / h;
      const wb = (b - t0) / h;
      for (let i = 0; i < n; i++) {
        const d = safeLog(yNew[i]!) - logOld[i]!;
        const la = logOld[i]! + wa * d;
        const lb = logOld[i]! + wb * d;
        this.sums[k * n + i] = this.sums[k * n + i]! + 0.5 * (la + lb) * (b - a);
      }
      a = b;
    }
    for (let i = 0; i < n; i++) logOld[i] = safeLog(yNew[i]!);
  }

  /** The fitted rates and their errors (NaN before any step). */
  trends(): LevelTrends {
    const n = this.dimension;
    const p = TREND_PARTS;
    const rates: number[] = [];
    const standardErrors: number[] = [];
    const midMean = this.window / 2;
    let stt = 0;
    for (let k = 0; k < p; k++) stt += ((k + 0.5) * this.part - midMean) ** 2;
    for (let i = 0; i < n; i++) {
      if (!this.started) {
        rates.push(Number.NaN);
        standardErrors.push(Number.NaN);
        continue;
      }
      let mean = 0;
      for (let k = 0; k < p; k++) mean += this.sums[k * n + i]! / this.part / p;
      let sty = 0;
      for (let k = 0; k < p; k++) {
        sty += ((k + 0.5) * this.part - midMean) * (this.sums[k * n + i]! / this.part - mean);
      }
      const slope = sty / stt;
      let ss = 0;
      for (let k = 0; k < p; k++) {
        const fit = mean + slope * ((k + 0.5) * this.part - midMean);
        ss += (this.sums[k * n + i]! / this.part - fit) ** 2;
      }
      rates.push(slope);
      standardErrors.push(Math.sqrt(ss / (p - 2) / stt));
    }
    return { rates, standardErrors, window: this.window };
  }
}

/** ln N, with N ≤ 0 (a level already gone) taken as the smallest positive double. */
const safeLog = (v: number) => Math.log(Math.max(v, Number.MIN_VALUE));
