import { HttpClient } from '@angular/common/http';
import { inject, Injectable, signal } from '@angular/core';
import { catchError, map, of } from 'rxjs';

/**
 * Whether this server runs the development mail catcher (never in production), asked once so
 * the navigation and the sign-in page can offer the mailbox only where it exists.
 */
@Injectable({ providedIn: 'root' })
export class DevMailboxProbe {
  private readonly http = inject(HttpClient);
  private asked = false;
  private readonly served = signal(false);

  /** Whether `/api/v1/dev/mailbox` answers here. */
  available(): boolean {
    if (!this.asked) {
      this.asked = true;
      this.http
        .head('/api/v1/dev/mailbox', { observe: 'response' })
        .pipe(
          map((res) => res.ok),
          catchError(() => of(false)),
        )
        .subscribe((ok) => this.served.set(ok));
    }
    return this.served();
  }
}
