import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';

/** A tenant: the agency that owns keys, scenarios and a quota. */
export interface TenantRecord {
  readonly id: string;
  readonly slug: string;
  readonly name: string;
  readonly createdAt: string;
}

/** A tenant as its owners manage it. */
export interface TenantSettings extends TenantRecord {
  /** Also told about quota thresholds, besides the owners and admins; null when unset. */
  readonly contactEmail: string | null;
}

/** What an owner may change about the tenant; a field left out stays as it is. */
export interface TenantChange {
  readonly name?: string;
  readonly contactEmail?: string | null;
}

interface TenantRow {
  id: string;
  slug: string;
  name: string;
  created_at: string;
  contact_email?: string | null;
}

function toSettings(row: TenantRow): TenantSettings {
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    createdAt: row.created_at,
    contactEmail: row.contact_email ?? null,
  };
}

/** Storage of tenants. */
export class TenantsRepository {
  constructor(private readonly db: Knex | Knex.Transaction) {}

  /** Inserts a tenant and returns it. */
  async insert(slug: string, name: string, at: string): Promise<TenantRecord> {
    const tenant = { id: randomUUID(), slug, name, createdAt: at };
    await this.db('tenants').insert({ id: tenant.id, slug, name, created_at: at });
    return tenant;
  }

  /** The tenant with this slug, or undefined. */
  async findBySlug(slug: string): Promise<TenantRecord | undefined> {
    const row = await this.db('tenants').where({ slug }).first();
    return row
      ? { id: row.id, slug: row.slug, name: row.name, createdAt: row.created_at }
      : undefined;
  }

  /** The tenant with this id and its settings, or undefined. */
  async settings(id: string): Promise<TenantSettings | undefined> {
    const row = await this.db('tenants').where({ id }).first();
    return row ? toSettings(row as TenantRow) : undefined;
  }

  /** Writes the fields of `change` that are present. */
  async update(id: string, change: TenantChange): Promise<void> {
    const row: Record<string, unknown> = {};
    if (change.name !== undefined) row.name = change.name;
    if (change.contactEmail !== undefined) row.contact_email = change.contactEmail;
    if (Object.keys(row).length) await this.db('tenants').where({ id }).update(row);
  }
}
