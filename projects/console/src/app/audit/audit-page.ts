import { DatePipe } from '@angular/common';
import { HttpClient } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import { PageData } from '../common/page-data';
import { EmptyState, Skeleton } from '../common/page-states';
import { MembersApi } from '../members/members-api';
import { ProblemAlert } from '../problem/problem-alert';
import { ConsoleSession } from '../session/console-session';
import {
  AUDIT_ACTIONS,
  auditQuery,
  auditRows,
  type AuditEventView,
  type AuditFilter,
} from './audit-rows';

const PAGE_SIZE = 25;

/** The tenant's audit trail, newest first, filtered and paged. */
@Component({
  selector: 'tc-audit-page',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    MatButton,
    MatFormFieldModule,
    MatIcon,
    MatInput,
    MatSelectModule,
    MatTableModule,
    EmptyState,
    Skeleton,
    ProblemAlert,
  ],
  templateUrl: './audit-page.html',
  styleUrl: './audit-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuditPage {
  private readonly http = inject(HttpClient);
  private readonly membersApi = inject(MembersApi);
  private readonly session = inject(ConsoleSession);

  protected readonly actions = Object.entries(AUDIT_ACTIONS);
  protected readonly columns = ['at', 'who', 'what', 'target', 'detail'];
  protected readonly form = inject(NonNullableFormBuilder).group({
    action: [''],
    actor: [''],
    target: [''],
    from: [''],
    to: [''],
  });
  private readonly applied = signal<AuditFilter>(this.form.getRawValue());
  /** Cursors of the pages seen so far; the last is the page on screen. */
  private readonly cursors = signal<(number | undefined)[]>([undefined]);
  protected readonly pageNumber = computed(() => this.cursors().length);
  protected readonly hasOlder = computed(() => typeof this.data.value()?.next === 'number');

  protected readonly members = new PageData(() => this.membersApi.members(), 'load members');
  protected readonly data = new PageData(
    () =>
      firstValueFrom(
        this.http.get<{ events: AuditEventView[]; next: number | null }>('/api/v1/audit-events', {
          params: auditQuery(this.applied(), this.cursors().at(-1), PAGE_SIZE),
        }),
      ),
    'load the audit trail',
  );
  protected readonly rows = computed(() =>
    auditRows(this.data.value()?.events ?? [], this.members.value() ?? []),
  );

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => {
        void this.members.load();
        void this.data.load();
      });
    });
  }

  protected apply(): void {
    this.applied.set(this.form.getRawValue());
    this.cursors.set([undefined]);
    void this.data.load();
  }

  protected clear(): void {
    this.form.reset();
    this.apply();
  }

  protected older(): void {
    const next = this.data.value()?.next;
    if (next == null) return;
    this.cursors.update((c) => [...c, next]);
    void this.data.load();
  }

  protected newer(): void {
    if (this.cursors().length < 2) return;
    this.cursors.update((c) => c.slice(0, -1));
    void this.data.load();
  }
}
