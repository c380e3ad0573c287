import type { Knex } from 'knex';
import type { SurveySeries } from './survey-csv';

/** One level column of a dataset: its id and unit as the dataset's scenario version had them. */
export interface DatasetLevel {
  readonly id: string;
  readonly unit: string;
}

/** One stored dataset version: the upload as sent and its parsed series. */
export interface DatasetRecord {
  readonly id: string;
  readonly tenantId: string;
  readonly scenarioId: string;
  readonly version: number;
  /** The scenario version the file was made for (its header checked against). */
  readonly scenarioVersion: number;
  /** Its level columns with their units; null for uploads stored before this was recorded. */
  readonly levels: DatasetLevel[] | null;
  readonly filename: string;
  readonly rows: number;
  readonly sha256: string;
  readonly changeNote: string;
  readonly author: string;
  readonly createdAt: string;
}

function record(r: Record<string, unknown>): DatasetRecord {
  return {
    id: r.id as string,
    tenantId: r.tenant_id as string,
    scenarioId: r.scenario_id as string,
    version: Number(r.version),
    scenarioVersion: Number(r.scenario_version ?? 1),
    levels: typeof r.levels === 'string' ? (JSON.parse(r.levels) as DatasetLevel[]) : null,
    filename: r.filename as string,
    rows: Number(r.rows),
    sha256: r.sha256 as string,
    changeNote: r.change_note as string,
    author: r.author as string,
    createdAt: r.created_at as string,
  };
}

const META = [
  'id',
  'tenant_id',
  'scenario_id',
  'version',
  'scenario_version',
  'levels',
  'filename',
  'rows',
  'sha256',
  'change_note',
  'author',
  'created_at',
];

/** Storage of dataset versions; plain objects in and out. */
export class DatasetsRepository {
  constructor(private readonly db: Knex) {}

  /** Stores a version numbered after the scenario's last one (one transaction). */
  async insert(
    meta: Omit<DatasetRecord, 'version'>,
    original: Buffer,
    series: SurveySeries,
  ): Promise<DatasetRecord> {
    return this.db.transaction(async (trx) => {
      const last = await trx('dataset_versions')
        .where({ scenario_id: meta.scenarioId })
        .max<{ v: number | null }>({ v: 'version' })
        .first();
      const version = Number(last?.v ?? 0) + 1;
      await trx('dataset_versions').insert({
        id: meta.id,
        tenant_id: meta.tenantId,
        scenario_id: meta.scenarioId,
        version,
        scenario_version: meta.scenarioVersion,
        levels: JSON.stringify(meta.levels),
        filename: meta.filename,
        original,
        series: JSON.stringify(series),
        rows: meta.rows,
        sha256: meta.sha256,
        change_note: meta.changeNote,
        author: meta.author,
        created_at: meta.createdAt,
      });
      return { ...meta, version };
    });
  }

  /** A scenario's dataset versions, oldest first. */
  async list(scenarioId: string): Promise<DatasetRecord[]> {
    const rows = await this.db('dataset_versions')
      .where({ scenario_id: scenarioId })
      .select(META)
      .orderBy('version');
    return rows.map(record);
  }

  /** One version's metadata and series. */
  async find(
    scenarioId: string,
    version: number,
  ): Promise<{ meta: DatasetRecord; series: SurveySeries } | undefined> {
    const row = await this.db('dataset_versions')
      .where({ scenario_id: scenarioId, version })
      .select([...META, 'series'])
      .first();
    return row ? { meta: record(row), series: JSON.parse(row.series) as SurveySeries } : undefined;
  }

  /** The upload exactly as it was sent. */
  async original(scenarioId: string, version: number): Promise<Buffer | undefined> {
    const row = await this.db('dataset_versions')
      .where({ scenario_id: scenarioId, version })
      .select('original')
      .first();
    return row ? Buffer.from(row.original as Uint8Array) : undefined;
  }
}
