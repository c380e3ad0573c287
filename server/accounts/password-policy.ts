import type { FieldError } from '../http/problem';
import { COMMON_PASSWORDS } from './common-passwords';

/** Shortest password accepted, in characters (code points). */
export const MIN_PASSWORD_LENGTH = 12;

/** Longest password accepted: argon2 handles more, but nobody types this much. */
export const MAX_PASSWORD_LENGTH = 256;

/**
 * The password policy of common practice: long enough, not absurdly long, not one of the most
 * common passwords, and not the account's own e-mail address. No composition rules (they push
 * people towards predictable patterns). Returns the complaints, empty when the password is fine.
 */
export function passwordProblems(
  password: string,
  email: string | undefined,
  pointer = '/password',
): FieldError[] {
  const length = [...password].length;
  if (length < MIN_PASSWORD_LENGTH) {
    return [{ pointer, message: `the password needs at least ${MIN_PASSWORD_LENGTH} characters` }];
  }
  if (length > MAX_PASSWORD_LENGTH) {
    return [
      { pointer, message: `the password may have at most ${MAX_PASSWORD_LENGTH} characters` },
    ];
  }
  const lower = password.toLowerCase();
  if (COMMON_PASSWORDS.has(lower) || COMMON_PASSWORDS.has(lower.trim())) {
    return [{ pointer, message: 'this password is among the most common ones; choose another' }];
  }
  if (email && (lower === email.toLowerCase() || lower === email.split('@')[0]!.toLowerCase())) {
    return [{ pointer, message: 'the password must not be your e-mail address' }];
  }
  if (new Set(password).size < 3) {
    return [{ pointer, message: 'the password repeats too few different characters' }];
  }
  return [];
}
