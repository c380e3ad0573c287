import { HttpErrorResponse } from '@angular/common/http';

/** One problem with one field, as the API names it (JSON Pointer + message). */
export interface FieldProblem {
  readonly pointer: string;
  readonly message: string;
}

/** An API failure put into words for the page: what happened and what to do next. */
export interface ProblemText {
  readonly status: number;
  readonly title: string;
  readonly detail: string;
  /** What the reader can do about it. */
  readonly next: string;
  readonly fields: readonly FieldProblem[];
}

interface ProblemBody {
  title?: unknown;
  detail?: unknown;
  errors?: unknown;
}

const NEXT_STEP: Record<number, string> = {
  0: 'Check your network connection, then try again. If it keeps failing, the service may be down: see Service status.',
  400: 'Correct the marked fields and try again.',
  401: 'Sign in again to continue.',
  403: 'Ask an owner or admin of this tenant if you need this.',
  404: 'It may have been removed by someone else. Reload the page to see what is there now.',
  409: 'Reload the page to see the current state, then try again.',
  422: 'Correct the marked fields and try again.',
  429: 'Wait a moment and try again.',
};

function fieldsOf(errors: unknown): FieldProblem[] {
  if (!Array.isArray(errors)) return [];
  return errors.flatMap((e: unknown) => {
    const f = e as { pointer?: unknown; message?: unknown };
    return typeof f.message === 'string'
      ? [{ pointer: typeof f.pointer === 'string' ? f.pointer : '', message: f.message }]
      : [];
  });
}

/** Reads an RFC 9457 problem (or any failure) into text for the page. */
export function problemText(err: unknown, doing: string): ProblemText {
  if (!(err instanceof HttpErrorResponse)) {
    return {
      status: -1,
      title: `Could not ${doing}`,
      detail: err instanceof Error ? err.message : String(err),
      next: 'Reload the page and try again.',
      fields: [],
    };
  }
  const body = (typeof err.error === 'object' && err.error ? err.error : {}) as ProblemBody;
  const status = err.status;
  const fallback =
    status === 0 ? 'The console could not reach the API.' : `The server answered ${status}.`;
  return {
    status,
    title: typeof body.title === 'string' ? body.title : `Could not ${doing}`,
    detail: typeof body.detail === 'string' ? body.detail : fallback,
    next:
      NEXT_STEP[status] ??
      (status >= 500 ? 'This is a fault on the server. Try again in a minute.' : ''),
    fields: fieldsOf(body.errors),
  };
}

/** The message for one field (`/email`, `/origins/0`), or undefined. */
export function fieldMessage(
  problem: ProblemText | undefined,
  pointer: string,
): string | undefined {
  return problem?.fields.find((f) => f.pointer === pointer || f.pointer.startsWith(pointer + '/'))
    ?.message;
}
