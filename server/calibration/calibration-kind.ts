import {
  calibrationWork,
  validateCalibrationRequest,
  type CalibrationRequest,
  type ValidationResult,
} from '@tropline/core';
import type { JobKind } from '../jobs/job-kind';
import { workCost } from '../quotas/compute-costs';
import type { CalibrationPool } from './calibration-pool';

/** Which scenario version and dataset a calibration job fitted (kept with its result). */
export interface CalibrationSource {
  readonly scenarioId: string;
  readonly scenarioVersion: number;
  readonly dataset: number;
}

/** A calibration job's stored request: the source and the engine's request body. */
export interface CalibrationJobBody {
  readonly source: CalibrationSource;
  readonly calibration: unknown;
}

interface Checked {
  readonly source: CalibrationSource;
  readonly request: CalibrationRequest;
}

/**
 * The `calibrations` job: priced by the model time it may integrate (every start, every
 * iteration, one integration per fitted value plus one), run on the calibration pool.
 */
export function calibrationKind(pool: CalibrationPool): JobKind<Checked> {
  return {
    kind: 'calibrations',
    validate(body: unknown): ValidationResult<Checked> {
      const b = body as CalibrationJobBody;
      const checked = validateCalibrationRequest(b.calibration);
      return checked.ok
        ? { ok: true, value: { source: b.source, request: checked.value } }
        : checked;
    },
    cost: (c) => workCost(calibrationWork(c.request)),
    run: async (c, ctx) => ({ source: c.source, ...(await pool.run(c.request, ctx)) }),
  };
}
