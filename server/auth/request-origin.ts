import type { Request } from 'express';

/**
 * The origin of the page that sent a request, for checking a browser key's allowed origins.
 * Browsers send `Origin` on cross-origin requests and on POSTs, but omit it on same-origin GETs
 * (Fetch standard), marking those `Sec-Fetch-Site: same-origin` instead — a header page scripts
 * cannot set. Then the page's origin is this server's own. Non-browser clients can claim any
 * origin either way; the binding only stops other web sites from using a public key.
 */
export function requestOrigin(req: Request): string | undefined {
  const origin = req.headers.origin;
  if (origin && origin !== 'null') return origin;
  if (req.headers['sec-fetch-site'] === 'same-origin') {
    const host = req.get('host');
    if (host) return `${req.protocol}://${host}`;
  }
  return undefined;
}
