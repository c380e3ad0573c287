import { HttpClient, HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { ProjectionRequestInput, ProjectionResponse } from '@tropline/core';
import { catchError, type Observable, retry, throwError, timer } from 'rxjs';
import { problemMessage } from './problem-message';
import { TROPLINE_OPTIONS } from './tropline-options';

/** How often and how patiently a request is retried on network errors and 503. */
const RETRIES = 3;
const BASE_DELAY_MS = 500;

/**
 * Typed access to the Tropline API over HttpClient. Network failures and 503 are retried with
 * exponential backoff; every failure surfaces as a {@link TroplineApiError}.
 */
@Injectable({ providedIn: 'root' })
export class TroplineClient {
  private readonly http = inject(HttpClient);
  private readonly options = inject(TROPLINE_OPTIONS);

  /** Projects a model over a horizon. */
  project(request: ProjectionRequestInput): Observable<ProjectionResponse> {
    return this.post<ProjectionResponse>('/projections', request);
  }

  private post<T>(path: string, body: unknown): Observable<T> {
    const headers = new HttpHeaders(
      this.options.apiKey ? { Authorization: `Bearer ${this.options.apiKey}` } : {},
    );
    return this.http.post<T>(this.options.apiUrl + path, body, { headers }).pipe(
      retry({
        count: RETRIES,
        delay: (err: unknown, attempt: number) =>
          err instanceof HttpErrorResponse && (err.status === 0 || err.status === 503)
            ? timer(BASE_DELAY_MS * 2 ** (attempt - 1))
            : throwError(() => err),
      }),
      catchError((err: unknown) =>
        throwError(() => (err instanceof HttpErrorResponse ? problemMessage(err) : err)),
      ),
    );
  }
}
