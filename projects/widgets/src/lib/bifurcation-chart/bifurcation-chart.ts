import {
  ChangeDetectionStrategy,
  Component,
  computed,
  type ElementRef,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { getParameter } from '@tropline/core/contract';
import type { EChartsType } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { Subject } from 'rxjs';
import type { SweepRequest, SweepResult } from '../api/analysis-types';
import { TroplineClient } from '../api/tropline-client';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { ChartFigure } from '../chart-figure/chart-figure';
import { injectChartPalette } from '../chart-figure/chart-palette';
import { injectElementSize } from '../chart-figure/element-size';
import { jobState } from '../job-strip/job-state';
import { JobStrip } from '../job-strip/job-strip';
import { parameterGroups } from '../parameter-form/parameter-form-schema';
import { formatUnit } from '../trajectory-chart/trajectory-chart-format';
import {
  type BifurcationAxes,
  bifurcationChartOptions,
  bifurcationTable,
  describeBifurcation,
} from './bifurcation-chart-options';

let nextId = 0;

/** Axis labels of a sweep request, from the model's names and units. */
export function sweepAxes(request: SweepRequest): BifurcationAxes {
  const field = parameterGroups(request.model)
    .flatMap((g) => g.fields.map((f) => ({ ...f, level: g.legend.split(' — ')[0] })))
    .find((f) => f.pointer === request.parameter);
  const observed = request.model.levels.find((l) => l.id === request.observe);
  return {
    parameter: field
      ? `${field.label} of ${field.level}${field.unit ? ` (${field.unit})` : ''}`
      : request.parameter,
    observed: observed ? `${observed.name} (${formatUnit(observed.unit)})` : request.observe,
  };
}

/**
 * The long-run maxima of one level against a swept parameter, points shaped and coloured by
 * regime, the current value marked. Given a `request` it runs the sweep as a background job with
 * progress and a cancel button; given a `result` it only draws.
 */
@Component({
  selector: 'tropline-bifurcation-chart',
  imports: [NgxEchartsDirective, ChartFigure, JobStrip],
  templateUrl: './bifurcation-chart.html',
  styleUrl: './bifurcation-chart.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-bifurcation-chart' },
})
export class BifurcationChart {
  private readonly client = inject(TroplineClient);
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);
  private readonly palette = injectChartPalette();
  private readonly cancelled = new Subject<void>();

  /** The sweep to run as a job. */
  readonly request = input<SweepRequest | undefined>(undefined);
  /** A finished sweep to draw (instead of a request). */
  readonly result = input<SweepResult | undefined>(undefined);
  /** Axis labels; derived from the request's model when not given. */
  readonly axes = input<BifurcationAxes | undefined>(undefined);
  /** The parameter's current value; the request model's value when not given. */
  readonly current = input<number | undefined>(undefined);
  /** Accessible name of the chart. */
  readonly label = input<string>('Bifurcation diagram');

  protected readonly summaryId = `tropline-bifurcation-summary-${nextId++}`;
  protected readonly initOpts = { renderer: this.options.renderer };
  protected readonly chart = signal<EChartsType | undefined>(undefined);
  protected readonly job = jobState(this.request, (req) => this.client.sweep(req), this.cancelled);

  protected readonly shown = computed((): SweepResult | undefined => {
    const job = this.job();
    return this.result() ?? (job.kind === 'done' ? job.result : undefined);
  });
  private readonly axisLabels = computed((): BifurcationAxes => {
    const req = this.request();
    return this.axes() ?? (req ? sweepAxes(req) : { parameter: 'parameter', observed: 'level' });
  });
  private readonly currentValue = computed(() => {
    const req = this.request();
    return this.current() ?? (req ? getParameter(req.model, req.parameter) : undefined);
  });
  protected readonly background = computed(() => this.palette().surface);
  private readonly canvas = viewChild<ElementRef<HTMLElement>>('canvas');
  private readonly canvasSize = injectElementSize(() => this.canvas()?.nativeElement);

  protected readonly chartOptions = computed(() => {
    const result = this.shown();
    if (!result) return {};
    const p = this.palette();
    return bifurcationChartOptions(result, {
      width: this.canvasSize().width,
      axes: this.axisLabels(),
      current: this.currentValue(),
      colors: {
        equilibrium: p.series[0]!,
        cycle: p.series[1]!,
        chaotic: p.series[2]!,
        collapse: p.series[3]!,
      },
      textColor: p.text,
      locale: this.options.locale,
      strings: this.strings,
    });
  });
  protected readonly summary = computed(() => {
    const result = this.shown();
    return result
      ? describeBifurcation(result, this.axisLabels(), this.options.locale, this.strings)
      : this.strings.empty;
  });
  protected readonly table = computed(() => {
    const result = this.shown();
    return result
      ? bifurcationTable(result, this.axisLabels(), this.strings)
      : { caption: this.strings.empty, columns: [], rows: [] };
  });

  /** Stops the running sweep. */
  cancel(): void {
    this.cancelled.next();
  }
}
