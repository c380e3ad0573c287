import type { Knex } from 'knex';
import { ProblemError } from '../http/problem';

/** Limits on failed sign-ins over a sliding window. */
export interface ThrottleLimits {
  /** Window length in milliseconds. */
  readonly windowMs: number;
  /** Failures allowed per e-mail address (whether or not it has an account). */
  readonly perAccount: number;
  /** Failures allowed per client address (one network guessing many accounts). */
  readonly perAddress: number;
}

/** 5 failures per account and 30 per address in 15 minutes. */
export const DEFAULT_THROTTLE: ThrottleLimits = {
  windowMs: 15 * 60_000,
  perAccount: 5,
  perAddress: 30,
};

/**
 * Throttling of failed sign-ins, per account and per address. The refusal reads the same in
 * both cases and for addresses with no account, so it reveals nothing about who exists.
 */
export class SignInThrottle {
  constructor(
    private readonly db: Knex,
    private readonly now: () => number,
    private readonly limits: ThrottleLimits = DEFAULT_THROTTLE,
  ) {}

  /** Throws 429 when either limit is used up; otherwise returns. */
  async check(email: string, address: string): Promise<void> {
    const nowMs = this.now();
    const since = new Date(nowMs - this.limits.windowMs).toISOString();
    const [byAccount, byAddress] = await Promise.all([
      this.failures('email', email, since),
      this.failures('address', address, since),
    ]);
    const blocking = [
      byAccount.count >= this.limits.perAccount ? byAccount.oldest : undefined,
      byAddress.count >= this.limits.perAddress ? byAddress.oldest : undefined,
    ].filter((at): at is string => at !== undefined);
    if (blocking.length === 0) return;
    // The limit lifts when the oldest counted failure leaves the window.
    const until = Math.max(...blocking.map((at) => Date.parse(at) + this.limits.windowMs));
    const retryAfter = Math.max(1, Math.ceil((until - nowMs) / 1000));
    const retryAt = new Date(until).toISOString();
    throw new ProblemError(
      429,
      'sign-in-throttled',
      'Too many failed sign-ins',
      `Too many failed sign-ins for this e-mail address or from your network. Try again after ` +
        `${retryAt}, or reset your password.`,
      { retryAfter, resetsAt: retryAt },
      { 'Retry-After': String(retryAfter) },
    );
  }

  /** Counts one failure against both the e-mail address and the client address. */
  async recordFailure(email: string, address: string): Promise<void> {
    await this.db('sign_in_failures').insert({
      email,
      address,
      at: new Date(this.now()).toISOString(),
    });
  }

  /** A successful sign-in clears the account's failures (not the address's). */
  async clearAccount(email: string): Promise<void> {
    await this.db('sign_in_failures').where({ email }).del();
  }

  /** Housekeeping: failures older than the window limit nothing. */
  async prune(): Promise<void> {
    const before = new Date(this.now() - this.limits.windowMs).toISOString();
    await this.db('sign_in_failures').where('at', '<', before).del();
  }

  private async failures(column: 'email' | 'address', value: string, since: string) {
    const row = await this.db('sign_in_failures')
      .where(column, value)
      .where('at', '>=', since)
      .count({ n: '*' })
      .min({ oldest: 'at' })
      .first();
    const r = row as { n: number | string; oldest: string | null } | undefined;
    return { count: Number(r?.n ?? 0), oldest: r?.oldest ?? undefined };
  }
}
