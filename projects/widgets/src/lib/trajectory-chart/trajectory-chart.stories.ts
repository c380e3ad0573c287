import type { Meta, StoryObj } from '@storybook/angular';
import {
  HASTINGS_POWELL_BENCHMARK,
  LAKE_DEMO,
  project,
  UPLAND_DEMO,
  withParameter,
} from '@tropline/core';
import { darkMode, narrow } from '../../../../../.storybook/story-states';
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
        component: `
**What it is for.** Every level of a food chain over time, with names and units: the chart a
projection is read from. Levels in different units get their own axes; a log scale helps when
levels differ by orders of magnitude; uncertainty bands and monitoring points are drawn when
given; in a chaotic regime the span past the predictability horizon is shaded and faded.

**Inputs.** \`data\`: times, one series per level (id, name, unit, values), optional \`bands\` and
\`observations\`; while undefined a skeleton of the same height holds the place. \`logScale\`,
\`predictabilityHorizon\` (model time), \`zoom\` (default on), \`label\` (the accessible name, default
*Trajectory of every level over time*) and \`fileName\` for downloads.

**Outputs.** None: it draws what it is given. Its numbers are one button away as a table, and it
downloads as PNG, SVG and CSV.

**Accessibility.** The chart is an image (\`role="img"\`) named by \`label\` and described by the
caption under it, one sentence with each level's range and end value in the reader's locale.
Focus it to zoom with the keyboard: plus and minus zoom, left and right move, zero shows all.
Series differ by line style as well as colour; the table view gives every number as text.

**Cautions.** A trajectory is a scenario, not a forecast, and means nothing past the
predictability horizon of a chaotic regime. Alone on a page, show \`<tropline-caution-notice>\`
with it; the projection panel does so itself.
`,
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

/** Nothing to draw yet: the skeleton holds the chart's place. */
export const Empty: Story = { args: { data: undefined } };

/**
 * The upland with a band from 40 runs whose wolf mortality is spread ±20 % (computed here with
 * the engine), and invented survey counts of deer.
 */
export const UplandWithBandAndSurveys: Story = {
  args: {
    data: (() => {
      const base = projected(UPLAND_DEMO, 40, 201);
      const pointer = '/levels/2/mortality';
      const m0 = UPLAND_DEMO.model.levels[2]!.mortality;
      const runs = Array.from({ length: 40 }, (_, i) =>
        project({
          model: withParameter(UPLAND_DEMO.model, pointer, m0 * (0.8 + (0.4 * i) / 39)),
          initial: UPLAND_DEMO.initial,
          horizon: 40,
          samples: 201,
        }),
      );
      const deer = UPLAND_DEMO.model.levels[1]!.id;
      const q = (id: string, p: number) =>
        base.times.map((_, k) => {
          const xs = runs.map((r) => r.series[id]![k]!).sort((a, b) => a - b);
          return xs[Math.round(p * (xs.length - 1))]!;
        });
      return {
        ...base,
        bands: base.series.map((s) => ({ id: s.id, lower: q(s.id, 0.05), upper: q(s.id, 0.95) })),
        observations: [
          {
            id: deer,
            times: [0, 3, 7, 12, 18, 25, 31, 38],
            values: base.series[1]!.values.filter((_, k) =>
              [0, 15, 35, 60, 90, 125, 155, 190].includes(k),
            ).map((v, i) => (i === 4 ? null : v * (1 + 0.08 * Math.sin(i * 2.3)))),
          },
        ],
      };
    })(),
  },
};

/** The lake on a dark host page. */
export const DarkMode: Story = {
  args: { data: projected(LAKE_DEMO, 208), predictabilityHorizon: 120 },
  decorators: [darkMode],
};

/** 320 px wide. */
export const Narrow: Story = {
  args: { data: projected(LAKE_DEMO, 208) },
  decorators: [narrow],
};
