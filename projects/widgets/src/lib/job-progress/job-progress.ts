import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatProgressBar } from '@angular/material/progress-bar';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';

/** Progress of a background job with a cancel button; the percentage is announced politely. */
@Component({
  selector: 'tropline-job-progress',
  imports: [MatButton, MatProgressBar],
  template: `
    <div class="tropline-job-progress__row">
      <mat-progress-bar
        [mode]="progress() === undefined ? 'indeterminate' : 'determinate'"
        [value]="(progress() ?? 0) * 100"
        [attr.aria-label]="label() ?? strings.computing"
      />
      <button matButton="outlined" type="button" (click)="cancelJob.emit()">
        {{ strings.cancel }}
      </button>
    </div>
    <p class="tropline-job-progress__text" role="status" aria-live="polite">{{ text() }}</p>
  `,
  styles: `
    :host {
      display: block;
    }
    .tropline-job-progress__row {
      display: flex;
      align-items: center;
      gap: 12px;
    }
    mat-progress-bar {
      flex: 1;
    }
    /* The focus ring of theme/_focus.scss (inline styles here are plain CSS). */
    button:focus-visible {
      outline: 3px solid var(--mat-sys-primary, #1b6a5e);
      outline-offset: 2px;
    }
    .tropline-job-progress__text {
      margin: 4px 0 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-job-progress' },
})
export class JobProgress {
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** Fraction done (0..1); undefined while queued. */
  readonly progress = input<number | undefined>(undefined);
  /** What is being computed, e.g. "Computing the bifurcation diagram". */
  readonly label = input<string | undefined>(undefined);
  /** Emits when the reader asks to stop the job. */
  readonly cancelJob = output<void>();

  private readonly percent = new Intl.NumberFormat(this.options.locale, { style: 'percent' });
  protected readonly text = computed(() => {
    const p = this.progress();
    // Announce in steps of a tenth so a screen reader is not flooded.
    return p === undefined
      ? this.strings.computing
      : this.strings.jobProgress(this.percent.format(Math.floor(p * 10) / 10));
  });
}
