import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { RequestHandler } from 'express';

/** The embedding guide, rendered from docs/embedding.md (a test keeps the two in agreement). */
export const EMBEDDING_GUIDE = resolve(import.meta.dirname, '../../docs/embedding.html');

/**
 * The policy of the demo portal's plain HTML page: the strict one the embedding guide
 * promises works — scripts only from this origin, styles from this origin or carrying the
 * page's nonce, no inline style attributes, nothing fetched elsewhere.
 */
export function strictPolicy(nonce: string): string {
  return [
    "default-src 'self'",
    "script-src 'self'",
    `style-src 'self' 'nonce-${nonce}'`,
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "frame-ancestors 'self'",
    "form-action 'self'",
  ].join('; ');
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/**
 * Serves the plain page (built into the demo portal as plain/index.html) as an agency's CMS
 * would: a fresh nonce per response in the page and in its Content-Security-Policy, and the
 * site's browser key written into the elements' attributes.
 */
export function plainPageHandler(
  file: string,
  runtime: () => { apiUrl: string; apiKey: string } | undefined,
): RequestHandler {
  return (_req, res, next) => {
    if (!existsSync(file)) return next();
    const nonce = randomBytes(16).toString('base64');
    const config = runtime() ?? { apiUrl: '/api/v1', apiKey: '' };
    const values: Record<string, string> = { nonce, apiUrl: config.apiUrl, apiKey: config.apiKey };
    // Placeholders are written `{{ name }}` (formatters may add the spaces).
    const html = readFileSync(file, 'utf8').replace(
      /\{\{\s*(nonce|apiUrl|apiKey)\s*\}\}/g,
      (_m, name: string) => escapeHtml(values[name]!),
    );
    res.setHeader('Content-Security-Policy', strictPolicy(nonce));
    res.setHeader('Cache-Control', 'no-store');
    res.type('html').send(html);
  };
}

/** `/docs/embedding`: the guide as a page; a problem when the page is missing. */
export const embeddingGuideHandler: RequestHandler = (_req, res, next) => {
  if (!existsSync(EMBEDDING_GUIDE)) return next();
  res.setHeader('Cache-Control', 'no-cache');
  res.sendFile(EMBEDDING_GUIDE);
};
