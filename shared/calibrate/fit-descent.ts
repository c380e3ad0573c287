import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import type { Matrix } from 'ml-matrix';
import { fromUnit, toUnit, type FitProblem } from './fit-problem';

/** Where one descent ended. */
export interface Descent {
  /** The best vector found, in unit-box coordinates (every coordinate of the problem). */
  readonly u: number[];
  /** Its weighted sum of squares (over the focused window's points only, when focused). */
  readonly ss: number;
  /** Levenberg–Marquardt steps tried (accepted or not). */
  readonly iterations: number;
}

/** A descent over one segment's start only, the rest of the vector held fixed. */
export interface Focus {
  readonly window: number;
  /** The coordinates (indices) that move: that segment's start values. */
  readonly columns: readonly number[];
}

/** Damping bounds and factors of the accept-or-reject rule (those of ml-levenberg-marquardt). */
const DAMPING = { first: 1e-2, min: 1e-7, max: 1e7, up: 11, down: 9 } as const;

interface Evaluated {
  readonly values: number[];
  readonly r: Float64Array;
}

/**
 * Levenberg–Marquardt descents over a fit problem's unit box. Each step is one iteration of
 * ml-levenberg-marquardt (the damped Gauss–Newton step, box projection and the problem's own
 * block-structured Jacobian); around it runs Marquardt's rule (Marquardt 1963, recalled from
 * memory): a step that raises the sum of squares is refused and the damping raised, one that
 * lowers it is kept and the damping lowered. The package on its own walks on from a refused
 * step, which in a segmented chaotic fit can carry a segment's start into another basin of the
 * least-squares surface and leave it there.
 */
export class FitDescent {
  /** The points fitted (indices), their weighted log observations, and every point's. */
  private readonly x: number[];
  private readonly yData: number[];
  private readonly y: number[];
  /** The current vector's and the last trial's residuals (a refused trial returns to it). */
  private readonly seen = new Map<string, Evaluated>();
  private lastJacobian?: { key: string; J: Matrix };

  constructor(
    private readonly problem: FitProblem,
    private readonly checkAbort: () => void,
    private readonly focus?: Focus,
  ) {
    const points = focus
      ? [...problem.layout.windows[focus.window]!.points]
      : problem.layout.points.map((_, i) => i);
    this.x = points;
    this.y = problem.layout.points.map((p) => p.weight * p.logObserved);
    this.yData = points.map((i) => this.y[i]!);
  }

  /** Residuals of a full unit vector, computed once per vector. */
  private evaluate(u: readonly number[]): Evaluated & { key: string } {
    const key = u.join(',');
    let found = this.seen.get(key);
    if (!found) {
      this.checkAbort();
      const values = u.map((v, j) => fromUnit(this.problem.coords[j]!, v));
      found = { values, r: this.problem.residuals(values, this.focus?.window) };
      if (this.seen.size >= 2) this.seen.delete(this.seen.keys().next().value!);
      this.seen.set(key, found);
    }
    return { key, ...found };
  }

  private sumOfSquares(r: Float64Array): number {
    let s = 0;
    for (const i of this.x) s += r[i]! * r[i]!;
    return s;
  }

  /** Descends from `start` for at most `maxIterations` steps; `onStep(k)` after each. */
  descend(start: readonly number[], maxIterations: number, onStep?: (k: number) => void): Descent {
    const moving = this.focus?.columns ?? this.problem.coords.map((_, j) => j);
    const full = (m: readonly number[]) => {
      const u = [...start];
      moving.forEach((j, k) => (u[j] = m[k]!));
      return u;
    };
    // The package fits y = f(x) point by point: x is the point's index, y its weighted log
    // observation and f(i) = y[i] − r[i]; it sees the moving coordinates only.
    const model = (m: number[]) => {
      const { r } = this.evaluate(full(m));
      return (i: number) => this.y[i]! - r[i]!;
    };
    const jacobianFunction = (m: number[]) => {
      const { key, values, r } = this.evaluate(full(m));
      if (this.lastJacobian?.key !== key) {
        this.checkAbort();
        const J = this.problem.jacobian(values, r, 'unit', false, this.focus?.columns);
        this.lastJacobian = { key, J };
      }
      const J = this.lastJacobian.J;
      return (i: number) => moving.map((j) => -J.get(i, j)); // ∂f/∂u = −∂r/∂u
    };
    let m = moving.map((j) => start[j]!);
    let ss = this.sumOfSquares(this.evaluate(full(m)).r);
    let damping: number = DAMPING.first;
    let k = 0;
    while (k < maxIterations) {
      k++;
      const step = levenbergMarquardt({ x: this.x, y: this.yData }, model, {
        initialValues: m,
        minValues: moving.map(() => 0),
        maxValues: moving.map(() => 1),
        jacobianFunction,
        damping,
        maxIterations: 1,
        errorTolerance: 0,
      });
      onStep?.(k);
      if (step.parameterError < ss) {
        const gain = ss - step.parameterError;
        m = step.parameterValues;
        ss = step.parameterError;
        damping = Math.max(damping / DAMPING.down, DAMPING.min);
        // Stop when a step gains less than one part in 10⁹: the optimum is reached.
        if (gain <= 1e-9 * Math.max(ss, 1e-12)) break;
      } else {
        if (damping >= DAMPING.max) break;
        damping = Math.min(damping * DAMPING.up, DAMPING.max);
      }
    }
    return { u: full(m), ss, iterations: k };
  }
}

/**
 * First starts of every segment for one descent: each segment's start is fitted alone (the
 * parameters held at `u`'s values), once from the surveys at its first row and once from the
 * state the previous segment's fitted trajectory reaches there (continuity, as multiple
 * shooting converges to), and the better of the two is kept. A survey that missed badly (one
 * slow level drawn two standard errors low) can put a segment's start in another basin of the
 * least-squares surface; the carried state usually lies in the right one.
 */
export function segmentFirstStarts(
  problem: FitProblem,
  u: readonly number[],
  maxIterations: number,
  checkAbort: () => void,
  onSegment?: (done: number, of: number) => void,
): number[] {
  const { coords, layout } = problem;
  let current = [...u];
  layout.windows.forEach((w, window) => {
    const columns = coords.flatMap((c, j) => (c.window === window ? [j] : []));
    if (!columns.length) return;
    const focus = new FitDescent(problem, checkAbort, { window, columns });
    const candidates = [current];
    if (window > 0) {
      const values = current.map((v, j) => fromUnit(coords[j]!, v));
      const carried = problem.carry(values, window - 1, w.t0);
      if (carried) {
        const next = [...current];
        for (const j of columns) {
          const c = coords[j]!;
          next[j] = Math.min(1, Math.max(0, toUnit(c, carried[c.level!]!)));
        }
        candidates.push(next);
      }
    }
    let best: Descent | undefined;
    for (const c of candidates) {
      const found = focus.descend(c, maxIterations);
      if (!best || found.ss < best.ss) best = found;
    }
    current = best!.u;
    onSegment?.(window + 1, layout.windows.length);
  });
  return current;
}
