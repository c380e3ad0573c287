import { type Provider } from '@angular/core';
import {
  type ChainModel,
  findEquilibria,
  IntegrationError,
  ModelValidationError,
  project,
  type ProjectionRequestInput,
  type ProjectionResponse,
} from '@tropline/core';
import { concat, defer, Observable, of, throwError, timer } from 'rxjs';
import { finalize, switchMap } from 'rxjs/operators';
import { provideEchartsCore } from 'ngx-echarts';
import {
  type ComparisonRequest,
  type ComparisonResult,
  defaultTroplineOptions,
  type EquilibriaResponse,
  type JobView,
  type RegimeRequest,
  type RegimeResponse,
  type SweepRequest,
  type SweepResult,
  TROPLINE_OPTIONS,
  type TroplineApiError,
  TroplineClient,
  type TroplineOptions,
  loadTroplineEcharts,
} from '@tropline/widgets';

/** A unit of an analysis the fake runs between progress reports. */
export interface AnalysisSteps<T> {
  /** How many steps the analysis has. */
  readonly count: number;
  /** Runs step `i` (0-based, in order). */
  run(i: number): void;
  /** The result once every step ran. */
  result(): T;
}

/** The analyses the fake computes; without them it answers as an API lacking those routes. */
export interface FakeAnalyses {
  /** `POST /regimes`. */
  regime(body: unknown): RegimeResponse;
  /** `POST /sweeps`, one step per parameter value. */
  sweep(body: unknown): AnalysisSteps<SweepResult>;
  /** `POST /comparisons`, one step per scenario, baseline first. */
  comparison(body: unknown): AnalysisSteps<ComparisonResult>;
}

/** Settings of the fake client. */
export interface FakeTroplineClientOptions {
  /** Simulated latency in ms before each answer and between job steps (default 0). */
  readonly latencyMs?: number;
  /** When set, every call fails with this error instead of computing. */
  readonly failWith?: TroplineApiError;
  /** Whether calls never answer (to show loading states). */
  readonly neverAnswer?: boolean;
  /** The analyses to compute with (regimes, sweeps, comparisons), usually `ENGINE_ANALYSES`. */
  readonly analyses?: FakeAnalyses;
}

/** What the fake was asked, by route, oldest first. */
export interface FakeRequests {
  /** `/projections` bodies. */
  readonly projections: ProjectionRequestInput[];
  /** `/equilibria` bodies. */
  readonly equilibria: { readonly model: ChainModel }[];
  /** `/regimes` bodies. */
  readonly regimes: RegimeRequest[];
  /** Job submissions, with their route. */
  readonly jobs: { readonly path: string; readonly body: unknown }[];
  /** Ids of the jobs cancelled by unsubscribing. */
  readonly cancelled: string[];
}

type Client = Pick<
  TroplineClient,
  'project' | 'equilibria' | 'regime' | 'sweep' | 'compare' | 'job' | 'cancel'
>;

/**
 * A TroplineClient that computes in the page with @tropline/core instead of calling the API, so
 * stories and host-app tests get real numbers without a server or a key. Validation failures
 * come back shaped like the API's 400 problems; jobs report progress step by step and are
 * cancelled when their subscriber leaves, as with the real client.
 */
export class FakeTroplineClient implements Client {
  /** Every request received, by route. */
  readonly calls: FakeRequests = {
    projections: [],
    equilibria: [],
    regimes: [],
    jobs: [],
    cancelled: [],
  };
  private jobCount = 0;

  constructor(private readonly settings: FakeTroplineClientOptions = {}) {}

  /** The projection requests received (kept for older tests). */
  get requests(): ProjectionRequestInput[] {
    return this.calls.projections;
  }

  /** Projects in-process with the engine. */
  project(request: ProjectionRequestInput): Observable<ProjectionResponse> {
    this.calls.projections.push(request);
    return this.answer(() => project(request));
  }

  /** Every equilibrium, computed with the engine. */
  equilibria(request: { readonly model: ChainModel }): Observable<EquilibriaResponse> {
    this.calls.equilibria.push(request);
    return this.answer(() => ({ equilibria: findEquilibria(request.model) }));
  }

  /** The regime, computed with the engine's Benettin exponent and regime rules. */
  regime(request: RegimeRequest): Observable<RegimeResponse> {
    this.calls.regimes.push(request);
    return this.answer(() => this.analyses('/regimes').regime(request));
  }

  /** A sweep as a job, one parameter value per step. */
  sweep(request: SweepRequest): Observable<JobView<SweepResult>> {
    return this.job<SweepResult>('/sweeps', request);
  }

  /** A comparison as a job, one scenario per step. */
  compare(request: ComparisonRequest): Observable<JobView<ComparisonResult>> {
    return this.job<ComparisonResult>('/comparisons', request);
  }

  /** Runs `/sweeps` or `/comparisons` in steps, emitting the job after each. */
  job<T>(path: string, body: unknown): Observable<JobView<T>> {
    this.calls.jobs.push({ path, body });
    const id = `fake-job-${++this.jobCount}`;
    const kind = path.replace(/^\//, '');
    const view = (status: JobView['status'], progress: number, result?: T): JobView<T> => ({
      id,
      kind,
      status,
      progress,
      ...(result === undefined ? {} : { result }),
    });
    let done = false;
    return this.answer(() => this.steps<T>(path, body)).pipe(
      switchMap((steps) => {
        const step = (i: number): Observable<JobView<T>> =>
          timer(this.settings.latencyMs ?? 0).pipe(
            switchMap(() => {
              steps.run(i);
              if (i + 1 < steps.count) {
                return concat(of(view('running', (i + 1) / steps.count)), step(i + 1));
              }
              done = true;
              return of(view('succeeded', 1, steps.result()));
            }),
          );
        return concat(of(view('running', 0)), step(0));
      }),
      finalize(() => {
        if (!done) this.calls.cancelled.push(id);
      }),
    );
  }

  /** Records a cancellation. */
  cancel(id: string): Observable<JobView> {
    this.calls.cancelled.push(id);
    return of({ id, kind: 'job', status: 'failed', progress: 0 });
  }

  private steps<T>(path: string, body: unknown): AnalysisSteps<T> {
    const analyses = this.analyses(path);
    if (path === '/sweeps') return analyses.sweep(body) as unknown as AnalysisSteps<T>;
    if (path === '/comparisons') return analyses.comparison(body) as unknown as AnalysisSteps<T>;
    throw new MissingRoute(path);
  }

  private analyses(path: string): FakeAnalyses {
    if (!this.settings.analyses) throw new MissingRoute(path);
    return this.settings.analyses;
  }

  private answer<T>(compute: () => T): Observable<T> {
    const failWith = this.settings.failWith;
    if (this.settings.neverAnswer) return new Observable<T>(() => undefined);
    return timer(this.settings.latencyMs ?? 0).pipe(
      switchMap(() =>
        failWith
          ? throwError(() => failWith)
          : defer(() => {
              try {
                return of(compute());
              } catch (err) {
                return throwError(() => asApiError(err));
              }
            }),
      ),
    );
  }
}

/** A route the fake was given no analysis for: answered as the API answers an unknown route. */
class MissingRoute extends Error {
  constructor(readonly path: string) {
    super(`${path} is not available`);
  }
}

function asApiError(err: unknown): TroplineApiError {
  if (err instanceof MissingRoute) {
    return {
      status: 404,
      title: 'This analysis is not available',
      message: `The service does not offer ${err.path} yet.`,
      fieldErrors: [],
      retryable: false,
    };
  }
  if (err instanceof ModelValidationError) {
    return {
      status: 400,
      title: 'The request is not valid',
      message: err.message,
      fieldErrors: err.errors,
      retryable: false,
    };
  }
  if (
    err instanceof IntegrationError ||
    (err instanceof Error && err.name === 'AnalysisRunError')
  ) {
    return {
      status: 422,
      title: 'The projection could not be computed',
      message: (err as Error).message,
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
    provideEchartsCore({ echarts: loadTroplineEcharts }),
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
