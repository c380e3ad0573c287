/** One problem with an input, located by a JSON Pointer (RFC 6901) into the checked document. */
export interface ValidationIssue {
  /** JSON Pointer to the offending field, e.g. `/model/levels/1/attackRate`; `''` is the root. */
  readonly pointer: string;
  /** Plain-language message for the person who wrote the input. */
  readonly message: string;
}

/**
 * Thrown (or returned inside a failed result) when an input fails validation. The server turns
 * it into RFC 9457 problem details with `errors: [{ pointer, message }]`.
 */
export class ModelValidationError extends Error {
  override readonly name = 'ModelValidationError';
  /** Every problem found, each with its pointer; never empty. */
  readonly errors: readonly ValidationIssue[];

  constructor(errors: readonly ValidationIssue[]) {
    const first = errors[0];
    super(
      first
        ? `${first.pointer || '/'}: ${first.message}` +
            (errors.length > 1 ? ` (and ${errors.length - 1} more)` : '')
        : 'invalid input',
    );
    this.errors = errors.length > 0 ? errors : [{ pointer: '', message: 'invalid input' }];
  }
}

/** The outcome of a validation: the parsed value, or the list of problems. */
export type ValidationResult<T> =
  | { readonly ok: true; readonly value: T }
  | { readonly ok: false; readonly errors: readonly ValidationIssue[] };

/** Escapes one reference token for a JSON Pointer (RFC 6901 §3: `~` → `~0`, `/` → `~1`). */
export function escapePointerToken(token: string | number): string {
  return String(token).replace(/~/g, '~0').replace(/\//g, '~1');
}

/** Builds a JSON Pointer from reference tokens; `[]` gives `''` (the whole document). */
export function formatPointer(tokens: readonly (string | number)[]): string {
  return tokens.map((t) => '/' + escapePointerToken(t)).join('');
}

/**
 * Splits a JSON Pointer into unescaped reference tokens (RFC 6901 §4). Returns `undefined` for a
 * string that is not a pointer (non-empty and not starting with `/`, or a bad `~` escape).
 */
export function parsePointer(pointer: string): string[] | undefined {
  if (pointer === '') return [];
  if (!pointer.startsWith('/')) return undefined;
  const tokens = pointer.slice(1).split('/');
  for (const t of tokens) if (/~[^01]|~$/.test(t)) return undefined;
  return tokens.map((t) => t.replace(/~1/g, '/').replace(/~0/g, '~'));
}
