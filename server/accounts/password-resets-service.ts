import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem } from '../http/problem';
import { passwordResetMail } from '../mail/mail-templates';
import { emailProblems, normaliseEmail } from './email-address';
import type { MailQueue } from './mail-queue';
import { oneTimeToken, tokenHash } from './one-time-token';
import type { PasswordHasher } from './password-hasher';
import { passwordProblems } from './password-policy';
import type { SignInThrottle } from './sign-in-throttle';
import { UsersRepository } from './users-repository';

/** A reset link is good for 30 minutes. */
export const RESET_TTL_MS = 30 * 60_000;
/** At most this many reset mails per account per hour (the rest are silently dropped). */
export const RESETS_PER_HOUR = 3;

const unusable = () =>
  new ProblemError(
    410,
    'reset-unusable',
    'This reset link cannot be used',
    'The link was already used or has expired. Ask for a new one.',
  );

/**
 * Password resets: a one-time link by e-mail, short-lived; completing it sets the password and
 * ends every session of the account (its session generation moves on).
 */
export class PasswordResetsService {
  private readonly users: UsersRepository;

  constructor(
    private readonly db: Knex,
    private readonly hasher: PasswordHasher,
    private readonly throttle: SignInThrottle,
    private readonly mail: MailQueue,
    private readonly publicUrl: string,
    private readonly now: () => number,
  ) {
    this.users = new UsersRepository(db);
  }

  /**
   * Mails a reset link when an account has this address. The caller answers the same either
   * way, so the request reveals nothing about who has an account.
   */
  async request(rawEmail: string, address: string): Promise<void> {
    const errors = emailProblems(rawEmail);
    if (errors.length) throw validationProblem(errors);
    const email = normaliseEmail(rawEmail);
    const user = await this.users.findByEmail(email);
    if (!user) return;
    const nowMs = this.now();
    const at = new Date(nowMs).toISOString();
    const recent = await this.db('password_resets')
      .where({ user_id: user.id })
      .where('created_at', '>', new Date(nowMs - 3_600_000).toISOString())
      .count({ n: '*' })
      .first();
    if (Number((recent as { n?: number } | undefined)?.n ?? 0) >= RESETS_PER_HOUR) return;
    const token = oneTimeToken();
    const expiresAt = new Date(nowMs + RESET_TTL_MS).toISOString();
    await this.db.transaction(async (trx) => {
      await trx('password_resets').insert({
        id: randomUUID(),
        user_id: user.id,
        token_hash: token.hash,
        created_at: at,
        expires_at: expiresAt,
      });
      await new AuditRepository(trx).record({
        tenantId: null,
        actor: 'anonymous',
        action: 'user.password-reset-request',
        target: `user:${user.id}`,
        at,
        address,
      });
      const link =
        `${this.publicUrl}/console/password-reset?token=` + encodeURIComponent(token.token);
      await this.mail.enqueue(
        [passwordResetMail({ to: user.email, name: user.name, link, expiresAt })],
        at,
        trx,
      );
    });
    this.mail.afterCommit();
  }

  /** Sets a new password with a reset token, once; every session of the account ends. */
  async complete(token: string, password: string, address: string): Promise<void> {
    const nowIso = new Date(this.now()).toISOString();
    const find = (db: Knex | Knex.Transaction) =>
      db('password_resets as r')
        .join('users as u', 'u.id', 'r.user_id')
        .where('r.token_hash', tokenHash(token))
        .whereNull('r.used_at')
        .where('r.expires_at', '>', nowIso)
        .first('r.id', 'r.user_id', 'u.email');
    const reset = await find(this.db);
    if (!reset) throw unusable();
    const problems = passwordProblems(password, reset.email);
    if (problems.length) throw validationProblem(problems);
    const hash = await this.hasher.hash(password);
    await this.db.transaction(async (trx) => {
      const spent = await trx('password_resets')
        .where({ id: reset.id })
        .whereNull('used_at')
        .update({ used_at: nowIso });
      if (spent !== 1) throw unusable();
      // Any other link still in someone's mailbox dies with this one.
      await trx('password_resets')
        .where({ user_id: reset.user_id })
        .whereNull('used_at')
        .update({ used_at: nowIso });
      await this.users.with(trx).setPassword(reset.user_id, hash, nowIso);
      await new AuditRepository(trx).record({
        tenantId: null,
        actor: `user:${reset.user_id}`,
        action: 'user.password-reset',
        target: `user:${reset.user_id}`,
        at: nowIso,
        address,
      });
    });
    // Whoever holds the mailbox holds the account: earlier failed guesses no longer count.
    await this.throttle.clearAccount(reset.email);
  }
}
