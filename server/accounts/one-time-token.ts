import { createHash, randomBytes } from 'node:crypto';

/** A secret for a link (invitation, password reset) and the hash that is stored instead. */
export interface OneTimeToken {
  /** Goes into the e-mail only. */
  readonly token: string;
  /** SHA-256 hex of the token: what the database keeps and looks up. */
  readonly hash: string;
}

/** Hash of a token as stored. SHA-256 suffices: the token has 256 random bits, not a password. */
export function tokenHash(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A fresh 256-bit token, base64url so it survives being pasted from an e-mail. */
export function oneTimeToken(): OneTimeToken {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: tokenHash(token) };
}
