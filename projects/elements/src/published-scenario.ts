import { HttpClient, HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { Injectable, InjectionToken, inject } from '@angular/core';
import {
  type ChainModel,
  getParameter,
  type ProjectionRequestInput,
  type ProjectionResponse,
  type ScenarioContent,
} from '@tropline/core/contract';
import {
  type EquilibriaResponse,
  type ParameterBounds,
  problemMessage,
  type RegimeRequest,
  type RegimeResponse,
  TROPLINE_OPTIONS,
  type TroplineApiError,
} from '@tropline/widgets';
import { catchError, map, type Observable, of, startWith, throwError } from 'rxjs';

/**
 * A published scenario as `GET /published-scenarios/{publicId}` serves it: the vetted model,
 * start, horizon and public ranges of the version now published behind the public id.
 */
export interface PublishedScenario extends ScenarioContent {
  readonly publicId: string;
  readonly version: number;
  readonly publishedAt: string;
}

/** Where loading a published scenario stands. */
export type PublishedState =
  | { readonly kind: 'loading'; readonly publicId: string }
  | { readonly kind: 'ready'; readonly scenario: PublishedScenario }
  | { readonly kind: 'refused'; readonly publicId: string; readonly error: TroplineApiError };

/** One public what-if change, as the published projections route takes it. */
export interface WhatIfChange {
  readonly pointer: string;
  readonly value: number;
}

/** The sentence shown when a public id names nothing published (or no id is given). */
export function missingScenarioMessage(publicId: string): string {
  return publicId
    ? `No published scenario is called “${publicId}”. Check the scenario's public id.`
    : 'No scenario is named: give the public id of a published scenario.';
}

/** The public ranges of a published scenario, as the widgets' parameter form reads them. */
export function publishedBounds(s: PublishedScenario): readonly ParameterBounds[] {
  return s.publicParameters.map((p) => ({
    pointer: p.pointer,
    min: p.min,
    max: p.max,
    ...(p.step !== undefined ? { step: p.step } : {}),
    ...(p.label !== undefined ? { label: p.label } : {}),
  }));
}

/**
 * The what-if a model amounts to against the published one: every public parameter whose value
 * differs, in the publisher's order. Parameters the public may not change are never sent; the
 * server computes from its own copy of the published model.
 */
export function whatIfChanges(s: PublishedScenario, model: ProjectionRequestInput['model']) {
  const changes: WhatIfChange[] = [];
  for (const p of s.publicParameters) {
    const value = getParameter(model, p.pointer);
    if (value !== getParameter(s.model, p.pointer)) changes.push({ pointer: p.pointer, value });
  }
  return changes;
}

/**
 * A refusal of the published projections route with its field pointers (`/changes/0/value`)
 * turned back into the parameter they name, and the publisher's label in the sentence.
 */
export function namedRefusal(
  s: PublishedScenario,
  changes: readonly WhatIfChange[],
  error: TroplineApiError,
): TroplineApiError {
  const labelOf = (pointer: string) =>
    s.publicParameters.find((p) => p.pointer === pointer)?.label ?? pointer;
  const fieldErrors = error.fieldErrors.map((f) => {
    const at = /^\/changes\/(\d+)\//.exec(f.pointer);
    const change = at ? changes[Number(at[1])] : undefined;
    return change
      ? { ...f, pointer: change.pointer, message: `${labelOf(change.pointer)}: ${f.message}` }
      : f;
  });
  const first = fieldErrors[0];
  return first && first !== error.fieldErrors[0]
    ? { ...error, message: `${first.message}.`, fieldErrors }
    : { ...error, fieldErrors };
}

/**
 * Reads published scenarios and asks for their bounded what-if projections, over HttpClient
 * with the configured API and key. Provided next to `provideTropline` (the portal's root, each
 * element's own injector), so it uses the same key as the widgets.
 */
@Injectable()
export class PublishedScenarioApi {
  private readonly http = inject(HttpClient);
  private readonly options = inject(TROPLINE_OPTIONS);

  /** The published scenario behind a public id: loading, then ready or refused (404: unknown). */
  load(publicId: string): Observable<PublishedState> {
    const id = publicId.trim();
    if (!id) {
      return of({ kind: 'refused', publicId: id, error: this.missing(id) });
    }
    return this.http.get<PublishedScenario>(this.url(id), { headers: this.headers() }).pipe(
      map((scenario): PublishedState => ({ kind: 'ready', scenario })),
      catchError((err: unknown) =>
        of<PublishedState>({ kind: 'refused', publicId: id, error: this.refusal(id, err) }),
      ),
      startWith<PublishedState>({ kind: 'loading', publicId: id }),
    );
  }

  /**
   * A what-if projection of the published scenario: only the public parameters, only within
   * their ranges, the server checking both. Refusals name the parameter, not the body field.
   */
  project(
    s: PublishedScenario,
    request: Pick<ProjectionRequestInput, 'model' | 'horizon' | 'samples'>,
  ): Observable<ProjectionResponse> {
    return this.whatIf<ProjectionResponse>(s, 'projections', request.model, {
      ...(request.horizon !== undefined ? { horizon: request.horizon } : {}),
      ...(request.samples !== undefined ? { samples: request.samples } : {}),
    });
  }

  /** The long-run regime of a what-if, from the published start (same checks as projections). */
  regime(s: PublishedScenario, request: Pick<RegimeRequest, 'model'>): Observable<RegimeResponse> {
    return this.whatIf<RegimeResponse>(s, 'regimes', request.model);
  }

  /** Every equilibrium of a what-if (same checks as projections). */
  equilibria(s: PublishedScenario, request: { readonly model: ChainModel }) {
    return this.whatIf<EquilibriaResponse>(s, 'equilibria', request.model);
  }

  private whatIf<T>(
    s: PublishedScenario,
    route: 'projections' | 'regimes' | 'equilibria',
    model: ChainModel,
    extra: Record<string, number> = {},
  ): Observable<T> {
    const changes = whatIfChanges(s, model);
    return this.http
      .post<T>(
        `${this.url(s.publicId)}/${route}`,
        { changes, ...extra },
        { headers: this.headers() },
      )
      .pipe(
        catchError((err: unknown) =>
          throwError(() => namedRefusal(s, changes, this.refusal(s.publicId, err))),
        ),
      );
  }

  private url(publicId: string): string {
    return `${this.options.apiUrl}/published-scenarios/${encodeURIComponent(publicId)}`;
  }

  private headers(): HttpHeaders {
    return new HttpHeaders(
      this.options.apiKey ? { Authorization: `Bearer ${this.options.apiKey}` } : {},
    );
  }

  private missing(publicId: string): TroplineApiError {
    return {
      status: 404,
      title: 'No such published scenario',
      message: missingScenarioMessage(publicId),
      fieldErrors: [],
      retryable: false,
    };
  }

  private refusal(publicId: string, err: unknown): TroplineApiError {
    if (!(err instanceof HttpErrorResponse)) throw err;
    if (err.status === 404) return this.missing(publicId);
    return problemMessage(err, new Date(), this.options.locale);
  }
}

/** What a client needs to send a page's projections through the published route. */
export interface PublishedBinding {
  /** The published scenario the page shows, once loaded. */
  published(): PublishedScenario | undefined;
}

/** The published scenario a widget's projections are bound to, when there is one. */
export const PUBLISHED_BINDING = new InjectionToken<PublishedBinding>('PUBLISHED_BINDING');

/**
 * A projection through the published route when bound to a published scenario whose model
 * the request starts from; otherwise undefined (the caller uses the open projections route).
 */
export function boundProjection(
  api: PublishedScenarioApi,
  binding: PublishedBinding | null,
  request: ProjectionRequestInput,
): Observable<ProjectionResponse> | undefined {
  const s = binding?.published();
  return s ? api.project(s, request) : undefined;
}

/**
 * A regime through the published route when bound to a published scenario and the request asks
 * for nothing the route does not take (the published start, the engine's default spans);
 * otherwise undefined (the caller uses the open regimes route).
 */
export function boundRegime(
  api: PublishedScenarioApi,
  binding: PublishedBinding | null,
  request: RegimeRequest,
): Observable<RegimeResponse> | undefined {
  const s = binding?.published();
  const { model, initial, ...spans } = request;
  const sameStart =
    s !== undefined &&
    Object.keys(s.initial).length === Object.keys(initial).length &&
    Object.entries(s.initial).every(([id, v]) => initial[id] === v);
  return s && sameStart && !Object.keys(spans).length ? api.regime(s, { model }) : undefined;
}

/** Equilibria through the published route when bound to a published scenario. */
export function boundEquilibria(
  api: PublishedScenarioApi,
  binding: PublishedBinding | null,
  request: { readonly model: ChainModel },
): Observable<EquilibriaResponse> | undefined {
  const s = binding?.published();
  return s ? api.equilibria(s, request) : undefined;
}
