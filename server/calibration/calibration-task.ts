import type { MessagePort } from 'node:worker_threads';
import {
  calibrateChain,
  ModelValidationError,
  type CalibrationRequest,
  type CalibrationResult,
  type ValidationIssue,
} from '@tropline/core';

/** What the pool sends: the validated request and a port for progress reports. */
export interface CalibrationTask {
  readonly request: CalibrationRequest;
  readonly port: MessagePort;
}

/** What comes back when the request turns out unusable while running (a bad segment cut). */
export interface CalibrationFailure {
  readonly failed: true;
  readonly errors: ValidationIssue[];
}

/** Runs one calibration on a worker thread, posting progress (0..1) as it goes. */
export default function runCalibration(
  task: CalibrationTask,
): CalibrationResult | CalibrationFailure {
  try {
    return calibrateChain(task.request, { onProgress: (f) => task.port.postMessage(f) });
  } catch (err) {
    if (err instanceof ModelValidationError) return { failed: true, errors: [...err.errors] };
    throw err;
  } finally {
    task.port.close();
  }
}
