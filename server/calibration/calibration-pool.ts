import { MessageChannel, type Worker } from 'node:worker_threads';
import { Piscina } from 'piscina';
import {
  ModelValidationError,
  type CalibrationRequest,
  type CalibrationResult,
} from '@tropline/core';
import type { JobContext } from '../jobs/job-kind';
import type { CalibrationFailure } from './calibration-task';

const WORKER = new URL('./calibration-worker.mjs', import.meta.url).href;

/**
 * Calibrations on worker threads: a fit integrates the chain hundreds of times, so it never
 * runs on the request thread. Threads start on first use; cancelling a job aborts its task.
 */
export class CalibrationPool {
  private pool: Piscina | undefined;

  constructor(private readonly threads: number) {}

  /** Runs one calibration, forwarding its progress to the job. */
  async run(request: CalibrationRequest, ctx: JobContext): Promise<CalibrationResult> {
    this.pool ??= new Piscina({
      filename: WORKER,
      minThreads: 0,
      maxThreads: this.threads,
      idleTimeout: 30_000,
      maxQueue: 32,
    });
    const { port1, port2 } = new MessageChannel();
    port1.on('message', (fraction: number) => ctx.onProgress(fraction));
    try {
      const out = (await this.pool.run(
        { request, port: port2 },
        { transferList: [port2], signal: ctx.signal },
      )) as CalibrationResult | CalibrationFailure;
      if ('failed' in out) throw new ModelValidationError(out.errors);
      return out;
    } finally {
      port1.close();
    }
  }

  /** The worker threads alive now (none before first use, or once an aborted task's ended). */
  get workers(): readonly Worker[] {
    return this.pool?.threads ?? [];
  }

  /** Stops the threads. */
  async close(): Promise<void> {
    await this.pool?.close({ force: true });
  }
}
