import type { Meta, StoryObj } from '@storybook/angular';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { darkMode, QUOTA_REFUSED, withClient } from '../../../../../.storybook/story-states';
import type { SweepRequest } from '../api/analysis-types';
import { BifurcationChart } from './bifurcation-chart';

const { model, initial } = HASTINGS_POWELL_BENCHMARK;

/** b1 = a·h of the grazer swept 2.0–6.2 as in the benchmark (h from 0.4 to 1.24 at a = 5). */
const sweep: SweepRequest = {
  model,
  initial,
  parameter: '/levels/1/handlingTime',
  from: 0.4,
  to: 1.24,
  steps: 60,
  observe: model.levels[2]!.id,
  transient: 2000,
  window: 1000,
};

const meta: Meta<BifurcationChart> = {
  title: 'Widgets/Bifurcation chart',
  component: BifurcationChart,
  parameters: {
    docs: {
      description: {
        component:
          'The long-run maxima of one level against a swept parameter, computed as a background ' +
          'job with progress and a cancel button. Regimes differ by marker shape as well as ' +
          'colour; the current value is marked.',
      },
    },
  },
};
export default meta;

type Story = StoryObj<BifurcationChart>;

/** The benchmark's sweep, computed in the page step by step. */
export const BenchmarkSweep: Story = { args: { request: sweep } };

/** A slow service: the progress bar and the cancel button. */
export const Running: Story = {
  args: { request: { ...sweep, steps: 200 } },
  decorators: [withClient({ latencyMs: 400 })],
};

/** The tenant's allowance is used up. */
export const QuotaRefused: Story = {
  args: { request: sweep },
  decorators: [withClient({ failWith: QUOTA_REFUSED })],
};

/** No sweep asked for yet. */
export const Empty: Story = { args: {} };

/** On a dark host page. */
export const DarkMode: Story = {
  args: { request: { ...sweep, steps: 40 } },
  decorators: [darkMode],
};
