/** The state of one limit at the end of a request. */
export interface LimitState {
  /** Policy name in the headers: `per-minute` or `monthly-units`. */
  readonly name: 'per-minute' | 'monthly-units';
  /** The limit (requests or compute units). */
  readonly quota: number;
  /** Window length in seconds. */
  readonly window: number;
  /** What is left in the current window. */
  readonly remaining: number;
  /** Seconds until the window resets. */
  readonly reset: number;
}

/**
 * `RateLimit-Policy` and `RateLimit` fields in the structured-field syntax of the IETF httpapi
 * rate-limit header draft: one list member per policy, `q`/`w` for the policy and `r`/`t` for
 * the current state. Both policies are always listed so a client sees the tighter one.
 */
export function rateLimitHeaders(states: readonly LimitState[]): Record<string, string> {
  return {
    'RateLimit-Policy': states.map((s) => `"${s.name}";q=${s.quota};w=${s.window}`).join(', '),
    RateLimit: states
      .map((s) => `"${s.name}";r=${Math.max(0, s.remaining)};t=${Math.max(0, s.reset)}`)
      .join(', '),
  };
}

/** Parses a `RateLimit` field back into `{ name: { r, t } }` (used by tests and clients). */
export function parseRateLimit(value: string): Record<string, { r: number; t: number }> {
  const out: Record<string, { r: number; t: number }> = {};
  for (const member of value.split(',')) {
    const m = /^\s*"([^"]+)";r=(\d+);t=(\d+)\s*$/.exec(member);
    if (m) out[m[1]] = { r: Number(m[2]), t: Number(m[3]) };
  }
  return out;
}
