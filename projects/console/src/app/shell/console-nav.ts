import { can, type Action, type TenantRole } from '@tropline/core';

/** One entry of the console's navigation. */
export interface NavItem {
  readonly path: string;
  readonly label: string;
  /** Material Symbols ligature. */
  readonly icon: string;
  /** What the role must be allowed to do to see it; none for everyone signed in. */
  readonly needs?: Action;
  /** Whether it exists only where the development mailbox is served. */
  readonly devOnly?: boolean;
}

/** Every page of the console, in the order the navigation lists them. */
export const NAV_ITEMS: readonly NavItem[] = [
  { path: '/', label: 'Overview', icon: 'home' },
  { path: '/scenarios', label: 'Scenarios', icon: 'ssid_chart', needs: 'scenarios:read' },
  { path: '/keys', label: 'API keys', icon: 'key', needs: 'keys:read' },
  { path: '/usage', label: 'Usage and quota', icon: 'data_usage', needs: 'usage:read' },
  { path: '/members', label: 'Members', icon: 'group', needs: 'members:read' },
  { path: '/audit', label: 'Audit trail', icon: 'history', needs: 'audit:read' },
  { path: '/tenant', label: 'Tenant and plan', icon: 'domain', needs: 'tenant:manage' },
  { path: '/mailbox', label: 'Development mailbox', icon: 'mail', devOnly: true },
  { path: '/status', label: 'Service status', icon: 'monitor_heart' },
];

/** The entries a role sees; the mailbox only where the server runs its mail catcher. */
export function navFor(role: TenantRole | undefined, mailbox: boolean): NavItem[] {
  return NAV_ITEMS.filter(
    (item) => (!item.needs || can(role, item.needs)) && (!item.devOnly || mailbox),
  );
}

/** How a role is named on screen, with what it may do in a few words. */
export const ROLE_LABELS: Readonly<Record<TenantRole, { name: string; summary: string }>> = {
  owner: { name: 'Owner', summary: 'everything, including who else is owner' },
  admin: { name: 'Admin', summary: 'keys, members and the audit trail, plus analyst work' },
  analyst: { name: 'Analyst', summary: 'scenarios, data, analyses and publishing' },
  viewer: {
    name: 'Viewer',
    summary: 'reading scenarios, data, usage and members, without changes',
  },
};

/** A role's name on screen; an unknown value shows as it is. */
export function roleName(role: string): string {
  return ROLE_LABELS[role as TenantRole]?.name ?? role;
}
