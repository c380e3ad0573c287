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
import { MatSlider, MatSliderThumb } from '@angular/material/slider';
import type { ChainModel, Equilibrium } from '@tropline/core/contract';
import type { EChartsType } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { ChartFigure } from '../chart-figure/chart-figure';
import { injectChartPalette, injectReducedMotion } from '../chart-figure/chart-palette';
import { injectElementSize } from '../chart-figure/element-size';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';
import {
  DEFAULT_VIEW_ANGLES,
  describePhasePortrait3d,
  phasePortrait3dOptions,
  turnView,
  type ViewAngles,
  type ViewKey,
} from './phase-portrait-3d-options';
import {
  describePhasePortrait,
  phasePortraitOptions,
  phasePortraitTable,
  twoLevelNullclines,
} from './phase-portrait-options';

let nextId = 0;

/** Whether the portrait shows two levels in the plane or three in a turnable box. */
export type PhasePortraitView = 'plane' | 'box';

/** The arrow keys that turn the box, and Home, which restores the opening view. */
const VIEW_KEYS: Readonly<Record<string, ViewKey>> = {
  ArrowLeft: 'left',
  ArrowRight: 'right',
  ArrowUp: 'up',
  ArrowDown: 'down',
  Home: 'reset',
};

/**
 * Any two levels against each other: the trajectory with its transient faded, equilibria
 * marked filled (stable) or hollow (unstable), and the nullclines of a two-level chain. For a
 * chain of three or more levels a second view shows three levels in a box drawn in orthographic
 * projection, turned with two sliders or the arrow keys on the focused chart. The reader picks
 * the levels with ordinary selects.
 */
@Component({
  selector: 'tropline-phase-portrait',
  imports: [
    NgxEchartsDirective,
    ChartFigure,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatSlider,
    MatSliderThumb,
  ],
  templateUrl: './phase-portrait.html',
  styleUrl: './phase-portrait.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-phase-portrait' },
})
export class PhasePortrait {
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);
  private readonly palette = injectChartPalette();
  private readonly reducedMotion = injectReducedMotion();

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
  /** Level id on the depth axis of the three-level view; default the third level. */
  readonly depth = input<string | undefined>(undefined);
  /** The view to open with; `box` needs a chain of at least three levels. */
  readonly view = input<PhasePortraitView>('plane');
  /** Where the three-level view is seen from when it opens, in degrees. */
  readonly viewAngles = input<ViewAngles>(DEFAULT_VIEW_ANGLES);
  /** End of the transient in model time; default a quarter of the span. */
  readonly transientEnd = input<number | undefined>(undefined);
  /** Accessible name of the chart. */
  readonly label = input<string>('Phase portrait');

  private readonly id = nextId++;
  protected readonly summaryId = `tropline-phase-summary-${this.id}`;
  protected readonly keysId = `tropline-phase-keys-${this.id}`;
  protected readonly xSelectId = `tropline-phase-x-${this.id}`;
  protected readonly ySelectId = `tropline-phase-y-${this.id}`;
  protected readonly depthSelectId = `tropline-phase-depth-${this.id}`;
  protected readonly initOpts = { renderer: this.options.renderer };
  protected readonly chart = signal<EChartsType | undefined>(undefined);
  protected readonly levels = computed(() => this.model().levels);
  /** Whether the chain has the three levels the box needs. */
  protected readonly boxPossible = computed(() => this.model().levels.length >= 3);
  /** The view shown. */
  protected readonly shownView = linkedSignal(() =>
    this.view() === 'box' && this.boxPossible() ? 'box' : 'plane',
  );
  /** The chosen horizontal level. */
  protected readonly xLevel = linkedSignal(() => this.x() ?? this.model().levels[0]!.id);
  /** The chosen vertical level. */
  protected readonly yLevel = linkedSignal(() => this.y() ?? this.model().levels[1]!.id);
  /** The chosen depth level of the box. */
  protected readonly depthLevel = linkedSignal(
    () => this.depth() ?? this.model().levels[2]?.id ?? this.model().levels[0]!.id,
  );
  /** Where the box is seen from. */
  protected readonly angles = linkedSignal(() => this.viewAngles());
  protected readonly background = computed(() => this.palette().surface);
  private readonly canvas = viewChild<ElementRef<HTMLElement>>('canvas');
  private readonly canvasSize = injectElementSize(() => this.canvas()?.nativeElement);

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
      animation: !this.reducedMotion(),
      strings: this.strings,
      width: this.canvasSize().width,
    };
  });
  private readonly boxSettings = computed(() => {
    const { width, height } = this.canvasSize();
    // The option's grid keeps 16 px across and 48 px up for margins and the legend.
    const aspect = width > 16 && height > 48 ? (width - 16) / (height - 48) : 2;
    return {
      ...this.settings(),
      depth: this.depthLevel(),
      angles: this.angles(),
      aspect,
      colors: [this.palette().series[1]!, this.palette().muted],
    };
  });

  protected readonly chartOptions = computed(() => {
    const data = this.data();
    if (!data) return {};
    return this.shownView() === 'box'
      ? phasePortrait3dOptions(data, this.boxSettings())
      : phasePortraitOptions(data, this.settings());
  });
  protected readonly summary = computed(() => {
    const data = this.data();
    if (!data) return this.strings.empty;
    return this.shownView() === 'box'
      ? describePhasePortrait3d(data, this.boxSettings())
      : describePhasePortrait(data, this.settings());
  });
  protected readonly table = computed(() => {
    const data = this.data();
    if (!data) return { caption: this.strings.empty, columns: [], rows: [] };
    return phasePortraitTable(
      data,
      this.xLevel(),
      this.yLevel(),
      this.shownView() === 'box' ? this.depthLevel() : undefined,
    );
  });
  protected readonly describedBy = computed(() =>
    this.shownView() === 'box' ? `${this.summaryId} ${this.keysId}` : this.summaryId,
  );

  protected pick(axis: 'x' | 'y' | 'depth', event: Event): void {
    const id = (event.target as HTMLSelectElement).value;
    ({ x: this.xLevel, y: this.yLevel, depth: this.depthLevel })[axis].set(id);
  }

  protected setAngle(which: keyof ViewAngles, value: number): void {
    this.angles.update((a) => ({ ...a, [which]: value }));
  }

  protected onKey(event: KeyboardEvent): void {
    const key = VIEW_KEYS[event.key];
    if (this.shownView() !== 'box' || !key) return;
    event.preventDefault();
    this.angles.update((a) => turnView(a, key));
  }

  protected degrees(value: number): string {
    return `${value}°`;
  }
}
