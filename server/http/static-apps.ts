import express, { Router } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { embeddingGuideHandler, plainPageHandler } from './embedding-pages';

/** A built front end and the path it is served under. */
interface StaticApp {
  readonly mount: string;
  readonly dir: string;
  /** Whether unknown paths fall back to index.html (client-side routing). */
  readonly spa: boolean;
}

/** The front ends `npm start` builds into `dist/`, in the order they are mounted. */
export function staticApps(distDir: string): StaticApp[] {
  return [
    { mount: '/console', dir: resolve(distDir, 'console/browser'), spa: true },
    { mount: '/demo', dir: resolve(distDir, 'demo-portal/browser'), spa: true },
    // The custom elements: one ES module and its stylesheet (tropline-elements.{js,css}).
    { mount: '/elements', dir: resolve(distDir, 'elements/browser'), spa: false },
    { mount: '/storybook', dir: resolve(distDir, 'storybook'), spa: false },
  ];
}

/**
 * Serves the built console, demo portal and Storybook. A front end that has not been built is
 * answered with a problem that says which command builds it, rather than an empty page.
 */
export function staticAppRoutes(
  distDir: string,
  demoRuntimeConfig: () => { apiUrl: string; apiKey: string } | undefined,
): Router {
  const router = Router();
  router.get('/', (_req, res) => res.redirect(302, '/console/'));
  router.get('/docs/embedding', embeddingGuideHandler);
  for (const app of staticApps(distDir)) {
    const sub = Router();
    if (app.mount === '/storybook') {
      // Storybook's static build boots from inline scripts.
      sub.use(
        helmet.contentSecurityPolicy({
          directives: {
            scriptSrc: ["'self'", "'unsafe-inline'", "'unsafe-eval'"],
            upgradeInsecureRequests: null,
          },
        }),
      );
    }
    sub.use((req, res, next) => {
      if (existsSync(app.dir)) return next();
      const build = app.mount === '/storybook' ? 'npm run storybook:build' : 'npm run build';
      res
        .status(404)
        .type('application/problem+json')
        .send(
          JSON.stringify({
            type: 'https://tropline.dev/problems/not-built',
            title: 'This front end has not been built',
            status: 404,
            detail: `${app.mount}/ is served from ${app.dir}; run \`${build}\` first.`,
          }),
        );
    });
    if (app.mount === '/demo') {
      // The portal's plain HTML page: no Angular on it, the custom elements under a strict CSP.
      const plainPage = plainPageHandler(resolve(app.dir, 'plain/index.html'), demoRuntimeConfig);
      sub.get(['/plain', '/plain/index.html'], (req, res, next) =>
        req.originalUrl.split('?')[0] === '/demo/plain'
          ? res.redirect(301, '/demo/plain/')
          : plainPage(req, res, next),
      );
    }
    sub.use(express.static(app.dir, { index: 'index.html', fallthrough: true, maxAge: '1h' }));
    if (app.mount === '/demo') {
      // A deployed portal ships its own runtime-config.json (served just above); in development
      // the server writes one with the seeded demo browser key.
      sub.get('/runtime-config.json', (_req, res, next) => {
        const runtime = demoRuntimeConfig();
        if (!runtime) return next();
        res.setHeader('Cache-Control', 'no-store');
        res.json(runtime);
      });
    }
    if (app.spa) {
      // Client-side routes have no file extension; a missing asset stays a 404.
      sub.get('/{*rest}', (req, res, next) => {
        if (/\.[a-z0-9]+$/i.test(req.path)) return next();
        res.setHeader('Cache-Control', 'no-cache');
        res.sendFile(resolve(app.dir, 'index.html'));
      });
    }
    router.get(app.mount, (req, res, next) =>
      req.originalUrl.split('?')[0] === app.mount ? res.redirect(301, app.mount + '/') : next(),
    );
    router.use(app.mount, sub);
  }
  return router;
}
