import { validateEquilibriaRequest } from '../contract/equilibria-contract';
import { compileChain, levelScales } from '../model/chain-kernel';
import { ModelValidationError } from '../model/validation-issue';
import type { ChainModel } from '../model/chain-model';
import { stateRecord } from '../model/initial-vector';
import { classifyEquilibrium, type EquilibriumClass } from '../stability/classify-equilibrium';
import { eigenvalues, type Eigenvalue } from '../stability/eigenvalues';
import { closedFormEquilibria, hasClosedForm } from './closed-form';
import { newtonEquilibria, newtonRoot } from './newton-equilibria';

/** One equilibrium of a chain with its stability. */
export interface Equilibrium {
  /** Value of every level, by id. */
  readonly state: Record<string, number>;
  /** Whether no level is negative (an ecologically possible state). */
  readonly feasible: boolean;
  /** Jacobian eigenvalues, real part descending. */
  readonly eigenvalues: Eigenvalue[];
  /** Whether it attracts nearby states (every eigenvalue has a negative real part). */
  readonly stable: boolean;
  /** Plain-language class (stable node, stable spiral, saddle, …). */
  readonly classification: EquilibriumClass;
  /** One sentence for non-specialists. */
  readonly description: string;
  /** Ids of the levels present (non-zero), bottom up. */
  readonly present: string[];
  /** Which kind: everything extinct, producer alone, a partial chain or the full chain. */
  readonly kind: 'extinction' | 'producer-only' | 'partial-chain' | 'interior';
  /** How it was found. */
  readonly method: 'closed-form' | 'newton';
}

/** Relative distance under which two roots are the same equilibrium. */
const SAME_ROOT = 1e-7;

function isZero(v: number, scale: number): boolean {
  return Math.abs(v) <= 1e-12 * scale;
}

/**
 * Every equilibrium of the chain: extinction, producer alone, each partial chain and the
 * interior, feasible or not. Closed form where the chain structure gives one (type II responses,
 * effort harvest only, up to three levels present; see closedFormEquilibria), otherwise damped
 * Newton from many deterministic starts, de-duplicated. Each comes with its Jacobian eigenvalues
 * (ml-matrix) and a stability verdict. Sorted: feasible first, then by number of levels present.
 */
export function findEquilibria(model: ChainModel): Equilibrium[] {
  const kernel = compileChain(model);
  const n = kernel.dimension;
  const scales = levelScales(model);
  const found: { y: Float64Array; method: Equilibrium['method'] }[] = [];
  const residual = new Float64Array(n);
  const add = (y: Float64Array, method: Equilibrium['method']): void => {
    if (!y.every(Number.isFinite)) return;
    for (let i = 0; i < n; i++) if (isZero(y[i]!, scales[i]!)) y[i] = 0;
    // Zeroing rounding-level entries must leave a root; drop anything that is not one.
    kernel.rhs(0, y, residual);
    const rate = model.levels[0].growthRate;
    for (let i = 0; i < n; i++) {
      if (!(Math.abs(residual[i]!) <= 1e-10 * rate * Math.max(scales[i]!, Math.abs(y[i]!)))) return;
    }
    const dup = found.some((f) =>
      f.y.every(
        (v, i) =>
          Math.abs(v - y[i]!) <= SAME_ROOT * Math.max(scales[i]!, Math.abs(v), Math.abs(y[i]!)),
      ),
    );
    if (!dup) found.push({ y, method });
  };
  const closed = hasClosedForm(model);
  if (closed) {
    for (let top = -1; top < n; top++) {
      const roots = closedFormEquilibria(model, top);
      if (roots) for (const y of roots) add(polish(kernel, y, scales), 'closed-form');
    }
  }
  const stockedLevels = new Set(
    (model.stocking ?? []).filter((s) => s.amount > 0).map((s) => kernel.ids.indexOf(s.level)),
  );
  const stocked = stockedLevels.size > 0;
  if (!closed || n === 4) {
    for (const y of newtonEquilibria(kernel, { scales, supports: !stocked })) {
      if (closed && y.some((v, i) => isZero(v, scales[i]!))) continue; // closed form has these
      if (!chainShaped(y, scales, stockedLevels)) continue;
      add(y, 'newton');
    }
  }
  const jac = new Float64Array(n * n);
  const out = found.map(({ y, method }): Equilibrium => {
    kernel.jacobian(0, y, jac);
    const eig = eigenvalues(jac, n);
    const verdict = classifyEquilibrium(eig);
    const presentIdx = [...y].map((v, i) => (v !== 0 ? i : -1)).filter((i) => i >= 0);
    const count = presentIdx.length;
    return {
      state: stateRecord(model, y),
      feasible: y.every((v) => v >= 0),
      eigenvalues: eig,
      stable: verdict.stable,
      classification: verdict.classification,
      description: verdict.description,
      present: presentIdx.map((i) => kernel.ids[i]!),
      kind:
        count === 0
          ? 'extinction'
          : count === n
            ? 'interior'
            : count === 1 && y[0] !== 0
              ? 'producer-only'
              : 'partial-chain',
      method,
    };
  });
  return out.sort(
    (p, q) => Number(q.feasible) - Number(p.feasible) || p.present.length - q.present.length,
  );
}

/**
 * Whether every consumer present has its prey present (or is stocked): without stocking the
 * levels present are 0..p, a producer with its consumers stacked on it. Other real roots need a
 * consumer living without food, which only happens at negative densities; the chain's
 * equilibria are defined as the (partial) chains.
 */
function chainShaped(y: Float64Array, scales: Float64Array, stocked: ReadonlySet<number>): boolean {
  for (let i = 1; i < y.length; i++) {
    if (!isZero(y[i]!, scales[i]!) && isZero(y[i - 1]!, scales[i - 1]!) && !stocked.has(i))
      return false;
  }
  return true;
}

/** One or two Newton steps on a closed-form root to remove rounding; keeps it if Newton fails. */
function polish(
  kernel: ReturnType<typeof compileChain>,
  y: Float64Array,
  scales: Float64Array,
): Float64Array {
  const copy = Float64Array.from(y);
  return newtonRoot(kernel, copy, scales) &&
    copy.every((v, i) => Math.abs(v - y[i]!) <= 1e-6 * Math.max(scales[i]!, Math.abs(v)))
    ? copy
    : y;
}

/**
 * The `/equilibria` computation: validates the body `{ model }` (throwing
 * {@link ModelValidationError} with body-relative pointers) and answers `{ equilibria }`.
 */
export function computeEquilibria(body: unknown): { equilibria: Equilibrium[] } {
  const checked = validateEquilibriaRequest(body);
  if (!checked.ok) throw new ModelValidationError(checked.errors);
  return { equilibria: findEquilibria(checked.value.model) };
}
