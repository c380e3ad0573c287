import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { TenantRole } from '@tropline/core';
import { firstValueFrom, map } from 'rxjs';
import type { Invitation, Member } from './member-rows';

/** `/members` and `/invitations` of the current tenant. */
@Injectable({ providedIn: 'root' })
export class MembersApi {
  private readonly http = inject(HttpClient);

  /** Everyone in the tenant. */
  members(): Promise<Member[]> {
    return firstValueFrom(
      this.http.get<{ members: Member[] }>('/api/v1/members').pipe(map((r) => r.members)),
    );
  }

  /** Gives a member another role. */
  changeRole(userId: string, role: TenantRole): Promise<Member> {
    return firstValueFrom(
      this.http.patch<Member>(`/api/v1/members/${encodeURIComponent(userId)}`, { role }),
    );
  }

  /** Removes a member from the tenant (their account stays). */
  remove(userId: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`/api/v1/members/${encodeURIComponent(userId)}`));
  }

  /** Pending invitations, newest first. */
  invitations(): Promise<Invitation[]> {
    return firstValueFrom(
      this.http
        .get<{ invitations: Invitation[] }>('/api/v1/invitations')
        .pipe(map((r) => r.invitations)),
    );
  }

  /** Invites someone; inviting the same address again sends a fresh link and voids the old. */
  invite(email: string, role: TenantRole): Promise<Invitation> {
    return firstValueFrom(this.http.post<Invitation>('/api/v1/invitations', { email, role }));
  }

  /** Withdraws a pending invitation: its link stops working. */
  cancel(id: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`/api/v1/invitations/${encodeURIComponent(id)}`));
  }
}
