import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';

/** `GET /api/v1/tenant`: the tenant as its owners manage it. */
export interface TenantSettings {
  readonly slug: string;
  readonly name: string;
  /** Also mailed the quota alerts; null when unset. */
  readonly contactEmail: string | null;
  readonly createdAt: string;
}

/** What `PATCH /api/v1/tenant` takes; a field left out stays as it is. */
export interface TenantChange {
  readonly name?: string;
  readonly contactEmail?: string | null;
}

/** One plan on offer, as `GET /api/v1/tenant/plan` lists it. */
export interface PlanOffer {
  readonly id: string;
  readonly name: string;
  readonly description: string;
  readonly monthlyUnits: number;
  readonly perMinute: number;
  readonly browserPerMinute: number;
  readonly current: boolean;
  /** False when this month's units already exceed its allowance. */
  readonly fitsThisMonth: boolean;
}

/** `GET /api/v1/tenant/plan`. */
export interface TenantPlan {
  readonly current: {
    /** Null when the platform operator set the numbers directly. */
    readonly offer: { readonly id: string; readonly name: string } | null;
    readonly monthlyUnits: number;
    readonly perMinute: number;
    readonly browserPerMinute: number;
    readonly since: string | null;
  };
  readonly usage: { readonly period: string; readonly used: number; readonly resetsAt: string };
  readonly offers: readonly PlanOffer[];
}

/** The owner's routes for their own tenant (`tenant:manage`, `plan:manage`). */
@Injectable({ providedIn: 'root' })
export class TenantApi {
  private readonly http = inject(HttpClient);

  /** The current tenant's name and contact address. */
  settings(): Promise<TenantSettings> {
    return firstValueFrom(this.http.get<TenantSettings>('/api/v1/tenant'));
  }

  /** Renames the tenant and/or sets its contact address. */
  update(change: TenantChange): Promise<TenantSettings> {
    return firstValueFrom(this.http.patch<TenantSettings>('/api/v1/tenant', change));
  }

  /** The plan, this month's units and the plans on offer. */
  plan(): Promise<TenantPlan> {
    return firstValueFrom(this.http.get<TenantPlan>('/api/v1/tenant/plan'));
  }

  /** Moves the tenant to an offer; effective with the next request. */
  choose(offer: string): Promise<TenantPlan> {
    return firstValueFrom(this.http.put<TenantPlan>('/api/v1/tenant/plan', { offer }));
  }
}
