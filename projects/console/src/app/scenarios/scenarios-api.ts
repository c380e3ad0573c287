import { HttpClient, HttpEventType } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { parseEventStream } from '@tropline/widgets';
import {
  concatMap,
  defer,
  EMPTY,
  firstValueFrom,
  from,
  map,
  repeat,
  takeWhile,
  timer,
  type Observable,
} from 'rxjs';
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

  /**
   * Uploads a CSV as a new dataset version made for `scenarioVersion` (default the latest); a
   * bad file rejects with per-cell errors.
   */
  upload(id: string, file: File, changeNote: string, scenarioVersion?: number): Promise<Dataset> {
    const form = new FormData();
    form.append('file', file, file.name);
    if (changeNote) form.append('changeNote', changeNote);
    if (scenarioVersion !== undefined) form.append('scenarioVersion', String(scenarioVersion));
    return firstValueFrom(this.http.post<Dataset>(`${BASE}/scenarios/${enc(id)}/datasets`, form));
  }

  /** Starts a calibration job. */
  calibrate(
    id: string,
    body: {
      dataset: number;
      scenarioVersion: number;
      parameters: FitRange[];
      starts: number;
      segmentLength?: number;
    },
  ): Promise<CalibrationJob> {
    return firstValueFrom(
      this.http.post<CalibrationJob>(`${BASE}/scenarios/${enc(id)}/calibrations`, body),
    );
  }

  /** A calibration job as it stands. */
  calibration(jobId: string): Promise<CalibrationJob> {
    return firstValueFrom(this.http.get<CalibrationJob>(`${BASE}/calibrations/${enc(jobId)}`));
  }

  /**
   * A calibration's updates as the server streams them (`GET /calibrations/{id}/events`: one
   * `job` event per change, the last when it finishes), until it finishes. The stream runs on
   * the member's session, so the interceptor's tenant header goes with it (an EventSource could
   * not send it); one the server closes early (its 10-minute limit) is opened again.
   */
  calibrationEvents(jobId: string): Observable<CalibrationJob> {
    const url = `${BASE}/calibrations/${enc(jobId)}/events`;
    const once = defer(() => {
      let text = '';
      let consumed = 0;
      return this.http
        .get(url, { observe: 'events', reportProgress: true, responseType: 'text' })
        .pipe(
          concatMap((e) => {
            if (e.type === HttpEventType.DownloadProgress) text = e.partialText ?? text;
            else if (e.type === HttpEventType.Response) text = e.body ?? text;
            else return EMPTY;
            const parsed = parseEventStream(text.slice(consumed));
            consumed += parsed.consumed;
            const jobs = parsed.events.filter((ev) => ev.event === 'job');
            return from(jobs.map((ev) => JSON.parse(ev.data) as CalibrationJob));
          }),
        );
    });
    const done = (j: CalibrationJob) => j.status === 'succeeded' || j.status === 'failed';
    return once.pipe(
      repeat({ delay: () => timer(0) }),
      takeWhile((j) => !done(j), true),
    );
  }

  /** Cancels a queued or running calibration; the job as it then stands. */
  cancelCalibration(jobId: string): Promise<CalibrationJob> {
    return firstValueFrom(this.http.delete<CalibrationJob>(`${BASE}/calibrations/${enc(jobId)}`));
  }

  /** Saves a succeeded calibration's fitted model as a new draft version. */
  saveCalibration(jobId: string): Promise<ScenarioSaved> {
    return firstValueFrom(
      this.http.post<ScenarioSaved>(`${BASE}/calibrations/${enc(jobId)}/versions`, {}),
    );
  }
}
