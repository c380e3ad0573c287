import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { JobProgress } from '../job-progress/job-progress';
import type { JobState } from './job-state';

let nextId = 0;

/**
 * Where a widget's background job stands, in one strip above its chart: the progress bar with
 * a cancel button while it runs; the refusal or failure once it fails (heading, what to do —
 * for a quota refusal, when the allowance resets — and the fields at fault); a note once
 * cancelled. It takes no space while idle or done.
 */
@Component({
  selector: 'tropline-job-strip',
  imports: [JobProgress],
  template: `
    @switch (state().kind) {
      @case ('running') {
        <tropline-job-progress
          [progress]="progress()"
          [label]="label()"
          (cancelJob)="cancelJob.emit()"
        />
      }
      @case ('failed') {
        @if (error(); as e) {
          <div class="tropline-job-strip__error" role="alert" [attr.aria-labelledby]="titleId">
            <strong [id]="titleId">{{ e.title }}</strong>
            <p>{{ e.message }}</p>
            @for (field of e.fieldErrors; track field.pointer) {
              <p class="tropline-job-strip__field">{{ field.pointer }}: {{ field.message }}</p>
            }
          </div>
        }
      }
      @case ('cancelled') {
        <p class="tropline-job-strip__note" role="status">{{ strings.cancelled }}</p>
      }
    }
  `,
  styles: `
    :host {
      display: block;
    }
    :host(.tropline-job-strip--quiet) {
      display: none;
    }
    .tropline-job-strip__error {
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium, 12px);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .tropline-job-strip__error p {
      margin: 4px 0 0;
    }
    .tropline-job-strip__field {
      font: var(--mat-sys-body-small);
    }
    .tropline-job-strip__note {
      margin: 0;
      font: var(--mat-sys-body-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    class: 'tropline-job-strip',
    '[class.tropline-job-strip--quiet]': 'quiet()',
  },
})
export class JobStrip {
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** The job's state, as {@link jobState} follows it. */
  readonly state = input.required<JobState<unknown>>();
  /** What is being computed, read with the progress bar, e.g. "Computing the sweep". */
  readonly label = input<string | undefined>(undefined);
  /** Emits when the reader asks to stop the job. */
  readonly cancelJob = output<void>();

  /** Names the alert by its heading, so it is found (and read) by what went wrong. */
  protected readonly titleId = `tropline-job-strip-title-${nextId++}`;
  /** Whether there is nothing to say (idle or done): the strip then takes no space. */
  protected readonly quiet = computed(() => {
    const kind = this.state().kind;
    return kind === 'idle' || kind === 'done';
  });
  protected readonly progress = computed(() => {
    const s = this.state();
    return s.kind === 'running' ? s.progress : undefined;
  });
  protected readonly error = computed(() => {
    const s = this.state();
    return s.kind === 'failed' ? s.error : undefined;
  });
}
