import {
  ChangeDetectionStrategy,
  Component,
  computed,
  type ElementRef,
  inject,
  input,
  linkedSignal,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import type { ChainModel } from '@tropline/core/contract';
import type { EChartsType } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { Subject } from 'rxjs';
import type { ComparisonRequest, ComparisonResult } from '../api/analysis-types';
import { TroplineClient } from '../api/tropline-client';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { CautionNotice } from '../caution-notice/caution-notice';
import { ChartFigure } from '../chart-figure/chart-figure';
import { injectChartPalette } from '../chart-figure/chart-palette';
import { injectElementSize } from '../chart-figure/element-size';
import { jobState } from '../job-strip/job-state';
import { JobStrip } from '../job-strip/job-strip';
import {
  type ComparisonLayout,
  comparisonChartOptions,
  comparisonRowCount,
  comparisonTable,
  describeComparison,
} from './scenario-comparison-options';
import { comparisonRows } from './scenario-comparison-table';

let nextId = 0;

/**
 * A baseline and its management alternatives side by side: small multiples or an overlay of one
 * level, and a table of the comparison metrics with each difference from the baseline written
 * out and the large ones highlighted (bold and an arrow, not colour alone). Given a `request`
 * it runs the comparison as a background job; given a `result` it only draws.
 */
@Component({
  selector: 'tropline-scenario-comparison',
  imports: [
    NgxEchartsDirective,
    ChartFigure,
    JobStrip,
    CautionNotice,
    MatButtonToggle,
    MatButtonToggleGroup,
  ],
  templateUrl: './scenario-comparison.html',
  styleUrl: './scenario-comparison.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-scenario-comparison' },
})
export class ScenarioComparison {
  private readonly client = inject(TroplineClient);
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);
  private readonly palette = injectChartPalette();
  private readonly cancelled = new Subject<void>();

  /** The baseline model (names and units). */
  readonly model = input.required<ChainModel>();
  /** The comparison to run as a job. */
  readonly request = input<ComparisonRequest | undefined>(undefined);
  /** A finished comparison to show (instead of a request). */
  readonly result = input<ComparisonResult | undefined>(undefined);
  /** Initial layout. */
  readonly layout = input<ComparisonLayout>('multiples');

  private readonly id = nextId++;
  protected readonly summaryId = `tropline-comparison-summary-${this.id}`;
  protected readonly levelSelectId = `tropline-comparison-level-${this.id}`;
  protected readonly initOpts = { renderer: this.options.renderer };
  protected readonly chart = signal<EChartsType | undefined>(undefined);
  protected readonly shownLayout = linkedSignal(() => this.layout());
  protected readonly level = linkedSignal(() => this.model().levels.at(-1)!.id);
  protected readonly job = jobState(this.request, (r) => this.client.compare(r), this.cancelled);
  protected readonly background = computed(() => this.palette().surface);

  protected readonly shown = computed((): ComparisonResult | undefined => {
    const job = this.job();
    return this.result() ?? (job.kind === 'done' ? job.result : undefined);
  });
  private readonly canvas = viewChild<ElementRef<HTMLElement>>('canvas');
  private readonly canvasSize = injectElementSize(() => this.canvas()?.nativeElement);
  /** Small multiples side by side: three on a wide chart, fewer as it narrows. */
  private readonly columns = computed(() => {
    const width = this.canvasSize().width;
    return width === 0 || width >= 840 ? 3 : width >= 520 ? 2 : 1;
  });
  /** Rows beyond one get room of their own (as least height, so a host's height still holds). */
  protected readonly minHeight = computed(() => {
    const result = this.shown();
    if (!result || this.shownLayout() === 'overlay') return null;
    const rows = comparisonRowCount(result.scenarios.length, this.columns());
    return rows > 1 ? 40 + rows * 190 : null;
  });

  protected readonly chartOptions = computed(() => {
    const result = this.shown();
    if (!result) return {};
    const p = this.palette();
    const height = this.canvasSize().height;
    return comparisonChartOptions(this.model(), result, {
      layout: this.shownLayout(),
      level: this.level(),
      colors: p.series,
      textColor: p.text,
      locale: this.options.locale,
      strings: this.strings,
      columns: this.columns(),
      width: this.canvasSize().width,
      ...(height > 0 ? { height: Math.max(height, this.minHeight() ?? 0) } : {}),
    });
  });
  protected readonly summary = computed(() => {
    const result = this.shown();
    return result
      ? describeComparison(this.model(), result, {
          layout: this.shownLayout(),
          level: this.level(),
          locale: this.options.locale,
        })
      : this.strings.empty;
  });
  protected readonly table = computed(() => {
    const result = this.shown();
    return result
      ? comparisonTable(this.model(), result, this.level())
      : { caption: this.strings.empty, columns: [], rows: [] };
  });
  protected readonly rows = computed(() => {
    const result = this.shown();
    return result ? comparisonRows(this.model(), result, this.options.locale, this.strings) : [];
  });
  protected readonly names = computed(() => this.shown()?.scenarios.map((s) => s.name) ?? []);

  /** Stops the running comparison. */
  cancel(): void {
    this.cancelled.next();
  }

  protected pickLevel(event: Event): void {
    this.level.set((event.target as HTMLSelectElement).value);
  }
}
