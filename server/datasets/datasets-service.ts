import { createHash, randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import type { ChainModel, ValidationIssue } from '@tropline/core';
import { ProblemError, validationProblem } from '../http/problem';
import type { Actor } from '../scenarios/scenario-access';
import type { ScenariosService } from '../scenarios/scenarios-service';
import { DatasetsRepository, type DatasetLevel, type DatasetRecord } from './datasets-repository';
import { parseSurveyCsv, type SurveySeries } from './survey-csv';

/** A dataset version as the API shows it. */
export function datasetView(d: DatasetRecord, levels: DatasetLevel[]) {
  return {
    version: d.version,
    scenarioVersion: d.scenarioVersion,
    levels,
    filename: d.filename,
    rows: d.rows,
    sha256: d.sha256,
    changeNote: d.changeNote,
    author: d.author,
    createdAt: d.createdAt,
  };
}

/** The level columns of a series with their units in `model`. */
function levelsOf(series: SurveySeries, model: ChainModel): DatasetLevel[] {
  return Object.keys(series.levels).map((id) => ({
    id,
    unit: model.levels.find((l) => l.id === id)?.unit ?? '',
  }));
}

/**
 * Why a dataset cannot be fitted by a model: a level column the model lacks, or one whose unit
 * it changed (the numbers would be read in another unit). Pointers name `/dataset`.
 */
export function datasetMismatch(
  dataset: { version: number; scenarioVersion: number; levels: readonly DatasetLevel[] },
  model: ChainModel,
  scenarioVersion: number,
): ValidationIssue[] {
  const out: ValidationIssue[] = [];
  for (const level of dataset.levels) {
    const there = model.levels.find((l) => l.id === level.id);
    const why = !there
      ? `has no level "${level.id}"`
      : there.unit !== level.unit
        ? `measures "${level.id}" in ${there.unit}, not ${level.unit}`
        : undefined;
    if (why) {
      out.push({
        pointer: '/dataset',
        message:
          `dataset version ${dataset.version} was made for scenario version ` +
          `${dataset.scenarioVersion}; scenario version ${scenarioVersion} ${why}. Upload the ` +
          `data for version ${scenarioVersion}, or calibrate version ${dataset.scenarioVersion}`,
      });
    }
  }
  return out;
}

/**
 * Monitoring data: a CSV upload becomes a dataset version of a scenario only when every row
 * is valid against the level ids of the scenario version it is made for (the latest unless the
 * upload names one), which is recorded with the ids' units; the bytes are kept for download.
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
  async upload(
    actor: Actor,
    scenarioId: string,
    upload: { file: Buffer; filename: string; note: string; scenarioVersion?: number },
  ) {
    const s = await this.scenarios.require(actor, scenarioId);
    const n = upload.scenarioVersion ?? s.latestVersion;
    const target = await this.scenarios.repository.version(scenarioId, n);
    if (!target) {
      throw validationProblem([
        {
          pointer: '/scenarioVersion',
          message: `the scenario has no version ${n}; its latest is ${s.latestVersion}`,
        },
      ]);
    }
    const { file } = upload;
    const parsed = await parseSurveyCsv(file, target.content.model);
    if (!parsed.ok) {
      const first = parsed.errors[0]!;
      throw new ProblemError(
        400,
        'invalid-csv',
        'The file is not valid survey data',
        `line ${first.line}, column ${first.column}: ${first.message}` +
          (parsed.errors.length > 1 ? ` (and ${parsed.errors.length - 1} more)` : '') +
          `, checked against scenario version ${n}. Nothing was stored.`,
        { errors: parsed.errors },
      );
    }
    const levels = levelsOf(parsed.series, target.content.model);
    const stored = await this.repository.insert(
      {
        id: randomUUID(),
        tenantId: actor.tenantId,
        scenarioId,
        scenarioVersion: n,
        levels,
        filename: upload.filename.slice(0, 200),
        rows: parsed.series.times.length,
        sha256: createHash('sha256').update(file).digest('hex'),
        changeNote: upload.note,
        author: actor.actor,
        createdAt: new Date(this.now()).toISOString(),
      },
      file,
      parsed.series,
    );
    return { ...datasetView(stored, levels), columns: parsed.columns };
  }

  /** A scenario's dataset versions. */
  async list(actor: Actor, scenarioId: string) {
    await this.scenarios.require(actor, scenarioId);
    const all = await this.repository.list(scenarioId);
    return Promise.all(all.map(async (d) => datasetView(d, await this.levels(d))));
  }

  /** One version with its parsed series, or 404. */
  async get(actor: Actor, scenarioId: string, version: number) {
    await this.scenarios.require(actor, scenarioId);
    const found = await this.repository.find(scenarioId, version);
    if (!found) {
      throw new ProblemError(404, 'not-found', 'No such dataset', `No dataset version ${version}.`);
    }
    return { ...datasetView(found.meta, await this.levels(found.meta)), series: found.series };
  }

  /** The upload's bytes and file name. */
  async original(actor: Actor, scenarioId: string, version: number) {
    const meta = await this.get(actor, scenarioId, version);
    return {
      filename: meta.filename,
      bytes: (await this.repository.original(scenarioId, version))!,
    };
  }

  /** A dataset's level columns and units: recorded, or (older uploads) read from its version. */
  private async levels(d: DatasetRecord): Promise<DatasetLevel[]> {
    if (d.levels) return d.levels;
    const found = await this.repository.find(d.scenarioId, d.version);
    const v = await this.scenarios.repository.version(d.scenarioId, d.scenarioVersion);
    return found && v ? levelsOf(found.series, v.content.model) : [];
  }
}
