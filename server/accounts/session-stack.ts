import { createHmac } from 'node:crypto';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import cookieParser from 'cookie-parser';
import { doubleCsrf } from 'csrf-csrf';
import type { Request, RequestHandler, Response } from 'express';
import session from 'express-session';
import type { Knex } from 'knex';
import passport from 'passport';
import type { Config } from '../config';
import { ProblemError } from '../http/problem';
import { UsersRepository } from './users-repository';

/** Sessions end after 2 hours without a request… */
export const IDLE_TIMEOUT_MS = 2 * 3_600_000;
/** …and 12 hours after sign-in whatever happens. */
export const ABSOLUTE_TIMEOUT_MS = 12 * 3_600_000;
/** Header that carries the CSRF token on state-changing console requests. */
export const CSRF_HEADER = 'x-csrf-token';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

interface SerializedUser {
  id: string;
  gen: number;
}

/** The session machinery the console routes sit behind. */
export interface SessionStack {
  /** cookie-parser, express-session, passport, expiry: for every console path. */
  readonly middleware: RequestHandler[];
  /** Refuses cookie-authenticated state changes without a valid CSRF token. */
  readonly csrfGuard: RequestHandler;
  /** Refuses state changes whose `Origin` is some other site (login CSRF included). */
  readonly originGuard: RequestHandler;
  readonly passport: passport.PassportStatic;
  /** Name of the session cookie. */
  readonly cookieName: string;
  /**
   * A CSRF token bound to the request's (current) session; sets its cookie. `fresh` replaces a
   * valid existing token (at sign-in); otherwise it is reused, so open tabs keep theirs.
   */
  csrfToken(req: Request, res: Response, fresh?: boolean): string;
  /** When the session ends if nothing else happens, epoch ms. */
  expiresAt(req: Request): number;
}

/**
 * Cookie sessions for the console: express-session in the `sessions` table, passport on top,
 * double-submit CSRF tokens bound to the session id, and expiry on the app's clock.
 */
export function sessionStack(db: Knex, config: Config, now: () => number): SessionStack {
  const production = config.nodeEnv === 'production';
  // The `__Host-` prefix makes browsers insist on Secure, no Domain and path `/`.
  const prefix = production ? '__Host-' : '';
  // Built on first use: the store checks for its table when constructed, and the table only
  // exists once migrations ran (requests wait for them; construction does not).
  let sessionHandler: RequestHandler | undefined;
  const sessions: RequestHandler = (req, res, next) => {
    sessionHandler ??= session({
      name: `${prefix}tropline.sid`,
      secret: config.sessionSecret,
      store: new ConnectSessionKnexStore({
        knex: db,
        tableName: 'sessions',
        createTable: false,
        // Expired rows are removed by the accounts housekeeping, on the app's clock.
        cleanupInterval: 0,
      }),
      resave: false,
      saveUninitialized: false,
      unset: 'destroy',
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: production,
        path: '/',
        maxAge: ABSOLUTE_TIMEOUT_MS,
      },
    });
    sessionHandler(req, res, next);
  };

  const users = new UsersRepository(db);
  const pp = new passport.Passport() as unknown as passport.PassportStatic;
  pp.serializeUser<SerializedUser>((user, done) =>
    done(null, { id: user.id, gen: user.sessionGeneration }),
  );
  pp.deserializeUser<SerializedUser>((stored, done) => {
    (async () => {
      const user = await users.find(stored.id);
      // A reset password or "sign out everywhere" bumped the generation: this session is over.
      if (!user || user.sessionGeneration !== stored.gen) return false;
      return {
        id: user.id,
        email: user.email,
        name: user.name,
        isOperator: user.isOperator,
        sessionGeneration: user.sessionGeneration,
        memberships: await users.memberships(user.id),
      };
    })().then((user) => done(null, user), done);
  });

  const expiresAt = (req: Request) =>
    Math.min(
      (req.session.lastSeenAt ?? 0) + IDLE_TIMEOUT_MS,
      (req.session.signedInAt ?? 0) + ABSOLUTE_TIMEOUT_MS,
    );

  const expiry: RequestHandler = (req, _res, next) => {
    if (!req.user) return next();
    const nowMs = now();
    if (nowMs >= expiresAt(req)) {
      (req as Request & { sessionExpired?: boolean }).sessionExpired = true;
      req.logout({ keepSessionInfo: false }, (err) => next(err));
      return;
    }
    // Write the session back at most once a minute, not on every request.
    if (nowMs - (req.session.lastSeenAt ?? 0) > 60_000) req.session.lastSeenAt = nowMs;
    next();
  };

  const csrfSecret = createHmac('sha256', config.sessionSecret).update('csrf').digest('hex');
  const csrf = doubleCsrf({
    getSecret: () => csrfSecret,
    getSessionIdentifier: (req) => req.session?.id ?? '',
    cookieName: `${prefix}tropline.csrf`,
    cookieOptions: { sameSite: 'lax', secure: production, httpOnly: true, path: '/' },
    getCsrfTokenFromRequest: (req) => req.headers[CSRF_HEADER] as string | undefined,
  });

  const csrfGuard: RequestHandler = (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || !req.user) return next();
    if (csrf.validateRequest(req)) return next();
    throw new ProblemError(
      403,
      'csrf-refused',
      'Missing or invalid CSRF token',
      `A signed-in change needs the ${CSRF_HEADER} header with the token from GET ` +
        '/api/v1/session; this request had none or a stale one.',
      { errors: [{ pointer: '', message: `send the ${CSRF_HEADER} header` }] },
    );
  };

  const ownOrigins = new Set([new URL(config.publicUrl).origin]);
  const originGuard: RequestHandler = (req, _res, next) => {
    const origin = req.headers.origin;
    if (SAFE_METHODS.has(req.method) || !origin) return next();
    if (ownOrigins.has(origin) || origin === `${req.protocol}://${req.get('host')}`) return next();
    throw new ProblemError(
      403,
      'cross-site-refused',
      'Cross-site request refused',
      `Console requests are only accepted from Tropline's own pages, not from ${origin}.`,
    );
  };

  return {
    middleware: [cookieParser(), sessions, pp.initialize(), pp.session(), expiry],
    csrfGuard,
    originGuard,
    passport: pp,
    cookieName: `${prefix}tropline.sid`,
    csrfToken: (req, res, fresh = false) => csrf.generateCsrfToken(req, res, { overwrite: fresh }),
    expiresAt,
  };
}
