import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  Injectable,
  input,
  type Signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import type { ChainModel, ProjectionRequestInput } from '@tropline/core/contract';
import {
  type ComparisonRequest,
  type RegimeRequest,
  type SweepRequest,
  TroplineClient,
} from '@tropline/widgets';
import {
  boundEquilibria,
  boundProjection,
  boundRegime,
  PUBLISHED_BINDING,
  PublishedScenarioApi,
  type PublishedScenario,
  type PublishedState,
} from '../../../../elements/src/published-scenario';

export {
  publishedBounds,
  PUBLISHED_BINDING,
  PublishedScenarioApi,
  type PublishedBinding,
  type PublishedScenario,
  type PublishedState,
} from '../../../../elements/src/published-scenario';
export { projectionSamples } from '../../../../elements/src/published-analyses';

/** Public id of the mere's published scenario (the Larchmere demo tenant publishes it). */
export const BRACKENLOW_MERE = 'larchmere-brackenlow-mere';
/** Public id of the moor's published scenario. */
export const HOBCAIRN_MOOR = 'larchmere-hobcairn-moor';

/**
 * The published scenario behind a public id, as the API serves it to this portal's browser key:
 * loading, then ready or refused. Call in an injection context (a page's field).
 */
export function publishedScenario(publicId: string): Signal<PublishedState> {
  return toSignal(inject(PublishedScenarioApi).load(publicId), {
    initialValue: { kind: 'loading', publicId },
  });
}

/** The scenario of a state once it is ready. */
export function readyScenario(state: PublishedState): PublishedScenario | undefined {
  return state.kind === 'ready' ? state.scenario : undefined;
}

/**
 * The widgets' client for a page bound to a published scenario: projections, regimes and
 * equilibria go through the scenario's published routes (the server holds the publisher's
 * ranges), jobs to the portal's client unchanged. A page provides it with
 * {@link PUBLISHED_BINDING}.
 */
@Injectable()
export class PublishedProjectionClient implements Pick<
  TroplineClient,
  'project' | 'equilibria' | 'regime' | 'sweep' | 'compare' | 'job' | 'cancel'
> {
  private readonly portal = inject(TroplineClient, { skipSelf: true });
  private readonly api = inject(PublishedScenarioApi);
  private readonly binding = inject(PUBLISHED_BINDING);

  project(request: ProjectionRequestInput) {
    return boundProjection(this.api, this.binding, request) ?? this.portal.project(request);
  }
  equilibria(request: { readonly model: ChainModel }) {
    return boundEquilibria(this.api, this.binding, request) ?? this.portal.equilibria(request);
  }
  regime(request: RegimeRequest) {
    return boundRegime(this.api, this.binding, request) ?? this.portal.regime(request);
  }
  sweep(request: SweepRequest) {
    return this.portal.sweep(request);
  }
  compare(request: ComparisonRequest) {
    return this.portal.compare(request);
  }
  job<T>(path: string, body: unknown) {
    return this.portal.job<T>(path, body);
  }
  cancel(id: string) {
    return this.portal.cancel(id);
  }
}

/** While a published scenario loads, and why it cannot be shown when it is refused. */
@Component({
  selector: 'lla-published-status',
  template: `
    @switch (state().kind) {
      @case ('loading') {
        <p class="lla-published-status" role="status">Loading the published scenario…</p>
      }
      @case ('refused') {
        <div class="lla-published-status lla-published-status--refused" role="alert">
          <strong>{{ refusal()?.title }}</strong>
          <p>{{ refusal()?.message }}</p>
        </div>
      }
    }
  `,
  styles: `
    .lla-published-status {
      padding: 12px 16px;
      border-radius: 8px;
      font: var(--mat-sys-body-large);
    }
    .lla-published-status--refused {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .lla-published-status--refused p {
      margin: 4px 0 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PublishedStatus {
  /** The state of the page's published scenario. */
  readonly state = input.required<PublishedState>();
  protected readonly refusal = computed(() => {
    const s = this.state();
    return s.kind === 'refused' ? s.error : undefined;
  });
}
