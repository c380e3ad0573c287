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

/** One projection on a worker thread; a typed failure is returned, never thrown across. */
export default function runProjectionTask(task: {
  request: ProjectionRequest;
  wallTimeMs: number;
}): unknown {
  try {
    return projectValidated(task.request, { wallTimeMs: task.wallTimeMs });
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
