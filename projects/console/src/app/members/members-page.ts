import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
  untracked,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect, MatSelectModule } from '@angular/material/select';
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
import { InvitationsPanel } from './invitations-panel';
import { memberRows, type Member } from './member-rows';
import { MembersApi } from './members-api';

/** Who is in the tenant and with which role; admins change roles, remove and invite. */
@Component({
  selector: 'tc-members-page',
  imports: [
    MatProgressBar,
    DatePipe,
    MatButton,
    MatFormFieldModule,
    MatSelectModule,
    MatTableModule,
    Skeleton,
    ProblemAlert,
    InvitationsPanel,
  ],
  templateUrl: './members-page.html',
  styleUrl: './members-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MembersPage {
  private readonly api = inject(MembersApi);
  private readonly dialog = inject(MatDialog);
  protected readonly session = inject(ConsoleSession);

  protected readonly data = new PageData(() => this.api.members(), 'load the members');
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleName = roleName;
  protected readonly canManage = computed(() => this.session.can('members:manage'));
  protected readonly columns = computed(() => [
    'name',
    'email',
    'role',
    'since',
    ...(this.canManage() ? ['actions'] : []),
  ]);
  protected readonly rows = computed(() =>
    memberRows(this.data.value() ?? [], this.session.session()?.user.id, this.session.role()),
  );
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly announcement = signal('');
  /** What is being done right now (a role change, a removal), for the progress bar. */
  protected readonly working = signal('');

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => void this.data.load());
    });
  }

  protected async changeRole(member: Member, role: TenantRole, select: MatSelect): Promise<void> {
    if (role === member.role) return;
    const from = ROLE_LABELS[member.role].name.toLowerCase();
    const to = ROLE_LABELS[role].name.toLowerCase();
    const article = /^[aeiou]/.test(to) ? 'An' : 'A';
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: `Make ${member.name} ${to}?`,
        message:
          `${member.name} (${member.email}) goes from ${from} to ${to} in ` +
          `${this.session.tenant()?.name} at once. ${article} ${to}’s access: ` +
          `${ROLE_LABELS[role].summary}.`,
        confirm: `Make ${to}`,
      },
    });
    if (!(await firstValueFrom(ref.afterClosed()))) {
      select.value = member.role; // the list shows the role still held
      return;
    }
    await this.act('change the role', async () => {
      await this.api.changeRole(member.userId, role);
      this.announcement.set(`${member.name} is now ${ROLE_LABELS[role].name.toLowerCase()}.`);
    });
  }

  protected async remove(member: Member): Promise<void> {
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: `Remove ${member.name}?`,
        message:
          `${member.name} (${member.email}) loses access to ${this.session.tenant()?.name} at ` +
          'once. Their account stays; an admin can invite them again later.',
        confirm: 'Remove member',
      },
    });
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    await this.act('remove the member', async () => {
      await this.api.remove(member.userId);
      this.announcement.set(`${member.name} was removed.`);
    });
  }

  private async act(doing: string, work: () => Promise<void>): Promise<void> {
    this.problem.set(undefined);
    this.working.set(`Working: ${doing}…`);
    try {
      await work();
    } catch (err) {
      this.problem.set(problemText(err, doing));
    }
    await this.data.load();
    this.working.set('');
  }
}
