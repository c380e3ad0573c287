import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { getParameter, type Equilibrium, type ProjectionResponse } from '@tropline/core';
import {
  BifurcationChart,
  CautionNotice,
  JobProgress,
  PhasePortrait,
  RegimeSummary,
  ScenarioComparison,
  TrajectoryChart,
  TroplineClient,
  type ComparisonRequest,
  type RegimeResponse,
  type SweepRequest,
  type TrajectoryData,
  type TroplineApiError,
} from '@tropline/widgets';
import { firstValueFrom, type Subscription } from 'rxjs';
import {
  comparisonRequest,
  defaultSweep,
  ensembleRequest,
  ensembleTrajectory,
  sweepRequest,
  type Alternative,
  type EnsembleResult,
  type SweepForm,
} from './analysis-requests';
import { parameterFields } from './scenario-editor-form';
import type { ScenarioContent } from './scenario-types';

/** The projection, equilibria and regime of one run. */
interface LongRun {
  readonly projection: ProjectionResponse;
  readonly equilibria: readonly Equilibrium[];
  readonly regime?: RegimeResponse;
  readonly regimeError?: TroplineApiError;
}

/**
 * Every analysis of one version with the library's widgets, computed by the API for the
 * signed-in member (the role matrix's `analyses:run`, the tenant's compute units): projection
 * with phase portrait and regime summary, a bifurcation sweep of a chosen parameter, ensemble
 * bands for uncertain parameters, and a comparison with alternatives. Nothing runs until asked,
 * since each run is charged.
 */
@Component({
  selector: 'tc-scenario-analyses',
  imports: [
    FormsModule,
    MatButton,
    MatCheckbox,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    MatProgressBar,
    BifurcationChart,
    CautionNotice,
    JobProgress,
    PhasePortrait,
    RegimeSummary,
    ScenarioComparison,
    TrajectoryChart,
  ],
  templateUrl: './scenario-analyses.html',
  styleUrl: './scenario-analyses.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScenarioAnalyses {
  private readonly client = inject(TroplineClient);

  /** The version analysed. */
  readonly content = input.required<ScenarioContent>();
  /** Its number, for headings. */
  readonly version = input.required<number>();

  protected readonly parameters = computed(() => parameterFields(this.content().model));
  protected readonly levels = computed(() => this.content().model.levels);

  // ── Projection, phase portrait, regime ───────────────────────────────────────────────────
  protected readonly longRun = signal<LongRun | undefined>(undefined);
  protected readonly longRunBusy = signal(false);
  protected readonly longRunError = signal<TroplineApiError | undefined>(undefined);
  protected readonly trajectory = computed((): TrajectoryData | undefined => {
    const run = this.longRun();
    if (!run) return undefined;
    const { model } = this.content();
    return {
      times: run.projection.times,
      timeUnit: model.timeUnit,
      series: model.levels.map((l) => ({
        id: l.id,
        name: l.name,
        unit: l.unit,
        values: run.projection.series[l.id] ?? [],
      })),
    };
  });

  // ── Sweep ────────────────────────────────────────────────────────────────────────────────
  protected readonly sweepForm = signal<SweepForm | undefined>(undefined);
  protected readonly sweep = signal<SweepRequest | undefined>(undefined);
  /** The sweep form's number fields, in the order shown. */
  protected readonly sweepNumbers: readonly {
    key: 'from' | 'to' | 'steps' | 'transient' | 'window';
    label: string;
    min?: number;
    max?: number;
    inTime?: boolean;
  }[] = [
    { key: 'from', label: 'From' },
    { key: 'to', label: 'To' },
    { key: 'steps', label: 'Values', min: 2, max: 1000 },
    { key: 'transient', label: 'Transient discarded', min: 0, inTime: true },
    { key: 'window', label: 'Window recorded', min: 0, inTime: true },
  ];

  // ── Ensemble ─────────────────────────────────────────────────────────────────────────────
  protected readonly uncertain = signal<readonly string[]>([]);
  protected readonly sigma = signal(0.1);
  protected readonly members = signal(200);
  protected readonly ensembleProgress = signal<number | undefined>(undefined);
  protected readonly ensembleRunning = signal(false);
  protected readonly ensemble = signal<TrajectoryData | undefined>(undefined);
  protected readonly ensembleError = signal<TroplineApiError | undefined>(undefined);
  protected readonly ensembleNote = signal('');
  private ensembleJob?: Subscription;

  // ── Comparison ───────────────────────────────────────────────────────────────────────────
  protected readonly alternatives = signal<readonly Alternative[]>([]);
  protected readonly comparison = signal<ComparisonRequest | undefined>(undefined);

  constructor() {
    inject(DestroyRef).onDestroy(() => this.ensembleJob?.unsubscribe());
    // A new version starts every analysis afresh, with defaults from its model.
    effect(() => {
      const content = this.content();
      untracked(() => {
        const first = parameterFields(content.model);
        this.longRun.set(undefined);
        this.longRunError.set(undefined);
        this.sweep.set(undefined);
        this.sweepForm.set(first[0] ? defaultSweep(content.model, first[0].pointer) : undefined);
        this.uncertain.set(first.slice(0, 1).map((f) => f.pointer));
        this.stopEnsemble();
        this.ensemble.set(undefined);
        this.comparison.set(undefined);
        this.alternatives.set(first[0] ? [this.alternativeFor(first[0].pointer, 1.2)] : []);
      });
    });
  }

  protected async runLongRun(): Promise<void> {
    const c = this.content();
    this.longRunBusy.set(true);
    this.longRunError.set(undefined);
    try {
      const [projection, eq] = await Promise.all([
        firstValueFrom(
          this.client.project({
            model: c.model,
            initial: c.initial,
            horizon: c.horizon,
            samples: 2001,
          }),
        ),
        firstValueFrom(this.client.equilibria({ model: c.model })),
      ]);
      let regime: RegimeResponse | undefined;
      let regimeError: TroplineApiError | undefined;
      try {
        regime = await firstValueFrom(this.client.regime({ model: c.model, initial: c.initial }));
      } catch (err) {
        regimeError = err as TroplineApiError;
      }
      this.longRun.set({ projection, equilibria: eq.equilibria, regime, regimeError });
    } catch (err) {
      this.longRunError.set(err as TroplineApiError);
    } finally {
      this.longRunBusy.set(false);
    }
  }

  protected setSweep(change: Partial<SweepForm>): void {
    const f = this.sweepForm();
    if (!f) return;
    this.sweepForm.set(
      change.parameter && change.parameter !== f.parameter
        ? { ...defaultSweep(this.content().model, change.parameter), observe: f.observe }
        : { ...f, ...change },
    );
  }

  protected setSweepNumber(key: keyof SweepForm, event: Event): void {
    this.setSweep({ [key]: this.num(event) });
  }

  protected runSweep(): void {
    const f = this.sweepForm();
    if (f) this.sweep.set(sweepRequest(this.content(), f));
  }

  protected toggleUncertain(pointer: string, on: boolean): void {
    const now = this.uncertain().filter((p) => p !== pointer);
    this.uncertain.set(on ? [...now, pointer] : now);
  }

  protected runEnsemble(): void {
    this.stopEnsemble();
    const body = ensembleRequest(this.content(), {
      pointers: this.uncertain(),
      sigma: this.sigma(),
      members: this.members(),
      seed: 1,
    });
    this.ensembleRunning.set(true);
    this.ensembleError.set(undefined);
    this.ensembleProgress.set(undefined);
    this.ensembleNote.set('');
    this.ensembleJob = this.client.job<EnsembleResult>('/ensembles', body).subscribe({
      next: (job) => {
        this.ensembleProgress.set(job.status === 'queued' ? undefined : job.progress);
        if (job.status === 'succeeded' && job.result) {
          this.ensemble.set(ensembleTrajectory(this.content().model, job.result));
          this.ensembleNote.set(
            `${body.members} members, ${body.parameters.length} uncertain parameter` +
              `${body.parameters.length === 1 ? '' : 's'}, spread ${body.parameters[0]?.distribution.sigma ?? 0} on the log scale.`,
          );
        }
      },
      error: (err: TroplineApiError) => {
        this.ensembleError.set(err);
        this.ensembleRunning.set(false);
      },
      complete: () => this.ensembleRunning.set(false),
    });
  }

  /** Stops the running ensemble (the client cancels the job on the server). */
  protected stopEnsemble(): void {
    this.ensembleJob?.unsubscribe();
    this.ensembleJob = undefined;
    if (this.ensembleRunning()) this.ensembleNote.set('The ensemble was stopped.');
    this.ensembleRunning.set(false);
  }

  protected setAlternative(i: number, change: Partial<Alternative>): void {
    this.alternatives.update((list) =>
      list.map((a, j) =>
        j !== i
          ? a
          : change.pointer && change.pointer !== a.pointer
            ? this.alternativeFor(change.pointer, 1.2, a.name)
            : { ...a, ...change },
      ),
    );
  }

  protected addAlternative(): void {
    const first = this.parameters()[0];
    if (!first || this.alternatives().length >= 5) return;
    const factor = 1 + 0.2 * (this.alternatives().length + 1);
    this.alternatives.update((list) => [...list, this.alternativeFor(first.pointer, factor)]);
  }

  protected removeAlternative(i: number): void {
    this.alternatives.update((list) => list.filter((_, j) => j !== i));
  }

  protected runComparison(): void {
    this.comparison.set(comparisonRequest(this.content(), this.alternatives()));
  }

  protected num(event: Event): number {
    return (event.target as HTMLInputElement).valueAsNumber;
  }

  protected select(event: Event): string {
    return (event.target as HTMLSelectElement).value;
  }

  private alternativeFor(pointer: string, factor: number, name?: string): Alternative {
    const field =
      this.parameters().find((f) => f.pointer === pointer) ??
      parameterFields(this.content().model).find((f) => f.pointer === pointer);
    const base = this.valueOf(pointer);
    const value = Number((base * factor).toPrecision(3));
    const what = field?.label.split(': ').at(-1) ?? pointer;
    return { name: name ?? `${what} ${value}`, pointer, value };
  }

  protected valueOf(pointer: string): number {
    return getParameter(this.content().model, pointer);
  }
}
