import { type ChainModel, project, type ProjectionResponse } from '@tropline/core';
import type { TrajectoryData } from '@tropline/widgets';

/**
 * A model projected in the page with the engine, shaped as the trajectory chart and the phase
 * portrait take it (every level with its name and unit), for tests and stories. Returns the
 * engine's run too, to check drawn values against.
 */
export function engineTrajectory(
  model: ChainModel,
  initial: Readonly<Record<string, number>>,
  horizon: number,
  samples: number,
): TrajectoryData & { readonly run: ProjectionResponse } {
  const run = project({ model, initial: { ...initial }, horizon, samples });
  return {
    run,
    times: run.times,
    timeUnit: model.timeUnit,
    series: model.levels.map((l) => ({
      id: l.id,
      name: l.name,
      unit: l.unit,
      values: run.series[l.id]!,
    })),
  };
}
