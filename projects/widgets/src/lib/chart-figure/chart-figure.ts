import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DOCUMENT,
  effect,
  type ElementRef,
  inject,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import type { EChartsCoreOption, EChartsType } from 'echarts/core';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { chartPng, type ChartTable, optionSvg, saveFile, tableCsv } from './chart-export';
import { injectElementSize } from './element-size';

let nextId = 0;

/**
 * The frame every Tropline chart sits in: the chart (projected), its one-paragraph summary as
 * the figure caption, a button that shows the same numbers as a table, and downloads as PNG,
 * SVG and CSV. While `loading` a skeleton of the same height keeps the page from shifting.
 *
 * The frame also keeps the chart the size of its stage: a chart first drawn while hidden (in a
 * closed tab, at 0 × 0) is redrawn at its real size once shown, and one whose container changes
 * width is redrawn at the new width. The stage carries `data-animation="on|off"`, read back from
 * the drawn chart's own option, so a host (or a test) can see that reduced motion is honoured.
 */
@Component({
  selector: 'tropline-chart-figure',
  imports: [MatButton],
  templateUrl: './chart-figure.html',
  styleUrl: './chart-figure.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-chart-figure' },
})
export class ChartFigure {
  private readonly document = inject(DOCUMENT);
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** Id of the caption; the projected chart points `aria-describedby` at it. */
  readonly summaryId = input.required<string>();
  /** The sentence that describes the chart. */
  readonly summary = input.required<string>();
  /** The chart's numbers, for the table view and the CSV. */
  readonly table = input.required<ChartTable>();
  /** The drawn chart, for the PNG export. */
  readonly chart = input<EChartsType | undefined>(undefined);
  /** The chart's option, for the SVG export. */
  readonly option = input<EChartsCoreOption | undefined>(undefined);
  /** Base name of downloaded files. */
  readonly fileName = input<string>('tropline-chart');
  /** Background of exported images (the theme's surface). */
  readonly background = input<string>('#ffffff');
  /** Whether the chart is waiting for its data (a skeleton is shown). */
  readonly loading = input<boolean>(false);

  private readonly stage = viewChild<ElementRef<HTMLElement>>('stage');
  private readonly stageSize = injectElementSize(() => this.stage()?.nativeElement);
  /** Whether the drawn chart animates, as its instance reports it after drawing. */
  protected readonly drawnAnimation = signal<'on' | 'off' | undefined>(undefined);

  constructor() {
    // ngx-echarts ignores its observer's first report, which for a chart created hidden is the
    // one that reveals it; follow the stage here and resize whenever the drawing disagrees.
    effect(() => {
      const { width, height } = this.stageSize();
      const chart = this.chart();
      if (!chart || chart.isDisposed() || width === 0 || height === 0) return;
      const dom = chart.getDom();
      if (chart.getWidth() !== dom.clientWidth || chart.getHeight() !== dom.clientHeight) {
        chart.resize();
      }
    });
    effect((onCleanup) => {
      const chart = this.chart();
      if (!chart) return;
      let read: unknown;
      const check = () => {
        const option = untracked(this.option);
        // While loading the chart holds a placeholder option; only the real one counts.
        if (chart.isDisposed() || option === read || untracked(this.loading)) return;
        read = option;
        const drawn = (chart.getOption() as { animation?: unknown } | undefined)?.animation;
        this.drawnAnimation.set(drawn === false ? 'off' : 'on');
      };
      chart.on('finished', check);
      onCleanup(() => {
        if (!chart.isDisposed()) chart.off('finished', check);
      });
    });
  }

  /** Whether the table view is open. */
  protected readonly tableShown = signal(false);
  protected readonly tableId = `tropline-chart-table-${nextId++}`;
  private readonly numbers = computed(
    () => new Intl.NumberFormat(this.options.locale, { maximumSignificantDigits: 4 }),
  );
  /** Cells as shown on screen, numbers in the reader's locale. */
  protected readonly shownRows = computed(() =>
    this.table().rows.map((row) =>
      row.map((cell) =>
        cell === null ? '—' : typeof cell === 'number' ? this.numbers().format(cell) : cell,
      ),
    ),
  );

  protected toggleTable(): void {
    this.tableShown.update((shown) => !shown);
  }

  protected exportPng(): void {
    const chart = this.chart();
    if (chart)
      saveFile(this.document, `${this.fileName()}.png`, chartPng(chart, this.background()));
  }

  protected async exportSvg(): Promise<void> {
    const option = this.option();
    if (!option) return;
    const chart = this.chart();
    const svg = await optionSvg(
      { ...option, backgroundColor: this.background() },
      chart?.getWidth() ?? 800,
      chart?.getHeight() ?? 400,
    );
    saveFile(this.document, `${this.fileName()}.svg`, new Blob([svg], { type: 'image/svg+xml' }));
  }

  protected exportCsv(): void {
    const csv = tableCsv(this.table());
    saveFile(this.document, `${this.fileName()}.csv`, new Blob([csv], { type: 'text/csv' }));
  }
}
