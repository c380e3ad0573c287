import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import type { ChainModel } from '@tropline/core';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { fitRanges, tunableParameters } from './scenario-drafts';
import { ScenariosApi } from './scenarios-api';
import type { CalibrationJob, Dataset, ScenarioSaved } from './scenario-types';

/** How often a running calibration is asked for its progress. */
const POLL_MS = 1000;

/**
 * Fits chosen parameters of a version to a dataset as a job, follows its progress until it
 * finishes, shows the estimates and offers to save the fitted model as a new version.
 */
@Component({
  selector: 'tc-calibration-panel',
  imports: [
    DecimalPipe,
    MatButton,
    MatCheckbox,
    MatFormFieldModule,
    MatProgressBar,
    MatSelectModule,
    ProblemAlert,
  ],
  templateUrl: './calibration-panel.html',
  styleUrl: './calibration-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalibrationPanel {
  private readonly api = inject(ScenariosApi);
  private destroyed = false;

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
  protected readonly job = signal<CalibrationJob | undefined>(undefined);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly busy = signal(false);
  protected readonly running = computed(() => {
    const s = this.job()?.status;
    return s === 'queued' || s === 'running';
  });
  protected readonly percent = computed(() => Math.round((this.job()?.progress ?? 0) * 100));
  protected readonly labels = computed(
    () => new Map(this.parameters().map((p) => [p.pointer, p.label])),
  );

  constructor() {
    inject(DestroyRef).onDestroy(() => (this.destroyed = true));
  }

  protected toggle(pointer: string, on: boolean): void {
    this.chosen.update((c) => (on ? [...c, pointer] : c.filter((p) => p !== pointer)));
  }

  protected async start(): Promise<void> {
    const dataset = this.datasetShown();
    if (dataset === undefined) return;
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      let job = await this.api.calibrate(this.scenarioId(), {
        dataset,
        scenarioVersion: this.version(),
        parameters: fitRanges(this.model(), this.chosen()),
        starts: 2,
      });
      this.job.set(job);
      while (!this.destroyed && (job.status === 'queued' || job.status === 'running')) {
        await new Promise((resolve) => setTimeout(resolve, POLL_MS));
        job = await this.api.calibration(job.id);
        this.job.set(job);
      }
    } catch (err) {
      this.problem.set(problemText(err, 'run the calibration'));
    } finally {
      this.busy.set(false);
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
