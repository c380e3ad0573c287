import type { Meta, StoryObj } from '@storybook/angular';
import { LAKE_DEMO, UPLAND_DEMO } from '@tropline/core';
import {
  darkMode,
  narrow,
  NOT_ACCEPTED,
  QUOTA_REFUSED,
  withClient,
} from '../../../../../.storybook/story-states';
import { ProjectionPanel } from './projection-panel';

const meta: Meta<ProjectionPanel> = {
  title: 'Widgets/Projection panel',
  component: ProjectionPanel,
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** The composite a portal embeds with one tag: the parameter form (limited to
what the publisher allowed), the trajectory chart, the phase portrait and the regime summary,
with the cautions once for all. Edits are debounced; a newer edit cancels requests in flight,
and the last drawn result stays on screen while the next one loads.

**Inputs.** \`model\` and \`initial\` (required; the published model and each level's start by
id), \`horizon\` and \`samples\`, \`logScale\`, \`bounds\` (the public ranges), and \`showForm\`,
\`showPhasePortrait\`, \`showSummary\` to leave parts out. Here the fake client from
\`@tropline/widgets/testing\` computes in the page; in a host app \`provideTropline({ apiUrl,
apiKey })\` points it at the API with a browser key.

**Outputs.** None of its own: what the reader changes stays in the panel. Hosts that need the
answers use the custom element's \`tropline-result\` and \`tropline-refused\` events.

**Accessibility.** Marked busy while computing, with a labelled progress bar; a refused request
shows as an alert naming the field and the reason; every part keeps its own labels, captions
and keyboard use (see each widget's page). At 320 px everything stacks.

**Cautions.** Always shown under the results: projections are for comparing scenarios, not
forecasts; chaos caps predictability (the chart shades the span past the horizon); harvest,
stocking and culling decisions rest with qualified biologists under local law. The API's own
cautions replace the defaults when it sends them.
`,
      },
    },
  },
};
export default meta;

type Story = StoryObj<ProjectionPanel>;

const lake = {
  model: LAKE_DEMO.model,
  initial: { ...LAKE_DEMO.initial },
  horizon: 208,
  samples: 833,
};

/** The invented lake over ten years: chaotic, so the span past its horizon is faded. */
export const ChaoticLakeWithHorizon: Story = { args: { ...lake, horizon: 520, samples: 1041 } };

/** As published: the public may change the nutrient load (as K) and perch mortality only. */
export const PublishedBounds: Story = {
  args: {
    ...lake,
    bounds: [
      {
        pointer: '/levels/0/carryingCapacity',
        min: 20,
        max: 60,
        label: 'Nutrient load (as carrying capacity K)',
      },
      { pointer: '/levels/2/mortality', min: 0.001, max: 0.02 },
    ],
  },
};

/** The invented upland over sixty years, on a log scale (it settles). */
export const SettlingUplandLogScale: Story = {
  args: {
    model: UPLAND_DEMO.model,
    initial: { ...UPLAND_DEMO.initial },
    horizon: 60,
    samples: 601,
    logScale: true,
  },
};

/** Waiting for the service: skeletons hold the layout. */
export const Loading: Story = { args: lake, decorators: [withClient({ neverAnswer: true })] };

/** The service refused a value. */
export const NotAccepted: Story = {
  args: lake,
  decorators: [withClient({ failWith: NOT_ACCEPTED })],
};

/** The tenant's allowance is used up: the reset time is shown. */
export const QuotaRefused: Story = {
  args: lake,
  decorators: [withClient({ failWith: QUOTA_REFUSED })],
};

/** On a dark host page. */
export const DarkMode: Story = { args: lake, decorators: [darkMode] };

/** 320 px wide: everything stacks. */
export const Narrow: Story = { args: lake, decorators: [narrow] };
