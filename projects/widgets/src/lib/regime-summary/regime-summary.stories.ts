import type { Meta, StoryObj } from '@storybook/angular';
import { findEquilibria, LAKE_DEMO, UPLAND_DEMO } from '@tropline/core';
import { QUOTA_REFUSED } from '../../../../../.storybook/story-states';
import { ENGINE_ANALYSES } from '../../../testing/src/engine-analyses';
import { RegimeSummary } from './regime-summary';

const meta: Meta<RegimeSummary> = {
  title: 'Widgets/Regime summary',
  component: RegimeSummary,
  parameters: {
    docs: {
      description: {
        component:
          'The long-run behaviour in plain words: regime, largest Lyapunov exponent with its ' +
          'error, the predictability horizon in the model’s time unit, the equilibria with their ' +
          'stability, and the cautions.',
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

/** Still computing. */
export const Loading: Story = { args: { model: LAKE_DEMO.model } };

/** The assessment was refused. */
export const QuotaRefused: Story = { args: { model: LAKE_DEMO.model, error: QUOTA_REFUSED } };
