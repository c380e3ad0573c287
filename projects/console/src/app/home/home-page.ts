import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { ConsoleSession } from '../session/console-session';
import { DevMailboxProbe } from '../session/dev-mailbox-probe';
import { navFor, ROLE_LABELS } from '../shell/console-nav';

const BLURBS: Record<string, string> = {
  '/scenarios': 'Build, calibrate and publish the food-chain scenarios your portal shows.',
  '/usage': "This month's compute units against the quota, per day, key and endpoint.",
  '/keys': 'Issue, rotate and revoke the keys your portal and systems call the API with.',
  '/members': 'See who works in this tenant and with which role; invite colleagues.',
  '/audit': 'Who did what and when: sign-ins, keys, members and more.',
  '/mailbox': 'Mail the local server caught: invitations and password links.',
  '/status': 'Whether the API and its database answer.',
};

/** The landing page after sign-in: who you are here, and the pages your role opens. */
@Component({
  selector: 'tc-home-page',
  imports: [MatCardModule, MatIcon, RouterLink],
  template: `
    @if (session.session(); as s) {
      <h1>Welcome, {{ s.user.name }}</h1>
      @if (session.tenant(); as t) {
        <p>
          You work in <strong>{{ t.name }}</strong> as {{ role()?.name }}: {{ role()?.summary }}.
        </p>
      } @else {
        <p>
          You belong to no tenant yet. When an admin invites you, the link in the e-mail adds you to
          their tenant.
        </p>
      }
      <ul class="tc-cards">
        @for (item of pages(); track item.path) {
          <li>
            <a class="tc-card-link" [routerLink]="item.path">
              <mat-card appearance="outlined">
                <mat-card-header>
                  <mat-icon matCardAvatar fontSet="material-symbols-outlined" aria-hidden="true">
                    {{ item.icon }}
                  </mat-icon>
                  <mat-card-title
                    ><h2>{{ item.label }}</h2></mat-card-title
                  >
                </mat-card-header>
                <mat-card-content>{{ item.blurb }}</mat-card-content>
              </mat-card>
            </a>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .tc-cards {
      list-style: none;
      padding: 0;
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(240px, 1fr));
      gap: 16px;
    }
    .tc-card-link {
      color: inherit;
      text-decoration: none;
      display: block;
      height: 100%;
    }
    .tc-card-link mat-card {
      height: 100%;
    }
    .tc-card-link:focus-visible mat-card,
    .tc-card-link:hover mat-card {
      outline: 2px solid var(--mat-sys-primary);
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HomePage {
  protected readonly session = inject(ConsoleSession);
  private readonly mailbox = inject(DevMailboxProbe);
  protected readonly role = computed(() => {
    const r = this.session.role();
    return r ? { ...ROLE_LABELS[r], name: ROLE_LABELS[r].name.toLowerCase() } : undefined;
  });
  protected readonly pages = computed(() =>
    navFor(this.session.role(), this.mailbox.available())
      .filter((item) => item.path !== '/')
      .map((item) => ({ ...item, blurb: BLURBS[item.path] ?? '' })),
  );
}
