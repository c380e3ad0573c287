import { DOP853_TABLEAU, type StageCombination } from './dop853-step';

/**
 * Source of a block that evaluates an autonomous right-hand side: it reads the state from the
 * expressions `inputs[i]` and assigns the derivative to the variables `outputs[i]` (declared
 * by the caller). Its own names must be block-scoped (`const` inside `{ … }`).
 */
export type RhsBlock = (inputs: readonly string[], outputs: readonly string[]) => string;

/** A number as source text that parses back to the same double. */
const literal = (v: number): string => `(${String(v)})`;

/** `Σ weight·stage` over the combination for component i, in the order the tableau sums it. */
function combine(terms: StageCombination, i: number): string {
  return terms.map(([stage, w]) => `${literal(w)} * k${stage}_${i}`).join(' + ');
}

/**
 * Source of a function with the signature and result of `dop853Attempt` for an autonomous
 * system of `n` components whose right-hand side is `rhsBlock`: the eleven stages, the new state
 * and the error norm computed in local variables, without calls or loops, the stages then stored
 * into `k[1..11]` for the dense output. Every sum is taken in the same order as
 * `dop853Attempt`, so with the same right-hand side the two agree bit for bit (the spec beside
 * this file checks it). For code generated with `new Function` by the long analysis runs, where
 * profiling showed the generic step's short loops, array accesses and eleven calls taking most
 * of the time; the caller's `rhs` argument is not used.
 */
export function fusedDop853AttemptSource(n: number, rhsBlock: RhsBlock): string {
  const { stages, weights, error5, error3 } = DOP853_TABLEAU;
  const components = Array.from({ length: n }, (_, i) => i);
  const lines: string[] = [];
  lines.push(`if (n !== ${n}) throw new RangeError('this step attempt is for ${n} components');`);
  for (const i of components) lines.push(`const y_${i} = y[${i}];`);
  for (const i of components) lines.push(`const k0_${i} = k[0][${i}];`);
  for (let s = 1; s < stages.length; s++) {
    const outs = components.map((i) => `k${s}_${i}`);
    lines.push(`let ${outs.join(', ')};`);
    const inputs = components.map((i) => `y_${i} + h * (${combine(stages[s]!, i)})`);
    lines.push(rhsBlock(inputs, outs));
  }
  for (let s = 1; s < stages.length; s++) {
    lines.push(
      `{ const ks = k[${s}]; ${components.map((i) => `ks[${i}] = k${s}_${i};`).join(' ')} }`,
    );
  }
  lines.push(`const m = s.errorComponents, atol = s.atol, rtol = s.rtol;`);
  lines.push(`let err5 = 0, err3 = 0;`);
  for (const i of components) {
    lines.push(`{
  const b = ${combine(weights, i)};
  const yni = y_${i} + h * b;
  yn[${i}] = yni;
  if (${i} < m) {
    const sk = atol + rtol * Math.max(Math.abs(y_${i}), Math.abs(yni));
    const e3 = b${error3.map(([st, w]) => ` - ${literal(w)} * k${st}_${i}`).join('')};
    const e5 = ${combine(error5, i)};
    err3 += (e3 / sk) * (e3 / sk);
    err5 += (e5 / sk) * (e5 / sk);
  }
}`);
  }
  lines.push(`let deno = err5 + 0.01 * err3;`);
  lines.push(`if (deno <= 0) deno = 1;`);
  lines.push(`return Math.abs(h) * err5 * Math.sqrt(1 / (m * deno));`);
  return `function fusedDop853Attempt(rhs, n, t, h, y, yn, yt, k, s) {\n${lines.join('\n')}\n}`;
}
