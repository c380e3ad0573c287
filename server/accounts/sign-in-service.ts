import type { Knex } from 'knex';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError } from '../http/problem';
import { normaliseEmail } from './email-address';
import type { PasswordHasher } from './password-hasher';
import { SignInThrottle } from './sign-in-throttle';
import { UsersRepository, type UserRecord } from './users-repository';

/** The one answer to a wrong e-mail address or a wrong password. */
export function signInFailed(): ProblemError {
  return new ProblemError(
    401,
    'sign-in-failed',
    'Sign-in failed',
    'The e-mail address or the password is not right.',
  );
}

/**
 * Checks credentials. Throttled per account and per address; an unknown account costs the
 * same hashing time and gets the same answer as a wrong password, so nobody learns who has an
 * account. Every attempt, good or bad, leaves one audit event. A good password whose stored
 * hash is cheaper than today's cost is rehashed and stored on the way.
 */
export class SignInService {
  readonly throttle: SignInThrottle;
  private readonly users: UsersRepository;
  private readonly audit: AuditRepository;

  constructor(
    db: Knex,
    private readonly hasher: PasswordHasher,
    private readonly now: () => number,
  ) {
    this.throttle = new SignInThrottle(db, now);
    this.users = new UsersRepository(db);
    this.audit = new AuditRepository(db);
  }

  /** The user whose credentials these are, or a 401 / 429 problem. */
  async verify(rawEmail: string, password: string, address: string): Promise<UserRecord> {
    const email = normaliseEmail(rawEmail);
    await this.throttle.check(email, address);
    const user = await this.users.findByEmail(email);
    const ok = user
      ? await this.hasher.verify(user.passwordHash, password)
      : await this.hasher.verifyNobody(password);
    if (!user || !ok) {
      await this.throttle.recordFailure(email, address);
      await this.audit.record({
        tenantId: null,
        actor: 'anonymous',
        action: 'session.sign-in-failed',
        target: user ? `user:${user.id}` : undefined,
        detail: { email },
        at: new Date(this.now()).toISOString(),
        address,
      });
      throw signInFailed();
    }
    await this.throttle.clearAccount(email);
    if (this.hasher.needsRehash(user.passwordHash)) {
      // The cost went up since this hash was made; the password is at hand only now.
      const stronger = await this.hasher.hash(password);
      if (await this.users.upgradeHash(user.id, user.passwordHash, stronger)) {
        return { ...user, passwordHash: stronger };
      }
    }
    return user;
  }

  /** Records a completed sign-in (after the session was regenerated). */
  async recordSignIn(userId: string, address: string): Promise<void> {
    await this.audit.record({
      tenantId: null,
      actor: `user:${userId}`,
      action: 'session.sign-in',
      target: `user:${userId}`,
      at: new Date(this.now()).toISOString(),
      address,
    });
  }

  /** Records a sign-out; `everywhere` when every session of the user was ended. */
  async recordSignOut(userId: string, address: string, everywhere: boolean): Promise<void> {
    if (everywhere) await this.users.bumpSessionGeneration(userId);
    await this.audit.record({
      tenantId: null,
      actor: `user:${userId}`,
      action: everywhere ? 'session.sign-out-everywhere' : 'session.sign-out',
      target: `user:${userId}`,
      at: new Date(this.now()).toISOString(),
      address,
    });
  }
}
