import type { Dop853AttemptFunction } from '../integrate/dop853-options';
import type { ChainModel } from './chain-model';

/**
 * The compiled right-hand side of a chain: allocation-free kernels over Float64Array, in level
 * order. Implementations write into buffers the caller owns and never keep references to them.
 */
export interface ChainKernel {
  /** Number of levels, 2..4. */
  readonly dimension: number;
  /** Level ids in order. */
  readonly ids: readonly string[];
  /** Writes dy/dt at (t, y) into `dydt`; allocation-free. */
  rhs(t: number, y: Float64Array, dydt: Float64Array): void;
  /** Writes the analytic Jacobian ∂f_i/∂y_j at (t, y) into `jac`, row-major n×n. */
  jacobian(t: number, y: Float64Array, jac: Float64Array): void;
  /**
   * A DOP853 step attempt with this right-hand side fused in (pass it as the `attempt` option
   * of `Dop853.integrate` together with `rhs`); only specialised kernels have one.
   */
  readonly attempt?: Dop853AttemptFunction;
}

/**
 * Width of the quota taper as a fraction of each level's reference scale (see
 * {@link levelScales}): a quota H is taken as H·N/(N + ε·S). At N = ε·S half the quota is
 * landed; at 10·ε·S, 91 %. The harvest then vanishes linearly as N → 0, so N = 0 stays
 * invariant and no level can turn negative.
 */
export const QUOTA_TAPER_FRACTION = 0.01;

/**
 * Each level's natural magnitude in its own unit: S₀ = K, Sⱼ = eⱼ·Sⱼ₋₁ (the state scales of the
 * Hastings–Powell nondimensionalisation). Used for the quota taper, the absolute tolerance floor
 * and the blow-up guard.
 */
export function levelScales(model: ChainModel): Float64Array {
  const n = model.levels.length;
  const s = new Float64Array(n);
  s[0] = model.levels[0].carryingCapacity;
  for (let j = 1; j < n; j++) {
    const level = model.levels[j] as { efficiency: number };
    s[j] = level.efficiency * s[j - 1]!;
  }
  return s;
}

/**
 * Compiles a validated model into its kernel. Level 0 grows logistically; level j ≥ 1 eats
 * level j-1 with g(N) = a·N/(1+a·h·N) (type III: a·N²/(1+a·h·N²)), gains e·g(N) per capita
 * and dies at m; effort harvest F·N, tapered quota H·N/(N+ε·S), constant stocking.
 */
export function compileChain(model: ChainModel): ChainKernel {
  const n = model.levels.length;
  const ids = Object.freeze(model.levels.map((l) => l.id));
  const r = model.levels[0].growthRate;
  const invK = 1 / model.levels[0].carryingCapacity;
  // Index j holds the parameters of consumer j (eating j-1); index 0 unused.
  const a = new Float64Array(n);
  const ah = new Float64Array(n);
  const e = new Float64Array(n);
  const m = new Float64Array(n);
  const type3 = new Uint8Array(n);
  for (let j = 1; j < n; j++) {
    const c = model.levels[j] as {
      attackRate: number;
      handlingTime: number;
      efficiency: number;
      mortality: number;
      response?: 'type2' | 'type3';
    };
    a[j] = c.attackRate;
    ah[j] = c.attackRate * c.handlingTime;
    e[j] = c.efficiency;
    m[j] = c.mortality;
    type3[j] = c.response === 'type3' ? 1 : 0;
  }
  const effort = new Float64Array(n);
  const quota = new Float64Array(n);
  const stock = new Float64Array(n);
  const index = new Map(ids.map((id, i) => [id, i]));
  for (const rule of model.harvest ?? []) {
    const i = index.get(rule.level)!;
    if (rule.kind === 'effort') effort[i]! += rule.rate;
    else quota[i]! += rule.amount;
  }
  for (const rule of model.stocking ?? []) stock[index.get(rule.level)!]! += rule.amount;
  const taper = levelScales(model).map((s) => s * QUOTA_TAPER_FRACTION);
  // Per-call scratch: g[j] = feeding rate of one consumer j, dg[j] = dg/dN at N_{j-1}.
  const g = new Float64Array(n + 1);
  const dg = new Float64Array(n + 1);

  const feed = (y: Float64Array): void => {
    for (let j = 1; j < n; j++) {
      const x = y[j - 1]!;
      if (type3[j]) {
        const den = 1 / (1 + ah[j]! * x * x);
        g[j] = a[j]! * x * x * den;
        dg[j] = 2 * a[j]! * x * den * den;
      } else {
        const den = 1 / (1 + ah[j]! * x);
        g[j] = a[j]! * x * den;
        dg[j] = a[j]! * den * den;
      }
    }
    g[n] = 0;
    dg[n] = 0;
  };

  return {
    dimension: n,
    ids,
    rhs(_t: number, y: Float64Array, dydt: Float64Array): void {
      feed(y);
      for (let j = 0; j < n; j++) {
        const x = y[j]!;
        const up = j + 1 < n ? g[j + 1]! * y[j + 1]! : 0;
        const own = j === 0 ? r * x * (1 - x * invK) : (e[j]! * g[j]! - m[j]!) * x;
        let d = own - up - effort[j]! * x + stock[j]!;
        if (quota[j]! > 0) d -= (quota[j]! * x) / (x + taper[j]!);
        dydt[j] = d;
      }
    },
    jacobian(_t: number, y: Float64Array, jac: Float64Array): void {
      feed(y);
      jac.fill(0, 0, n * n);
      for (let j = 0; j < n; j++) {
        const x = y[j]!;
        const row = j * n;
        let diag = j === 0 ? r * (1 - 2 * x * invK) : e[j]! * g[j]! - m[j]!;
        diag -= effort[j]!;
        if (j + 1 < n) {
          diag -= dg[j + 1]! * y[j + 1]!;
          jac[row + j + 1] = -g[j + 1]!;
        }
        if (quota[j]! > 0) {
          const den = x + taper[j]!;
          diag -= (quota[j]! * taper[j]!) / (den * den);
        }
        if (j > 0) jac[row + j - 1] = e[j]! * dg[j]! * x;
        jac[row + j] = diag;
      }
    },
  };
}
