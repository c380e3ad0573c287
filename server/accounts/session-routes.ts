import { Router, type Request } from 'express';
import type { Strategy } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { signInBody } from './account-schemas';
import { notSignedIn, requireSignIn } from './access-guard';
import { parseBody } from './parse-body';
import { signInFailed, type SignInService } from './sign-in-service';
import { clientAddress, type SignedInUser } from './signed-in-user';
import type { SessionStack } from './session-stack';
import type { UsersRepository } from './users-repository';

/** The body of `GET /session` and of a successful sign-in. */
function sessionView(req: Request, user: SignedInUser, stack: SessionStack, csrfToken: string) {
  return {
    user: { id: user.id, email: user.email, name: user.name, operator: user.isOperator },
    tenants: user.memberships.map((m) => ({
      id: m.tenantId,
      slug: m.tenantSlug,
      name: m.tenantName,
      role: m.role,
    })),
    csrfToken,
    expiresAt: new Date(stack.expiresAt(req)).toISOString(),
  };
}

function promise<T>(run: (done: (err: unknown, value?: T) => void) => void): Promise<T> {
  return new Promise<T>((resolve, reject) =>
    run((err, value) => (err ? reject(err) : resolve(value as T))),
  );
}

/**
 * `/session`: sign in (passport-local; the session is regenerated, so a planted session id is
 * worthless), read who is signed in, sign out. Mounted before the CSRF guard: signing in is
 * not cookie-authenticated, and signing out only ever takes access away.
 */
export function sessionRoutes(
  stack: SessionStack,
  signIn: SignInService,
  users: UsersRepository,
  now: () => number,
): Router {
  const local = new LocalStrategy(
    { usernameField: 'email', passwordField: 'password', passReqToCallback: true, session: true },
    (req, email, password, done) => {
      signIn
        .verify(email, password, clientAddress(req))
        .then(async (u): Promise<SignedInUser> => ({
          ...u,
          memberships: await users.memberships(u.id),
        }))
        .then((u) => done(null, u), done);
    },
  );
  stack.passport.use('local', local as unknown as Strategy);
  const router = Router();

  router.post('/session', async (req, res) => {
    parseBody(signInBody, req.body);
    const user = await promise<SignedInUser>((done) =>
      stack.passport.authenticate(
        'local',
        { session: false },
        (err: unknown, found: SignedInUser | false) =>
          done(err ?? (found ? null : signInFailed()), found || undefined),
      )(req, res, done),
    );
    // passport regenerates the session here: a session id planted before sign-in is dropped.
    await promise<void>((done) => req.logIn(user, { session: true, keepSessionInfo: false }, done));
    req.session.signedInAt = req.session.lastSeenAt = now();
    await signIn.recordSignIn(user.id, clientAddress(req));
    res.set('Cache-Control', 'no-store');
    res.json(sessionView(req, user, stack, stack.csrfToken(req, res, true)));
  });

  router.get('/session', (req, res) => {
    if (!req.user) throw notSignedIn(req);
    const view = sessionView(req, req.user, stack, stack.csrfToken(req, res));
    res.set('Cache-Control', 'no-store').json(view);
  });

  router.delete('/session', async (req, res) => {
    const user = req.user;
    if (user) {
      await signIn.recordSignOut(user.id, clientAddress(req), false);
      await promise<void>((done) => req.logout({ keepSessionInfo: false }, done));
    }
    res.clearCookie(stack.cookieName, { path: '/' });
    res.status(204).end();
  });
  return router;
}

/** `POST /session/sign-out-everywhere`: ends this and every other session of the user. */
export function signOutEverywhereRoutes(stack: SessionStack, signIn: SignInService): Router {
  const router = Router();
  router.post('/session/sign-out-everywhere', requireSignIn, async (req, res) => {
    await signIn.recordSignOut(req.user!.id, clientAddress(req), true);
    await promise<void>((done) => req.logout({ keepSessionInfo: false }, done));
    res.clearCookie(stack.cookieName, { path: '/' });
    res.status(204).end();
  });
  return router;
}
