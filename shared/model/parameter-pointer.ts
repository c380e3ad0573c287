import type { ChainModel } from './chain-model';
import { validateModel } from './model-validation';
import { ModelValidationError, formatPointer, parsePointer } from './validation-issue';

/**
 * Thrown when a parameter pointer does not name a numeric field of the model. Its single issue
 * carries the pointer that was asked for.
 */
export class ParameterPointerError extends ModelValidationError {
  /** The pointer that was asked for, as given. */
  readonly parameter: string;
  constructor(parameter: string, message: string) {
    super([{ pointer: parameter, message }]);
    this.parameter = parameter;
  }
}

function resolve(
  model: ChainModel,
  pointer: string,
): { parent: Record<string, unknown>; key: string } {
  const tokens = parsePointer(pointer);
  if (!tokens || tokens.length === 0) {
    throw new ParameterPointerError(
      pointer,
      'not a JSON Pointer to a model parameter, e.g. "/levels/1/handlingTime"',
    );
  }
  let node: unknown = model;
  for (let i = 0; i < tokens.length - 1; i++) {
    const t = tokens[i]!;
    if (Array.isArray(node)) {
      if (!/^(0|[1-9][0-9]*)$/.test(t) || Number(t) >= node.length) {
        throw new ParameterPointerError(
          pointer,
          `no element "${t}" at ${formatPointer(tokens.slice(0, i))}`,
        );
      }
      node = node[Number(t)];
    } else if (node !== null && typeof node === 'object' && Object.hasOwn(node, t)) {
      node = (node as Record<string, unknown>)[t];
    } else {
      throw new ParameterPointerError(
        pointer,
        `no field "${t}" at ${formatPointer(tokens.slice(0, i)) || '/'}`,
      );
    }
  }
  const key = tokens[tokens.length - 1]!;
  if (node === null || typeof node !== 'object' || Array.isArray(node)) {
    throw new ParameterPointerError(pointer, 'does not point at a field of an object');
  }
  const parent = node as Record<string, unknown>;
  if (!Object.hasOwn(parent, key) || typeof parent[key] !== 'number') {
    throw new ParameterPointerError(pointer, 'does not point at a numeric parameter of this model');
  }
  return { parent, key };
}

/**
 * Reads the numeric parameter at an RFC 6901 pointer into the model, e.g.
 * `/levels/1/handlingTime` or `/harvest/0/rate`. Throws {@link ParameterPointerError} if absent
 * or not a number.
 */
export function getParameter(model: ChainModel, pointer: string): number {
  const { parent, key } = resolve(model, pointer);
  return parent[key] as number;
}

/**
 * Returns a copy of the model with the parameter at `pointer` set to `value`; the input is not
 * touched. Throws {@link ParameterPointerError} for a bad pointer and
 * {@link ModelValidationError} when the value makes the model invalid (e.g. a negative rate).
 */
export function withParameter(model: ChainModel, pointer: string, value: number): ChainModel {
  resolve(model, pointer);
  const copy = structuredClone(model);
  const { parent, key } = resolve(copy, pointer);
  parent[key] = value;
  const checked = validateModel(copy);
  if (!checked.ok) throw new ModelValidationError(checked.errors);
  return checked.value;
}

/** Every numeric parameter of the model as a pointer, in document order. */
export function parameterPointers(model: ChainModel): string[] {
  const out: string[] = [];
  const walk = (node: unknown, tokens: (string | number)[]): void => {
    if (typeof node === 'number') out.push(formatPointer(tokens));
    else if (Array.isArray(node)) node.forEach((v, i) => walk(v, [...tokens, i]));
    else if (node !== null && typeof node === 'object') {
      for (const [k, v] of Object.entries(node)) walk(v, [...tokens, k]);
    }
  };
  walk(model, []);
  return out;
}
