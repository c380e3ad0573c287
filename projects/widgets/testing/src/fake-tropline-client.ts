import { type Provider } from '@angular/core';
import {
  IntegrationError,
  ModelValidationError,
  project,
  type ProjectionRequestInput,
  type ProjectionResponse,
} from '@tropline/core';
import { defer, type Observable, of, throwError, timer } from 'rxjs';
import { switchMap } from 'rxjs/operators';
import { provideEchartsCore } from 'ngx-echarts';
import {
  defaultTroplineOptions,
  TROPLINE_OPTIONS,
  type TroplineApiError,
  TroplineClient,
  type TroplineOptions,
  troplineEcharts,
} from '@tropline/widgets';

/** Settings of the fake client. */
export interface FakeTroplineClientOptions {
  /** Simulated latency in ms (default 0). */
  readonly latencyMs?: number;
  /** When set, every call fails with this error instead of computing. */
  readonly failWith?: TroplineApiError;
}

/**
 * A TroplineClient that computes in the page with @tropline/core instead of calling the API, so
 * stories and host-app tests get real numbers without a server or a key. Validation failures
 * come back shaped exactly like the API's 400 problems.
 */
export class FakeTroplineClient implements Pick<TroplineClient, 'project'> {
  /** Every request received, oldest first. */
  readonly requests: ProjectionRequestInput[] = [];

  constructor(private readonly settings: FakeTroplineClientOptions = {}) {}

  /** Projects in-process with the engine. */
  project(request: ProjectionRequestInput): Observable<ProjectionResponse> {
    this.requests.push(request);
    const failWith = this.settings.failWith;
    return timer(this.settings.latencyMs ?? 0).pipe(
      switchMap(() =>
        failWith
          ? throwError(() => failWith)
          : defer(() => {
              try {
                return of(project(request));
              } catch (err) {
                return throwError(() => asApiError(err));
              }
            }),
      ),
    );
  }
}

function asApiError(err: unknown): TroplineApiError {
  if (err instanceof ModelValidationError) {
    return {
      status: 400,
      title: 'The request is not valid',
      message: err.message,
      fieldErrors: err.errors,
      retryable: false,
    };
  }
  if (err instanceof IntegrationError) {
    return {
      status: 422,
      title: 'The projection could not be computed',
      message: err.message,
      fieldErrors: [],
      retryable: false,
    };
  }
  throw err;
}

/** Provides a {@link FakeTroplineClient} in place of the real one. */
export function provideFakeTroplineClient(options: FakeTroplineClientOptions = {}): Provider[] {
  const fake = new FakeTroplineClient(options);
  return [
    { provide: FakeTroplineClient, useValue: fake },
    { provide: TroplineClient, useValue: fake },
  ];
}

/**
 * Everything a test or story needs to render the widgets without a server: the fake client,
 * the trimmed ECharts build and options (no debounce, SVG charts, unless given).
 */
export function provideTroplineTesting(
  settings: { client?: FakeTroplineClientOptions; options?: Partial<TroplineOptions> } = {},
): Provider[] {
  return [
    ...provideFakeTroplineClient(settings.client),
    provideEchartsCore({ echarts: troplineEcharts }),
    {
      provide: TROPLINE_OPTIONS,
      useValue: {
        ...defaultTroplineOptions(),
        debounceMs: 0,
        renderer: 'svg',
        ...settings.options,
      },
    },
  ];
}
