import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { can, type Action } from '@tropline/core';
import { firstValueFrom } from 'rxjs';
import { chooseTenant, type SessionState, type SessionView } from './session-types';

/** Where the chosen tenant is remembered between visits (a slug: nothing secret). */
const TENANT_KEY = 'tropline.console.tenant';

function remembered(): string | null {
  try {
    return globalThis.localStorage?.getItem(TENANT_KEY) ?? null;
  } catch {
    return null;
  }
}

/**
 * The signed-in person, the tenant they act in and what their role there allows. The console
 * hides what a role may not do; the server decides, whatever the console shows.
 */
@Injectable({ providedIn: 'root' })
export class ConsoleSession {
  private readonly http = inject(HttpClient);
  private readonly chosenSlug = signal<string | null>(remembered());
  private loading: Promise<SessionState> | undefined;

  /** What the console knows about the session. */
  readonly state = signal<SessionState>({ kind: 'unknown' });

  /** The session, when someone is signed in. */
  readonly session = computed(() => {
    const s = this.state();
    return s.kind === 'signed-in' ? s.session : undefined;
  });

  /** The tenant the console acts in. */
  readonly tenant = computed(() => {
    const s = this.session();
    return s ? chooseTenant(s.tenants, this.chosenSlug()) : undefined;
  });

  /** The signed-in person's role in the current tenant. */
  readonly role = computed(() => this.tenant()?.role);

  /** The CSRF token every cookie-authenticated change must carry. */
  readonly csrfToken = computed(() => this.session()?.csrfToken);

  /** Whether the current role may do `action` (by the shared role matrix). */
  can(action: Action): boolean {
    return can(this.role(), action);
  }

  /** Switches the tenant the console acts in. */
  selectTenant(slug: string): void {
    this.chosenSlug.set(slug);
    try {
      globalThis.localStorage?.setItem(TENANT_KEY, slug);
    } catch {
      // Private windows may refuse storage; the choice then lasts for this page only.
    }
  }

  /** Asks the server who is signed in, once; later calls share the answer. */
  ensureLoaded(): Promise<SessionState> {
    if (this.state().kind !== 'unknown') return Promise.resolve(this.state());
    this.loading ??= this.refresh().finally(() => (this.loading = undefined));
    return this.loading;
  }

  /** Re-reads the session from the server (a 401 means signed out). */
  async refresh(): Promise<SessionState> {
    try {
      const session = await firstValueFrom(this.http.get<SessionView>('/api/v1/session'));
      return this.set({ kind: 'signed-in', session });
    } catch (err) {
      if (err instanceof HttpErrorResponse && err.status === 401) {
        const expired = (err.error as { type?: string } | null)?.type?.endsWith('session-expired');
        return this.set({ kind: 'signed-out', reason: expired ? 'expired' : undefined });
      }
      throw err;
    }
  }

  /** Signs in; a wrong password rejects with the server's problem. */
  async signIn(email: string, password: string): Promise<SessionView> {
    const session = await firstValueFrom(
      this.http.post<SessionView>('/api/v1/session', { email, password }),
    );
    this.set({ kind: 'signed-in', session });
    return session;
  }

  /** Signs out of this browser. */
  async signOut(): Promise<void> {
    await firstValueFrom(this.http.delete('/api/v1/session'));
    this.set({ kind: 'signed-out', reason: 'signed-out' });
  }

  /** Ends every session of this person, on every device. */
  async signOutEverywhere(): Promise<void> {
    await firstValueFrom(this.http.post('/api/v1/session/sign-out-everywhere', {}));
    this.set({ kind: 'signed-out', reason: 'signed-out' });
  }

  /** Marks the session as ended by the server (a 401 on some request). */
  ended(): void {
    if (this.state().kind === 'signed-in') this.set({ kind: 'signed-out', reason: 'expired' });
  }

  private set(state: SessionState): SessionState {
    this.state.set(state);
    return state;
  }
}
