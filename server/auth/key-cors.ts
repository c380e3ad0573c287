import type { Request, RequestHandler, Response } from 'express';
import cors from 'cors';
import type { KeysService } from '../keys/keys-service';

/** Headers a browser page may read from our answers. */
export const EXPOSED_HEADERS = [
  'RateLimit',
  'RateLimit-Policy',
  'Retry-After',
  'Location',
  'Tropline-Cache',
  'Idempotent-Replayed',
];

/** Sets the CORS answer for one listed origin on an actual (non-preflight) request. */
export function allowOrigin(res: Response, origin: string): void {
  res.setHeader('Access-Control-Allow-Origin', origin);
  res.setHeader('Access-Control-Expose-Headers', EXPOSED_HEADERS.join(', '));
  res.vary('Origin');
}

/**
 * Answers CORS preflights for origins that some live browser key lists, and only for those:
 * a preflight carries no key, so the origin list is all it can be judged by. The actual
 * request is then checked against its own key's origins by the key middleware.
 */
export function keyCorsPreflight(keys: KeysService, now: () => number): RequestHandler {
  const preflight = cors({
    origin: (origin, done) => {
      if (!origin) return done(null, false);
      keys.repository
        .originIsListed(origin, new Date(now()).toISOString())
        .then((listed) => done(null, listed ? origin : false), done);
    },
    methods: ['GET', 'POST', 'DELETE'],
    allowedHeaders: ['Authorization', 'Content-Type', 'Idempotency-Key', 'Last-Event-ID'],
    exposedHeaders: EXPOSED_HEADERS,
    maxAge: 600,
    preflightContinue: false,
    optionsSuccessStatus: 204,
  });
  return (req: Request, res: Response, next) => {
    if (req.method !== 'OPTIONS' || !req.headers.origin) return next();
    preflight(req, res, (err?: unknown) => {
      if (err) return next(err);
      // cors() found the origin unlisted: answer without any CORS headers, so the browser
      // blocks the request.
      res
        .status(403)
        .type('application/problem+json')
        .send(
          JSON.stringify({
            type: 'https://tropline.dev/problems/origin-not-allowed',
            title: 'Origin not allowed for this key',
            status: 403,
            detail: `No browser key is valid on ${req.headers.origin}.`,
          }),
        );
    });
  };
}
