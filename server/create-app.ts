import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Knex } from 'knex';
import { pinoHttp } from 'pino-http';
import type { Config } from './config';
import { openDatabase, prepareDatabase, type PrepareOutcome } from './db/database';
import { docsRoutes } from './docs/docs-routes';
import { healthRoutes } from './health/health-routes';
import { notFound, problemHandler } from './http/problem';
import { staticAppRoutes } from './http/static-apps';

/** What the server shares with its routes, kept on `app.locals.tropline`. */
export interface AppContext {
  readonly config: Config;
  readonly db: Knex;
  /** Settles when migrations (and first-start seeds) are done; requests wait for it. */
  readonly ready: Promise<PrepareOutcome>;
  /** Releases the database and any worker threads. */
  close(): Promise<void>;
}

/** The app plus its context. */
export type TroplineApp = Express & { locals: { tropline: AppContext } };

/**
 * Builds the Express application. It never listens (main.ts does), so tests can drive it with
 * supertest. The database is opened and migrated here; requests wait until it is ready.
 */
export function createApp(config: Config): TroplineApp {
  const db = openDatabase(config);
  const ready = prepareDatabase(db, config);
  ready.catch(() => undefined); // reported by whoever awaits it (main.ts or the first request)
  const context: AppContext = { config, db, ready, close: () => db.destroy() };

  const app = express() as TroplineApp;
  app.locals.tropline = context;
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'simple');
  app.use(
    pinoHttp({
      level: config.logLevel,
      redact: ['req.headers.authorization', 'req.headers.cookie'],
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api/') },
    }),
  );
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
  api.use(notFound);
  app.use('/api/v1', api);
  app.use('/api', docsRoutes());
  app.use('/api', notFound);
  if (config.serveApps) app.use(staticAppRoutes(config.distDir));
  app.use(notFound);
  app.use(problemHandler);
  return app;
}
