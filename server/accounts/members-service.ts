import type { Knex } from 'knex';
import { canAssignRole, isTenantRole, type TenantRole } from '@tropline/core';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem } from '../http/problem';
import type { SignedInUser, TenantAccess } from './signed-in-user';
import { UsersRepository, type MemberRecord } from './users-repository';

const notMember = (userId: string) =>
  new ProblemError(404, 'not-found', 'No such member', `No member ${userId} in this tenant.`);

const lastOwner = () =>
  new ProblemError(
    409,
    'last-owner',
    'A tenant needs an owner',
    "This is the tenant's only owner; make someone else owner first.",
  );

/** Members of a tenant: list, change a role, remove. Owners alone grant or take ownership. */
export class MembersService {
  private readonly users: UsersRepository;

  constructor(
    private readonly db: Knex,
    private readonly now: () => number,
  ) {
    this.users = new UsersRepository(db);
  }

  /** The tenant's members. */
  list(tenantId: string): Promise<MemberRecord[]> {
    return this.users.members(tenantId);
  }

  /** Gives a member another role; no change, no event. */
  async changeRole(
    access: TenantAccess,
    actor: SignedInUser,
    userId: string,
    role: unknown,
    address: string,
  ): Promise<MemberRecord> {
    if (!isTenantRole(role)) {
      throw validationProblem([
        { pointer: '/role', message: 'role must be owner, admin, analyst or viewer' },
      ]);
    }
    await this.db.transaction(async (trx) => {
      const users = this.users.with(trx);
      const current = await users.roleIn(userId, access.tenantId);
      if (!current) throw notMember(userId);
      if (current === role) return;
      this.mayTouch(access, current, role);
      if (current === 'owner' && (await users.ownerCount(access.tenantId)) <= 1) throw lastOwner();
      const at = new Date(this.now()).toISOString();
      await users.putMembership(userId, access.tenantId, role, at);
      await new AuditRepository(trx).record({
        tenantId: access.tenantId,
        actor: `user:${actor.id}`,
        action: 'member.role-change',
        target: `user:${userId}`,
        detail: { from: current, to: role },
        at,
        address,
      });
    });
    const member = (await this.users.members(access.tenantId)).find((m) => m.userId === userId);
    return member!;
  }

  /** Removes a member from the tenant (their account stays). */
  async remove(access: TenantAccess, actor: SignedInUser, userId: string, address: string) {
    await this.db.transaction(async (trx) => {
      const users = this.users.with(trx);
      const current = await users.roleIn(userId, access.tenantId);
      if (!current) throw notMember(userId);
      this.mayTouch(access, current, current);
      if (current === 'owner' && (await users.ownerCount(access.tenantId)) <= 1) throw lastOwner();
      await users.removeMembership(userId, access.tenantId);
      await new AuditRepository(trx).record({
        tenantId: access.tenantId,
        actor: `user:${actor.id}`,
        action: 'member.remove',
        target: `user:${userId}`,
        detail: { role: current },
        at: new Date(this.now()).toISOString(),
        address,
      });
    });
  }

  /** An admin may neither touch an owner nor make one. */
  private mayTouch(access: TenantAccess, current: TenantRole, next: TenantRole): void {
    if (!canAssignRole(access.role, current) || !canAssignRole(access.role, next)) {
      throw new ProblemError(
        403,
        'role-forbidden',
        'Your role does not allow this',
        `As ${access.role} you may not change an owner's membership or make someone owner.`,
        { errors: [{ pointer: '/role', message: 'only an owner may grant or remove owner' }] },
      );
    }
  }
}
