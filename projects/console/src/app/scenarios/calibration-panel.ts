import { DecimalPipe, formatNumber } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  input,
  LOCALE_ID,
  output,
  signal,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { ChainModel } from '@tropline/core';
import { JobProgress } from '@tropline/widgets';
import type { Subscription } from 'rxjs';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { fitRanges, tunableParameters } from './scenario-drafts';
import { ScenariosApi } from './scenarios-api';
import type { CalibrationJob, Dataset, ScenarioSaved } from './scenario-types';

/**
 * Fits chosen parameters of a version to a dataset as a job, follows its progress on the
 * server's event stream (a progress bar with a cancel button that stops the job on the
 * server), shows the estimates and offers to save the fitted model as a new version. When the
 * fitted model is chaotic on the data's span it offers a fit in the suggested segments.
 */
@Component({
  selector: 'tc-calibration-panel',
  imports: [
    DecimalPipe,
    JobProgress,
    MatButton,
    MatCheckbox,
    MatFormFieldModule,
    MatSelectModule,
    ProblemAlert,
  ],
  templateUrl: './calibration-panel.html',
  styleUrl: './calibration-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalibrationPanel {
  private readonly api = inject(ScenariosApi);
  private readonly locale = inject(LOCALE_ID);
  private following: Subscription | undefined;

  /** The scenario. */
  readonly scenarioId = input.required<string>();
  /** The version to fit (its model is the starting point). */
  readonly version = input.required<number>();
  /** That version's model. */
  readonly model = input.required<ChainModel>();
  /** The scenario's datasets, oldest first. */
  readonly datasets = input.required<readonly Dataset[]>();
  /** Emits the version saved from a fit. */
  readonly saved = output<ScenarioSaved>();

  protected readonly parameters = computed(() => tunableParameters(this.model()));
  protected readonly chosen = signal<string[]>(['/levels/1/attackRate', '/levels/1/mortality']);
  protected readonly dataset = signal<number | undefined>(undefined);
  protected readonly datasetShown = computed(
    () => this.dataset() ?? this.datasets().at(-1)?.version,
  );
  /** The chosen dataset, when it was made for another version than the one fitted. */
  protected readonly otherVersion = computed(() => {
    const d = this.datasets().find((x) => x.version === this.datasetShown());
    return d && d.scenarioVersion !== this.version() ? d.scenarioVersion : undefined;
  });
  protected readonly job = signal<CalibrationJob | undefined>(undefined);
  /** Segment length of the running or last fit (undefined: the whole span). */
  protected readonly segmentLength = signal<number | undefined>(undefined);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly busy = signal(false);
  protected readonly running = computed(() => {
    const s = this.job()?.status;
    return s === 'queued' || s === 'running';
  });
  /** Fraction done while running; undefined while queued (the bar then moves on its own). */
  protected readonly progress = computed(() => {
    const j = this.job();
    return j?.status === 'running' ? j.progress : undefined;
  });
  protected readonly cancelled = computed(() => /cancelled$/.test(this.job()?.error?.type ?? ''));
  protected readonly labels = computed(
    () => new Map(this.parameters().map((p) => [p.pointer, p.label])),
  );

  constructor() {
    inject(DestroyRef).onDestroy(() => this.following?.unsubscribe());
  }

  /** The estimates table's caption: how many observations, and how well the fit meets them. */
  protected fitCaption(fit: NonNullable<CalibrationJob['result']>['fit']): string {
    const n = (v: number, digits: string) => formatNumber(v, this.locale, digits);
    const miss = `Estimates (${fit.points} observations; typical miss on the log scale ${n(fit.rmse, '1.0-3')}`;
    return fit.weightedRms === undefined
      ? `${miss})`
      : `${miss}; weighted by the surveys' standard errors, the residuals average ` +
          `${n(fit.weightedRms, '1.0-2')} standard errors, about 1 when those errors are right)`;
  }

  protected toggle(pointer: string, on: boolean): void {
    this.chosen.update((c) => (on ? [...c, pointer] : c.filter((p) => p !== pointer)));
  }

  /** Starts a fit (in segments of `segmentLength` when given) and follows its events. */
  protected async start(segmentLength?: number): Promise<void> {
    const dataset = this.datasetShown();
    if (dataset === undefined) return;
    this.following?.unsubscribe();
    this.busy.set(true);
    this.problem.set(undefined);
    this.segmentLength.set(segmentLength);
    try {
      const job = await this.api.calibrate(this.scenarioId(), {
        dataset,
        scenarioVersion: this.version(),
        parameters: fitRanges(this.model(), this.chosen()),
        starts: 2,
        ...(segmentLength === undefined ? {} : { segmentLength }),
      });
      this.job.set(job);
      this.following = this.api.calibrationEvents(job.id).subscribe({
        next: (j) => this.job.set(j),
        error: (err: unknown) => this.problem.set(problemText(err, 'follow the calibration')),
      });
    } catch (err) {
      this.problem.set(problemText(err, 'run the calibration'));
    } finally {
      this.busy.set(false);
    }
  }

  /** Stops the running fit on the server; its stream then ends with the cancellation. */
  protected async cancel(): Promise<void> {
    const job = this.job();
    if (!job) return;
    try {
      const now = await this.api.cancelCalibration(job.id);
      if (now.status === 'failed' || now.status === 'succeeded') this.job.set(now);
    } catch (err) {
      this.problem.set(problemText(err, 'cancel the calibration'));
    }
  }

  protected async save(): Promise<void> {
    const job = this.job();
    if (!job) return;
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      this.saved.emit(await this.api.saveCalibration(job.id));
    } catch (err) {
      this.problem.set(problemText(err, 'save the fit as a version'));
    } finally {
      this.busy.set(false);
    }
  }
}
