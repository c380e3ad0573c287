import type { Meta, StoryObj } from '@storybook/angular';
import { HASTINGS_POWELL_BENCHMARK, LAKE_DEMO, project, UPLAND_DEMO } from '@tropline/core';
import { TrajectoryChart } from './trajectory-chart';
import type { TrajectoryData } from './trajectory-chart-options';

/** A preset projected in the page with the engine, as the chart receives it from the API. */
function projected(preset: typeof LAKE_DEMO, horizon: number, samples = 801): TrajectoryData {
  const result = project({ model: preset.model, initial: preset.initial, horizon, samples });
  return {
    times: result.times,
    timeUnit: preset.model.timeUnit,
    series: preset.model.levels.map((l) => ({
      id: l.id,
      name: l.name,
      unit: l.unit,
      values: result.series[l.id]!,
    })),
  };
}

const meta: Meta<TrajectoryChart> = {
  title: 'Widgets/Trajectory chart',
  component: TrajectoryChart,
  parameters: {
    docs: {
      description: {
        component:
          'Every level of a food chain over time, with names and units. Levels in different units ' +
          'get their own axes; a log scale helps when levels differ by orders of magnitude; the ' +
          'span past the predictability horizon is shaded. A sentence under the chart describes ' +
          'it for screen readers.',
      },
    },
  },
};
export default meta;

type Story = StoryObj<TrajectoryChart>;

/** The invented lake: chaotic plankton chain, weekly steps over four years. */
export const InventedLake: Story = {
  args: { data: projected(LAKE_DEMO, 208), logScale: false },
};

/** The invented upland: levels in different units, so two value axes. */
export const InventedUplandTwoUnits: Story = {
  args: { data: projected(UPLAND_DEMO, 60), logScale: false },
};

/** The published benchmark on a log scale, shaded past an illustrative horizon. */
export const BenchmarkLogScaleWithHorizon: Story = {
  args: {
    data: projected(HASTINGS_POWELL_BENCHMARK, 1000),
    logScale: true,
    predictabilityHorizon: 600,
  },
};
