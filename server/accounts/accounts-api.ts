import { Router } from 'express';
import type { Knex } from 'knex';
import type { Config } from '../config';
import type { KeysService } from '../keys/keys-service';
import { mailboxRoutes } from '../mail/mailbox-routes';
import { Mailer, type MailerOptions } from '../mail/mailer';
import { consoleUsageRoutes } from '../quotas/console-usage-routes';
import type { QuotasService } from '../quotas/quotas-service';
import { ownerTenantRoutes, planOffersRoutes } from '../tenants/tenant-routes';
import { auditEventsRoutes } from './audit-events-routes';
import { consoleKeysRoutes } from './console-keys-routes';
import { InvitationsService } from './invitations-service';
import { invitationsRoutes, membersRoutes } from './members-routes';
import { MembersService } from './members-service';
import { operatorRoutes } from './operator-routes';
import { hashCostFor, PasswordHasher } from './password-hasher';
import { passwordResetsRoutes } from './password-resets-routes';
import { PasswordResetsService } from './password-resets-service';
import { SignInService } from './sign-in-service';
import { sessionRoutes, signOutEverywhereRoutes } from './session-routes';
import { sessionStack, type SessionStack } from './session-stack';
import { UsersService } from './users-service';

/** Paths that use the console's cookie session (everything else under /api/v1 never sees it). */
export const SESSION_PATHS = [
  '/session',
  '/members',
  '/invitations',
  '/password-resets',
  '/audit-events',
  '/console',
  '/tenants',
  '/tenant',
  '/plan-offers',
];

/** How often expired sessions and old sign-in failures are removed outside tests. */
const HOUSEKEEPING_MS = 10 * 60_000;

/** The accounts part of `/api/v1` and what it holds on to. */
export interface AccountsApi {
  readonly router: Router;
  readonly users: UsersService;
  readonly signIn: SignInService;
  readonly mailer: Mailer;
  /** The console's cookie sessions, shared by every route that accepts a signed-in member. */
  readonly sessions: SessionStack;
  /** Starts the mail catcher (development, tests), the outbox worker and housekeeping. */
  start(): Promise<void>;
  /** Stops them; the database stays open for the caller to close. */
  close(): Promise<void>;
}

/**
 * Sign-in, sessions, members, invitations, password resets, the audit trail, key management
 * for signed-in admins, the owner's tenant and plan, the operator's platform routes (tenants,
 * quotas, the plan catalogue) and the development mailbox.
 */
export function accountsApi(
  db: Knex,
  config: Config,
  now: () => number,
  keyed: { readonly keys: KeysService; readonly quotas: QuotasService },
  mailerOptions: MailerOptions = {},
): AccountsApi {
  const hasher = new PasswordHasher(hashCostFor(config.nodeEnv));
  const mailer = new Mailer(db, config, now, mailerOptions);
  const users = new UsersService(db, hasher, now);
  const signIn = new SignInService(db, hasher, now);
  const stack = sessionStack(db, config, now);
  const invitations = new InvitationsService(
    db,
    users,
    signIn.throttle,
    mailer,
    config.publicUrl,
    now,
  );
  const resets = new PasswordResetsService(
    db,
    hasher,
    signIn.throttle,
    mailer,
    config.publicUrl,
    now,
  );

  const router = Router();
  router.use(SESSION_PATHS, ...stack.middleware, stack.originGuard);
  router.use(sessionRoutes(stack, signIn, users.repository, now));
  router.use(SESSION_PATHS, stack.csrfGuard);
  router.use(signOutEverywhereRoutes(stack, signIn));
  router.use(membersRoutes(new MembersService(db, now)));
  router.use(invitationsRoutes(invitations));
  router.use(passwordResetsRoutes(resets));
  router.use(auditEventsRoutes(db));
  router.use(consoleKeysRoutes(db, keyed.keys));
  router.use(consoleUsageRoutes(db, now));
  router.use(ownerTenantRoutes(db, now, () => mailer.afterCommit()));
  router.use(operatorRoutes(db, now));
  router.use(planOffersRoutes(db, now));
  if (mailer.catcher) router.use(mailboxRoutes(mailer.catcher));

  let housekeeping: NodeJS.Timeout | undefined;
  const tidy = async () => {
    await signIn.throttle.prune();
    await db('sessions').where('expired', '<', new Date(now()).toISOString()).del();
  };
  return {
    router,
    users,
    signIn,
    mailer,
    sessions: stack,
    async start() {
      await mailer.start();
      if (config.nodeEnv !== 'test') {
        housekeeping = setInterval(() => void tidy().catch(() => undefined), HOUSEKEEPING_MS);
        housekeeping.unref();
      }
    },
    async close() {
      if (housekeeping) clearInterval(housekeeping);
      await mailer.close();
    },
  };
}
