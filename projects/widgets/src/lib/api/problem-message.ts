import { HttpErrorResponse } from '@angular/common/http';

/** A field-level complaint from the API: a JSON Pointer into the request and a message. */
export interface ApiFieldError {
  readonly pointer: string;
  readonly message: string;
}

/** An API failure, turned into something a person can act on. */
export interface TroplineApiError {
  /** HTTP status; 0 when the API could not be reached. */
  readonly status: number;
  /** Short heading, e.g. "Monthly allowance used up". */
  readonly title: string;
  /** A sentence that says what happened and what to do. */
  readonly message: string;
  /** Field errors from a validation problem. */
  readonly fieldErrors: readonly ApiFieldError[];
  /** When a refused request may be tried again (429, 503). */
  readonly retryAt?: Date;
  /** Whether trying again later could succeed. */
  readonly retryable: boolean;
}

/** A time of day (and the date when not today) in the reader's locale. */
function formatWhen(at: Date, now: Date, locale?: string): string {
  const sameDay = at.toDateString() === now.toDateString();
  return new Intl.DateTimeFormat(locale, {
    ...(sameDay ? {} : { dateStyle: 'medium' as const }),
    timeStyle: 'short',
  }).format(at);
}

interface ProblemBody {
  title?: string;
  detail?: string;
  errors?: ApiFieldError[];
}

function retryAfter(res: HttpErrorResponse, now: Date): Date | undefined {
  const raw = res.headers?.get('Retry-After');
  if (!raw) return undefined;
  const seconds = Number(raw);
  if (Number.isFinite(seconds)) return new Date(now.getTime() + seconds * 1000);
  const at = new Date(raw);
  return Number.isNaN(at.getTime()) ? undefined : at;
}

/**
 * Maps an HTTP failure (ideally an RFC 9457 problem document) to a {@link TroplineApiError}
 * whose message a member of the public or a web developer can act on.
 */
export function problemMessage(
  res: HttpErrorResponse,
  now = new Date(),
  locale?: string,
): TroplineApiError {
  const body: ProblemBody =
    res.error && typeof res.error === 'object' ? (res.error as ProblemBody) : {};
  const detail = body.detail ?? '';
  const fieldErrors = Array.isArray(body.errors) ? body.errors : [];
  const retryAt = retryAfter(res, now);
  switch (true) {
    case res.status === 0:
      return {
        status: 0,
        title: 'Cannot reach the projection service',
        message: 'Check your connection; the request will be retried automatically.',
        fieldErrors,
        retryable: true,
      };
    case res.status === 400 || res.status === 422:
      return {
        status: res.status,
        title: body.title ?? 'Some values are not accepted',
        message: detail || 'Correct the highlighted values and try again.',
        fieldErrors,
        retryable: false,
      };
    case res.status === 401:
      return {
        status: 401,
        title: 'This site’s access key is not valid',
        message: 'The key may have been revoked or expired. Site owner: issue a new browser key.',
        fieldErrors,
        retryable: false,
      };
    case res.status === 403:
      return {
        status: 403,
        title: 'This site may not use the projection service',
        message: detail || 'Site owner: add this page’s origin to the browser key’s allowed list.',
        fieldErrors,
        retryable: false,
      };
    case res.status === 429:
      return {
        status: 429,
        title: body.title ?? 'Too many projections for now',
        message:
          (detail || 'The usage limit was reached.') +
          (retryAt ? ` You can try again after ${formatWhen(retryAt, now, locale)}.` : ''),
        fieldErrors,
        retryAt,
        retryable: true,
      };
    case res.status === 503:
      return {
        status: 503,
        title: 'The projection service is busy',
        message: 'It will be retried shortly.',
        fieldErrors,
        retryAt,
        retryable: true,
      };
    default:
      return {
        status: res.status,
        title: body.title ?? 'The projection could not be computed',
        message: detail || `The service answered ${res.status}. Try again later.`,
        fieldErrors,
        retryable: res.status >= 500,
      };
  }
}

/**
 * Maps a problem document that arrived inside a successful response (a failed job's `error`)
 * the same way as an HTTP failure.
 */
export function problemFromDocument(
  doc: Record<string, unknown> | undefined,
  locale?: string,
): TroplineApiError {
  const status = typeof doc?.['status'] === 'number' ? doc['status'] : 500;
  return problemMessage(new HttpErrorResponse({ status, error: doc ?? null }), new Date(), locale);
}
