import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { OVERLAP_CHOICES } from './key-form';
import type { IssuedKey, KeyInfo } from './key-rows';
import { KeysApi } from './keys-api';

/** Rotation: a successor key now, the old one working for an overlap window. */
@Component({
  selector: 'tc-rotate-key-dialog',
  imports: [FormsModule, MatDialogModule, MatButton, MatProgressBar, MatRadioModule, ProblemAlert],
  template: `
    <h2 mat-dialog-title>Rotate “{{ key.name || key.label }}”</h2>
    <mat-dialog-content>
      <p>
        A new key with the same kind, scopes and origins is issued now. The old key keeps working
        for the overlap you choose, so your systems can switch without a gap.
      </p>
      <p id="tc-overlap-label" class="tc-overlap-label">Overlap window</p>
      <mat-radio-group
        aria-labelledby="tc-overlap-label"
        class="tc-overlap"
        [ngModel]="overlap()"
        (ngModelChange)="overlap.set($event)"
      >
        @for (c of choices; track c.seconds) {
          <mat-radio-button [value]="c.seconds">{{ c.label }}</mat-radio-button>
        }
      </mat-radio-group>
      <tc-problem-alert [problem]="problem()" />
      @if (busy()) {
        <mat-progress-bar mode="indeterminate" aria-label="Rotating the key" />
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button mat-dialog-close>Cancel</button>
      <button mat-flat-button (click)="rotate()" [disabled]="busy()">Rotate key</button>
    </mat-dialog-actions>
  `,
  styles: `
    .tc-overlap {
      display: flex;
      flex-direction: column;
    }
    .tc-overlap-label {
      font: var(--mat-sys-title-small);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RotateKeyDialog {
  private readonly api = inject(KeysApi);
  private readonly ref = inject<MatDialogRef<RotateKeyDialog, IssuedKey>>(MatDialogRef);
  protected readonly key = inject<KeyInfo>(MAT_DIALOG_DATA);
  protected readonly choices = OVERLAP_CHOICES;
  protected readonly overlap = signal(86_400);
  protected readonly busy = signal(false);
  protected readonly problem = signal<ProblemText | undefined>(undefined);

  protected async rotate(): Promise<void> {
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      this.ref.close(await this.api.rotate(this.key.id, this.overlap()));
    } catch (err) {
      this.problem.set(problemText(err, 'rotate the key'));
    } finally {
      this.busy.set(false);
    }
  }
}
