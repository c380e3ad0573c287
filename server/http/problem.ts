import type { ErrorRequestHandler, RequestHandler } from 'express';

/** One field-level complaint: an RFC 6901 JSON Pointer into the request and a message. */
export interface FieldError {
  readonly pointer: string;
  readonly message: string;
}

/** The body of every error answer: RFC 9457 problem details. */
export interface ProblemDocument {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance?: string;
  errors?: FieldError[];
  [extension: string]: unknown;
}

/** Base URI of Tropline's problem types; each type has a page in the API docs. */
export const PROBLEM_BASE = 'https://tropline.dev/problems/';

/**
 * An error that answers with problem details. Async handlers just throw it; the error
 * middleware writes it.
 */
export class ProblemError extends Error {
  constructor(
    /** HTTP status. */
    readonly status: number,
    /** Short slug of the problem type, e.g. `validation`. */
    readonly slug: string,
    /** Human title, the same for every instance of the type. */
    readonly title: string,
    /** What went wrong this time, in words a person can act on. */
    readonly detail: string,
    /** Extra members: `errors`, `limit`, `resetsAt` … */
    readonly extensions: Record<string, unknown> = {},
    /** Extra response headers (`Retry-After`, `WWW-Authenticate`). */
    readonly headers: Record<string, string> = {},
  ) {
    super(detail);
    this.name = 'ProblemError';
  }

  /** The problem document for this error. */
  toDocument(instance?: string): ProblemDocument {
    return {
      type: PROBLEM_BASE + this.slug,
      title: this.title,
      status: this.status,
      detail: this.detail,
      ...(instance ? { instance } : {}),
      ...this.extensions,
    };
  }
}

/** 422-free validation failure: 400 with the list of pointers. */
export function validationProblem(errors: FieldError[], detail?: string): ProblemError {
  const first = errors[0];
  return new ProblemError(
    400,
    'validation',
    'The request is not valid',
    detail ??
      (first
        ? `${first.pointer || '(body)'}: ${first.message}` +
          (errors.length > 1 ? ` (and ${errors.length - 1} more)` : '')
        : 'The request is not valid.'),
    { errors },
  );
}

/** Catch-all for routes that do not exist. */
export const notFound: RequestHandler = (req, _res, next) => {
  next(new ProblemError(404, 'not-found', 'No such resource', `Nothing is served at ${req.path}.`));
};

interface BodyParserError extends Error {
  type?: string;
  status?: number;
  limit?: number;
}

/** Maps errors thrown by Express's own parsers to problems that name the cause. */
function fromParserError(err: BodyParserError): ProblemError | undefined {
  switch (err.type) {
    case 'entity.parse.failed':
      return validationProblem(
        [{ pointer: '', message: 'the body is not valid JSON' }],
        'The body is not valid JSON.',
      );
    case 'entity.too.large':
      return new ProblemError(
        413,
        'body-too-large',
        'The body is too large',
        `The body exceeds the limit of ${err.limit} bytes.`,
        { limit: err.limit },
      );
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new ProblemError(415, 'unsupported-encoding', 'Unsupported encoding', err.message);
    default:
      // The router cannot decode a path parameter (`%ED%A0%80`): the client's fault, not ours.
      if (err instanceof URIError && err.status === 400) {
        return new ProblemError(
          400,
          'bad-path',
          'The path is not valid',
          'A path segment is not valid percent-encoded UTF-8.',
        );
      }
      return undefined;
  }
}

/**
 * The one error middleware: every error becomes problem details. Unknown errors are logged and
 * answered 500 without internals.
 */
export const problemHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let problem: ProblemError;
  if (err instanceof ProblemError) problem = err;
  else {
    problem =
      fromParserError(err as BodyParserError) ??
      new ProblemError(500, 'internal', 'Internal error', 'Something went wrong on our side.');
    if (problem.status >= 500) req.log?.error({ err }, 'unhandled error');
  }
  if (res.headersSent) {
    res.end();
    return;
  }
  for (const [name, value] of Object.entries(problem.headers)) res.setHeader(name, value);
  res
    .status(problem.status)
    .type('application/problem+json')
    .send(JSON.stringify(problem.toDocument(req.originalUrl)));
};
