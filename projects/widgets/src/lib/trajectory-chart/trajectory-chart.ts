import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  input,
  signal,
} from '@angular/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import {
  describeTrajectory,
  type TrajectoryData,
  trajectoryChartOptions,
} from './trajectory-chart-options';

let nextId = 0;

const FALLBACK_COLORS = ['#2e7d32', '#1565c0', '#b0561d', '#6a3d9a'];

/**
 * Every level of a food chain over time, with names and units, an optional log scale and the
 * predictability horizon shaded. The chart carries an ARIA description; the same numbers are
 * available to assistive technology as a summary sentence.
 */
@Component({
  selector: 'tropline-trajectory-chart',
  imports: [NgxEchartsDirective],
  templateUrl: './trajectory-chart.html',
  styleUrl: './trajectory-chart.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-trajectory-chart' },
})
export class TrajectoryChart {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly options = inject(TROPLINE_OPTIONS);

  /** The trajectory to draw. */
  readonly data = input.required<TrajectoryData>();
  /** Whether the value axes are logarithmic. */
  readonly logScale = input<boolean>(false);
  /** Time past which a chaotic projection is not meaningful; shaded when set. */
  readonly predictabilityHorizon = input<number | undefined>(undefined);
  /** Accessible name of the chart. */
  readonly label = input<string>('Trajectory of every level over time');

  /** Links the canvas to its text summary. */
  protected readonly summaryId = `tropline-trajectory-summary-${nextId++}`;

  private readonly colors = signal<readonly string[]>(FALLBACK_COLORS);
  private readonly textColor = signal<string>('#333');

  protected readonly chartOptions = computed(() =>
    trajectoryChartOptions(this.data(), {
      logScale: this.logScale(),
      colors: this.colors(),
      locale: this.options.locale,
      predictabilityHorizon: this.predictabilityHorizon(),
      textColor: this.textColor(),
    }),
  );

  protected readonly initOpts = { renderer: this.options.renderer };

  protected readonly summary = computed(() => describeTrajectory(this.data(), this.options.locale));

  constructor() {
    // Theme colours come from CSS custom properties, known only once the host is in the page.
    afterNextRender(() => {
      const style = getComputedStyle(this.host.nativeElement);
      const colors = FALLBACK_COLORS.map(
        (fallback, i) => style.getPropertyValue(`--tropline-series-${i + 1}`).trim() || fallback,
      );
      this.colors.set(colors);
      this.textColor.set(style.getPropertyValue('--mat-sys-on-surface').trim() || '#333');
    });
  }
}
