import type { Knex } from 'knex';
import type { TenantRole } from '@tropline/core';

/** A person who can sign in to the console. */
export interface UserRecord {
  readonly id: string;
  readonly email: string;
  readonly name: string;
  readonly passwordHash: string;
  readonly isOperator: boolean;
  readonly sessionGeneration: number;
  readonly createdAt: string;
  readonly passwordChangedAt: string;
}

/** One of a user's tenants and the role held there. */
export interface MembershipRecord {
  readonly tenantId: string;
  readonly tenantSlug: string;
  readonly tenantName: string;
  readonly role: TenantRole;
  readonly since: string;
}

/** A tenant's member as the members page lists them. */
export interface MemberRecord {
  readonly userId: string;
  readonly email: string;
  readonly name: string;
  readonly role: TenantRole;
  readonly since: string;
}

interface UserRow {
  id: string;
  email: string;
  name: string;
  password_hash: string;
  is_operator: boolean | number;
  session_generation: number;
  created_at: string;
  password_changed_at: string;
}

function toUser(row: UserRow): UserRecord {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    passwordHash: row.password_hash,
    isOperator: Boolean(row.is_operator),
    sessionGeneration: Number(row.session_generation),
    createdAt: row.created_at,
    passwordChangedAt: row.password_changed_at,
  };
}

/** Storage of users and memberships; plain objects in and out. */
export class UsersRepository {
  constructor(private readonly db: Knex | Knex.Transaction) {}

  /** The same repository inside a transaction. */
  with(trx: Knex.Transaction): UsersRepository {
    return new UsersRepository(trx);
  }

  /** Inserts a user. */
  async insert(user: Omit<UserRecord, 'sessionGeneration'>): Promise<void> {
    await this.db('users').insert({
      id: user.id,
      email: user.email,
      name: user.name,
      password_hash: user.passwordHash,
      is_operator: user.isOperator,
      session_generation: 0,
      created_at: user.createdAt,
      password_changed_at: user.passwordChangedAt,
    });
  }

  /** The user with this (lowercased) e-mail address, or undefined. */
  async findByEmail(email: string): Promise<UserRecord | undefined> {
    const row = await this.db('users').where({ email }).first();
    return row ? toUser(row as UserRow) : undefined;
  }

  /** The user with this id, or undefined. */
  async find(id: string): Promise<UserRecord | undefined> {
    const row = await this.db('users').where({ id }).first();
    return row ? toUser(row as UserRow) : undefined;
  }

  /** Replaces a password hash and ends every session of the user in the same write. */
  async setPassword(id: string, passwordHash: string, at: string): Promise<void> {
    await this.db('users')
      .where({ id })
      .update({
        password_hash: passwordHash,
        password_changed_at: at,
        session_generation: this.db.raw('session_generation + 1'),
      });
  }

  /**
   * Swaps a hash for a stronger one of the same password (sessions stay valid). Only while the
   * stored hash is still `previous`, so a password changed meanwhile is never overwritten.
   */
  async upgradeHash(id: string, previous: string, passwordHash: string): Promise<boolean> {
    const n = await this.db('users')
      .where({ id, password_hash: previous })
      .update({ password_hash: passwordHash });
    return n > 0;
  }

  /** Ends every session of the user (they hold the old generation). */
  async bumpSessionGeneration(id: string): Promise<void> {
    await this.db('users').where({ id }).increment('session_generation', 1);
  }

  /** The user's tenants and roles, by tenant slug. */
  async memberships(userId: string): Promise<MembershipRecord[]> {
    const rows = await this.db('memberships as m')
      .join('tenants as t', 't.id', 'm.tenant_id')
      .where('m.user_id', userId)
      .orderBy('t.slug')
      .select('m.tenant_id', 't.slug', 't.name', 'm.role', 'm.created_at');
    return rows.map((r) => ({
      tenantId: r.tenant_id,
      tenantSlug: r.slug,
      tenantName: r.name,
      role: r.role as TenantRole,
      since: r.created_at,
    }));
  }

  /** A tenant's members, by name. */
  async members(tenantId: string): Promise<MemberRecord[]> {
    const rows = await this.db('memberships as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where('m.tenant_id', tenantId)
      .orderBy([{ column: 'u.name' }, { column: 'u.id' }])
      .select('u.id', 'u.email', 'u.name', 'm.role', 'm.created_at');
    return rows.map((r) => ({
      userId: r.id,
      email: r.email,
      name: r.name,
      role: r.role as TenantRole,
      since: r.created_at,
    }));
  }

  /** One membership's role, or undefined. */
  async roleIn(userId: string, tenantId: string): Promise<TenantRole | undefined> {
    const row = await this.db('memberships')
      .where({ user_id: userId, tenant_id: tenantId })
      .first('role');
    return row ? (row.role as TenantRole) : undefined;
  }

  /** Adds a membership, or changes its role when it exists. */
  async putMembership(userId: string, tenantId: string, role: TenantRole, at: string) {
    const changed = await this.db('memberships')
      .where({ user_id: userId, tenant_id: tenantId })
      .update({ role });
    if (changed === 0) {
      await this.db('memberships').insert({
        user_id: userId,
        tenant_id: tenantId,
        role,
        created_at: at,
      });
    }
  }

  /** Removes a membership; returns whether one existed. */
  async removeMembership(userId: string, tenantId: string): Promise<boolean> {
    return (await this.db('memberships').where({ user_id: userId, tenant_id: tenantId }).del()) > 0;
  }

  /** How many owners a tenant has. */
  async ownerCount(tenantId: string): Promise<number> {
    const row = await this.db('memberships')
      .where({ tenant_id: tenantId, role: 'owner' })
      .count<{ n: number }[]>({ n: '*' })
      .first();
    return Number(row?.n ?? 0);
  }

  /** E-mail addresses of a tenant's owners and admins: who hears about keys and quotas. */
  async adminEmails(tenantId: string): Promise<string[]> {
    const rows = await this.db('memberships as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where('m.tenant_id', tenantId)
      .whereIn('m.role', ['owner', 'admin'])
      .orderBy('u.email')
      .select('u.email');
    return rows.map((r) => r.email as string);
  }
}
