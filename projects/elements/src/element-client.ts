import { Injectable, InjectionToken, inject } from '@angular/core';
import type {
  ChainModel,
  ProjectionRequestInput,
  ProjectionResponse,
} from '@tropline/core/contract';
import {
  type ComparisonRequest,
  type ComparisonResult,
  type EquilibriaResponse,
  type JobView,
  type RegimeRequest,
  type RegimeResponse,
  type SweepRequest,
  type SweepResult,
  TroplineClient,
  type TroplineApiError,
} from '@tropline/widgets';
import { type MonoTypeOperatorFunction, type Observable, tap } from 'rxjs';
import {
  boundEquilibria,
  boundProjection,
  boundRegime,
  PUBLISHED_BINDING,
  PublishedScenarioApi,
} from './published-scenario';

/** What an element reports as a DOM event when the API answers. */
export type ElementResult =
  | { readonly kind: 'projection'; readonly value: ProjectionResponse }
  | { readonly kind: 'regime'; readonly value: RegimeResponse }
  | { readonly kind: 'sweep'; readonly value: SweepResult }
  | { readonly kind: 'comparison'; readonly value: ComparisonResult };

/** What an element reports as a DOM event when the API refuses or cannot be reached. */
export interface ElementRefusal {
  /** HTTP status; 0 when the API could not be reached. */
  readonly status: number;
  /** Short heading, as the widget shows it. */
  readonly title: string;
  /** The sentence the widget shows. */
  readonly message: string;
  /** Field errors, each a JSON Pointer and a message. */
  readonly fieldErrors: readonly { readonly pointer: string; readonly message: string }[];
}

/** Where an element's client reports answers; the element turns them into DOM events. */
export interface ElementReporter {
  result(result: ElementResult): void;
  refused(refusal: ElementRefusal): void;
}

/** The reporter of the element whose injector this is. */
export const ELEMENT_REPORTER = new InjectionToken<ElementReporter>('ELEMENT_REPORTER');

/** A refusal as plain data, fit for a CustomEvent's detail. */
export function refusalOf(error: TroplineApiError): ElementRefusal {
  return {
    status: error.status,
    title: error.title,
    message: error.message,
    fieldErrors: error.fieldErrors.map((f) => ({ pointer: f.pointer, message: f.message })),
  };
}

/**
 * The widgets' client with every answer and refusal also reported to the element that owns it
 * (the widgets expose no outputs for their results, so the element listens here), and its
 * projections sent through the published scenario's route, where the server enforces the
 * publisher's ranges.
 */
@Injectable()
export class ElementClient extends TroplineClient {
  private readonly reporter = inject(ELEMENT_REPORTER);
  private readonly published = inject(PublishedScenarioApi);
  private readonly binding = inject(PUBLISHED_BINDING, { optional: true });

  /** Through the published route when the element shows a published scenario. */
  override project(request: ProjectionRequestInput): Observable<ProjectionResponse> {
    const source = boundProjection(this.published, this.binding, request) ?? super.project(request);
    return source.pipe(this.report((value) => ({ kind: 'projection', value })));
  }

  /** Through the published route too, so the publisher's ranges hold for every analysis. */
  override regime(request: RegimeRequest): Observable<RegimeResponse> {
    const source = boundRegime(this.published, this.binding, request) ?? super.regime(request);
    return source.pipe(this.report((value) => ({ kind: 'regime', value })));
  }

  override equilibria(request: { readonly model: ChainModel }): Observable<EquilibriaResponse> {
    return boundEquilibria(this.published, this.binding, request) ?? super.equilibria(request);
  }

  override sweep(request: SweepRequest): Observable<JobView<SweepResult>> {
    return super.sweep(request).pipe(this.reportJob((value) => ({ kind: 'sweep', value })));
  }

  override compare(request: ComparisonRequest): Observable<JobView<ComparisonResult>> {
    return super.compare(request).pipe(this.reportJob((value) => ({ kind: 'comparison', value })));
  }

  private report<T>(wrap: (value: T) => ElementResult): MonoTypeOperatorFunction<T> {
    return tap({
      next: (value) => this.reporter.result(wrap(value)),
      error: (error: TroplineApiError) => this.reporter.refused(refusalOf(error)),
    });
  }

  private reportJob<T>(wrap: (value: T) => ElementResult): MonoTypeOperatorFunction<JobView<T>> {
    return tap({
      next: (job) => {
        if (job.status === 'succeeded' && job.result !== undefined) {
          this.reporter.result(wrap(job.result));
        }
      },
      error: (error: TroplineApiError) => this.reporter.refused(refusalOf(error)),
    });
  }
}
