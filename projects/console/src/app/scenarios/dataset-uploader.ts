import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { csvReport, type CsvCellError } from './csv-report';
import { ScenariosApi } from './scenarios-api';
import type { Dataset } from './scenario-types';

/**
 * Uploads monitoring data for one scenario version: drop a CSV on the zone or pick one. A
 * refused file shows every bad cell with its line and column, as the server found them against
 * that version's levels; nothing is stored until it is valid.
 */
@Component({
  selector: 'tc-dataset-uploader',
  imports: [MatButton, MatFormFieldModule, MatIcon, MatInput, MatProgressBar, ProblemAlert],
  templateUrl: './dataset-uploader.html',
  styleUrl: './dataset-uploader.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DatasetUploader {
  private readonly api = inject(ScenariosApi);
  /** The scenario the data belong to. */
  readonly scenarioId = input.required<string>();
  /** Level ids of the version the data are for: the columns the file may have. */
  readonly levels = input.required<readonly string[]>();
  /** The scenario version the data are for (its header is checked against; default latest). */
  readonly version = input<number | undefined>(undefined);
  /** Emits the stored dataset version. */
  readonly uploaded = output<Dataset>();

  protected readonly over = signal(false);
  protected readonly busy = signal(false);
  protected readonly note = signal('');
  protected readonly fileName = signal<string | undefined>(undefined);
  protected readonly cells = signal<CsvCellError[]>([]);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly stored = signal<Dataset | undefined>(undefined);

  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    this.over.set(true);
  }

  protected drop(event: DragEvent): void {
    event.preventDefault();
    this.over.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file) void this.send(file);
  }

  protected picked(event: Event): void {
    const el = event.target as HTMLInputElement;
    const file = el.files?.[0];
    if (file) void this.send(file);
    el.value = '';
  }

  private async send(file: File): Promise<void> {
    this.busy.set(true);
    this.fileName.set(file.name);
    this.cells.set([]);
    this.problem.set(undefined);
    this.stored.set(undefined);
    try {
      const dataset = await this.api.upload(
        this.scenarioId(),
        file,
        this.note().trim(),
        this.version(),
      );
      this.stored.set(dataset);
      this.uploaded.emit(dataset);
    } catch (err) {
      this.cells.set(csvReport(err));
      this.problem.set(problemText(err, 'upload the file'));
    } finally {
      this.busy.set(false);
    }
  }
}
