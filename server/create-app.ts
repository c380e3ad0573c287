import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Knex } from 'knex';
import { pinoHttp } from 'pino-http';
import type { Config } from './config';
import { openDatabase, prepareDatabase, type PrepareOutcome } from './db/database';
import { keyedApi } from './auth/keyed-api';
import { memberComputeGuard } from './accounts/member-compute-guard';
import { stampStart } from './projections/sync-compute';
import { accountsApi, type AccountsApi } from './accounts/accounts-api';
import { DEMO_USERS, type DemoUser } from '../seeds/03-demo-users';
import type { ComputeLimits } from './projections/projections-routes';
import { docsRoutes } from './docs/docs-routes';
import { healthRoutes } from './health/health-routes';
import { notFound, problemHandler } from './http/problem';
import { staticAppRoutes } from './http/static-apps';
import { issueDemoKeys, readDemoKeys, type DemoKeys } from './keys/demo-keys';
import { scenariosApi } from './scenarios/scenarios-api';

/** What the server shares with its routes, kept on `app.locals.tropline`. */
export interface AppContext {
  readonly config: Config;
  readonly db: Knex;
  /** Settles when migrations (and first-start seeds) are done; requests wait for it. */
  readonly ready: Promise<PrepareOutcome>;
  /** Releases the database and any worker threads. */
  close(): Promise<void>;
  /** The clock every expiry, window and period is read from (tests move it). */
  readonly now: () => number;
  /** The demo tenant's keys in plaintext, once `ready` (development and test only). */
  demoKeys?: DemoKeys;
  /** Sign-in, sessions, mail (and the dev mail catcher) of the console. */
  readonly accounts: AccountsApi;
  /** The demo sign-ins with their passwords (development and test only). */
  demoSignIns?: readonly DemoUser[];
}

/** Options for tests. */
export interface AppOptions {
  /** Clock in epoch milliseconds; defaults to `Date.now`. */
  readonly now?: () => number;
  /** Tighter wall-time bounds (tests of the bounds themselves). */
  readonly computeLimits?: Partial<ComputeLimits>;
}

/** The app plus its context. */
export type TroplineApp = Express & { locals: { tropline: AppContext } };

/**
 * Builds the Express application. It never listens (main.ts does), so tests can drive it with
 * supertest. The database is opened and migrated here; requests wait until it is ready.
 */
export function createApp(config: Config, options: AppOptions = {}): TroplineApp {
  const now = options.now ?? Date.now;
  const db = openDatabase(config);
  const keyed = keyedApi(db, now, options.computeLimits);
  const accounts = accountsApi(db, config, now, keyed);
  const scenarios = scenariosApi(db, accounts.sessions, now, keyed);
  const ready = prepareDatabase(db, config).then(async (outcome) => {
    if (config.nodeEnv !== 'production') {
      context.demoKeys = outcome.seeded
        ? await issueDemoKeys(db, config, now)
        : readDemoKeys(config);
      context.demoSignIns = DEMO_USERS;
    }
    await accounts.start();
    return outcome;
  });
  ready.catch(() => undefined); // reported by whoever awaits it (main.ts or the first request)
  const context: AppContext = {
    config,
    db,
    ready,
    now,
    accounts,
    close: async () => {
      await accounts.close();
      await keyed.close();
      await scenarios.close();
      await db.destroy();
    },
  };

  const app = express() as TroplineApp;
  app.locals.tropline = context;
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'simple');
  // Server-Timing's `total` counts from here: logging, headers, body parsing and routing too.
  app.use(stampStart);
  // A request's logger is built (its bindings serialised and redacted) even when nothing will
  // be logged; with logging off the stack does without it (errors check for `req.log`).
  if (config.logLevel !== 'silent') {
    app.use(
      pinoHttp({
        level: config.logLevel,
        redact: ['req.headers.authorization', 'req.headers.cookie'],
        autoLogging: { ignore: (req) => !req.url?.startsWith('/api/') },
      }),
    );
  }
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Angular inserts component styles at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          upgradeInsecureRequests: null,
        },
      },
      hsts: config.nodeEnv === 'production',
    }),
  );
  app.use(async (_req, _res, next) => {
    await ready;
    next();
  });

  const api = express.Router();
  api.use(express.json({ limit: '256kb', strict: true }));
  api.use(healthRoutes(db));
  api.use(accounts.router);
  api.use(keyed.router);
  api.use(scenarios.router);
  // Behind the accounts' session stack, which every `/console` path passes first.
  api.use('/console/compute', stampStart, keyed.computeRoutes(memberComputeGuard(db)));
  api.use(notFound);
  app.use('/api/v1', api);
  app.use('/api', docsRoutes());
  app.use('/api', notFound);
  if (config.serveApps) {
    const demoKeys = () => (context as { demoKeys?: { browserKey: string } }).demoKeys;
    app.use(
      staticAppRoutes(config.distDir, () => {
        const keys = demoKeys();
        return keys ? { apiUrl: '/api/v1', apiKey: keys.browserKey } : undefined;
      }),
    );
  }
  app.use(notFound);
  app.use(problemHandler);
  return app;
}
