import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';

/** A tenant: the agency that owns keys, scenarios and a quota. */
export interface TenantRecord {
  readonly id: string;
  readonly slug: string;
  readonly name: string;
  readonly createdAt: string;
}

/** Storage of tenants. */
export class TenantsRepository {
  constructor(private readonly db: Knex) {}

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
}
