import { Piscina } from 'piscina';
import { IntegrationError, type ProjectionRequest, type ProjectionResponse } from '@tropline/core';
import type { ProjectionFailure } from './projection-task';

const WORKER = new URL('./projection-worker.mjs', import.meta.url).href;

/**
 * Nice value of the projection threads: below the request thread (0), above the analysis jobs'
 * workers (10), since a client is waiting on a long projection and not on a job.
 */
export const PROJECTION_NICENESS = 5;

/**
 * Runs long projections on worker threads so the request thread stays free for other tenants'
 * short requests; the threads lower their own priority ({@link PROJECTION_NICENESS}), so the
 * request thread gets a core whenever it needs one. Threads start on first use (most apps, and
 * every test app, never need one).
 */
export class ProjectionPool {
  private pool: Piscina | undefined;

  constructor(
    private readonly threads: number,
    private readonly niceness = PROJECTION_NICENESS,
  ) {}

  /** Projects on a worker; rejects with the engine's IntegrationError when it stops. */
  async run(request: ProjectionRequest, wallTimeMs: number): Promise<ProjectionResponse> {
    this.pool ??= new Piscina({
      filename: WORKER,
      minThreads: 0,
      maxThreads: this.threads,
      idleTimeout: 30_000,
      // Beyond this the pool is saturated: refuse rather than queue without bound.
      maxQueue: 64,
      workerData: { niceness: this.niceness },
    });
    const out = (await this.pool.run({ request, wallTimeMs })) as
      ProjectionResponse | ProjectionFailure;
    if ('failed' in out) {
      throw new IntegrationError(
        out.code,
        out.message,
        out.time,
        out.diagnostics,
        out.levelIndex,
        out.levelId,
      );
    }
    return out;
  }

  /** Stops the threads. */
  async close(): Promise<void> {
    await this.pool?.close();
  }
}
