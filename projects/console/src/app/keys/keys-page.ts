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
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltip } from '@angular/material/tooltip';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialog, type ConfirmData } from '../common/confirm-dialog';
import { PageData } from '../common/page-data';
import { EmptyState, Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { ConsoleSession } from '../session/console-session';
import { IssueKeyDialog } from './issue-key-dialog';
import {
  filterKeyRows,
  KEY_STATE_LABELS,
  keyRows,
  pageOf,
  sortKeyRows,
  type IssuedKey,
  type KeyFilter,
  type KeyInfo,
  type KeySortColumn,
} from './key-rows';
import { KeysApi } from './keys-api';
import { KeySecretDialog } from './key-secret-dialog';
import { RotateKeyDialog } from './rotate-key-dialog';

/** The tenant's API keys: table with sorting, filtering and paging; issue, rotate, revoke. */
@Component({
  selector: 'tc-keys-page',
  imports: [
    MatProgressBar,
    DatePipe,
    MatButton,
    MatIconButton,
    MatFormFieldModule,
    MatIcon,
    MatInput,
    MatPaginator,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    MatTooltip,
    EmptyState,
    Skeleton,
    ProblemAlert,
  ],
  templateUrl: './keys-page.html',
  styleUrl: './keys-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class KeysPage {
  private readonly api = inject(KeysApi);
  private readonly dialog = inject(MatDialog);
  protected readonly session = inject(ConsoleSession);

  protected readonly data = new PageData(() => this.api.list(), 'load the keys');
  protected readonly stateLabels = KEY_STATE_LABELS;
  protected readonly states = Object.entries(KEY_STATE_LABELS);
  protected readonly filter = signal<KeyFilter>({ text: '', state: 'all', kind: 'all' });
  protected readonly sort = signal<Sort>({ active: 'createdAt', direction: 'desc' });
  protected readonly page = signal({ index: 0, size: 10 });
  protected readonly actionProblem = signal<ProblemText | undefined>(undefined);
  protected readonly announcement = signal('');
  /** Whether a revocation is on its way to the server. */
  protected readonly revoking = signal(false);
  protected readonly canManage = computed(() => this.session.can('keys:manage'));
  protected readonly columns = computed(() => [
    'name',
    'kind',
    'label',
    'scopes',
    'origins',
    'createdAt',
    'lastUsedAt',
    'expiresAt',
    'state',
    ...(this.canManage() ? ['actions'] : []),
  ]);
  private readonly rows = computed(() => keyRows(this.data.value() ?? [], Date.now()));
  protected readonly filtered = computed(() => {
    const s = this.sort();
    return sortKeyRows(
      filterKeyRows(this.rows(), this.filter()),
      s.active as KeySortColumn,
      s.direction,
    );
  });
  protected readonly visible = computed(() =>
    pageOf(this.filtered(), this.page().index, this.page().size),
  );

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => void this.data.load());
    });
  }

  protected setFilter(change: Partial<KeyFilter>): void {
    this.filter.update((f) => ({ ...f, ...change }));
    this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected onPage(e: PageEvent): void {
    this.page.set({ index: e.pageIndex, size: e.pageSize });
  }

  protected async issue(): Promise<void> {
    const ref = this.dialog.open<IssueKeyDialog, void, IssuedKey>(IssueKeyDialog, {
      autoFocus: 'first-tabbable',
    });
    const issued = await firstValueFrom(ref.afterClosed());
    if (issued)
      await this.showSecret(issued, `Key “${issued.key.name || issued.key.label}” issued.`);
  }

  protected async rotate(key: KeyInfo): Promise<void> {
    const ref = this.dialog.open<RotateKeyDialog, KeyInfo, IssuedKey>(RotateKeyDialog, {
      data: key,
    });
    const rotated = await firstValueFrom(ref.afterClosed());
    if (rotated) await this.showSecret(rotated, `Key “${key.name || key.label}” rotated.`);
  }

  protected async revoke(key: KeyInfo): Promise<void> {
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: `Revoke “${key.name || key.label}”?`,
        message:
          'The very next request made with this key is refused, wherever it comes from. ' +
          'This cannot be undone; a revoked key stays listed for the record.',
        confirm: 'Revoke key',
      },
    });
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    this.actionProblem.set(undefined);
    this.revoking.set(true);
    try {
      await this.api.revoke(key.id);
      this.announcement.set(`Key “${key.name || key.label}” revoked.`);
      await this.data.load();
    } catch (err) {
      this.actionProblem.set(problemText(err, 'revoke the key'));
    } finally {
      this.revoking.set(false);
    }
  }

  private async showSecret(issued: IssuedKey, done: string): Promise<void> {
    this.announcement.set(done);
    void this.data.load();
    const ref = this.dialog.open(KeySecretDialog, {
      data: issued,
      width: '600px',
      disableClose: true,
    });
    await firstValueFrom(ref.afterClosed());
  }
}
