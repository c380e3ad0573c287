import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import type { ProblemText } from './problem-text';

/** An error box: what went wrong, the server's detail, and what to do next. */
@Component({
  selector: 'tc-problem-alert',
  imports: [MatIcon],
  template: `
    @if (problem(); as p) {
      <div class="tc-problem" role="alert">
        <mat-icon fontSet="material-symbols-outlined" aria-hidden="true">error</mat-icon>
        <div>
          <p class="tc-problem__title">{{ p.title }}</p>
          <p>{{ p.detail }}</p>
          @for (f of p.fields; track $index) {
            @if (showFields()) {
              <p>{{ f.message }}</p>
            }
          }
          @if (p.next) {
            <p class="tc-problem__next">{{ p.next }}</p>
          }
        </div>
      </div>
    }
  `,
  styles: `
    .tc-problem {
      display: flex;
      gap: 12px;
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
      margin-block: 12px;
    }
    .tc-problem mat-icon {
      flex: none;
    }
    .tc-problem p {
      margin: 0 0 4px;
    }
    .tc-problem__title {
      font: var(--mat-sys-title-small);
    }
    .tc-problem__next {
      font-style: italic;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProblemAlert {
  /** The problem to show; nothing is drawn while undefined. */
  readonly problem = input<ProblemText | undefined>();
  /** Whether to list the field messages too (off when the form shows them beside fields). */
  readonly showFields = input<boolean>(true);
}
