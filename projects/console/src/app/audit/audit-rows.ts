import type { Member } from '../members/member-rows';

/** One event as `GET /audit-events` returns it. */
export interface AuditEventView {
  readonly id: number;
  readonly actor: string;
  readonly action: string;
  readonly target?: string | null;
  readonly detail?: Record<string, unknown> | null;
  readonly at: string;
  readonly address?: string | null;
}

/** Actions the trail records, in plain words (unknown ones show their dotted name). */
export const AUDIT_ACTIONS: Readonly<Record<string, string>> = {
  'session.sign-in': 'Signed in',
  'session.sign-in-failed': 'Failed sign-in',
  'session.sign-out': 'Signed out',
  'session.sign-out-everywhere': 'Signed out everywhere',
  'key.issue': 'Issued a key',
  'key.rotate': 'Rotated a key',
  'key.revoke': 'Revoked a key',
  'member.invite': 'Invited someone',
  'invitation.revoke': 'Cancelled an invitation',
  'member.join': 'Joined',
  'member.add': 'Added a member',
  'member.role-change': 'Changed a role',
  'member.remove': 'Removed a member',
  'user.create': 'Created an account',
  'user.password-reset-request': 'Asked for a password link',
  'user.password-reset': 'Changed a password by link',
  'quota.set': 'Set the quota numbers',
  'quota.plan-change': 'Chose another plan',
  'tenant.update': 'Changed the tenant',
};

/** One row of the audit table. */
export interface AuditRow {
  readonly id: number;
  readonly at: string;
  readonly who: string;
  readonly what: string;
  readonly target: string;
  readonly detail: string;
  readonly address: string;
}

/** A reference (`user:<id>`, `key:<id>`, `email:<a>`, `cli`) in words, naming members. */
export function describeRef(ref: string | null | undefined, people: ReadonlyMap<string, Member>) {
  if (!ref) return '';
  const [kind, ...rest] = ref.split(':');
  const id = rest.join(':');
  if (kind === 'user') {
    const m = people.get(id);
    return m ? m.name : `Former member ${id.slice(0, 8)}`;
  }
  if (kind === 'key') return `API key ${id.slice(0, 8)}`;
  if (kind === 'email') return id;
  if (kind === 'invitation') return 'Invitation link';
  if (ref === 'cli') return 'Command line';
  if (ref === 'seed') return 'Demo data set-up';
  return ref;
}

function detailText(detail: Record<string, unknown> | null | undefined): string {
  if (!detail) return '';
  return Object.entries(detail)
    .map(([k, v]) => `${k}: ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`)
    .join('; ');
}

/** The audit table's rows. */
export function auditRows(events: readonly AuditEventView[], members: readonly Member[]) {
  const people = new Map(members.map((m) => [m.userId, m]));
  return events.map((e): AuditRow => ({
    id: e.id,
    at: e.at,
    who: describeRef(e.actor, people),
    what: AUDIT_ACTIONS[e.action] ?? e.action,
    target: describeRef(e.target, people),
    detail: detailText(e.detail),
    address: e.address ?? '',
  }));
}

/** The filter form's values. */
export interface AuditFilter {
  readonly action: string;
  readonly actor: string;
  readonly target: string;
  /** `YYYY-MM-DD` or empty. */
  readonly from: string;
  readonly to: string;
}

/** Query parameters for `GET /audit-events`; `to` includes the whole day it names. */
export function auditQuery(f: AuditFilter, before: number | undefined, limit: number) {
  const q: Record<string, string> = { limit: String(limit) };
  if (f.action) q['action'] = f.action;
  if (f.actor) q['actor'] = f.actor;
  if (f.target.trim()) q['target'] = f.target.trim();
  if (f.from) q['from'] = new Date(`${f.from}T00:00:00Z`).toISOString();
  if (f.to) q['to'] = new Date(Date.parse(`${f.to}T00:00:00Z`) + 86_400_000 - 1).toISOString();
  if (before !== undefined) q['before'] = String(before);
  return q;
}
