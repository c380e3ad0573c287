import { DatePipe } from '@angular/common';
import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatListModule } from '@angular/material/list';
import { DomSanitizer } from '@angular/platform-browser';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialog, type ConfirmData } from '../common/confirm-dialog';
import { PageData } from '../common/page-data';
import { EmptyState, Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { linksIn, type CaughtMail } from './mail-links';
import { MatDialog } from '@angular/material/dialog';

/**
 * What the local SMTP catcher received (development servers only): invitations and password
 * links, readable without a real mail account.
 */
@Component({
  selector: 'tc-mailbox-page',
  imports: [DatePipe, MatButton, MatListModule, EmptyState, Skeleton, ProblemAlert],
  templateUrl: './mailbox-page.html',
  styleUrl: './mailbox-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MailboxPage {
  private readonly http = inject(HttpClient);
  private readonly sanitizer = inject(DomSanitizer);
  private readonly dialog = inject(MatDialog);

  protected readonly data = new PageData(
    () =>
      firstValueFrom(
        this.http.get<{ smtpPort: number; messages: CaughtMail[] }>('/api/v1/dev/mailbox'),
      ),
    'read the development mailbox',
  );
  protected readonly selectedId = signal<number | undefined>(undefined);
  protected readonly selected = computed((): CaughtMail | undefined => {
    const messages = this.data.value()?.messages ?? [];
    return messages.find((m) => m.id === this.selectedId()) ?? messages[0];
  });
  protected readonly links = computed(() => linksIn(this.selected()?.text ?? ''));
  // The frame is sandboxed with no permissions (no scripts, no navigation, an opaque origin),
  // so the mail's own HTML and styles are shown as sent rather than sanitised into plain text.
  protected readonly html = computed(() =>
    this.sanitizer.bypassSecurityTrustHtml(this.selected()?.html || ''),
  );

  constructor() {
    void this.data.load();
  }

  protected async empty(): Promise<void> {
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: 'Empty the development mailbox?',
        message: 'Every caught message is deleted. Links in them keep working until they expire.',
        confirm: 'Empty mailbox',
      },
    });
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    await firstValueFrom(this.http.delete('/api/v1/dev/mailbox'));
    this.selectedId.set(undefined);
    await this.data.load();
  }
}
