import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';

/** `GET /api/v1/console/usage`: the tenant's month in detail. */
export interface ConsoleUsage {
  /** `YYYY-MM` (UTC). */
  readonly period: string;
  readonly used: number;
  readonly limit: number;
  readonly resetsAt: string;
  readonly perMinute: number;
  readonly browserPerMinute: number;
  readonly byDay: readonly { readonly day: string; readonly units: number }[];
  readonly byKey: readonly {
    readonly keyId: string;
    readonly name: string | null;
    readonly units: number;
  }[];
  readonly byEndpoint: readonly { readonly endpoint: string; readonly units: number }[];
  readonly alerts: readonly { readonly sentAt: string; readonly threshold: number }[];
}

/** The console's usage route, for every role of the tenant. */
@Injectable({ providedIn: 'root' })
export class UsageApi {
  private readonly http = inject(HttpClient);

  /** This month's usage of the current tenant. */
  month(): Promise<ConsoleUsage> {
    return firstValueFrom(this.http.get<ConsoleUsage>('/api/v1/console/usage'));
  }
}
