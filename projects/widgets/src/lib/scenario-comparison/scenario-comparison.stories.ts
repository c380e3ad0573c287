import type { Meta, StoryObj } from '@storybook/angular';
import { UPLAND_DEMO } from '@tropline/core';
import { darkMode, QUOTA_REFUSED, withClient } from '../../../../../.storybook/story-states';
import type { ComparisonRequest } from '../api/analysis-types';
import { ScenarioComparison } from './scenario-comparison';

const { model, initial } = UPLAND_DEMO;
const [, deer, wolves] = model.levels.map((l) => l.id);

/** Invented management options for the invented upland. */
const request: ComparisonRequest = {
  model,
  initial,
  horizon: 40,
  window: 10,
  samples: 201,
  regimeTransient: 500,
  regimeWindow: 500,
  scenarios: [
    {
      name: 'Deer cull 10 % a year',
      changes: [{ pointer: `/model/levels/1/mortality`, value: model.levels[1]!.mortality! + 0.1 }],
    },
    { name: 'Wolves absent', changes: [{ pointer: `/initial/${wolves}`, value: 0 }] },
    {
      name: 'Twice the deer',
      changes: [{ pointer: `/initial/${deer}`, value: initial[deer!]! * 2 }],
    },
  ],
};

const meta: Meta<ScenarioComparison> = {
  title: 'Widgets/Scenario comparison',
  component: ScenarioComparison,
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** A baseline and its management alternatives side by side — a cull, a closed
season, a stocking — as one chart per scenario or one level of all on one chart, and a table of
the comparison metrics (value at the horizon, mean over the final window, lowest value, first
time below the threshold) with each difference from the baseline written out.

**Inputs.** \`model\` (required; the baseline's names and units), \`request\` (the comparison to run
on the API as a background job) or \`result\` (a finished comparison to show), and \`layout\`
(\`multiples\` or \`overlay\`).

**Outputs.** None. While the job runs a progress bar and a cancel button show; a refusal (quota,
bounds) shows its heading, what to do and when the allowance resets.

**Accessibility.** A labelled toggle for the layout and a labelled select for the overlaid
level; the chart is an image (\`role="img"\`) described by its caption; the metrics are a real
table with a caption, in a focusable region. Differences of 10 % or more are bold and carry an
arrow as well as a shade — never colour alone.

**Cautions.** A comparison ranks scenarios of the model; it forecasts none of them, and harvest,
stocking and culling decisions rest with qualified biologists under local law. The cautions
show under the comparison.
`,
      },
    },
  },
};
export default meta;

type Story = StoryObj<ScenarioComparison>;

/** Three options against the baseline, computed in the page as a job. */
export const SmallMultiples: Story = { args: { model, request } };

/** The top level under every scenario on one chart. */
export const Overlay: Story = { args: { model, request, layout: 'overlay' } };

/** The tenant's allowance is used up. */
export const QuotaRefused: Story = {
  args: { model, request },
  decorators: [withClient({ failWith: QUOTA_REFUSED })],
};

/** Nothing asked for yet. */
export const Empty: Story = { args: { model } };

/** On a dark host page. */
export const DarkMode: Story = { args: { model, request }, decorators: [darkMode] };
