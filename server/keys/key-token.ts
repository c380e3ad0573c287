import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import { crc32 } from 'node:zlib';

/** The two kinds of API key (architecture.md, "Keys and roles"). */
export type KeyKind = 'server' | 'browser';

const KIND_CODE: Record<KeyKind, string> = { server: 'sk', browser: 'bk' };
const ALPHABET = 'abcdefghijklmnopqrstuvwxyz234567'; // RFC 4648 base32, lower case
const ID_CHARS = 12; // 60 bits: unique enough for a lookup key, shown in the console
const SECRET_CHARS = 32; // 160 bits of secret (the issue asks for at least 128)
const CHECK_CHARS = 7; // the CRC-32 of everything before it, 35 bits wide

/**
 * The full shape of a key: `tropline_sk_<id>_<secret><check>` (or `_bk_` for browser keys). The
 * fixed prefix lets secret scanners find leaked keys; the checksum lets them confirm a hit
 * offline without asking us.
 */
export const KEY_PATTERN = new RegExp(
  `^tropline_(sk|bk)_([${ALPHABET}]{${ID_CHARS}})_([${ALPHABET}]{${SECRET_CHARS}})` +
    `([${ALPHABET}]{${CHECK_CHARS}})$`,
);

/** A key as generated: the plaintext (shown once) and what is stored. */
export interface GeneratedKey {
  readonly id: string;
  readonly kind: KeyKind;
  readonly token: string;
  readonly secretHash: string;
}

/** The parts of a well-formed token. */
export interface ParsedKey {
  readonly id: string;
  readonly kind: KeyKind;
  readonly secret: string;
}

function randomChars(n: number): string {
  const bytes = randomBytes(n);
  let out = '';
  for (let i = 0; i < n; i++) out += ALPHABET[bytes[i] & 31];
  return out;
}

function checksum(body: string): string {
  let value = crc32(body);
  let out = '';
  for (let i = 0; i < CHECK_CHARS; i++) {
    out = ALPHABET[value & 31] + out;
    value = Math.floor(value / 32);
  }
  return out;
}

/** SHA-256 of id and secret, hex. The secret has 160 random bits, so no slow hash is needed. */
export function hashSecret(id: string, secret: string): string {
  return createHash('sha256').update(`${id}:${secret}`).digest('hex');
}

/** Whether the secret matches the stored hash, compared in constant time. */
export function secretMatches(id: string, secret: string, storedHash: string): boolean {
  const a = Buffer.from(hashSecret(id, secret), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}

/** Makes a new key of the given kind. */
export function generateKey(kind: KeyKind): GeneratedKey {
  const id = randomChars(ID_CHARS);
  const secret = randomChars(SECRET_CHARS);
  const body = `tropline_${KIND_CODE[kind]}_${id}_${secret}`;
  return { id, kind, token: body + checksum(body), secretHash: hashSecret(id, secret) };
}

/**
 * Splits a token into its parts, or `undefined` when it is not a Tropline key or its checksum
 * is wrong (a typo or a truncated copy), so such tokens never reach the database.
 */
export function parseKey(token: string): ParsedKey | undefined {
  const m = KEY_PATTERN.exec(token);
  if (!m) return undefined;
  const [, code, id, secret, check] = m;
  if (checksum(`tropline_${code}_${id}_${secret}`) !== check) return undefined;
  return { id, kind: code === 'sk' ? 'server' : 'browser', secret };
}

/** Whether a string is a bare key id (as listed in the console and the CLI). */
export function isKeyId(value: string): boolean {
  return new RegExp(`^[${ALPHABET}]{${ID_CHARS}}$`).test(value);
}

/** The public, non-secret label of a key: `tropline_sk_<id>`. */
export function keyLabel(kind: KeyKind, id: string): string {
  return `tropline_${KIND_CODE[kind]}_${id}`;
}
