import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom, map } from 'rxjs';
import type { IssueKeyBody } from './key-form';
import type { IssuedKey, KeyInfo } from './key-rows';

/** The console's key routes (`/api/v1/console/keys`), for signed-in admins. */
@Injectable({ providedIn: 'root' })
export class KeysApi {
  private readonly http = inject(HttpClient);
  private readonly base = '/api/v1/console/keys';

  /** The tenant's keys, with when each was last used. */
  list(): Promise<KeyInfo[]> {
    return firstValueFrom(this.http.get<{ keys: KeyInfo[] }>(this.base).pipe(map((r) => r.keys)));
  }

  /** Issues a key; the answer holds its plaintext, once. */
  issue(body: IssueKeyBody): Promise<IssuedKey> {
    return firstValueFrom(this.http.post<IssuedKey>(this.base, body));
  }

  /** Issues a successor; the old key keeps working for `overlapSeconds`. */
  rotate(id: string, overlapSeconds: number): Promise<IssuedKey> {
    return firstValueFrom(
      this.http.post<IssuedKey>(`${this.base}/${encodeURIComponent(id)}/rotate`, {
        overlapSeconds,
      }),
    );
  }

  /** Revokes a key: the very next request with it is refused. */
  revoke(id: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`${this.base}/${encodeURIComponent(id)}`));
  }
}
