import { Piscina } from 'piscina';
import { IntegrationError, projectValidated, type ProjectionRequest } from '@tropline/core';

/** What crosses back from the worker when the engine stops with a typed error. */
export interface ProjectionFailure {
  readonly failed: true;
  readonly code: IntegrationError['code'];
  readonly message: string;
  readonly time: number;
  readonly diagnostics: IntegrationError['diagnostics'];
  readonly levelIndex?: number;
  readonly levelId?: string;
}

/** A task for the projection thread. */
export interface ProjectionTask {
  readonly request: ProjectionRequest;
  readonly wallTimeMs: number;
}

/**
 * One projection on a worker thread, answered as its JSON bytes (moved, not copied, to the
 * request thread, which then neither clones nor serialises the answer); a typed failure is
 * returned, never thrown across.
 */
export default function runProjectionTask(task: ProjectionTask): unknown {
  try {
    const result = projectValidated(task.request, { wallTimeMs: task.wallTimeMs });
    // TextEncoder gives the bytes an ArrayBuffer of their own (Buffer.from may share a slab).
    return Piscina.move(new TextEncoder().encode(JSON.stringify(result)));
  } catch (err) {
    if (!(err instanceof IntegrationError)) throw err;
    return {
      failed: true,
      code: err.code,
      message: err.message,
      time: err.time,
      diagnostics: err.diagnostics,
      levelIndex: err.levelIndex,
      levelId: err.levelId,
    } satisfies ProjectionFailure;
  }
}
