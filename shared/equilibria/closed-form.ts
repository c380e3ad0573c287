import type { ChainModel, ConsumerLevel } from '../model/chain-model';

/**
 * Whether the chain structure gives every partial-chain equilibrium in closed form: all
 * responses type II, no quota and no stocking (effort harvest only adds to mortality).
 * Supports up to three levels present; a four-level interior needs the numerical fallback.
 */
export function hasClosedForm(model: ChainModel): boolean {
  const consumers = model.levels.slice(1) as ConsumerLevel[];
  return (
    consumers.every((c) => (c.response ?? 'type2') === 'type2') &&
    !(model.harvest ?? []).some((h) => h.kind === 'quota' && h.amount > 0) &&
    !(model.stocking ?? []).some((s) => s.amount > 0)
  );
}

function effortBy(model: ChainModel): number[] {
  const f = model.levels.map(() => 0);
  const index = new Map(model.levels.map((l, i) => [l.id, i]));
  for (const h of model.harvest ?? []) if (h.kind === 'effort') f[index.get(h.level)!]! += h.rate;
  return f;
}

/**
 * Closed-form equilibria with levels 0..top present and the rest absent, solved from the top
 * predator down (Rosenzweig & MacArthur 1963 for two levels; the same algebra one level up for
 * three): the top level's zero-growth condition fixes its prey, the producer's isocline then
 * gives the producer (a quadratic for three levels), and the middle level's balance the top.
 * Returns every real root, feasible or not, or `undefined` when `top` is out of the closed form's
 * reach. Requires {@link hasClosedForm}.
 */
export function closedFormEquilibria(model: ChainModel, top: number): Float64Array[] | undefined {
  const n = model.levels.length;
  if (top > 2 || top >= n) return undefined;
  const { growthRate: r, carryingCapacity: K } = model.levels[0];
  const F = effortBy(model);
  const c = (j: number) => model.levels[j] as ConsumerLevel;
  const g = (j: number, x: number) =>
    (c(j).attackRate * x) / (1 + c(j).attackRate * c(j).handlingTime * x);
  // Prey density at which consumer j breaks even: e·g(N) = m + F  →  N = k / (a·(1 − h·k)).
  const breakEven = (j: number): number | undefined => {
    const k = (c(j).mortality + F[j]!) / c(j).efficiency;
    const den = c(j).attackRate * (1 - c(j).handlingTime * k);
    return k > 0 && den !== 0 ? k / den : undefined;
  };
  const state = (...v: number[]) => {
    const y = new Float64Array(n);
    v.forEach((x, i) => (y[i] = x));
    return y;
  };
  const R = r - F[0]!;
  if (top === -1) return [state()];
  if (top === 0) return [state((K * R) / r)];
  if (top === 1) {
    const x = breakEven(1);
    if (x === undefined) return [];
    // Producer isocline: r(1 − x/K) − F₀ = g₁(x)·y/x.
    const y = ((R - (r * x) / K) * (1 + c(1).attackRate * c(1).handlingTime * x)) / c(1).attackRate;
    return [state(x, y)];
  }
  const y = breakEven(2);
  if (y === undefined) return [];
  const a1 = c(1).attackRate;
  const b = a1 * c(1).handlingTime;
  const q = r / K;
  // (R − q·x)(1 + b·x) = a₁·y  →  q·b·x² + (q − R·b)·x + (a₁·y − R) = 0.
  const roots = quadraticRoots(q * b, q - R * b, a1 * y - R);
  return roots.map((x) => {
    const z = ((c(1).efficiency * g(1, x) - c(1).mortality - F[1]!) * y) / g(2, y);
    return state(x, y, z);
  });
}

/** Real roots of A·x² + B·x + C = 0 (linear when A = 0), computed without cancellation. */
export function quadraticRoots(A: number, B: number, C: number): number[] {
  if (A === 0) return B === 0 ? [] : [-C / B];
  const disc = B * B - 4 * A * C;
  if (disc < 0) return [];
  if (disc === 0) return [-B / (2 * A)];
  const qq = -0.5 * (B + Math.sign(B || 1) * Math.sqrt(disc));
  const r1 = qq / A;
  const r2 = qq === 0 ? -r1 : C / qq;
  return [r1, r2].sort((u, v) => u - v);
}
