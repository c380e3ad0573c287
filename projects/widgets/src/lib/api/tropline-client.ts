import {
  HttpClient,
  HttpErrorResponse,
  HttpEventType,
  HttpHeaders,
  type HttpResponse,
} from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type {
  ChainModel,
  ProjectionRequestInput,
  ProjectionResponse,
} from '@tropline/core/contract';
import {
  catchError,
  concatMap,
  defer,
  EMPTY,
  expand,
  filter,
  finalize,
  from,
  map,
  type MonoTypeOperatorFunction,
  type Observable,
  of,
  repeat,
  retry,
  switchMap,
  takeWhile,
  tap,
  throwError,
  timer,
} from 'rxjs';
import type {
  ComparisonRequest,
  ComparisonResult,
  EquilibriaResponse,
  JobView,
  RegimeRequest,
  RegimeResponse,
  SweepRequest,
  SweepResult,
} from './analysis-types';
import { parseEventStream } from './event-stream';
import { problemFromDocument, problemMessage } from './problem-message';
import { TROPLINE_OPTIONS } from './tropline-options';

/** How often and how patiently a request is retried on network errors and 503. */
const RETRIES = 3;
const BASE_DELAY_MS = 500;
/** Polling interval when a job's event stream is unavailable. */
const POLL_MS = 1000;

const finished = (job: JobView): boolean => job.status === 'succeeded' || job.status === 'failed';

/**
 * Typed access to the Tropline API over HttpClient. Network failures and 503 are retried with
 * exponential backoff; every failure surfaces as a {@link TroplineApiError}. Background jobs
 * (sweeps, comparisons …) are followed through their event stream; unsubscribing from an
 * unfinished job cancels it on the server.
 */
@Injectable({ providedIn: 'root' })
export class TroplineClient {
  private readonly http = inject(HttpClient);
  private readonly options = inject(TROPLINE_OPTIONS);

  /** Projects a model over a horizon. */
  project(request: ProjectionRequestInput): Observable<ProjectionResponse> {
    return this.post<ProjectionResponse>('/projections', request);
  }

  /** Every equilibrium of a model with its stability. */
  equilibria(request: { readonly model: ChainModel }): Observable<EquilibriaResponse> {
    return this.post<EquilibriaResponse>('/equilibria', request);
  }

  /** The long-run regime, largest Lyapunov exponent and predictability horizon. */
  regime(request: RegimeRequest): Observable<RegimeResponse> {
    return this.post<RegimeResponse>('/regimes', request);
  }

  /** A bifurcation sweep as a job: every update, the last one with the result. */
  sweep(request: SweepRequest): Observable<JobView<SweepResult>> {
    return this.job<SweepResult>('/sweeps', request);
  }

  /** A scenario comparison as a job: every update, the last one with the result. */
  compare(request: ComparisonRequest): Observable<JobView<ComparisonResult>> {
    return this.job<ComparisonResult>('/comparisons', request);
  }

  /**
   * Submits any job route (`/sweeps`, `/regime-maps`, `/ensembles`, `/comparisons`) and emits
   * the job on every change until it finishes; a failed job errors with its problem mapped.
   */
  job<T>(path: string, body: unknown): Observable<JobView<T>> {
    return defer(() => {
      let last: JobView<T> | undefined;
      // The same key on a retried submission makes the server answer with the first job.
      const idempotencyKey = globalThis.crypto?.randomUUID?.() ?? `${Date.now()}-${Math.random()}`;
      return this.post<JobView<T>>(path, body, { 'Idempotency-Key': idempotencyKey }).pipe(
        // Known from the submission on, so leaving before the first update still cancels it.
        tap((job) => (last = job)),
        switchMap((job) => (finished(job) ? of(job) : this.follow<T>(job))),
        map((job) => {
          last = job;
          if (job.status === 'failed') throw problemFromDocument(job.error, this.options.locale);
          return job;
        }),
        takeWhile((job) => !finished(job), true),
        finalize(() => {
          if (last && !finished(last)) this.cancel(last.id).subscribe({ error: () => undefined });
        }),
      );
    });
  }

  /** Asks the server to stop a job; emits the job as it stands. */
  cancel(id: string): Observable<JobView> {
    return this.http
      .delete<JobView>(`${this.options.apiUrl}/jobs/${encodeURIComponent(id)}`, {
        headers: this.headers(),
      })
      .pipe(this.mapErrors());
  }

  /**
   * A job's updates from its event stream (`GET /jobs/{id}/events`, one `job` event per
   * change). A stream the server ends before the job finishes (its time limit) is opened again;
   * one that cannot be reached at all falls back to polling `GET /jobs/{id}` every second. A
   * finished job whose update carries no result is fetched once more for it.
   */
  private follow<T>(job: JobView<T>): Observable<JobView<T>> {
    const url = `${this.options.apiUrl}/jobs/${encodeURIComponent(job.id)}`;
    const fetchJob = () => this.http.get<JobView<T>>(url, { headers: this.headers() });
    const stream = defer(() => {
      let consumed = 0;
      let text = '';
      return this.http
        .get(url + '/events', {
          headers: this.headers(),
          observe: 'events',
          reportProgress: true,
          responseType: 'text',
        })
        .pipe(
          concatMap((event) => {
            if (event.type === HttpEventType.DownloadProgress) text = event.partialText ?? text;
            else if (event.type === HttpEventType.Response)
              text = (event as HttpResponse<string>).body ?? text;
            else return EMPTY;
            const parsed = parseEventStream(text.slice(consumed));
            consumed += parsed.consumed;
            return from(
              parsed.events
                .filter((e) => e.event === 'job')
                .map((e) => JSON.parse(e.data) as JobView<T>),
            );
          }),
        );
    });
    const later = () => timer(POLL_MS).pipe(switchMap(fetchJob));
    const poll = later().pipe(expand((j) => (finished(j) ? EMPTY : later())));
    return stream.pipe(
      repeat({ delay: () => timer(0) }),
      takeWhile((j) => !finished(j), true),
      catchError((err: unknown) =>
        err instanceof HttpErrorResponse && err.status === 0 ? poll : throwError(() => err),
      ),
      concatMap((j) => (j.status === 'succeeded' && j.result === undefined ? fetchJob() : of(j))),
      this.mapErrors(),
      filter((j): j is JobView<T> => !!j),
    );
  }

  private headers(extra: Record<string, string> = {}): HttpHeaders {
    return new HttpHeaders({
      ...(this.options.apiKey ? { Authorization: `Bearer ${this.options.apiKey}` } : {}),
      ...extra,
    });
  }

  private post<T>(path: string, body: unknown, extra?: Record<string, string>): Observable<T> {
    return this.http
      .post<T>(this.options.apiUrl + path, body, { headers: this.headers(extra) })
      .pipe(this.mapErrors());
  }

  /** Backoff on network errors and 503, then every failure as a TroplineApiError. */
  private mapErrors<T>(): MonoTypeOperatorFunction<T> {
    return (source) =>
      source.pipe(
        retry({
          count: RETRIES,
          delay: (err: unknown, attempt: number) =>
            err instanceof HttpErrorResponse && (err.status === 0 || err.status === 503)
              ? timer(BASE_DELAY_MS * 2 ** (attempt - 1))
              : throwError(() => err),
        }),
        catchError((err: unknown) =>
          throwError(() =>
            err instanceof HttpErrorResponse
              ? problemMessage(err, new Date(), this.options.locale)
              : err,
          ),
        ),
      );
  }
}
