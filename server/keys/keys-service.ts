import type { Knex } from 'knex';
import { AuditRepository } from '../audit/audit-repository';
import type { KeyPrincipal } from '../auth/key-principal';
import { ProblemError, validationProblem, type FieldError } from '../http/problem';
import { DEFAULT_PLAN } from '../quotas/quotas-repository';
import { BROWSER_SCOPES, DEFAULT_SERVER_SCOPES, isScope, type Scope } from './key-scopes';
import { generateKey, isKeyId, keyLabel, parseKey, secretMatches, type KeyKind } from './key-token';
import { KeysRepository, type KeyRecord } from './keys-repository';

/** What an operator or admin asks for when issuing a key. */
export interface IssueKeyInput {
  readonly tenantId: string;
  readonly kind: KeyKind;
  readonly name?: string;
  readonly scopes?: readonly string[];
  readonly origins?: readonly string[];
  /** ISO instant after which the key stops working. */
  readonly expiresAt?: string;
  readonly perMinute?: number;
}

/** A key as shown in listings: everything but the secret. */
export interface KeyInfo {
  readonly id: string;
  readonly label: string;
  readonly kind: KeyKind;
  readonly name: string;
  readonly scopes: string[];
  readonly origins: string[];
  readonly createdAt: string;
  readonly expiresAt: string | null;
  readonly revokedAt: string | null;
  readonly rotatedTo: string | null;
}

/** A freshly issued key: the only time its plaintext exists outside the caller's hands. */
export interface IssuedKey {
  readonly key: KeyInfo;
  readonly token: string;
}

/** Longest rotation overlap: 30 days. */
export const MAX_OVERLAP_SECONDS = 30 * 86_400;

function info(k: KeyRecord): KeyInfo {
  return {
    id: k.id,
    label: keyLabel(k.kind, k.id),
    kind: k.kind,
    name: k.name,
    scopes: k.scopes,
    origins: k.origins,
    createdAt: k.createdAt,
    expiresAt: k.expiresAt,
    revokedAt: k.revokedAt,
    rotatedTo: k.rotatedTo,
  };
}

/** Normalises an origin (`https://portal.example:8443`) or returns undefined if it is not one. */
export function normaliseOrigin(value: string): string | undefined {
  try {
    const url = new URL(value);
    if (url.protocol !== 'https:' && url.protocol !== 'http:') return undefined;
    // `new URL` drops an empty query or fragment (`http://a.example#` has hash ''), so look at
    // the text too: an origin has neither.
    if (url.pathname !== '/' || /[?#]/.test(value) || url.username || url.password) {
      return undefined;
    }
    return url.origin;
  } catch {
    return undefined;
  }
}

const unauthorized = (detail: string) =>
  new ProblemError(
    401,
    'invalid-key',
    'The API key is not valid',
    detail,
    {},
    {
      'WWW-Authenticate': 'Bearer realm="tropline", error="invalid_token"',
    },
  );

/** The rules of API keys: issue, list, rotate, revoke, and authenticate a bearer token. */
export class KeysService {
  readonly repository: KeysRepository;
  private readonly db: Knex;

  constructor(
    db: Knex,
    private readonly now: () => number = Date.now,
  ) {
    this.db = db;
    this.repository = new KeysRepository(db);
  }

  /**
   * Issues a key; the plaintext is in the answer and nowhere else. `address` is the client's
   * IP for the audit trail when a request caused it.
   */
  async issue(input: IssueKeyInput, actor: string, address?: string): Promise<IssuedKey> {
    const { record, token } = this.prepare(input);
    await this.db.transaction(async (trx) => {
      await this.repository.insert(record, trx);
      await new AuditRepository(trx).record({
        tenantId: input.tenantId,
        actor,
        action: 'key.issue',
        target: record.id,
        detail: { kind: record.kind, scopes: record.scopes, origins: record.origins },
        at: record.createdAt,
        address,
      });
    });
    return { key: info({ ...record, revokedAt: null, rotatedTo: null }), token };
  }

  /** Validates an issue request and generates the key; writes nothing. */
  private prepare(input: IssueKeyInput) {
    const errors: FieldError[] = [];
    const origins: string[] = [];
    (input.origins ?? []).forEach((o, i) => {
      const n = typeof o === 'string' ? normaliseOrigin(o) : undefined;
      if (!n) errors.push({ pointer: `/origins/${i}`, message: `"${o}" is not an origin` });
      else if (!origins.includes(n)) origins.push(n);
    });
    if (input.kind === 'browser' && origins.length === 0 && errors.length === 0) {
      errors.push({ pointer: '/origins', message: 'a browser key needs at least one origin' });
    }
    if (input.kind === 'server' && origins.length > 0) {
      errors.push({ pointer: '/origins', message: 'server keys are not bound to origins' });
    }
    const scopes: Scope[] = [];
    (input.scopes ?? []).forEach((s, i) => {
      if (!isScope(s)) errors.push({ pointer: `/scopes/${i}`, message: `unknown scope "${s}"` });
      else if (input.kind === 'browser' && !BROWSER_SCOPES.includes(s)) {
        errors.push({ pointer: `/scopes/${i}`, message: `a browser key cannot hold "${s}"` });
      } else if (!scopes.includes(s)) scopes.push(s);
    });
    const nowMs = this.now();
    if (input.expiresAt !== undefined) {
      const t = Date.parse(input.expiresAt);
      if (!Number.isFinite(t) || t <= nowMs) {
        errors.push({ pointer: '/expiresAt', message: 'expiresAt must be a future ISO instant' });
      }
    }
    if (errors.length) throw validationProblem(errors);
    const generated = generateKey(input.kind);
    const record = {
      id: generated.id,
      tenantId: input.tenantId,
      kind: input.kind,
      name: input.name?.trim() || `${input.kind} key`,
      secretHash: generated.secretHash,
      scopes:
        input.kind === 'browser'
          ? [...BROWSER_SCOPES]
          : scopes.length
            ? scopes
            : [...DEFAULT_SERVER_SCOPES],
      origins,
      perMinute: input.perMinute ?? null,
      createdAt: new Date(nowMs).toISOString(),
      expiresAt: input.expiresAt ? new Date(Date.parse(input.expiresAt)).toISOString() : null,
    };
    return { record, token: generated.token };
  }

  /** A tenant's keys. */
  async list(tenantId: string): Promise<KeyInfo[]> {
    return (await this.repository.listForTenant(tenantId)).map(info);
  }

  /**
   * Resolves a key id or a full key to the stored key. A full key must also match its hash, so
   * a made-up token cannot be used to probe for ids.
   */
  async resolve(idOrToken: string): Promise<KeyRecord | undefined> {
    const bare = idOrToken.replace(/^tropline_(sk|bk)_/, '');
    if (isKeyId(bare)) return this.repository.find(bare);
    const parsed = parseKey(idOrToken);
    if (!parsed) return undefined;
    const key = await this.repository.find(parsed.id);
    return key && secretMatches(key.id, parsed.secret, key.secretHash) ? key : undefined;
  }

  /** Revokes a key; the very next request with it is refused (no cache in between). */
  async revoke(key: KeyRecord, actor: string, address?: string): Promise<void> {
    const at = new Date(this.now()).toISOString();
    // The revocation and its audit event commit together or not at all.
    await this.db.transaction(async (trx) => {
      if (await this.repository.revoke(key.id, at, trx)) {
        await new AuditRepository(trx).record({
          tenantId: key.tenantId,
          actor,
          action: 'key.revoke',
          target: key.id,
          at,
          address,
        });
      }
    });
  }

  /** Issues a successor with the same powers; the old key keeps working for `overlapSeconds`. */
  async rotate(key: KeyRecord, overlapSeconds: number, actor: string, address?: string) {
    if (key.revokedAt || key.rotatedTo) {
      throw new ProblemError(
        409,
        'conflict',
        'Cannot rotate',
        `Key ${key.id} was already ${key.revokedAt ? 'revoked' : 'rotated'}.`,
      );
    }
    const nowMs = this.now();
    const until = new Date(
      Math.min(nowMs + overlapSeconds * 1000, key.expiresAt ? Date.parse(key.expiresAt) : Infinity),
    ).toISOString();
    const { record, token } = this.prepare({
      tenantId: key.tenantId,
      kind: key.kind,
      name: key.name,
      scopes: key.scopes,
      origins: key.origins,
      perMinute: key.perMinute ?? undefined,
    });
    // One transaction and one audit event: a crash cannot leave a successor without the link
    // to its predecessor, and two concurrent rotations cannot both succeed.
    await this.db.transaction(async (trx) => {
      await this.repository.insert(record, trx);
      if (!(await this.repository.markRotated(key.id, record.id, until, trx))) {
        throw new ProblemError(
          409,
          'conflict',
          'Cannot rotate',
          `Key ${key.id} changed meanwhile.`,
        );
      }
      await new AuditRepository(trx).record({
        tenantId: key.tenantId,
        actor,
        action: 'key.rotate',
        target: key.id,
        detail: { successor: record.id, overlapUntil: until },
        at: new Date(nowMs).toISOString(),
        address,
      });
    });
    return {
      key: info({ ...record, revokedAt: null, rotatedTo: null }),
      token,
      previous: { id: key.id, expiresAt: until },
    };
  }

  /**
   * Checks a bearer token and the request's Origin; returns the principal or throws 401/403.
   * Reads the key on every request so revocation and expiry apply at once.
   */
  async authenticate(token: string, origin: string | undefined): Promise<KeyPrincipal> {
    const parsed = parseKey(token);
    if (!parsed)
      throw unauthorized('The bearer token is not a Tropline key (or its checksum is wrong).');
    const key = await this.repository.findWithPlan(parsed.id);
    if (!key || key.kind !== parsed.kind || !secretMatches(key.id, parsed.secret, key.secretHash)) {
      throw unauthorized('No key matches this token.');
    }
    const nowIso = new Date(this.now()).toISOString();
    if (key.revokedAt) throw unauthorized(`This key was revoked at ${key.revokedAt}.`);
    if (key.expiresAt && key.expiresAt <= nowIso) {
      throw unauthorized(
        key.rotatedTo
          ? `This key was rotated; its overlap ended at ${key.expiresAt}. Use its successor.`
          : `This key expired at ${key.expiresAt}.`,
      );
    }
    if (key.kind === 'browser') {
      if (!origin || !key.origins.includes(origin)) {
        throw new ProblemError(
          403,
          'origin-not-allowed',
          'Origin not allowed for this key',
          origin
            ? `Browser key ${key.id} is not valid on ${origin}.`
            : 'A browser key is only accepted with an Origin header from one of its origins.',
          { origin: origin ?? null },
        );
      }
    }
    const perMinute =
      key.perMinute ??
      (key.kind === 'browser'
        ? (key.browserPerMinute ?? DEFAULT_PLAN.browserPerMinute)
        : (key.planPerMinute ?? DEFAULT_PLAN.perMinute));
    return {
      keyId: key.id,
      kind: key.kind,
      tenantId: key.tenantId,
      tenantSlug: key.tenantSlug,
      scopes: key.scopes.filter(isScope),
      publishedOnly: key.kind === 'browser',
      origin: key.kind === 'browser' ? origin : undefined,
      monthlyUnits: key.monthlyUnits ?? DEFAULT_PLAN.monthlyUnits,
      perMinute,
    };
  }
}
