import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBar } from '@angular/material/progress-bar';
import type { ChainModel, ProjectionResponse } from '@tropline/core';
import { catchError, debounceTime, map, of, startWith, switchMap } from 'rxjs';
import type { TroplineApiError } from '../api/problem-message';
import { TroplineClient } from '../api/tropline-client';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { CautionNotice, DEFAULT_CAUTIONS } from '../caution-notice/caution-notice';
import { TrajectoryChart } from '../trajectory-chart/trajectory-chart';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';

/** One state of the panel: waiting, drawn, or refused with a reason. */
type PanelState =
  | { readonly kind: 'loading' }
  | { readonly kind: 'ready'; readonly result: ProjectionResponse }
  | { readonly kind: 'failed'; readonly error: TroplineApiError };

/**
 * Projects a model through the API and draws the trajectory with its cautions. Newer inputs
 * cancel a request still in flight.
 */
@Component({
  selector: 'tropline-projection-panel',
  imports: [TrajectoryChart, CautionNotice, MatProgressBar],
  templateUrl: './projection-panel.html',
  styleUrl: './projection-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectionPanel {
  private readonly client = inject(TroplineClient);
  private readonly options = inject(TROPLINE_OPTIONS);

  /** The food-chain model to project. */
  readonly model = input.required<ChainModel>();
  /** Starting value of each level, by id. */
  readonly initial = input.required<Record<string, number>>();
  /** End of the projection, in the model's time unit. */
  readonly horizon = input<number>(100);
  /** Number of evenly spaced samples. */
  readonly samples = input<number>(501);
  /** Whether the chart uses log scales. */
  readonly logScale = input<boolean>(false);

  protected readonly showCautions = this.options.showCautions;
  private readonly request = computed(() => ({
    model: this.model(),
    initial: this.initial(),
    horizon: this.horizon(),
    samples: this.samples(),
  }));

  protected readonly state = toSignal(
    toObservable(this.request).pipe(
      debounceTime(this.options.debounceMs),
      switchMap((req) =>
        this.client.project(req).pipe(
          map((result): PanelState => ({ kind: 'ready', result })),
          catchError((error: TroplineApiError) => of<PanelState>({ kind: 'failed', error })),
          startWith<PanelState>({ kind: 'loading' }),
        ),
      ),
    ),
    { initialValue: { kind: 'loading' } as PanelState },
  );

  /** The last drawn result stays on screen while a newer one loads. */
  private readonly lastResult = linkedSignal<PanelState, ProjectionResponse | undefined>({
    source: () => this.state(),
    computation: (state, previous) => (state.kind === 'ready' ? state.result : previous?.value),
  });

  protected readonly chartData = computed((): TrajectoryData | undefined => {
    const result = this.lastResult();
    if (!result) return undefined;
    const model = this.model();
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

  protected readonly cautions = computed(() => {
    const state = this.state();
    return state.kind === 'ready' && state.result.cautions.length
      ? state.result.cautions
      : DEFAULT_CAUTIONS;
  });
}
