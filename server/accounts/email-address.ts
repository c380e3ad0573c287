import type { FieldError } from '../http/problem';

/** Longest address SMTP allows (RFC 5321 path limit). */
export const MAX_EMAIL_LENGTH = 254;

/** The stored form of an address: trimmed and lowercased, so each person has one account. */
export function normaliseEmail(value: string): string {
  return value.trim().toLowerCase();
}

/**
 * Complaints about an address, empty when it looks deliverable. Deliberately loose (one `@`,
 * no spaces, a dot in the domain): the invitation mail is the real test.
 */
export function emailProblems(value: string, pointer = '/email'): FieldError[] {
  const email = normaliseEmail(value);
  if (email.length === 0) return [{ pointer, message: 'an e-mail address is required' }];
  if (email.length > MAX_EMAIL_LENGTH) {
    return [{ pointer, message: `an e-mail address has at most ${MAX_EMAIL_LENGTH} characters` }];
  }
  if (!/^[^\s@]+@[^\s@]+\.[^\s@.]+$/.test(email)) {
    return [{ pointer, message: `"${value}" is not an e-mail address` }];
  }
  return [];
}
