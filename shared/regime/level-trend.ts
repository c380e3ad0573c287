import type { Dop853 } from '../integrate/dop853';

/** Each level's exponential trend over a window: d(ln N)/dt fitted, with its standard error. */
export interface LevelTrends {
  /** Least-squares slope of ln(the parts' mean N) against time, per model time unit. */
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
 * attractor away from 0 has a bounded logarithm, so its long-run exponential rate is 0; a level
 * whose attractor lies on N = 0 declines at the boundary attractor's invasion rate (its
 * per-capita growth rate averaged along that attractor; common practice in invasion analysis),
 * a negative constant. The estimate: the mean of N over each of {@link TREND_PARTS} equal parts
 * of the window (trapezoid rule over the accepted steps, a step split where it crosses a part's
 * end), then the least-squares slope of the logarithms of those means against the parts'
 * midpoints. For N = e^{λt}·p(t) with p periodic the part means are e^{λt} times a bounded factor,
 * so the slope is λ with the oscillation's phase averaged out (the naive ln N(T) − ln N(0) keeps
 * it); a damped oscillation around a positive level has means that stay put. Taking logarithms
 * of the ten means, not of N at every step, keeps the per-step cost to a multiply-add per level.
 * Call {@link observe} from a step callback on a run from t = 0 to `window`; no allocation.
 */
export class LevelTrend {
  private readonly sums: Float64Array;
  private readonly part: number;

  constructor(
    readonly dimension: number,
    readonly window: number,
  ) {
    this.sums = new Float64Array(TREND_PARTS * dimension);
    this.part = window / TREND_PARTS;
  }

  private steps = 0;

  /** Adds the step just accepted (times relative to the window's start). */
  observe(step: Dop853): void {
    const n = this.dimension;
    const t0 = step.tOld;
    const t1 = step.tNew;
    const yOld = step.yOld;
    const yNew = step.yNew;
    const h = t1 - t0;
    this.steps++;
    let a = t0;
    while (a < t1) {
      const k = Math.min(TREND_PARTS - 1, Math.floor(a / this.part));
      let b = k === TREND_PARTS - 1 ? t1 : Math.min(t1, (k + 1) * this.part);
      if (b <= a) b = t1; // a part's end rounded onto a: the rest of the step stays in part k
      // N taken linear across the step: the trapezoid of the piece [a, b].
      const wa = (a - t0) / h;
      const wb = (b - t0) / h;
      const off = k * n;
      for (let i = 0; i < n; i++) {
        const y0 = yOld[i]!;
        const d = yNew[i]! - y0;
        this.sums[off + i] = this.sums[off + i]! + (y0 + 0.5 * (wa + wb) * d) * (b - a);
      }
      a = b;
    }
  }

  /** The fitted rates and their errors (NaN before any step). */
  trends(): LevelTrends {
    const n = this.dimension;
    const p = TREND_PARTS;
    const rates: number[] = [];
    const standardErrors: number[] = [];
    const mid = (k: number) => (k + 0.5) * this.part - this.window / 2;
    let stt = 0;
    for (let k = 0; k < p; k++) stt += mid(k) ** 2;
    const logs = new Float64Array(p);
    for (let i = 0; i < n; i++) {
      let mean = 0;
      for (let k = 0; k < p; k++) {
        logs[k] = safeLog(this.sums[k * n + i]! / this.part);
        mean += logs[k]! / p;
      }
      let sty = 0;
      for (let k = 0; k < p; k++) sty += mid(k) * (logs[k]! - mean);
      const slope = sty / stt;
      let ss = 0;
      for (let k = 0; k < p; k++) ss += (logs[k]! - mean - slope * mid(k)) ** 2;
      const ok = this.steps > 0;
      rates.push(ok ? slope : Number.NaN);
      standardErrors.push(ok ? Math.sqrt(ss / (p - 2) / stt) : Number.NaN);
    }
    return { rates, standardErrors, window: this.window };
  }
}

/** ln of a part's mean, a mean ≤ 0 (a level already gone) taken as the smallest double. */
const safeLog = (v: number) => Math.log(Math.max(v, Number.MIN_VALUE));
