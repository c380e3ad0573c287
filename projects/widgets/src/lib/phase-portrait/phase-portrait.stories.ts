import type { Meta, StoryObj } from '@storybook/angular';
import {
  type ChainPreset,
  findEquilibria,
  LAKE_DEMO,
  project,
  ROSENZWEIG_MACARTHUR,
} from '@tropline/core';
import { darkMode } from '../../../../../.storybook/story-states';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';
import { PhasePortrait } from './phase-portrait';

function projected(preset: ChainPreset, horizon: number, samples: number): TrajectoryData {
  const r = project({ model: preset.model, initial: preset.initial, horizon, samples });
  return {
    times: r.times,
    timeUnit: preset.model.timeUnit,
    series: preset.model.levels.map((l) => ({
      id: l.id,
      name: l.name,
      unit: l.unit,
      values: r.series[l.id]!,
    })),
  };
}

const meta: Meta<PhasePortrait> = {
  title: 'Widgets/Phase portrait',
  component: PhasePortrait,
  parameters: {
    docs: {
      description: {
        component:
          'Two levels against each other: the early transient faded, equilibria filled when ' +
          'stable and hollow when not, and for a two-level chain the nullclines where each ' +
          'level stops changing. Pick the levels with the selects above the chart.',
      },
    },
  },
};
export default meta;

type Story = StoryObj<PhasePortrait>;

/** The two-level chain: a limit cycle around the unstable interior equilibrium. */
export const TwoLevelCycleWithNullclines: Story = {
  args: {
    model: ROSENZWEIG_MACARTHUR.model,
    data: projected(ROSENZWEIG_MACARTHUR, 200, 2001),
    equilibria: findEquilibria(ROSENZWEIG_MACARTHUR.model),
  },
};

/** The lake's water fleas against its perch: the chaotic attractor. */
export const ChaoticLake: Story = {
  args: {
    model: LAKE_DEMO.model,
    data: projected(LAKE_DEMO, 2000, 4001),
    equilibria: findEquilibria(LAKE_DEMO.model),
    x: 'daphnia',
    y: 'perch',
    transientEnd: 400,
  },
};

/** Still computing. */
export const Loading: Story = { args: { model: LAKE_DEMO.model, data: undefined } };

/** On a dark host page. */
export const DarkMode: Story = {
  args: TwoLevelCycleWithNullclines.args,
  decorators: [darkMode],
};
