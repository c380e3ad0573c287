import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatAnchor } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { ConsoleSession } from '../session/console-session';
import { ROLE_LABELS } from '../shell/console-nav';

/** A page for an address the console does not have. */
@Component({
  selector: 'tc-not-found-page',
  imports: [MatAnchor, MatIcon, RouterLink],
  template: `
    <section class="tc-message">
      <mat-icon fontSet="material-symbols-outlined" aria-hidden="true">explore_off</mat-icon>
      <h1>There is no page at this address</h1>
      <p>The link may be mistyped or out of date. Start again from the overview.</p>
      <a mat-flat-button routerLink="/">Go to the overview</a>
    </section>
  `,
  styleUrl: './message-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFoundPage {}

/** A page a role may not open, saying which role can. */
@Component({
  selector: 'tc-not-allowed-page',
  imports: [MatAnchor, MatIcon, RouterLink],
  template: `
    <section class="tc-message">
      <mat-icon fontSet="material-symbols-outlined" aria-hidden="true">lock</mat-icon>
      <h1>This page is not available to your role</h1>
      <p>{{ explanation() }}</p>
      <p>If you need it, ask an owner or admin of {{ tenant() }} to change your role.</p>
      <a mat-flat-button routerLink="/">Go to the overview</a>
    </section>
  `,
  styleUrl: './message-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotAllowedPage {
  private readonly session = inject(ConsoleSession);
  protected readonly tenant = computed(() => this.session.tenant()?.name ?? 'your tenant');
  protected readonly explanation = computed(() => {
    const role = this.session.role();
    return role
      ? `As ${ROLE_LABELS[role].name.toLowerCase()} your role covers ${ROLE_LABELS[role].summary}.`
      : 'You belong to no tenant yet; an invitation from an admin gives you a role.';
  });
}
