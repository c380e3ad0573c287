import type { ChainModel } from '../model/chain-model';
import {
  compileChain,
  levelScales,
  QUOTA_TAPER_FRACTION,
  type ChainKernel,
} from '../model/chain-kernel';
import { fusedDop853AttemptSource, type RhsBlock } from '../integrate/dop853-fused';

/**
 * The chain kernel specialised to one model for the long analysis runs: the same equations as
 * `compileChain` (which stays the reference, see the spec beside this file), unrolled for the
 * model's level count with every zero term (no harvest, no stocking, type II response) dropped
 * and the parameters bound as constants. Profiling the 100-value b1 sweep showed the generic
 * kernel's loops and branches taking about two thirds of the run; unrolled, the right-hand side
 * is no longer the limit. Only numbers from the validated model enter the generated function, as
 * arguments, never as source text.
 */
export function specialiseChain(model: ChainModel): ChainKernel {
  const reference = compileChain(model);
  const n = model.levels.length;
  const P: number[] = [];
  const param = (v: number): string => {
    P.push(v);
    return `P${P.length - 1}`;
  };
  const effort = new Array<number>(n).fill(0);
  const quota = new Array<number>(n).fill(0);
  const stock = new Array<number>(n).fill(0);
  const index = new Map(model.levels.map((l, i) => [l.id, i]));
  for (const h of model.harvest ?? []) {
    const i = index.get(h.level)!;
    if (h.kind === 'effort') effort[i]! += h.rate;
    else quota[i]! += h.amount;
  }
  for (const s of model.stocking ?? []) stock[index.get(s.level)!]! += s.amount;
  const taper = levelScales(model).map((s) => s * QUOTA_TAPER_FRACTION);

  const feed: string[] = []; // g_j, dg_j of consumer j on x_{j-1}
  for (let j = 1; j < n; j++) {
    const c = model.levels[j] as {
      attackRate: number;
      handlingTime: number;
      efficiency: number;
      mortality: number;
      response?: string;
    };
    const a = param(c.attackRate);
    const ah = param(c.attackRate * c.handlingTime);
    const x = `x${j - 1}`;
    if (c.response === 'type3') {
      feed.push(`const n${j} = 1 / (1 + ${ah} * ${x} * ${x});`);
      feed.push(`const g${j} = ${a} * ${x} * ${x} * n${j};`);
      feed.push(`const dg${j} = 2 * ${a} * ${x} * n${j} * n${j};`);
    } else {
      feed.push(`const n${j} = 1 / (1 + ${ah} * ${x});`);
      feed.push(`const g${j} = ${a} * ${x} * n${j};`);
      feed.push(`const dg${j} = ${a} * n${j} * n${j};`);
    }
  }
  const rate = param(model.levels[0].growthRate);
  const invK = param(1 / model.levels[0].carryingCapacity);
  const e: string[] = [''];
  const m: string[] = [''];
  for (let j = 1; j < n; j++) {
    const c = model.levels[j] as { efficiency: number; mortality: number };
    e.push(param(c.efficiency));
    m.push(param(c.mortality));
  }
  const rhsLines: string[] = [];
  const rhsExpressions: string[] = [];
  const jacLines: string[] = [];
  for (let j = 0; j < n; j++) {
    const x = `x${j}`;
    let d =
      j === 0 ? `${rate} * ${x} * (1 - ${x} * ${invK})` : `(${e[j]} * g${j} - ${m[j]}) * ${x}`;
    let diag = j === 0 ? `${rate} * (1 - 2 * ${x} * ${invK})` : `${e[j]} * g${j} - ${m[j]}`;
    if (j + 1 < n) {
      d += ` - g${j + 1} * x${j + 1}`;
      jacLines.push(`jac[${j * n + j + 1}] = -g${j + 1};`);
    }
    if (effort[j]! !== 0) {
      d += ` - ${param(effort[j]!)} * ${x}`;
      diag += ` - ${param(effort[j]!)}`;
    }
    if (j + 1 < n) diag += ` - dg${j + 1} * x${j + 1}`;
    if (stock[j]! !== 0) d += ` + ${param(stock[j]!)}`;
    if (quota[j]! > 0) {
      const q = param(quota[j]!);
      const w = param(taper[j]!);
      d += ` - (${q} * ${x}) / (${x} + ${w})`;
      diag += ` - (${q} * ${w}) / ((${x} + ${w}) * (${x} + ${w}))`;
    }
    if (j > 0) jacLines.push(`jac[${j * n + j - 1}] = ${e[j]} * dg${j} * ${x};`);
    rhsLines.push(`dydt[${j}] = ${d};`);
    rhsExpressions.push(d);
    jacLines.push(`jac[${j * n + j}] = ${diag};`);
  }
  const load = Array.from({ length: n }, (_, i) => `const x${i} = y[${i}];`).join('\n');
  const consts = P.map((_, i) => `const P${i} = P[${i}];`).join('\n');
  // The same feeding lines and derivatives, on a stage's state given as expressions.
  const rhsBlock: RhsBlock = (inputs, outputs) =>
    `{\n${inputs.map((v, i) => `const x${i} = ${v};`).join('\n')}\n${feed.join('\n')}\n` +
    `${rhsExpressions.map((d, j) => `${outputs[j]} = ${d};`).join('\n')}\n}`;
  const source = `${consts}
return {
  attempt: ${fusedDop853AttemptSource(n, rhsBlock)},
  rhs(t, y, dydt) {
${load}
${feed.join('\n')}
${rhsLines.join('\n')}
  },
  jacobian(t, y, jac) {
${load}
${feed.join('\n')}
jac.fill(0, 0, ${n * n});
${jacLines.join('\n')}
  },
};`;
  const built = new Function('P', source)(Float64Array.from(P)) as Required<
    Pick<ChainKernel, 'rhs' | 'jacobian' | 'attempt'>
  >;
  return {
    dimension: reference.dimension,
    ids: reference.ids,
    rhs: built.rhs,
    jacobian: built.jacobian,
    attempt: built.attempt,
  };
}
