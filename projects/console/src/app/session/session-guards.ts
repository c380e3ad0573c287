import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import type { Action } from '@tropline/core';
import { ConsoleSession } from './console-session';

/** Pages behind sign-in: someone signed out is sent to sign in, then brought back. */
export const requireSignIn: CanActivateFn = async (_route, state) => {
  const session = inject(ConsoleSession);
  const router = inject(Router);
  try {
    const known = await session.ensureLoaded();
    if (known.kind === 'signed-in') return true;
    return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
  } catch {
    // The API did not answer at all: the status page says so and what to do.
    return router.createUrlTree(['/status']);
  }
};

/** Pages for roles that may do `action`; anyone else reads why they cannot. */
export function requireAction(action: Action): CanActivateFn {
  return () => {
    const session = inject(ConsoleSession);
    return session.can(action) || inject(Router).createUrlTree(['/not-allowed']);
  };
}
