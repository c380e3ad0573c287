import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { ConsoleSession } from '../session/console-session';
import { DevMailboxProbe } from '../session/dev-mailbox-probe';
import { signInNotice, safeNext } from './sign-in-notice';

/** Sign-in with e-mail and password; returns to the page that asked for it. */
@Component({
  selector: 'tc-sign-in-page',
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
  templateUrl: './sign-in-page.html',
  styleUrl: '../common/auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignInPage {
  private readonly session = inject(ConsoleSession);
  private readonly router = inject(Router);
  protected readonly mailbox = inject(DevMailboxProbe);

  /** Where to go after signing in (a console path). */
  readonly next = input<string | undefined>();
  /** Set when the session ended by itself. */
  readonly ended = input<string | undefined>();
  /** Set after signing out (`all` for every device). */
  readonly out = input<string | undefined>();
  /** Set after a password reset or an accepted invitation. */
  readonly done = input<string | undefined>();

  protected readonly notice = computed(() =>
    signInNotice({ ended: this.ended(), out: this.out(), done: this.done() }),
  );
  protected readonly busy = signal(false);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });

  protected async submit(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      const { email, password } = this.form.getRawValue();
      await this.session.signIn(email.trim(), password);
      await this.router.navigateByUrl(safeNext(this.next()));
    } catch (err) {
      const p = problemText(err, 'sign in');
      this.problem.set(
        p.status === 401
          ? { ...p, next: 'Check both and try again, or choose “Forgot your password?” below.' }
          : p,
      );
    } finally {
      this.busy.set(false);
    }
  }
}
