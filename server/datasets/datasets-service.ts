import { createHash, randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { ProblemError } from '../http/problem';
import type { Actor } from '../scenarios/scenario-access';
import type { ScenariosService } from '../scenarios/scenarios-service';
import { DatasetsRepository, type DatasetRecord } from './datasets-repository';
import { parseSurveyCsv } from './survey-csv';

/** A dataset version as the API shows it. */
export function datasetView(d: DatasetRecord) {
  return {
    version: d.version,
    filename: d.filename,
    rows: d.rows,
    sha256: d.sha256,
    changeNote: d.changeNote,
    author: d.author,
    createdAt: d.createdAt,
  };
}

/**
 * Monitoring data: a CSV upload becomes a dataset version of a scenario only when every row
 * is valid against the scenario's levels (latest version); the bytes are kept for download.
 */
export class DatasetsService {
  readonly repository: DatasetsRepository;

  constructor(
    db: Knex,
    private readonly scenarios: ScenariosService,
    private readonly now: () => number,
  ) {
    this.repository = new DatasetsRepository(db);
  }

  /** Parses, checks and stores an upload; throws 400 with every bad cell and stores nothing. */
  async upload(actor: Actor, scenarioId: string, file: Buffer, filename: string, note: string) {
    const s = await this.scenarios.require(actor, scenarioId);
    const latest = await this.scenarios.requireVersion(actor, scenarioId, s.latestVersion);
    const parsed = await parseSurveyCsv(file, latest.content.model);
    if (!parsed.ok) {
      const first = parsed.errors[0]!;
      throw new ProblemError(
        400,
        'invalid-csv',
        'The file is not valid survey data',
        `line ${first.line}, column ${first.column}: ${first.message}` +
          (parsed.errors.length > 1 ? ` (and ${parsed.errors.length - 1} more)` : '') +
          '. Nothing was stored.',
        { errors: parsed.errors },
      );
    }
    const stored = await this.repository.insert(
      {
        id: randomUUID(),
        tenantId: actor.tenantId,
        scenarioId,
        filename: filename.slice(0, 200),
        rows: parsed.series.times.length,
        sha256: createHash('sha256').update(file).digest('hex'),
        changeNote: note,
        author: actor.actor,
        createdAt: new Date(this.now()).toISOString(),
      },
      file,
      parsed.series,
    );
    return { ...datasetView(stored), columns: parsed.columns };
  }

  /** A scenario's dataset versions. */
  async list(actor: Actor, scenarioId: string) {
    await this.scenarios.require(actor, scenarioId);
    return (await this.repository.list(scenarioId)).map(datasetView);
  }

  /** One version with its parsed series, or 404. */
  async get(actor: Actor, scenarioId: string, version: number) {
    await this.scenarios.require(actor, scenarioId);
    const found = await this.repository.find(scenarioId, version);
    if (!found) {
      throw new ProblemError(404, 'not-found', 'No such dataset', `No dataset version ${version}.`);
    }
    return { ...datasetView(found.meta), series: found.series };
  }

  /** The upload's bytes and file name. */
  async original(actor: Actor, scenarioId: string, version: number) {
    const meta = await this.get(actor, scenarioId, version);
    return {
      filename: meta.filename,
      bytes: (await this.repository.original(scenarioId, version))!,
    };
  }
}
