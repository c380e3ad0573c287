import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import type { ChainModel, Equilibrium } from '@tropline/core/contract';
import type { EChartsType } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { ChartFigure } from '../chart-figure/chart-figure';
import { injectChartPalette, prefersReducedMotion } from '../chart-figure/chart-palette';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';
import {
  describePhasePortrait,
  phasePortraitOptions,
  phasePortraitTable,
  twoLevelNullclines,
} from './phase-portrait-options';

let nextId = 0;

/**
 * Any two levels against each other: the trajectory with its transient faded, equilibria
 * marked filled (stable) or hollow (unstable), and the nullclines of a two-level chain. The
 * reader picks the two levels with ordinary selects.
 */
@Component({
  selector: 'tropline-phase-portrait',
  imports: [NgxEchartsDirective, ChartFigure],
  templateUrl: './phase-portrait.html',
  styleUrl: './phase-portrait.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-phase-portrait' },
})
export class PhasePortrait {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  private readonly options = inject(TROPLINE_OPTIONS);
  private readonly strings = inject(TROPLINE_STRINGS);
  private readonly palette = injectChartPalette();

  /** The model (names, units, nullclines). */
  readonly model = input.required<ChainModel>();
  /** The trajectory; a skeleton holds its place while undefined. */
  readonly data = input<TrajectoryData | undefined>(undefined);
  /** Equilibria to mark. */
  readonly equilibria = input<readonly Equilibrium[]>([]);
  /** Level id on the horizontal axis; default the producer. */
  readonly x = input<string | undefined>(undefined);
  /** Level id on the vertical axis; default the level above the producer. */
  readonly y = input<string | undefined>(undefined);
  /** End of the transient in model time; default a quarter of the span. */
  readonly transientEnd = input<number | undefined>(undefined);
  /** Accessible name of the chart. */
  readonly label = input<string>('Phase portrait');

  private readonly id = nextId++;
  protected readonly summaryId = `tropline-phase-summary-${this.id}`;
  protected readonly xSelectId = `tropline-phase-x-${this.id}`;
  protected readonly ySelectId = `tropline-phase-y-${this.id}`;
  protected readonly initOpts = { renderer: this.options.renderer };
  protected readonly chart = signal<EChartsType | undefined>(undefined);
  protected readonly levels = computed(() => this.model().levels);
  /** The chosen horizontal level. */
  protected readonly xLevel = linkedSignal(() => this.x() ?? this.model().levels[0]!.id);
  /** The chosen vertical level. */
  protected readonly yLevel = linkedSignal(() => this.y() ?? this.model().levels[1]!.id);
  protected readonly background = computed(() => this.palette().surface);

  private readonly settings = computed(() => {
    const data = this.data();
    const end = data?.times[data.times.length - 1] ?? 0;
    const model = this.model();
    const natural = this.xLevel() === model.levels[0]!.id && this.yLevel() === model.levels[1]?.id;
    const p = this.palette();
    return {
      x: this.xLevel(),
      y: this.yLevel(),
      transientEnd: this.transientEnd() ?? end / 4,
      equilibria: this.equilibria(),
      nullclines: natural ? twoLevelNullclines(model) : undefined,
      colors: [p.series[1]!, p.series[2]!],
      textColor: p.text,
      surface: p.surface,
      locale: this.options.locale,
      animation: !prefersReducedMotion(this.host),
      strings: this.strings,
    };
  });

  protected readonly chartOptions = computed(() => {
    const data = this.data();
    return data ? phasePortraitOptions(data, this.settings()) : {};
  });
  protected readonly summary = computed(() => {
    const data = this.data();
    return data ? describePhasePortrait(data, this.settings()) : this.strings.empty;
  });
  protected readonly table = computed(() => {
    const data = this.data();
    return data
      ? phasePortraitTable(data, this.xLevel(), this.yLevel())
      : { caption: this.strings.empty, columns: [], rows: [] };
  });

  protected pick(axis: 'x' | 'y', event: Event): void {
    const id = (event.target as HTMLSelectElement).value;
    (axis === 'x' ? this.xLevel : this.yLevel).set(id);
  }
}
