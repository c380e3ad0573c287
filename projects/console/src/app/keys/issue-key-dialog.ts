import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import {
  BROWSER_SCOPES,
  readKeyForm,
  SERVER_SCOPE_CHOICES,
  type KeyFormProblems,
} from './key-form';
import type { IssuedKey } from './key-rows';
import { KeysApi } from './keys-api';

/** The form that issues a key; closes with the issued key (plaintext included). */
@Component({
  selector: 'tc-issue-key-dialog',
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButton,
    MatCheckbox,
    MatFormFieldModule,
    MatInput,
    MatProgressBar,
    MatRadioModule,
    ProblemAlert,
  ],
  templateUrl: './issue-key-dialog.html',
  styleUrl: './issue-key-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class IssueKeyDialog {
  private readonly api = inject(KeysApi);
  private readonly ref = inject<MatDialogRef<IssueKeyDialog, IssuedKey>>(MatDialogRef);

  protected readonly scopeChoices = SERVER_SCOPE_CHOICES;
  protected readonly browserScopes = BROWSER_SCOPES.join(', ');
  protected readonly form = inject(NonNullableFormBuilder).group({
    kind: ['browser' as 'browser' | 'server'],
    name: [''],
    origins: [''],
    expires: [''],
    scopes: [['compute', 'scenarios:read'] as string[]],
  });
  protected readonly kind = toSignal(this.form.controls.kind.valueChanges, {
    initialValue: this.form.controls.kind.value,
  });
  protected readonly problems = signal<KeyFormProblems>({});
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly busy = signal(false);

  protected hasScope(scope: string): boolean {
    return this.form.controls.scopes.value.includes(scope);
  }

  protected toggleScope(scope: string, on: boolean): void {
    const now = this.form.controls.scopes.value.filter((s) => s !== scope);
    this.form.controls.scopes.setValue(on ? [...now, scope] : now);
  }

  protected async submit(): Promise<void> {
    const read = readKeyForm(this.form.getRawValue(), new Date().toISOString().slice(0, 10));
    this.problems.set(read.problems ?? {});
    this.problem.set(undefined);
    if (!read.body) return;
    this.busy.set(true);
    try {
      this.ref.close(await this.api.issue(read.body));
    } catch (err) {
      this.problem.set(problemText(err, 'issue the key'));
    } finally {
      this.busy.set(false);
    }
  }
}
