import { Piscina } from 'piscina';
import { IntegrationError, type ProjectionRequest } from '@tropline/core';
import type { ProjectionFailure, ProjectionTask } from './projection-task';
import { SerializedAnswer } from './serialized-answer';

const WORKER = new URL('./projection-worker.mjs', import.meta.url).href;

/**
 * Runs long projections on worker threads so the request thread stays free for other tenants'
 * short requests; the thread also serialises the answer, so a large one costs the request
 * thread neither a structured clone nor its JSON. Threads start on first use (most apps, and
 * every test app, never need one).
 */
export class ProjectionPool {
  private pool: Piscina | undefined;

  constructor(private readonly threads: number) {}

  /**
   * Projects on a worker and answers with the JSON bytes; rejects with the engine's
   * IntegrationError when it stops.
   */
  async run(request: ProjectionRequest, wallTimeMs: number): Promise<SerializedAnswer> {
    this.pool ??= new Piscina({
      filename: WORKER,
      minThreads: 0,
      maxThreads: this.threads,
      idleTimeout: 30_000,
      // Beyond this the pool is saturated: refuse rather than queue without bound.
      maxQueue: 64,
    });
    const out = (await this.pool.run({ request, wallTimeMs } satisfies ProjectionTask)) as
      Uint8Array | ProjectionFailure;
    if (out instanceof Uint8Array) {
      return new SerializedAnswer(Buffer.from(out.buffer, out.byteOffset, out.byteLength));
    }
    throw new IntegrationError(
      out.code,
      out.message,
      out.time,
      out.diagnostics,
      out.levelIndex,
      out.levelId,
    );
  }

  /** Stops the threads. */
  async close(): Promise<void> {
    await this.pool?.close();
  }
}
