/** Scopes a server key may hold, with what each allows in plain words. */
export const SERVER_SCOPE_CHOICES: readonly { scope: string; label: string }[] = [
  { scope: 'compute', label: 'compute: run projections and analyses' },
  { scope: 'scenarios:read', label: 'scenarios:read: read scenarios' },
  { scope: 'scenarios:write', label: 'scenarios:write: create and change scenarios' },
  { scope: 'usage:read', label: 'usage:read: read the tenant’s usage' },
  { scope: 'keys:manage', label: 'keys:manage: issue and revoke keys (give sparingly)' },
];

/** What a browser key always holds: it is public by design, so nothing more. */
export const BROWSER_SCOPES: readonly string[] = ['compute', 'scenarios:read'];

/** What the issue form holds. */
export interface KeyFormValue {
  readonly kind: 'server' | 'browser';
  readonly name: string;
  /** One origin per line (browser keys). */
  readonly origins: string;
  readonly scopes: readonly string[];
  /** `YYYY-MM-DD`, or empty for no expiry. */
  readonly expires: string;
}

/** The request body of `POST /console/keys`. */
export interface IssueKeyBody {
  kind: 'server' | 'browser';
  name?: string;
  scopes: string[];
  origins?: string[];
  expiresAt?: string;
}

/** Problems with the form, by field. */
export interface KeyFormProblems {
  origins?: string;
  scopes?: string;
  expires?: string;
  name?: string;
}

/**
 * An origin as the server will store it (`https://portal.example`), or undefined when the
 * text is not one: a scheme and host, an optional port, and no path, query or fragment.
 */
export function normaliseOrigin(text: string): string | undefined {
  try {
    const url = new URL(text.trim());
    if (url.protocol !== 'https:' && url.protocol !== 'http:') return undefined;
    if (url.pathname !== '/' || url.search || url.hash || url.username) return undefined;
    return url.origin;
  } catch {
    return undefined;
  }
}

/** The form read into a request body, or the problems that stop it. */
export function readKeyForm(
  value: KeyFormValue,
  today: string,
): { body: IssueKeyBody; problems?: undefined } | { body?: undefined; problems: KeyFormProblems } {
  const problems: KeyFormProblems = {};
  const lines = value.origins
    .split(/[\n,]/)
    .map((l) => l.trim())
    .filter(Boolean);
  const origins: string[] = [];
  if (value.kind === 'browser') {
    const bad = lines.filter((l) => !normaliseOrigin(l));
    if (bad.length) {
      problems.origins = `Not an origin: ${bad.join(', ')}. Write scheme and host only, like https://portal.example.`;
    } else if (!lines.length) {
      problems.origins = 'A browser key needs at least one origin: the site that will use it.';
    } else if (lines.length > 20) {
      problems.origins = 'At most 20 origins per key.';
    }
    for (const l of lines) {
      const o = normaliseOrigin(l);
      if (o && !origins.includes(o)) origins.push(o);
    }
  }
  const scopes = value.kind === 'browser' ? [...BROWSER_SCOPES] : [...value.scopes];
  if (value.kind === 'server' && scopes.length === 0) {
    problems.scopes = 'Choose at least one scope.';
  }
  if (value.name.length > 120) problems.name = 'At most 120 characters.';
  let expiresAt: string | undefined;
  if (value.expires) {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(value.expires) || Number.isNaN(Date.parse(value.expires))) {
      problems.expires = 'Write the date as YYYY-MM-DD.';
    } else if (value.expires <= today) {
      problems.expires = 'Choose a date after today.';
    } else {
      expiresAt = new Date(`${value.expires}T00:00:00Z`).toISOString();
    }
  }
  if (Object.keys(problems).length) return { problems };
  const body: IssueKeyBody = { kind: value.kind, scopes };
  if (value.name.trim()) body.name = value.name.trim();
  if (value.kind === 'browser') body.origins = origins;
  if (expiresAt) body.expiresAt = expiresAt;
  return { body };
}

/** Rotation overlap choices: how long the old key keeps working beside the new one. */
export const OVERLAP_CHOICES: readonly { seconds: number; label: string }[] = [
  { seconds: 0, label: 'None: the old key stops at once' },
  { seconds: 3600, label: '1 hour' },
  { seconds: 86_400, label: '1 day (recommended)' },
  { seconds: 7 * 86_400, label: '7 days' },
  { seconds: 30 * 86_400, label: '30 days (the longest allowed)' },
];
