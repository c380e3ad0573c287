import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { canAssignRole, isTenantRole, type TenantRole } from '@tropline/core';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem } from '../http/problem';
import { invitationMail } from '../mail/mail-templates';
import { emailProblems, normaliseEmail } from './email-address';
import type { MailQueue } from './mail-queue';
import { oneTimeToken, tokenHash } from './one-time-token';
import type { SignedInUser, TenantAccess } from './signed-in-user';
import { signInFailed } from './sign-in-service';
import type { SignInThrottle } from './sign-in-throttle';
import type { UsersService } from './users-service';

/** An invitation link is good for 7 days. */
export const INVITATION_TTL_MS = 7 * 86_400_000;

/** An invitation as the members page lists it (never its token). */
export interface InvitationView {
  readonly id: string;
  readonly email: string;
  readonly role: TenantRole;
  readonly invitedBy: string | null;
  readonly createdAt: string;
  readonly expiresAt: string;
}

interface InvitationRow {
  id: string;
  tenant_id: string;
  email: string;
  role: TenantRole;
  invited_by: string | null;
  created_at: string;
  expires_at: string;
  accepted_at: string | null;
  revoked_at: string | null;
}

const view = (r: InvitationRow): InvitationView => ({
  id: r.id,
  email: r.email,
  role: r.role,
  invitedBy: r.invited_by,
  createdAt: r.created_at,
  expiresAt: r.expires_at,
});

/** One answer for a token that is unknown, used, revoked or expired: it reveals nothing. */
const unusable = () =>
  new ProblemError(
    410,
    'invitation-unusable',
    'This invitation cannot be used',
    'The link was already used, was withdrawn or has expired. Ask for a new invitation.',
  );

/** Invitations: issued by admins, mailed as a one-time link, accepted once. */
export class InvitationsService {
  constructor(
    private readonly db: Knex,
    private readonly users: UsersService,
    private readonly throttle: SignInThrottle,
    private readonly mail: MailQueue,
    private readonly publicUrl: string,
    private readonly now: () => number,
  ) {}

  /** Invites `email` into the caller's tenant with `role`; mails the link after commit. */
  async invite(
    access: TenantAccess,
    inviter: SignedInUser,
    input: { email: string; role: string },
    address: string,
  ): Promise<InvitationView> {
    const errors = emailProblems(input.email);
    if (!isTenantRole(input.role)) {
      errors.push({ pointer: '/role', message: 'role must be owner, admin, analyst or viewer' });
    }
    if (errors.length) throw validationProblem(errors);
    const role = input.role as TenantRole;
    if (!canAssignRole(access.role, role)) {
      throw new ProblemError(
        403,
        'role-forbidden',
        'Your role does not allow this',
        `As ${access.role} you may not invite someone as ${role}; only an owner may.`,
        { errors: [{ pointer: '/role', message: `you may not grant ${role}` }] },
      );
    }
    const email = normaliseEmail(input.email);
    const existing = await this.users.repository.findByEmail(email);
    if (existing && (await this.users.repository.roleIn(existing.id, access.tenantId))) {
      throw new ProblemError(409, 'conflict', 'Already a member', `${email} is already a member.`, {
        errors: [{ pointer: '/email', message: 'this person is already a member' }],
      });
    }
    const nowMs = this.now();
    const at = new Date(nowMs).toISOString();
    const token = oneTimeToken();
    const row: InvitationRow = {
      id: randomUUID(),
      tenant_id: access.tenantId,
      email,
      role,
      invited_by: inviter.id,
      created_at: at,
      expires_at: new Date(nowMs + INVITATION_TTL_MS).toISOString(),
      accepted_at: null,
      revoked_at: null,
    };
    await this.db.transaction(async (trx) => {
      // Only the newest link for a person works: an earlier invitation is withdrawn.
      await trx('invitations')
        .where({ tenant_id: access.tenantId, email })
        .whereNull('accepted_at')
        .whereNull('revoked_at')
        .update({ revoked_at: at });
      await trx('invitations').insert({ ...row, token_hash: token.hash });
      await new AuditRepository(trx).record({
        tenantId: access.tenantId,
        actor: `user:${inviter.id}`,
        action: 'member.invite',
        target: `email:${email}`,
        detail: { role, invitation: row.id },
        at,
        address,
      });
      const link = `${this.publicUrl}/console/invitation?token=${encodeURIComponent(token.token)}`;
      await this.mail.enqueue(
        [
          invitationMail({
            to: email,
            tenantName: access.tenantName,
            inviterName: inviter.name,
            role,
            link,
            expiresAt: row.expires_at,
          }),
        ],
        at,
        trx,
      );
    });
    this.mail.afterCommit();
    return view(row);
  }

  /** A tenant's pending invitations, newest first. */
  async pending(tenantId: string): Promise<InvitationView[]> {
    const rows = (await this.db('invitations')
      .where({ tenant_id: tenantId })
      .whereNull('accepted_at')
      .whereNull('revoked_at')
      .where('expires_at', '>', new Date(this.now()).toISOString())
      .orderBy([{ column: 'created_at', order: 'desc' }, { column: 'id' }])) as InvitationRow[];
    return rows.map(view);
  }

  /** Withdraws a pending invitation of the caller's tenant. */
  async revoke(access: TenantAccess, actor: SignedInUser, id: string, address: string) {
    const at = new Date(this.now()).toISOString();
    const changed = await this.db.transaction(async (trx) => {
      const n = await trx('invitations')
        .where({ id, tenant_id: access.tenantId })
        .whereNull('accepted_at')
        .whereNull('revoked_at')
        .update({ revoked_at: at });
      if (n === 1) {
        await new AuditRepository(trx).record({
          tenantId: access.tenantId,
          actor: `user:${actor.id}`,
          action: 'invitation.revoke',
          target: id,
          at,
          address,
        });
      }
      return n;
    });
    if (changed === 0) {
      throw new ProblemError(
        404,
        'not-found',
        'No such invitation',
        `No pending invitation ${id}.`,
      );
    }
  }

  /** What an invitation link offers, for the acceptance page. */
  async lookup(token: string) {
    const row = await this.usable(this.db, token);
    const tenant = await this.db('tenants').where({ id: row.tenant_id }).first('slug', 'name');
    const account = await this.users.repository.findByEmail(row.email);
    return {
      tenant: { slug: tenant.slug as string, name: tenant.name as string },
      email: row.email,
      role: row.role,
      expiresAt: row.expires_at,
      accountExists: account !== undefined,
    };
  }

  /**
   * Accepts an invitation once. A newcomer chooses a name and password (the account is
   * created); someone with an account confirms it with their password. Either way the token
   * is spent in the same transaction that adds the membership.
   */
  async accept(
    token: string,
    input: { name?: string; password: string },
    address: string,
  ): Promise<{ userId: string; tenant: string; role: TenantRole }> {
    const pending = await this.usable(this.db, token);
    const existing = await this.users.repository.findByEmail(pending.email);
    if (existing) {
      await this.throttle.check(existing.email, address);
      if (!(await this.users.hasher.verify(existing.passwordHash, input.password))) {
        await this.throttle.recordFailure(existing.email, address);
        throw signInFailed();
      }
    } else if (input.name === undefined) {
      throw validationProblem([{ pointer: '/name', message: 'a newcomer needs a name' }]);
    }
    const at = new Date(this.now()).toISOString();
    // Checked and hashed before the transaction: argon2 is slow and SQLite has one writer.
    const prepared = existing
      ? undefined
      : await this.users.prepare({
          email: pending.email,
          name: input.name ?? '',
          password: input.password,
        });
    return this.db.transaction(async (trx) => {
      const row = await this.usable(trx, token);
      const spent = await trx('invitations')
        .where({ id: row.id })
        .whereNull('accepted_at')
        .whereNull('revoked_at')
        .update({ accepted_at: at });
      if (spent !== 1) throw unusable();
      const userId = existing
        ? existing.id
        : (await this.users.insert(prepared!, `invitation:${row.id}`, trx)).id;
      await this.users.repository.with(trx).putMembership(userId, row.tenant_id, row.role, at);
      await new AuditRepository(trx).record({
        tenantId: row.tenant_id,
        actor: `user:${userId}`,
        action: 'member.join',
        target: `user:${userId}`,
        detail: { role: row.role, invitation: row.id },
        at,
        address,
      });
      const tenant = await trx('tenants').where({ id: row.tenant_id }).first('slug');
      return { userId, tenant: tenant.slug as string, role: row.role };
    });
  }

  private async usable(db: Knex | Knex.Transaction, token: string): Promise<InvitationRow> {
    const row = (await db('invitations')
      .where({ token_hash: tokenHash(token) })
      .first()) as InvitationRow | undefined;
    const now = new Date(this.now()).toISOString();
    if (!row || row.accepted_at || row.revoked_at || row.expires_at <= now) throw unusable();
    return row;
  }
}
