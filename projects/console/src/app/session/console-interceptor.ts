import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { tap } from 'rxjs';
import { consoleHeaders } from './console-headers';
import { ConsoleSession } from './console-session';

/**
 * Adds the tenant and CSRF headers to the console's API calls, and notices when the server
 * says the session has ended so the shell can offer to sign in again.
 */
export const consoleInterceptor: HttpInterceptorFn = (req, next) => {
  const session = inject(ConsoleSession);
  const add = consoleHeaders(req.method, req.url, (name) => req.headers.has(name), {
    tenantSlug: session.tenant()?.slug,
    csrfToken: session.csrfToken(),
  });
  const sent = Object.keys(add).length ? req.clone({ setHeaders: add }) : req;
  return next(sent).pipe(
    tap({
      error: (err: unknown) => {
        const ownSession = req.url === '/api/v1/session';
        if (err instanceof HttpErrorResponse && err.status === 401 && !ownSession) {
          session.ended();
        }
      },
    }),
  );
};
