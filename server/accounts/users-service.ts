import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { isTenantRole, type TenantRole } from '@tropline/core';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem, type FieldError } from '../http/problem';
import { emailProblems, normaliseEmail } from './email-address';
import type { PasswordHasher } from './password-hasher';
import { passwordProblems } from './password-policy';
import { UsersRepository, type UserRecord } from './users-repository';

/** What it takes to create an account. */
export interface NewUser {
  readonly email: string;
  readonly name: string;
  readonly password: string;
  /** Whether the account is the platform operator's. */
  readonly operator?: boolean;
  /** A first membership, e.g. from the CLI or an invitation. */
  readonly tenantId?: string;
  readonly role?: string;
}

/** A checked user with its password hashed, ready to insert. */
export interface PreparedUser {
  readonly user: UserRecord;
  readonly tenantId: string | undefined;
  readonly role: TenantRole | undefined;
}

/** Validates a display name; returns complaints. */
export function nameProblems(name: string, pointer = '/name'): FieldError[] {
  const trimmed = name.trim();
  if (trimmed.length === 0) return [{ pointer, message: 'a name is required' }];
  if (trimmed.length > 120) return [{ pointer, message: 'a name has at most 120 characters' }];
  return [];
}

/** Accounts: creation with a checked password, and the lookups other services need. */
export class UsersService {
  readonly repository: UsersRepository;

  constructor(
    private readonly db: Knex,
    readonly hasher: PasswordHasher,
    private readonly now: () => number = Date.now,
  ) {
    this.repository = new UsersRepository(db);
  }

  /**
   * Checks e-mail, name, password and role and hashes the password: the slow part, done
   * before any transaction opens (SQLite has one writer).
   */
  async prepare(input: NewUser): Promise<PreparedUser> {
    const email = normaliseEmail(input.email);
    const errors = [
      ...emailProblems(input.email),
      ...nameProblems(input.name),
      ...passwordProblems(input.password, email),
    ];
    if (input.tenantId !== undefined && !isTenantRole(input.role)) {
      errors.push({ pointer: '/role', message: 'role must be owner, admin, analyst or viewer' });
    }
    if (errors.length) throw validationProblem(errors);
    const at = new Date(this.now()).toISOString();
    return {
      user: {
        id: randomUUID(),
        email,
        name: input.name.trim(),
        passwordHash: await this.hasher.hash(input.password),
        isOperator: input.operator ?? false,
        sessionGeneration: 0,
        createdAt: at,
        passwordChangedAt: at,
      },
      tenantId: input.tenantId,
      role: input.tenantId !== undefined ? (input.role as TenantRole) : undefined,
    };
  }

  /** Stores a prepared user (and first membership) in `trx`, with one audit event. */
  async insert(prepared: PreparedUser, actor: string, trx: Knex.Transaction): Promise<UserRecord> {
    const { user, tenantId, role } = prepared;
    const users = this.repository.with(trx);
    if (await users.findByEmail(user.email)) {
      throw new ProblemError(409, 'conflict', 'Already exists', `An account uses ${user.email}.`, {
        errors: [{ pointer: '/email', message: 'an account already uses this address' }],
      });
    }
    await users.insert(user);
    await new AuditRepository(trx).record({
      tenantId: tenantId ?? null,
      actor,
      action: 'user.create',
      target: `user:${user.id}`,
      detail: { email: user.email, operator: user.isOperator, ...(role ? { role } : {}) },
      at: user.createdAt,
    });
    if (tenantId !== undefined && role) {
      await users.putMembership(user.id, tenantId, role, user.createdAt);
    }
    return user;
  }

  /** Creates a user (and their first membership) in one transaction. */
  async create(input: NewUser, actor: string): Promise<UserRecord> {
    const prepared = await this.prepare(input);
    return this.db.transaction((trx) => this.insert(prepared, actor, trx));
  }
}
