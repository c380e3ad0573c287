/**
 * Who may do what in Tropline: one table that the server enforces on every console route and the
 * console reads to decide what to show. Plain data plus a pure `can`, so both sides agree.
 */

/** Roles a member holds in one tenant. */
export const TENANT_ROLES = ['owner', 'admin', 'analyst', 'viewer'] as const;

/** A role in a tenant. */
export type TenantRole = (typeof TENANT_ROLES)[number];

/** Every role the matrix knows: the tenant roles plus the platform operator. */
export type Role = TenantRole | 'operator';

/** Things a signed-in person may be allowed to do. */
export const ACTIONS = [
  'scenarios:read',
  'data:read',
  'usage:read',
  'members:read',
  'scenarios:write',
  'data:write',
  'analyses:run',
  'scenarios:publish',
  'keys:read',
  'keys:manage',
  'members:manage',
  'audit:read',
  'tenant:manage',
  'plan:manage',
  'tenants:create',
  'quotas:set',
  'plans:offer',
] as const;

/** One action of the matrix. */
export type Action = (typeof ACTIONS)[number];

const READ: readonly Action[] = ['scenarios:read', 'data:read', 'usage:read', 'members:read'];
const EDIT: readonly Action[] = [
  ...READ,
  'scenarios:write',
  'data:write',
  'analyses:run',
  'scenarios:publish',
];
const ADMINISTER: readonly Action[] = [
  ...EDIT,
  'keys:read',
  'keys:manage',
  'members:manage',
  'audit:read',
];

/**
 * The matrix. Viewers read; analysts also edit scenarios and data, run analyses and publish;
 * admins also manage keys and members and read the audit trail; owners also manage the tenant
 * (name, contact address) and choose its plan among those on offer. The operator acts on the
 * platform, not inside a tenant: creates tenants, sets their quota numbers, offers plans.
 */
export const ROLE_MATRIX: Readonly<Record<Role, readonly Action[]>> = {
  viewer: READ,
  analyst: EDIT,
  admin: ADMINISTER,
  owner: [...ADMINISTER, 'tenant:manage', 'plan:manage'],
  operator: ['tenants:create', 'quotas:set', 'plans:offer'],
};

/** Whether `role` may perform `action`; an unknown role may do nothing. */
export function can(role: Role | undefined, action: Action): boolean {
  return role !== undefined && (ROLE_MATRIX[role]?.includes(action) ?? false);
}

/**
 * Whether a member with `actorRole` may give (or take away) `role`: only an owner hands out or
 * removes ownership, so an admin cannot promote themselves or unseat an owner.
 */
export function canAssignRole(actorRole: TenantRole, role: TenantRole): boolean {
  if (!can(actorRole, 'members:manage')) return false;
  return role !== 'owner' || actorRole === 'owner';
}

/** Whether a string names a tenant role. */
export function isTenantRole(value: unknown): value is TenantRole {
  return typeof value === 'string' && (TENANT_ROLES as readonly string[]).includes(value);
}
