import { ChangeDetectionStrategy, Component, computed, effect, inject } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatToolbar } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialog, type ConfirmData } from './common/confirm-dialog';
import { ConsoleSession } from './session/console-session';
import { DevMailboxProbe } from './session/dev-mailbox-probe';
import { navFor, ROLE_LABELS } from './shell/console-nav';

/** The console frame: toolbar with tenant and account, the navigation, and the routed page. */
@Component({
  selector: 'tc-root',
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbar,
    MatButton,
    MatIcon,
    MatMenuModule,
    MatListModule,
  ],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  private readonly router = inject(Router);
  private readonly mailbox = inject(DevMailboxProbe);
  private readonly dialog = inject(MatDialog);
  protected readonly session = inject(ConsoleSession);

  protected readonly nav = computed(() => navFor(this.session.role(), this.mailbox.available()));
  protected readonly roleLabel = computed(() => {
    const role = this.session.role();
    return role ? ROLE_LABELS[role].name : undefined;
  });

  constructor() {
    // A session that ends while a page is open (expiry, sign-out elsewhere) leads to sign-in.
    effect(() => {
      const state = this.session.state();
      if (state.kind === 'signed-out' && state.reason === 'expired') {
        const next = this.router.url.startsWith('/sign-in') ? undefined : this.router.url;
        void this.router.navigate(['/sign-in'], { queryParams: { next, ended: 1 } });
      }
    });
  }

  protected switchTenant(slug: string): void {
    this.session.selectTenant(slug);
    void this.router.navigateByUrl('/');
  }

  protected async signOut(everywhere: boolean): Promise<void> {
    if (everywhere) {
      const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
        data: {
          title: 'Sign out on every device?',
          message:
            'Every browser signed in as you, here and on other devices, is signed out at once ' +
            'and must sign in again.',
          confirm: 'Sign out on every device',
        },
      });
      if (!(await firstValueFrom(ref.afterClosed()))) return;
    }
    await (everywhere ? this.session.signOutEverywhere() : this.session.signOut());
    await this.router.navigate(['/sign-in'], { queryParams: { out: everywhere ? 'all' : 1 } });
  }
}
