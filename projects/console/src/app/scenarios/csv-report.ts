import { HttpErrorResponse } from '@angular/common/http';

/** One bad cell of an uploaded CSV, as the server reports it (1-based line and column). */
export interface CsvCellError {
  readonly line: number;
  readonly column: number;
  /** The column's header, when the server names it. */
  readonly field?: string;
  readonly message: string;
}

/** The per-cell errors of a refused upload, in file order; none when it failed otherwise. */
export function csvReport(err: unknown): CsvCellError[] {
  if (!(err instanceof HttpErrorResponse) || err.status !== 400) return [];
  const errors = (err.error as { errors?: unknown } | null)?.errors;
  if (!Array.isArray(errors)) return [];
  return errors
    .flatMap((e: unknown) => {
      const c = e as Record<string, unknown>;
      return typeof c.line === 'number' &&
        typeof c.column === 'number' &&
        typeof c.message === 'string'
        ? [
            {
              line: c.line,
              column: c.column,
              message: c.message,
              ...(typeof c.field === 'string' ? { field: c.field } : {}),
            },
          ]
        : [];
    })
    .sort((a, b) => a.line - b.line || a.column - b.column);
}
