import type { Meta, StoryObj } from '@storybook/angular';
import {
  findEquilibria,
  HASTINGS_POWELL_BENCHMARK,
  LAKE_DEMO,
  UPLAND_DEMO,
  withParameter,
} from '@tropline/core';
import { QUOTA_REFUSED } from '../../../../../.storybook/story-states';
import { ENGINE_ANALYSES } from '../../../testing/src/engine-analyses';
import { RegimeSummary } from './regime-summary';

const meta: Meta<RegimeSummary> = {
  title: 'Widgets/Regime summary',
  component: RegimeSummary,
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** The long-run behaviour in plain words, for readers who do not read phase
portraits: the regime (settles, cycles, chaotic or a level dies out — naming the levels that die out, with
their units), the largest Lyapunov exponent with its standard error, the predictability horizon
in the model's time unit, the API's note when the verdict rests on weaker evidence (a level
dying out while still above its quasi-extinction threshold; a window too short to settle
irregular peaks), the equilibria with their stability — and the cautions. Every word comes from
the strings object (\`provideTropline({ strings })\`), so a host can translate it.

**Inputs.** \`model\` (required; names, units and time unit), \`regime\` (the API's assessment;
undefined while it is computed), \`equilibria\`, \`error\` (why the assessment is not available),
\`showCautions\` (default on; a composite that shows them once turns this off) and \`cautions\`.

**Outputs.** None.

**Accessibility.** A region named by its heading *Long-run behaviour*; facts as a description
list; while computing, a status message says so; a failure is said in words. Numbers follow the
reader's locale.

**Cautions.** Shown here by default: projections are for comparing scenarios, not forecasts;
chaos caps how far ahead any projection means anything; harvest, stocking and culling decisions
rest with qualified biologists under local law.
`,
      },
    },
  },
};
export default meta;

type Story = StoryObj<RegimeSummary>;

/** The lake, assessed by the engine in the page: chaotic, with a horizon. */
export const ChaoticWithHorizon: Story = {
  args: {
    model: LAKE_DEMO.model,
    regime: ENGINE_ANALYSES.regime({ model: LAKE_DEMO.model, initial: LAKE_DEMO.initial }),
    equilibria: findEquilibria(LAKE_DEMO.model),
  },
};

/** The upland, which settles. */
export const Settles: Story = {
  args: {
    model: UPLAND_DEMO.model,
    regime: ENGINE_ANALYSES.regime({ model: UPLAND_DEMO.model, initial: UPLAND_DEMO.initial }),
    equilibria: findEquilibria(UPLAND_DEMO.model),
  },
};

// Hastings & Powell's chain at b1 = 1 with d2 = 0.0172: the top predator cannot invade and
// declines steadily, still above its threshold in the window (see the text spec).
const dying = withParameter(
  withParameter(HASTINGS_POWELL_BENCHMARK.model, '/levels/1/handlingTime', 0.2),
  '/levels/2/mortality',
  0.0172,
);

/** The top predator dies out: named with its unit, and the API's note said in words. */
export const Collapse: Story = {
  args: {
    model: dying,
    regime: ENGINE_ANALYSES.regime({
      model: dying,
      initial: HASTINGS_POWELL_BENCHMARK.initial,
      transient: 1000,
      window: 1000,
    }),
    equilibria: findEquilibria(dying),
  },
};

/** Still computing. */
export const Loading: Story = { args: { model: LAKE_DEMO.model } };

/** The assessment was refused. */
export const QuotaRefused: Story = { args: { model: LAKE_DEMO.model, error: QUOTA_REFUSED } };
