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
 * the drawn chart's own option, so a host (or a test) can see that reduced motion is honoured,
 * and `data-text-outside`: how many of the drawn texts (axis names, labels, legend) reach past the
 * canvas after each drawing — 0 when none runs off its edge — with their words in
 * `data-text-outside-words` (so a failing check can say which).
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
  /** The words of the drawn texts that reach past the canvas, after the last drawing. */
  protected readonly textOutside = signal<readonly string[] | undefined>(undefined);

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
        if (chart.isDisposed() || untracked(this.loading)) return;
        if (option !== read) {
          read = option;
          const drawn = (chart.getOption() as { animation?: unknown } | undefined)?.animation;
          this.drawnAnimation.set(drawn === false ? 'off' : 'on');
        }
        // A probe of the drawn scene: whatever it meets, it must not stop the frame's own work.
        try {
          this.textOutside.set(textsOutside(chart));
        } catch {
          this.textOutside.set(undefined);
        }
      };
      chart.on('finished', check);
      // ECharts may have finished drawing before loading ended (no animation under reduced
      // motion, so no later 'finished'): check again once the option or loading state changes.
      this.loading();
      this.option();
      const later = setTimeout(check, 0);
      onCleanup(() => {
        clearTimeout(later);
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

/** A box in canvas pixels. */
interface Box {
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
}

/** A drawn element of the chart's scene (or a clip path), as far as {@link textsOutside} reads it. */
interface SceneElement {
  readonly type: string;
  readonly invisible?: boolean;
  readonly ignore?: boolean;
  readonly transform?: ArrayLike<number> | null;
  /** A text's own words (tspan and text elements). */
  readonly style?: { readonly text?: string };
  /** The clip paths zrender collected for it while drawing, their transforms in canvas pixels. */
  readonly __clipPaths?: readonly SceneElement[];
  getBoundingRect(): { x: number; y: number; width: number; height: number };
}

/** An element's bounding box through its affine transform [a, b, c, d, e, f]. */
function canvasBox(el: SceneElement): Box {
  const r = el.getBoundingRect();
  const m = el.transform ?? [1, 0, 0, 1, 0, 0];
  const corners = [r.x, r.x + r.width].flatMap((x) =>
    [r.y, r.y + r.height].map((y) => [
      m[0]! * x + m[2]! * y + m[4]!,
      m[1]! * x + m[3]! * y + m[5]!,
    ]),
  );
  const xs = corners.map((c) => c[0]!);
  const ys = corners.map((c) => c[1]!);
  return { x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys) };
}

/**
 * The words of a drawn chart's texts whose drawn part — the box in canvas pixels, cut by the
 * text's clips — reaches more than a pixel past the canvas, so a reader sees part of a word or
 * none of it. A text its clip hides wholly (a scrolling legend's other pages) is not drawn and
 * does not count, nor does the part a clip cuts off (the scrolling legend's last partial item,
 * which its page arrows lead on to).
 */
function textsOutside(chart: EChartsType): string[] {
  const scene = chart.getZr().storage.getDisplayList(true) as unknown as readonly SceneElement[];
  const outside: string[] = [];
  const canvas: Box = { x0: 0, y0: 0, x1: chart.getWidth(), y1: chart.getHeight() };
  for (const el of scene) {
    if ((el.type !== 'tspan' && el.type !== 'text') || el.invisible || el.ignore) continue;
    const r = el.getBoundingRect();
    if (!r.width || !r.height) continue;
    // What of the text is drawn: its box cut by its clips (the part a clip hides is not seen).
    let seen = canvasBox(el);
    for (const clip of el.__clipPaths ?? []) {
      const c = canvasBox(clip);
      seen = {
        x0: Math.max(seen.x0, c.x0),
        y0: Math.max(seen.y0, c.y0),
        x1: Math.min(seen.x1, c.x1),
        y1: Math.min(seen.y1, c.y1),
      };
    }
    const hidden = seen.x1 <= seen.x0 || seen.y1 <= seen.y0;
    if (hidden) continue;
    if (
      seen.x0 < canvas.x0 - 1 ||
      seen.y0 < canvas.y0 - 1 ||
      seen.x1 > canvas.x1 + 1 ||
      seen.y1 > canvas.y1 + 1
    ) {
      outside.push(el.style?.text ?? '');
    }
  }
  return outside;
}
