import type { Meta, StoryObj } from '@storybook/angular';
import { HASTINGS_POWELL_BENCHMARK, withParameter } from '@tropline/core';
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

/**
 * The top predator's mortality d2 swept at b1 = 1: past the invasion threshold (d2 ≈ 0.0142,
 * derived in shared/regime/assess-regime.spec.ts) it declines without peaks and dies out.
 */
const dying: SweepRequest = {
  model: withParameter(model, '/levels/1/handlingTime', 0.2),
  initial,
  parameter: '/levels/2/mortality',
  from: 0.004,
  to: 0.03,
  steps: 27,
  observe: model.levels[2]!.id,
  transient: 1000,
  window: 1000,
};

const meta: Meta<BifurcationChart> = {
  title: 'Widgets/Bifurcation chart',
  component: BifurcationChart,
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** How the long-run behaviour changes as one parameter is varied: for each
value, the peaks one level reaches after the transient. One peak means a steady state or simple
cycle, a few a more complex cycle, a cloud chaos. Where the level dies out without peaks
(declining steadily toward zero), the value is marked ▼ on the zero line, with its own legend
entry. The current value is marked, so a reader sees how close the system sits to a change of
regime.

**Inputs.** \`request\`: a sweep (model, start, parameter pointer, range, steps, observed level,
transient and window) to run on the API as a background job; or \`result\`: a finished sweep to
draw. \`axes\` (labels; derived from the model's names and units when absent), \`current\` (the
parameter's value now) and \`label\` (the accessible name, default *Bifurcation diagram*).

**Outputs.** None. While the job runs a progress bar shows how far it is, with a cancel button;
a refusal (quota, bounds) shows its heading, what to do and when the allowance resets.

**Accessibility.** The chart is an image (\`role="img"\`) described by its caption; regimes differ
by marker shape as well as colour, and the legend names each shape in words. The summary lists
the values where a level dies out without peaks. Progress is announced through the progress
bar, refusals as an alert. The table view gives each value's regime and peaks as text.

**Cautions.** The diagram is the model's, computed over long runs: where it shows chaos, no
projection is meaningful past its predictability horizon, and decisions on harvest or culling
rest with qualified biologists under local law. Show the cautions beside it.
`,
      },
    },
  },
};
export default meta;

type Story = StoryObj<BifurcationChart>;

/** The benchmark's sweep, computed in the page step by step. */
export const BenchmarkSweep: Story = { args: { request: sweep } };

/** A level that dies out without peaks past a threshold: ▼ on the zero line. */
export const LevelDiesOut: Story = { args: { request: dying } };

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
