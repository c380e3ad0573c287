/** Why someone is on the sign-in page, from its query parameters. */
export interface SignInReason {
  readonly ended?: string;
  readonly out?: string;
  readonly done?: string;
}

/** The sentence that greets someone on the sign-in page, if any. */
export function signInNotice(reason: SignInReason): string | undefined {
  if (reason.done === 'reset') return 'Your password was changed. Sign in with the new one.';
  if (reason.done === 'joined') return 'You have joined the tenant. Sign in to start.';
  if (reason.out === 'all') return 'You are signed out on every device.';
  if (reason.out) return 'You are signed out.';
  if (reason.ended) return 'Your session ended. Sign in again to carry on where you were.';
  return undefined;
}

/**
 * The console path to open after sign-in. Only a path inside the console is followed, so a
 * crafted link cannot send someone to another site after they sign in.
 */
export function safeNext(next: string | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.includes('\\')) return '/';
  return next.startsWith('/sign-in') ? '/' : next;
}
