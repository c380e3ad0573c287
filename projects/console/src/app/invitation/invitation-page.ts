import { HttpClient } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { TenantRole } from '@tropline/core';
import { firstValueFrom } from 'rxjs';
import { DatePipe } from '@angular/common';
import { ProblemAlert } from '../problem/problem-alert';
import { fieldMessage, problemText, type ProblemText } from '../problem/problem-text';
import { ConsoleSession } from '../session/console-session';
import { ROLE_LABELS } from '../shell/console-nav';
import { PASSWORD_HINT } from '../password-reset/password-hint';

/** What `POST /invitations/lookup` says an invitation offers. */
interface InvitationOffer {
  readonly tenant: { readonly slug: string; readonly name: string };
  readonly email: string;
  readonly role: TenantRole;
  readonly expiresAt: string;
  readonly accountExists: boolean;
}

/**
 * The page an invitation e-mail links to: says who invited you to what, then creates the
 * account (newcomers) or confirms it with the password (members of other tenants), and signs in.
 */
@Component({
  selector: 'tc-invitation-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButton,
    MatCardModule,
    MatFormFieldModule,
    MatInput,
    MatProgressBar,
    ProblemAlert,
    DatePipe,
  ],
  templateUrl: './invitation-page.html',
  styleUrl: '../common/auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvitationPage {
  private readonly http = inject(HttpClient);
  private readonly session = inject(ConsoleSession);
  private readonly router = inject(Router);

  /** The one-time token from the e-mailed link. */
  readonly token = input<string | undefined>();

  protected readonly hint = PASSWORD_HINT;
  protected readonly offer = signal<InvitationOffer | undefined>(undefined);
  protected readonly lookupProblem = signal<ProblemText | undefined>(undefined);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly busy = signal(false);
  protected readonly roleText = computed(() => {
    const o = this.offer();
    return o ? `${ROLE_LABELS[o.role].name}: ${ROLE_LABELS[o.role].summary}` : '';
  });
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [''],
    password: ['', Validators.required],
  });
  protected readonly nameError = computed(() => fieldMessage(this.problem(), '/name'));
  protected readonly passwordError = computed(() => fieldMessage(this.problem(), '/password'));

  constructor() {
    effect(() => void this.lookUp(this.token()));
  }

  private async lookUp(token: string | undefined): Promise<void> {
    this.offer.set(undefined);
    this.lookupProblem.set(undefined);
    if (!token) {
      this.lookupProblem.set({
        status: 400,
        title: 'This link has no invitation in it',
        detail: 'Open the link from the invitation e-mail exactly as it was sent.',
        next: 'If the link was cut off, ask the admin who invited you to send it again.',
        fields: [],
      });
      return;
    }
    try {
      const offer = await firstValueFrom(
        this.http.post<InvitationOffer>('/api/v1/invitations/lookup', { token }),
      );
      this.offer.set(offer);
      if (!offer.accountExists) {
        this.form.controls.name.addValidators(Validators.required);
        this.form.controls.name.updateValueAndValidity();
      }
    } catch (err) {
      const p = problemText(err, 'read the invitation');
      this.lookupProblem.set({
        ...p,
        next: 'Invitations work once and expire. Ask the admin who invited you to send a new one.',
      });
    }
  }

  protected async accept(): Promise<void> {
    const offer = this.offer();
    const token = this.token();
    if (!offer || !token || this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.problem.set(undefined);
    const { name, password } = this.form.getRawValue();
    try {
      const body = offer.accountExists ? { token, password } : { token, password, name };
      await firstValueFrom(this.http.post('/api/v1/invitations/accept', body));
      await this.session.signIn(offer.email, password);
      this.session.selectTenant(offer.tenant.slug);
      await this.router.navigateByUrl('/');
    } catch (err) {
      this.problem.set(problemText(err, 'accept the invitation'));
    } finally {
      this.busy.set(false);
    }
  }
}
