import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import {
  FormGroupDirective,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import type { TenantRole } from '@tropline/core';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialog, type ConfirmData } from '../common/confirm-dialog';
import { PageData } from '../common/page-data';
import { Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { ConsoleSession } from '../session/console-session';
import { ROLE_LABELS, roleName } from '../shell/console-nav';
import { assignableRoles, type Invitation } from './member-rows';
import { MembersApi } from './members-api';

/** Invite by e-mail with a role; the pending invitations with resend and cancel. */
@Component({
  selector: 'tc-invitations-panel',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    MatButton,
    MatFormFieldModule,
    MatInput,
    MatProgressBar,
    MatSelectModule,
    MatTableModule,
    Skeleton,
    ProblemAlert,
  ],
  templateUrl: './invitations-panel.html',
  styleUrl: './members-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvitationsPanel {
  private readonly api = inject(MembersApi);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(ConsoleSession);

  protected readonly data = new PageData(() => this.api.invitations(), 'load the invitations');
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleName = roleName;
  protected readonly roles = computed(() => assignableRoles(this.session.role()));
  protected readonly columns = ['email', 'role', 'createdAt', 'expiresAt', 'actions'];
  protected readonly busy = signal(false);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly announcement = signal('');
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    role: ['analyst' as TenantRole, Validators.required],
  });

  private readonly formDirective = viewChild.required(FormGroupDirective);

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => void this.data.load());
    });
  }

  protected async invite(): Promise<void> {
    if (this.form.invalid) return this.form.markAllAsTouched();
    const { email, role } = this.form.getRawValue();
    const sent = await this.send(email.trim(), role, 'send the invitation');
    // Resetting through the directive also clears "submitted", so no error shows on the empty field.
    if (sent) this.formDirective().resetForm({ email: '', role });
  }

  protected async resend(inv: Invitation): Promise<void> {
    await this.send(inv.email, inv.role, 'send the invitation again');
  }

  protected async cancel(inv: Invitation): Promise<void> {
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: `Cancel the invitation for ${inv.email}?`,
        message: 'The link in the e-mail stops working at once. You can invite them again later.',
        confirm: 'Cancel invitation',
      },
    });
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    this.problem.set(undefined);
    try {
      await this.api.cancel(inv.id);
      this.announcement.set(`The invitation for ${inv.email} was cancelled.`);
    } catch (err) {
      this.problem.set(problemText(err, 'cancel the invitation'));
    }
    await this.data.load();
  }

  private async send(email: string, role: TenantRole, doing: string): Promise<boolean> {
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      await this.api.invite(email, role);
      this.announcement.set(
        `Invitation sent to ${email} as ${ROLE_LABELS[role].name.toLowerCase()}. ` +
          'Any earlier link for this address no longer works.',
      );
      return true;
    } catch (err) {
      this.problem.set(problemText(err, doing));
      return false;
    } finally {
      this.busy.set(false);
      await this.data.load();
    }
  }
}
