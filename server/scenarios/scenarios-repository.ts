import type { Knex } from 'knex';
import type { ScenarioContent } from '@tropline/core';

/** Where a version is in its life: saved, shown to the public, or withdrawn. */
export type VersionStatus = 'draft' | 'published' | 'retired';

/** A scenario's row: identity, tenant, public id and which versions matter. */
export interface ScenarioRecord {
  readonly id: string;
  readonly tenantId: string;
  readonly publicId: string | null;
  readonly latestVersion: number;
  readonly publishedVersion: number | null;
  readonly createdBy: string;
  readonly createdAt: string;
}

/** One immutable version (its status and dates are the only things that change). */
export interface VersionRecord {
  readonly scenarioId: string;
  readonly version: number;
  readonly status: VersionStatus;
  readonly content: ScenarioContent;
  readonly changeNote: string;
  readonly author: string;
  readonly createdAt: string;
  readonly publishedAt: string | null;
  readonly retiredAt: string | null;
}

function scenario(r: Record<string, unknown>): ScenarioRecord {
  return {
    id: r.id as string,
    tenantId: r.tenant_id as string,
    publicId: (r.public_id as string | null) ?? null,
    latestVersion: Number(r.latest_version),
    publishedVersion: r.published_version === null ? null : Number(r.published_version),
    createdBy: r.created_by as string,
    createdAt: r.created_at as string,
  };
}

function version(r: Record<string, unknown>): VersionRecord {
  return {
    scenarioId: r.scenario_id as string,
    version: Number(r.version),
    status: r.status as VersionStatus,
    content: JSON.parse(r.content as string) as ScenarioContent,
    changeNote: r.change_note as string,
    author: r.author as string,
    createdAt: r.created_at as string,
    publishedAt: (r.published_at as string | null) ?? null,
    retiredAt: (r.retired_at as string | null) ?? null,
  };
}

/** Storage of scenarios and their versions; plain objects in and out. */
export class ScenariosRepository {
  constructor(readonly db: Knex | Knex.Transaction) {}

  /** Runs `work` in one transaction (a save is a version row plus the scenario's counter). */
  transaction<T>(work: (repo: ScenariosRepository) => Promise<T>): Promise<T> {
    return (this.db as Knex).transaction((trx) => work(new ScenariosRepository(trx)));
  }

  /** Inserts a new scenario with its first version. */
  async create(record: ScenarioRecord, first: VersionRecord): Promise<void> {
    await this.db('scenarios').insert({
      id: record.id,
      tenant_id: record.tenantId,
      public_id: record.publicId,
      latest_version: record.latestVersion,
      published_version: record.publishedVersion,
      created_by: record.createdBy,
      created_at: record.createdAt,
    });
    await this.insertVersion(first);
  }

  /** Appends a version; the primary key refuses a second writer of the same number. */
  async insertVersion(v: VersionRecord): Promise<void> {
    await this.db('scenario_versions').insert({
      scenario_id: v.scenarioId,
      version: v.version,
      status: v.status,
      content: JSON.stringify(v.content),
      change_note: v.changeNote,
      author: v.author,
      created_at: v.createdAt,
      published_at: v.publishedAt,
      retired_at: v.retiredAt,
    });
  }

  /** Moves the latest-version counter forward only from the value the caller read. */
  async advanceLatest(id: string, from: number, to: number): Promise<boolean> {
    const n = await this.db('scenarios')
      .where({ id, latest_version: from })
      .update({ latest_version: to });
    return n === 1;
  }

  /** A tenant's scenario by id. */
  async find(tenantId: string, id: string): Promise<ScenarioRecord | undefined> {
    const row = await this.db('scenarios').where({ tenant_id: tenantId, id }).first();
    return row ? scenario(row) : undefined;
  }

  /** A scenario by its public id, whatever the tenant (public ids are global). */
  async findByPublicId(publicId: string): Promise<ScenarioRecord | undefined> {
    const row = await this.db('scenarios').where({ public_id: publicId }).first();
    return row ? scenario(row) : undefined;
  }

  /** A tenant's scenarios, newest first. */
  async list(tenantId: string, limit: number): Promise<ScenarioRecord[]> {
    const rows = await this.db('scenarios')
      .where({ tenant_id: tenantId })
      .orderBy([{ column: 'created_at', order: 'desc' }, { column: 'id' }])
      .limit(limit);
    return rows.map(scenario);
  }

  /** One version. */
  async version(scenarioId: string, n: number): Promise<VersionRecord | undefined> {
    const row = await this.db('scenario_versions')
      .where({ scenario_id: scenarioId, version: n })
      .first();
    return row ? version(row) : undefined;
  }

  /** Every version of a scenario, oldest first. */
  async versions(scenarioId: string): Promise<VersionRecord[]> {
    const rows = await this.db('scenario_versions')
      .where({ scenario_id: scenarioId })
      .orderBy('version');
    return rows.map(version);
  }

  /** Latest versions of many scenarios (for the list), keyed by scenario id. */
  async latest(scenarios: readonly ScenarioRecord[]): Promise<Map<string, VersionRecord>> {
    if (!scenarios.length) return new Map();
    const rows = await this.db('scenario_versions').where((w) => {
      for (const s of scenarios) w.orWhere({ scenario_id: s.id, version: s.latestVersion });
    });
    return new Map(rows.map((r) => [r.scenario_id as string, version(r)]));
  }

  /** Changes a version's status, only from the status the caller checked. */
  async setStatus(
    scenarioId: string,
    n: number,
    from: VersionStatus,
    to: VersionStatus,
    at: string,
  ): Promise<boolean> {
    const dates = to === 'published' ? { published_at: at } : { retired_at: at };
    const changed = await this.db('scenario_versions')
      .where({ scenario_id: scenarioId, version: n, status: from })
      .update({ status: to, ...dates });
    return changed === 1;
  }

  /** Records which version the public sees (null: none) and the public id. */
  async setPublished(id: string, publishedVersion: number | null, publicId: string | null) {
    await this.db('scenarios')
      .where({ id })
      .update({ published_version: publishedVersion, public_id: publicId });
  }
}
