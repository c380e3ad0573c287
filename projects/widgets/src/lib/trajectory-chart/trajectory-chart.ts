import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import type { EChartsType } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { ChartFigure } from '../chart-figure/chart-figure';
import { injectChartPalette, injectReducedMotion } from '../chart-figure/chart-palette';
import { zoomWindow, type ZoomKey } from '../chart-figure/zoom-keys';
import {
  describeTrajectory,
  type TrajectoryData,
  trajectoryChartOptions,
  trajectoryTable,
} from './trajectory-chart-options';

let nextId = 0;

/**
 * Every level of a food chain over time, with names and units, an optional log scale,
 * uncertainty bands and monitoring points when given, and, in a chaotic regime, the part past
 * the predictability horizon shaded and faded. Focus the chart to zoom with the keyboard
 * (+, −, ←, →, 0); its numbers are one button away as a table, and it downloads as PNG, SVG
 * and CSV.
 */
@Component({
  selector: 'tropline-trajectory-chart',
  imports: [NgxEchartsDirective, ChartFigure],
  templateUrl: './trajectory-chart.html',
  styleUrl: './trajectory-chart.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    class: 'tropline-trajectory-chart',
    '[style.color-scheme]': 'colorScheme',
  },
})
export class TrajectoryChart {
  private readonly options = inject(TROPLINE_OPTIONS);
  protected readonly strings = inject(TROPLINE_STRINGS);
  private readonly palette = injectChartPalette();
  private readonly reducedMotion = injectReducedMotion();

  /** The trajectory to draw; while undefined a skeleton holds its place. */
  readonly data = input<TrajectoryData | undefined>(undefined);
  /** Whether the value axes are logarithmic. */
  readonly logScale = input<boolean>(false);
  /** Time past which a chaotic projection is not meaningful; shaded and faded when set. */
  readonly predictabilityHorizon = input<number | undefined>(undefined);
  /** Accessible name of the chart. */
  readonly label = input<string>('Trajectory of every level over time');
  /** Whether the reader can zoom the time axis. */
  readonly zoom = input<boolean>(true);
  /** Base name of downloaded files. */
  readonly fileName = input<string>('tropline-trajectory');

  protected readonly summaryId = `tropline-trajectory-summary-${nextId}`;
  protected readonly keysId = `tropline-trajectory-keys-${nextId++}`;
  protected readonly colorScheme = this.options.theme === 'auto' ? null : this.options.theme;
  protected readonly initOpts = { renderer: this.options.renderer };
  /** The drawn ECharts instance, once initialised. */
  protected readonly chart = signal<EChartsType | undefined>(undefined);
  protected readonly background = computed(() => this.palette().surface);

  protected readonly chartOptions = computed(() => {
    const data = this.data();
    if (!data) return {};
    const palette = this.palette();
    return trajectoryChartOptions(data, {
      logScale: this.logScale(),
      colors: palette.series,
      locale: this.options.locale,
      predictabilityHorizon: this.predictabilityHorizon(),
      textColor: palette.text,
      fontFamily: palette.font,
      zoom: this.zoom(),
      animation: !this.reducedMotion(),
      strings: this.strings,
    });
  });

  protected readonly summary = computed(() => {
    const data = this.data();
    return data
      ? describeTrajectory(data, this.options.locale, this.predictabilityHorizon())
      : this.strings.empty;
  });

  protected readonly table = computed(() => {
    const data = this.data();
    return data
      ? trajectoryTable(data, this.strings)
      : { caption: this.strings.empty, columns: [], rows: [] };
  });

  protected onKey(event: KeyboardEvent): void {
    const chart = this.chart();
    if (!chart || !this.zoom()) return;
    const keys: Record<string, ZoomKey> = {
      '+': 'in',
      '=': 'in',
      '-': 'out',
      ArrowLeft: 'left',
      ArrowRight: 'right',
      '0': 'reset',
      Home: 'reset',
    };
    const key = keys[event.key];
    if (!key) return;
    event.preventDefault();
    const zoom = (chart.getOption() as { dataZoom?: { start?: number; end?: number }[] })
      .dataZoom?.[0];
    const next = zoomWindow({ start: zoom?.start ?? 0, end: zoom?.end ?? 100 }, key);
    chart.dispatchAction({ type: 'dataZoom', start: next.start, end: next.end });
  }
}
