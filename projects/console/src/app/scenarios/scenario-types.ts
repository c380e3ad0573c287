import type { ChainModel } from '@tropline/core';

/** One parameter the public may change, within its range. */
export interface PublicParameter {
  readonly pointer: string;
  readonly min: number;
  readonly max: number;
  readonly step?: number;
  readonly label?: string;
}

/** What one scenario version holds. */
export interface ScenarioContent {
  readonly name: string;
  readonly description?: string;
  readonly location?: string;
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
  readonly horizon: number;
  readonly publicParameters?: readonly PublicParameter[];
}

/** A save: content plus why this version exists. */
export interface ScenarioSaveBody extends ScenarioContent {
  readonly changeNote: string;
  readonly baseVersion?: number;
}

/** A scenario in lists. */
export interface ScenarioSummary {
  readonly id: string;
  readonly name: string;
  readonly publicId: string | null;
  readonly latestVersion: number;
  readonly publishedVersion: number | null;
  readonly createdAt: string;
  readonly createdBy: string;
}

/** One immutable version; `content` only when a single version is read. */
export interface ScenarioVersion {
  readonly version: number;
  readonly status: 'draft' | 'published' | 'retired';
  readonly changeNote: string;
  readonly author: string;
  readonly createdAt: string;
  readonly publishedAt: string | null;
  readonly retiredAt: string | null;
  readonly content?: ScenarioContent;
  readonly name?: string;
}

/** A scenario with every version's metadata. */
export interface Scenario extends ScenarioSummary {
  readonly versions: readonly ScenarioVersion[];
}

/** The answer to a save. */
export interface ScenarioSaved {
  readonly scenario: ScenarioSummary;
  readonly version: ScenarioVersion;
}

/** One uploaded monitoring dataset version. */
export interface Dataset {
  readonly version: number;
  /** The scenario version the file was made for (its header checked against). */
  readonly scenarioVersion: number;
  /** Its level columns with their units in that version. */
  readonly levels: readonly { readonly id: string; readonly unit: string }[];
  readonly filename: string;
  readonly rows: number;
  readonly sha256: string;
  readonly changeNote: string;
  readonly author: string;
  readonly createdAt: string;
  readonly columns?: readonly string[];
}

/** A dataset's parsed series: values per level id, null where a survey missed. */
export interface DatasetWithSeries extends Dataset {
  readonly series: {
    readonly times: readonly number[];
    readonly levels: Readonly<Record<string, readonly (number | null)[]>>;
  };
}

/** One estimate of a finished calibration. */
export interface CalibrationEstimate {
  readonly kind: 'parameter' | 'initial';
  readonly pointer: string;
  readonly value: number;
  readonly standardError: number | null;
  readonly min: number;
  readonly max: number;
  readonly atBound: boolean;
}

/** A calibration job as `GET /calibrations/{id}` answers. */
export interface CalibrationJob {
  readonly id: string;
  readonly status: 'queued' | 'running' | 'succeeded' | 'failed';
  readonly progress: number;
  readonly units: number;
  readonly createdAt: string;
  readonly result?: {
    readonly estimates: readonly CalibrationEstimate[];
    readonly fit: {
      readonly points: number;
      readonly rmse: number;
      readonly rSquaredLog: number;
      readonly weightedRms?: number;
    };
    readonly chaotic: boolean;
    readonly suggestedSegmentLength?: number;
    /** Segmented fits: each segment's span. */
    readonly segments?: readonly { readonly start: number; readonly end: number }[];
    readonly warnings: readonly string[];
  };
  readonly error?: { readonly type?: string; readonly title?: string; readonly detail?: string };
}

/** A parameter range to fit. */
export interface FitRange {
  readonly pointer: string;
  readonly min: number;
  readonly max: number;
}
