import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom, map } from 'rxjs';
import type {
  CalibrationJob,
  Dataset,
  DatasetWithSeries,
  FitRange,
  Scenario,
  ScenarioSaveBody,
  ScenarioSaved,
  ScenarioSummary,
  ScenarioVersion,
} from './scenario-types';
import type { VersionChange } from './version-fields';

/** The answer of `GET /scenarios/{id}/comparison`. */
export interface VersionComparison {
  readonly from: number;
  readonly to: number;
  readonly changes: readonly VersionChange[];
}

const BASE = '/api/v1';
const enc = encodeURIComponent;

/** Scenarios, their monitoring data and calibrations, for the signed-in member's tenant. */
@Injectable({ providedIn: 'root' })
export class ScenariosApi {
  private readonly http = inject(HttpClient);

  /** The tenant's scenarios, newest first. */
  list(): Promise<ScenarioSummary[]> {
    return firstValueFrom(
      this.http
        .get<{ scenarios: ScenarioSummary[] }>(`${BASE}/scenarios`)
        .pipe(map((r) => r.scenarios)),
    );
  }

  /** Creates a scenario; its first version is a draft. */
  create(body: ScenarioSaveBody): Promise<ScenarioSaved> {
    return firstValueFrom(this.http.post<ScenarioSaved>(`${BASE}/scenarios`, body));
  }

  /** A scenario with every version's metadata. */
  get(id: string): Promise<Scenario> {
    return firstValueFrom(this.http.get<Scenario>(`${BASE}/scenarios/${enc(id)}`));
  }

  /** One version with its content. */
  version(id: string, version: number): Promise<ScenarioVersion> {
    return firstValueFrom(
      this.http.get<ScenarioVersion>(`${BASE}/scenarios/${enc(id)}/versions/${version}`),
    );
  }

  /** Saves a new immutable draft. */
  save(id: string, body: ScenarioSaveBody): Promise<ScenarioSaved> {
    return firstValueFrom(
      this.http.post<ScenarioSaved>(`${BASE}/scenarios/${enc(id)}/versions`, body),
    );
  }

  /** The fields that differ between two versions, as JSON Pointers with both values. */
  compare(id: string, from: number, to: number): Promise<VersionComparison> {
    return firstValueFrom(
      this.http.get<VersionComparison>(`${BASE}/scenarios/${enc(id)}/comparison`, {
        params: { from, to },
      }),
    );
  }

  /** Publishes a draft behind the scenario's public id (the previous publication retires). */
  publish(id: string, version: number): Promise<{ publicId: string; version: ScenarioVersion }> {
    return firstValueFrom(
      this.http.post<{ publicId: string; version: ScenarioVersion }>(
        `${BASE}/scenarios/${enc(id)}/versions/${version}/publish`,
        {},
      ),
    );
  }

  /** Withdraws the published version. */
  retire(id: string, version: number): Promise<ScenarioVersion> {
    return firstValueFrom(
      this.http
        .post<{
          version: ScenarioVersion;
        }>(`${BASE}/scenarios/${enc(id)}/versions/${version}/retire`, {})
        .pipe(map((r) => r.version)),
    );
  }

  /** The scenario's dataset versions, oldest first. */
  datasets(id: string): Promise<Dataset[]> {
    return firstValueFrom(
      this.http
        .get<{ datasets: Dataset[] }>(`${BASE}/scenarios/${enc(id)}/datasets`)
        .pipe(map((r) => r.datasets)),
    );
  }

  /** One dataset version with its series. */
  dataset(id: string, version: number): Promise<DatasetWithSeries> {
    return firstValueFrom(
      this.http.get<DatasetWithSeries>(`${BASE}/scenarios/${enc(id)}/datasets/${version}`),
    );
  }

  /** Uploads a CSV as a new dataset version; a bad file rejects with per-cell errors. */
  upload(id: string, file: File, changeNote: string): Promise<Dataset> {
    const form = new FormData();
    form.append('file', file, file.name);
    if (changeNote) form.append('changeNote', changeNote);
    return firstValueFrom(this.http.post<Dataset>(`${BASE}/scenarios/${enc(id)}/datasets`, form));
  }

  /** Starts a calibration job. */
  calibrate(
    id: string,
    body: { dataset: number; scenarioVersion: number; parameters: FitRange[]; starts: number },
  ): Promise<CalibrationJob> {
    return firstValueFrom(
      this.http.post<CalibrationJob>(`${BASE}/scenarios/${enc(id)}/calibrations`, body),
    );
  }

  /** A calibration job as it stands. */
  calibration(jobId: string): Promise<CalibrationJob> {
    return firstValueFrom(this.http.get<CalibrationJob>(`${BASE}/calibrations/${enc(jobId)}`));
  }

  /** Saves a succeeded calibration's fitted model as a new draft version. */
  saveCalibration(jobId: string): Promise<ScenarioSaved> {
    return firstValueFrom(
      this.http.post<ScenarioSaved>(`${BASE}/calibrations/${enc(jobId)}/versions`, {}),
    );
  }
}
