import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { consoleInterceptor } from './console-interceptor';
import { ConsoleSession } from './console-session';
import type { SessionView } from './session-types';

const SESSION: SessionView = {
  user: { id: 'u1', email: 'tobias@larchmere.example', name: 'Tobias', operator: false },
  tenants: [
    { id: 't1', slug: 'larchmere', name: 'Larchmere', role: 'admin' },
    { id: 't2', slug: 'hobcairn', name: 'Hobcairn', role: 'viewer' },
  ],
  csrfToken: 'csrf-1',
  expiresAt: '2026-06-15T14:00:00Z',
};

describe('ConsoleSession with the console interceptor', () => {
  function setup() {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(withInterceptors([consoleInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    return {
      session: TestBed.inject(ConsoleSession),
      http: TestBed.inject(HttpClient),
      backend: TestBed.inject(HttpTestingController),
    };
  }

  it('reads a 401 from GET /session as signed out', async () => {
    const { session, backend } = setup();
    const loaded = session.ensureLoaded();
    backend
      .expectOne('/api/v1/session')
      .flush(
        { type: 'https://tropline.dev/problems/not-signed-in' },
        { status: 401, statusText: '' },
      );
    expect(await loaded).toEqual({ kind: 'signed-out', reason: undefined });
    expect(session.can('keys:read')).toBe(false);
  });

  it('follows the chosen tenant for role checks and headers, CSRF only on changes', async () => {
    const { session, http, backend } = setup();
    const loaded = session.ensureLoaded();
    backend.expectOne('/api/v1/session').flush(SESSION);
    await loaded;
    expect(session.can('keys:manage')).toBe(true);

    session.selectTenant('hobcairn');
    expect(session.role()).toBe('viewer');
    expect(session.can('keys:manage')).toBe(false);
    expect(localStorage.getItem('tropline.console.tenant')).toBe('hobcairn');

    void firstValueFrom(http.get('/api/v1/members'));
    const read = backend.expectOne('/api/v1/members');
    expect(read.request.headers.get('Tropline-Tenant')).toBe('hobcairn');
    expect(read.request.headers.has('X-CSRF-Token')).toBe(false);
    read.flush({ members: [] });

    void firstValueFrom(http.delete('/api/v1/invitations/i1'));
    const change = backend.expectOne('/api/v1/invitations/i1');
    expect(change.request.headers.get('X-CSRF-Token')).toBe('csrf-1');
    change.flush(null, { status: 204, statusText: '' });
  });

  it('notices when the server ends the session during work', async () => {
    const { session, http, backend } = setup();
    const loaded = session.ensureLoaded();
    backend.expectOne('/api/v1/session').flush(SESSION);
    await loaded;
    const failed = firstValueFrom(http.get('/api/v1/members')).catch(() => 'refused');
    backend.expectOne('/api/v1/members').flush({}, { status: 401, statusText: '' });
    expect(await failed).toBe('refused');
    expect(session.state()).toEqual({ kind: 'signed-out', reason: 'expired' });
  });
});
