import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { DevMailboxProbe } from '../session/dev-mailbox-probe';
import { PASSWORD_HINT } from './password-hint';

/**
 * Password reset in two steps on one page: without a token it asks for the address and mails
 * a link; the link brings the reader back with a token to choose the new password.
 */
@Component({
  selector: 'tc-password-reset-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButton,
    MatCardModule,
    MatFormFieldModule,
    MatInput,
    MatProgressBar,
    ProblemAlert,
  ],
  templateUrl: './password-reset-page.html',
  styleUrl: '../common/auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordResetPage {
  private readonly http = inject(HttpClient);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly mailbox = inject(DevMailboxProbe);

  /** The one-time token from the e-mailed link, on the second step. */
  readonly token = input<string | undefined>();

  protected readonly hint = PASSWORD_HINT;
  protected readonly busy = signal(false);
  protected readonly sent = signal<string | undefined>(undefined);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly request = this.fb.group({
    email: ['', [Validators.required, Validators.email]],
  });
  protected readonly complete = this.fb.group({
    password: ['', [Validators.required, Validators.minLength(12)]],
  });

  protected async ask(): Promise<void> {
    if (this.request.invalid) return this.request.markAllAsTouched();
    await this.run('send the link', async () => {
      const answer = await firstValueFrom(
        this.http.post<{ detail: string }>('/api/v1/password-resets', {
          email: this.request.getRawValue().email.trim(),
        }),
      );
      this.sent.set(answer.detail);
    });
  }

  protected async choose(): Promise<void> {
    if (this.complete.invalid) return this.complete.markAllAsTouched();
    await this.run('change the password', async () => {
      await firstValueFrom(
        this.http.post('/api/v1/password-resets/complete', {
          token: this.token(),
          password: this.complete.getRawValue().password,
        }),
      );
      await this.router.navigate(['/sign-in'], { queryParams: { done: 'reset' } });
    });
  }

  private async run(doing: string, work: () => Promise<void>): Promise<void> {
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      await work();
    } catch (err) {
      this.problem.set(problemText(err, doing));
    } finally {
      this.busy.set(false);
    }
  }
}
