import { Piscina } from 'piscina';
import { IntegrationError, type ProjectionRequest, type ProjectionResponse } from '@tropline/core';
import type { ProjectionFailure } from './projection-task';

const WORKER = new URL('./projection-worker.mjs', import.meta.url).href;

/**
 * Runs long projections on worker threads so the request thread stays free for other tenants'
 * short requests. Threads start on first use (most apps, and every test app, never need one).
 */
export class ProjectionPool {
  private pool: Piscina | undefined;

  constructor(private readonly threads: number) {}

  /** Projects on a worker; rejects with the engine's IntegrationError when it stops. */
  async run(request: ProjectionRequest, wallTimeMs: number): Promise<ProjectionResponse> {
    this.pool ??= new Piscina({
      filename: WORKER,
      minThreads: 0,
      maxThreads: this.threads,
      idleTimeout: 30_000,
      // Beyond this the pool is saturated: refuse rather than queue without bound.
      maxQueue: 64,
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
