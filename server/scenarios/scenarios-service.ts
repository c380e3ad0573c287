import { randomBytes, randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import {
  diffDocuments,
  scenarioExport,
  validateScenarioContent,
  validateScenarioExport,
  type ScenarioContent,
} from '@tropline/core';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem } from '../http/problem';
import type { Actor } from './scenario-access';
import {
  ScenariosRepository,
  type ScenarioRecord,
  type VersionRecord,
} from './scenarios-repository';

/** A version as the API shows it (content included or not). */
export function versionView(v: VersionRecord, withContent = true) {
  return {
    version: v.version,
    status: v.status,
    changeNote: v.changeNote,
    author: v.author,
    createdAt: v.createdAt,
    publishedAt: v.publishedAt,
    retiredAt: v.retiredAt,
    ...(withContent ? { content: v.content } : { name: v.content.name }),
  };
}

/** A scenario as the API shows it. */
export function scenarioView(s: ScenarioRecord, latest: VersionRecord) {
  return {
    id: s.id,
    name: latest.content.name,
    publicId: s.publicId,
    latestVersion: s.latestVersion,
    publishedVersion: s.publishedVersion,
    createdAt: s.createdAt,
    createdBy: s.createdBy,
  };
}

function notFound(what: string): ProblemError {
  return new ProblemError(404, 'not-found', 'No such scenario', `${what} does not exist here.`);
}

function conflict(detail: string, pointer = ''): ProblemError {
  return new ProblemError(409, 'version-state', 'Not possible in this state', detail, {
    errors: [{ pointer, message: detail }],
  });
}

/** A change note, required on every save: why this version exists. */
function changeNote(body: unknown, fallback?: string): string {
  const note = (body as { changeNote?: unknown } | null)?.changeNote;
  if (note === undefined && fallback !== undefined) return fallback;
  if (typeof note !== 'string' || !note.trim() || note.length > 500) {
    throw validationProblem([
      { pointer: '/changeNote', message: 'changeNote is required: 1 to 500 characters' },
    ]);
  }
  return note.trim();
}

function content(body: unknown): ScenarioContent {
  const {
    changeNote: _note,
    baseVersion: _base,
    ...rest
  } = (body ?? {}) as Record<string, unknown>;
  const checked = validateScenarioContent(body && typeof body === 'object' ? rest : body);
  if (!checked.ok) throw validationProblem([...checked.errors]);
  return checked.value;
}

/** Public ids: a readable slug of the name plus random hex, unique across tenants. */
export function newPublicId(name: string): string {
  const slug = name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40);
  return `${slug || 'scenario'}-${randomBytes(4).toString('hex')}`;
}

/**
 * The rules of scenarios: every save a new immutable version with author, time and note;
 * draft → published → retired, one published version at a time behind a stable public id;
 * public ranges checked against the model; comparison, export and import.
 */
export class ScenariosService {
  readonly repository: ScenariosRepository;

  constructor(
    private readonly db: Knex,
    private readonly now: () => number,
  ) {
    this.repository = new ScenariosRepository(db);
  }

  private iso(): string {
    return new Date(this.now()).toISOString();
  }

  /** A tenant's scenario or 404 (also for another tenant's id). */
  async require(actor: Actor, id: string): Promise<ScenarioRecord> {
    const found = await this.repository.find(actor.tenantId, id);
    if (!found) throw notFound(`Scenario ${id}`);
    return found;
  }

  /** One version or 404. */
  async requireVersion(actor: Actor, id: string, n: number): Promise<VersionRecord> {
    await this.require(actor, id);
    const v = Number.isSafeInteger(n) ? await this.repository.version(id, n) : undefined;
    if (!v) throw notFound(`Version ${n} of scenario ${id}`);
    return v;
  }

  /** The tenant's scenarios with their latest names. */
  async list(actor: Actor, limit = 100) {
    const all = await this.repository.list(actor.tenantId, limit);
    const latest = await this.repository.latest(all);
    return all.map((s) => scenarioView(s, latest.get(s.id)!));
  }

  /** Creates a scenario whose first version is a draft. */
  async create(actor: Actor, body: unknown, note?: string) {
    const value = content(body);
    const at = this.iso();
    const record: ScenarioRecord = {
      id: randomUUID(),
      tenantId: actor.tenantId,
      publicId: null,
      latestVersion: 1,
      publishedVersion: null,
      createdBy: actor.actor,
      createdAt: at,
    };
    const first = this.draft(record.id, 1, value, changeNote(body, note ?? 'First version'), actor);
    await this.repository.create(record, first);
    return { scenario: scenarioView(record, first), version: versionView(first) };
  }

  private draft(id: string, n: number, c: ScenarioContent, note: string, actor: Actor) {
    return {
      scenarioId: id,
      version: n,
      status: 'draft' as const,
      content: c,
      changeNote: note,
      author: actor.actor,
      createdAt: this.iso(),
      publishedAt: null,
      retiredAt: null,
    };
  }

  /**
   * Saves a new version. With `baseVersion` the save is refused (409) when someone saved in
   * between, so two analysts never overwrite each other's intent unnoticed.
   */
  async save(actor: Actor, id: string, body: unknown, fixedContent?: ScenarioContent) {
    const value = content(fixedContent ?? body);
    const note = changeNote(body);
    const base = (body as { baseVersion?: unknown } | null)?.baseVersion;
    return this.repository.transaction(async (repo) => {
      const s = await repo.find(actor.tenantId, id);
      if (!s) throw notFound(`Scenario ${id}`);
      if (base !== undefined && base !== s.latestVersion) {
        throw conflict(
          `Version ${s.latestVersion} was saved after version ${String(base)}; compare and ` +
            'save again from the latest.',
          '/baseVersion',
        );
      }
      const v = this.draft(id, s.latestVersion + 1, value, note, actor);
      await repo.insertVersion(v);
      if (!(await repo.advanceLatest(id, s.latestVersion, v.version))) {
        throw conflict('Another save landed at the same moment; save again.');
      }
      return {
        scenario: scenarioView({ ...s, latestVersion: v.version }, v),
        version: versionView(v),
      };
    });
  }

  /** The scenario with every version's metadata. */
  async get(actor: Actor, id: string) {
    const s = await this.require(actor, id);
    const versions = await this.repository.versions(id);
    return {
      ...scenarioView(s, versions.at(-1)!),
      versions: versions.map((v) => versionView(v, false)),
    };
  }

  /**
   * Publishes a draft; the version published before it is retired in the same transaction, and
   * the one audit event of the publication names it (`detail.replaced`).
   */
  async publish(actor: Actor, id: string, n: number) {
    const v = await this.requireVersion(actor, id, n);
    if (v.status !== 'draft') {
      throw conflict(
        `Version ${n} is ${v.status}; only a draft can be published (save a new version first).`,
      );
    }
    const at = this.iso();
    return this.repository.transaction(async (repo) => {
      const s = (await repo.find(actor.tenantId, id))!;
      const replaced = s.publishedVersion;
      if (replaced !== null) await repo.setStatus(id, replaced, 'published', 'retired', at);
      if (!(await repo.setStatus(id, n, 'draft', 'published', at))) {
        throw conflict(`Version ${n} changed state meanwhile; reload it.`);
      }
      const publicId = s.publicId ?? newPublicId(v.content.name);
      await repo.setPublished(id, n, publicId);
      await new AuditRepository(repo.db).record({
        tenantId: actor.tenantId,
        actor: actor.actor,
        action: 'scenario.published',
        target: `scenario:${id}`,
        detail: replaced !== null ? { version: n, publicId, replaced } : { version: n, publicId },
        address: actor.address,
        at,
      });
      return { publicId, version: versionView((await repo.version(id, n))!) };
    });
  }

  /** Withdraws the published version: the public id then answers 404 until a new publication. */
  async retire(actor: Actor, id: string, n: number) {
    const v = await this.requireVersion(actor, id, n);
    if (v.status !== 'published') {
      throw conflict(`Version ${n} is ${v.status}; only the published version can be retired.`);
    }
    const at = this.iso();
    return this.repository.transaction(async (repo) => {
      const s = (await repo.find(actor.tenantId, id))!;
      if (!(await repo.setStatus(id, n, 'published', 'retired', at))) {
        throw conflict(`Version ${n} changed state meanwhile; reload it.`);
      }
      await repo.setPublished(id, null, s.publicId);
      await new AuditRepository(repo.db).record({
        tenantId: actor.tenantId,
        actor: actor.actor,
        action: 'scenario.retired',
        target: `scenario:${id}`,
        detail: { version: n },
        address: actor.address,
        at,
      });
      return { version: versionView((await repo.version(id, n))!) };
    });
  }

  /** Field-by-field differences between two versions' content. */
  async compare(actor: Actor, id: string, from: number, to: number) {
    const a = await this.requireVersion(actor, id, from);
    const b = await this.requireVersion(actor, id, to);
    return { from, to, changes: diffDocuments(a.content, b.content) };
  }

  /** One version as a Tropline scenario file. */
  async export(actor: Actor, id: string, n: number, tenantSlug?: string) {
    const v = await this.requireVersion(actor, id, n);
    return scenarioExport(
      v.content,
      {
        scenarioId: id,
        version: n,
        status: v.status,
        ...(tenantSlug ? { tenant: tenantSlug } : {}),
      },
      this.iso(),
    );
  }

  /** Imports a scenario file as a new scenario (its first version a draft). */
  async import(actor: Actor, body: unknown) {
    const checked = validateScenarioExport(body);
    if (!checked.ok) throw validationProblem([...checked.errors]);
    const src = checked.value.source;
    const note = src?.scenarioId
      ? `Imported from scenario ${src.scenarioId} version ${src.version ?? '?'}`
      : 'Imported from a scenario file';
    return this.create(actor, { ...checked.value.scenario, changeNote: note });
  }

  /** The published version behind a public id, for the owning tenant's keys and members. */
  async published(tenantId: string, publicId: string) {
    const s = await this.repository.findByPublicId(publicId);
    if (!s || s.tenantId !== tenantId || s.publishedVersion === null) {
      throw new ProblemError(
        404,
        'not-found',
        'No such published scenario',
        `Nothing is published as ${publicId} (it may have been retired).`,
      );
    }
    const v = (await this.repository.version(s.id, s.publishedVersion))!;
    return { scenario: s, version: v };
  }
}
