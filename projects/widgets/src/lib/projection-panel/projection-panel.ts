import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { ChainModel, Equilibrium, ProjectionResponse } from '@tropline/core/contract';
import { catchError, debounceTime, map, of, startWith, switchMap } from 'rxjs';
import type { RegimeResponse } from '../api/analysis-types';
import type { TroplineApiError } from '../api/problem-message';
import { TroplineClient } from '../api/tropline-client';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { CautionNotice, DEFAULT_CAUTIONS } from '../caution-notice/caution-notice';
import { MatProgressBar } from '@angular/material/progress-bar';
import { ParameterForm } from '../parameter-form/parameter-form';
import type { ParameterBounds } from '../parameter-form/parameter-form-schema';
import { PhasePortrait } from '../phase-portrait/phase-portrait';
import { RegimeSummary } from '../regime-summary/regime-summary';
import { TrajectoryChart } from '../trajectory-chart/trajectory-chart';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';

/** One state of a request: waiting, answered, or refused with a reason. */
type Answer<T> =
  | { readonly kind: 'loading' }
  | { readonly kind: 'ready'; readonly value: T }
  | { readonly kind: 'failed'; readonly error: TroplineApiError };

const loading = { kind: 'loading' } as const;

/**
 * The composite a portal embeds with one tag: the parameter form (limited to what the publisher
 * allowed), the trajectory chart, the phase portrait and the regime summary with its cautions.
 * Edits are debounced; a newer edit cancels requests still in flight.
 */
@Component({
  selector: 'tropline-projection-panel',
  imports: [
    TrajectoryChart,
    CautionNotice,
    MatProgressBar,
    ParameterForm,
    PhasePortrait,
    RegimeSummary,
  ],
  templateUrl: './projection-panel.html',
  styleUrl: './projection-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-projection-panel-host' },
})
export class ProjectionPanel {
  private readonly client = inject(TroplineClient);
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** The published food-chain model. */
  readonly model = input.required<ChainModel>();
  /** Starting value of each level, by id. */
  readonly initial = input.required<Record<string, number>>();
  /** End of the projection, in the model's time unit. */
  readonly horizon = input<number>(100);
  /** Number of evenly spaced samples. */
  readonly samples = input<number>(501);
  /** Whether the chart uses log scales. */
  readonly logScale = input<boolean>(false);
  /** What the public may change (a published scenario's bounds); absent: everything. */
  readonly bounds = input<readonly ParameterBounds[] | undefined>(undefined);
  /** Whether the parameter form is shown. */
  readonly showForm = input<boolean>(true);
  /** Whether the phase portrait is shown. */
  readonly showPhasePortrait = input<boolean>(true);
  /** Whether the regime summary is shown (the cautions stay either way). */
  readonly showSummary = input<boolean>(true);

  protected readonly showCautions = this.options.showCautions;
  /** The model with the reader's edits; back to the published one when it changes. */
  protected readonly edited = linkedSignal(() => this.model());

  private readonly request = computed(() => ({
    model: this.edited(),
    initial: this.initial(),
    horizon: this.horizon(),
    samples: this.samples(),
  }));

  protected readonly projection = toSignal(
    toObservable(this.request).pipe(
      debounceTime(this.options.debounceMs),
      switchMap((req) =>
        this.client.project(req).pipe(
          map((value): Answer<ProjectionResponse> => ({ kind: 'ready', value })),
          catchError((error: TroplineApiError) =>
            of<Answer<ProjectionResponse>>({ kind: 'failed', error }),
          ),
          startWith<Answer<ProjectionResponse>>(loading),
        ),
      ),
    ),
    { initialValue: loading as Answer<ProjectionResponse> },
  );

  protected readonly equilibria = toSignal(
    toObservable(this.edited).pipe(
      debounceTime(this.options.debounceMs),
      switchMap((model) =>
        this.client.equilibria({ model }).pipe(
          map((r) => r.equilibria),
          catchError(() => of<readonly Equilibrium[]>([])),
        ),
      ),
    ),
    { initialValue: [] as readonly Equilibrium[] },
  );

  protected readonly regime = toSignal(
    toObservable(computed(() => ({ model: this.edited(), initial: this.initial() }))).pipe(
      debounceTime(this.options.debounceMs),
      switchMap((req) =>
        this.client.regime(req).pipe(
          map((value): Answer<RegimeResponse> => ({ kind: 'ready', value })),
          catchError((error: TroplineApiError) =>
            of<Answer<RegimeResponse>>({ kind: 'failed', error }),
          ),
          startWith<Answer<RegimeResponse>>(loading),
        ),
      ),
    ),
    { initialValue: loading as Answer<RegimeResponse> },
  );

  /** The last drawn result stays on screen while a newer one loads. */
  private readonly lastResult = linkedSignal<
    Answer<ProjectionResponse>,
    ProjectionResponse | undefined
  >({
    source: () => this.projection(),
    computation: (state, previous) => (state.kind === 'ready' ? state.value : previous?.value),
  });

  protected readonly chartData = computed((): TrajectoryData | undefined => {
    const result = this.lastResult();
    if (!result) return undefined;
    const model = this.edited();
    return {
      times: result.times,
      timeUnit: model.timeUnit,
      series: model.levels.map((level) => ({
        id: level.id,
        name: level.name,
        unit: level.unit,
        values: result.series[level.id] ?? [],
      })),
    };
  });

  /**
   * The server's field errors of a refused projection, for the form to show under the fields
   * their pointers name (`/model/levels/1/mortality`); the errors on other parts of the request
   * (`/horizon`) stay in the alert only.
   */
  protected readonly formFieldErrors = computed(() => {
    const p = this.projection();
    return p.kind === 'failed' ? p.error.fieldErrors : [];
  });

  protected readonly regimeValue = computed(() => {
    const r = this.regime();
    return r.kind === 'ready' ? r.value : undefined;
  });
  protected readonly regimeError = computed(() => {
    const r = this.regime();
    return r.kind === 'failed' ? r.error : undefined;
  });
  /** The horizon to mark: only a chaotic regime has one. */
  protected readonly predictabilityHorizon = computed(() => {
    const r = this.regimeValue();
    return r?.regime === 'chaotic' ? r.predictabilityHorizon : undefined;
  });

  protected readonly cautions = computed(() => {
    const state = this.projection();
    return state.kind === 'ready' && state.value.cautions.length
      ? state.value.cautions
      : DEFAULT_CAUTIONS;
  });
}
