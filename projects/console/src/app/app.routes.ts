import type { Routes } from '@angular/router';
import { requireAction, requireSignIn } from './session/session-guards';

const title = (page: string) => `${page} · Tropline console`;

export const routes: Routes = [
  {
    path: 'sign-in',
    title: title('Sign in'),
    loadComponent: () => import('./sign-in/sign-in-page').then((m) => m.SignInPage),
  },
  {
    path: 'invitation',
    title: title('Accept an invitation'),
    loadComponent: () => import('./invitation/invitation-page').then((m) => m.InvitationPage),
  },
  {
    path: 'password-reset',
    title: title('Choose a new password'),
    loadComponent: () =>
      import('./password-reset/password-reset-page').then((m) => m.PasswordResetPage),
  },
  {
    path: 'mailbox',
    title: title('Development mailbox'),
    loadComponent: () => import('./mailbox/mailbox-page').then((m) => m.MailboxPage),
  },
  {
    path: 'status',
    title: title('Service status'),
    loadComponent: () => import('./status/status-page').then((m) => m.StatusPage),
  },
  {
    path: '',
    canActivate: [requireSignIn],
    children: [
      {
        path: '',
        pathMatch: 'full',
        title: title('Overview'),
        loadComponent: () => import('./home/home-page').then((m) => m.HomePage),
      },
      {
        path: 'scenarios',
        canActivate: [requireAction('scenarios:read')],
        loadChildren: () => import('./scenarios/scenario-routes').then((m) => m.SCENARIO_ROUTES),
      },
      {
        path: 'keys',
        title: title('API keys'),
        canActivate: [requireAction('keys:read')],
        loadComponent: () => import('./keys/keys-page').then((m) => m.KeysPage),
      },
      {
        path: 'usage',
        title: title('Usage and quota'),
        canActivate: [requireAction('usage:read')],
        loadComponent: () => import('./usage/usage-page').then((m) => m.UsagePage),
      },
      {
        path: 'members',
        title: title('Members'),
        canActivate: [requireAction('members:read')],
        loadComponent: () => import('./members/members-page').then((m) => m.MembersPage),
      },
      {
        path: 'audit',
        title: title('Audit trail'),
        canActivate: [requireAction('audit:read')],
        loadComponent: () => import('./audit/audit-page').then((m) => m.AuditPage),
      },
      {
        path: 'tenant',
        title: title('Tenant and plan'),
        canActivate: [requireAction('tenant:manage')],
        loadComponent: () => import('./tenant/tenant-page').then((m) => m.TenantPage),
      },
      {
        path: 'not-allowed',
        title: title('Not available to your role'),
        loadComponent: () => import('./common/message-page').then((m) => m.NotAllowedPage),
      },
    ],
  },
  {
    path: '**',
    title: title('Page not found'),
    loadComponent: () => import('./common/message-page').then((m) => m.NotFoundPage),
  },
];
