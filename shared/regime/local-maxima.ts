import type { Dop853 } from '../integrate/dop853';

/**
 * Records the local maxima of one component from a DOP853 run, each located inside its step
 * from the order-7 dense output (the root of the interpolant's exact derivative), not taken as
 * the largest sample. A maximum is bracketed when the component's derivative goes from > 0 at
 * the step start to <= 0 at its end; at the tolerances used here steps are far shorter than the
 * oscillation, so two extrema inside one step do not occur (common practice: event location by
 * sign change of the derivative). Buffers grow only when a maximum is found, never per step.
 */
export class LocalMaxima {
  /** Number of maxima found so far. */
  count = 0;
  private times: Float64Array;
  private values: Float64Array;
  private readonly c = new Float64Array(8);

  /**
   * @param component index of the observed component.
   * @param capacity most maxima kept; later ones are dropped and counted in `dropped`.
   */
  constructor(
    readonly component: number,
    private readonly capacity = 100_000,
  ) {
    this.times = new Float64Array(64);
    this.values = new Float64Array(64);
  }

  /** Maxima beyond `capacity` that were not kept. */
  dropped = 0;

  /** Forgets every maximum found so far. */
  reset(): void {
    this.count = 0;
    this.dropped = 0;
  }

  /** Call from a step callback: checks the step just accepted for a maximum. */
  observe(step: Dop853): void {
    const i = this.component;
    if (!(step.fOld[i]! > 0 && step.fNew[i]! <= 0)) return;
    step.denseMonomials(i, this.c);
    const theta = this.argmax();
    const c = this.c;
    let v = c[7]!;
    for (let j = 6; j >= 0; j--) v = v * theta + c[j]!;
    // Guards against a rounding-level dip of the interpolant below a step end.
    const y0 = step.yOld[i]!;
    const y1 = step.yNew[i]!;
    const value = Math.max(v, y0, y1);
    this.push(step.tOld + theta * (step.tNew - step.tOld), value);
  }

  /** Times of the maxima kept (a copy). */
  maximaTimes(): number[] {
    return Array.from(this.times.subarray(0, Math.min(this.count, this.capacity)));
  }

  /** Values of the maxima kept (a copy). */
  maximaValues(): number[] {
    return Array.from(this.values.subarray(0, Math.min(this.count, this.capacity)));
  }

  /**
   * Root of P'(θ) on [0, 1] where P'(0) > 0 >= P'(1): safeguarded Newton (bisection whenever
   * Newton leaves the bracket), converging to machine precision in a few iterations.
   */
  private argmax(): number {
    const c = this.c;
    let lo = 0;
    let hi = 1;
    let x = 0.5;
    for (let it = 0; it < 60; it++) {
      let d1 = 7 * c[7]!;
      let d2 = 42 * c[7]!;
      for (let j = 6; j >= 1; j--) d1 = d1 * x + j * c[j]!;
      for (let j = 6; j >= 2; j--) d2 = d2 * x + j * (j - 1) * c[j]!;
      if (d1 > 0) lo = x;
      else hi = x;
      let next = d2 < 0 ? x - d1 / d2 : 0.5 * (lo + hi);
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      if (Math.abs(next - x) <= 1e-15 || hi - lo <= 1e-15) return next;
      x = next;
    }
    return x;
  }

  private push(t: number, v: number): void {
    if (this.count >= this.capacity) {
      this.dropped++;
      return;
    }
    if (this.count === this.times.length) {
      const times = new Float64Array(this.times.length * 2);
      const values = new Float64Array(this.values.length * 2);
      times.set(this.times);
      values.set(this.values);
      this.times = times;
      this.values = values;
    }
    this.times[this.count] = t;
    this.values[this.count] = v;
    this.count++;
  }
}
