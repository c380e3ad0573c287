import { canAssignRole, TENANT_ROLES, type TenantRole } from '@tropline/core';

/** A member as `GET /members` lists them. */
export interface Member {
  readonly userId: string;
  readonly email: string;
  readonly name: string;
  readonly role: TenantRole;
  readonly since: string;
}

/** A pending invitation as `GET /invitations` lists it. */
export interface Invitation {
  readonly id: string;
  readonly email: string;
  readonly role: TenantRole;
  readonly invitedBy: string | null;
  readonly createdAt: string;
  readonly expiresAt: string;
}

/** One row of the members table, with what the viewer may do to it. */
export interface MemberRow {
  readonly member: Member;
  /** Whether this is the signed-in person. */
  readonly you: boolean;
  /** Roles the viewer may move this member to (empty: the role is read-only here). */
  readonly roleChoices: readonly TenantRole[];
  /** Whether the viewer may remove this member. */
  readonly removable: boolean;
}

/** Roles someone with `actor` may hand out (only an owner makes owners). */
export function assignableRoles(actor: TenantRole | undefined): TenantRole[] {
  return actor ? TENANT_ROLES.filter((r) => canAssignRole(actor, r)) : [];
}

/**
 * The members table as `actor` (the signed-in person, `me`) sees it. Nobody changes or removes
 * themselves here, so an owner cannot lock the tenant out by a slip; the server also refuses to
 * leave a tenant without an owner.
 */
export function memberRows(
  members: readonly Member[],
  me: string | undefined,
  actor: TenantRole | undefined,
): MemberRow[] {
  const choices = assignableRoles(actor);
  return members.map((member) => {
    const you = member.userId === me;
    const touchable = !you && actor !== undefined && canAssignRole(actor, member.role);
    return {
      member,
      you,
      roleChoices: touchable ? choices : [],
      removable: touchable,
    };
  });
}
