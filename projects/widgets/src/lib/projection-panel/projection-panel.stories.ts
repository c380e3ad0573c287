import type { Meta, StoryObj } from '@storybook/angular';
import { LAKE_DEMO, UPLAND_DEMO } from '@tropline/core';
import { ProjectionPanel } from './projection-panel';

const meta: Meta<ProjectionPanel> = {
  title: 'Widgets/Projection panel',
  component: ProjectionPanel,
  parameters: {
    docs: {
      description: {
        component:
          'Projects a model through the Tropline API and draws the trajectory with the cautions. ' +
          'Here the fake client from `@tropline/widgets/testing` computes in the page. In a host ' +
          'app, `provideTropline({ apiUrl, apiKey })` points it at the API with a browser key.',
      },
    },
  },
};
export default meta;

type Story = StoryObj<ProjectionPanel>;

/** The invented lake over four years. */
export const InventedLake: Story = {
  args: { model: LAKE_DEMO.model, initial: { ...LAKE_DEMO.initial }, horizon: 208, samples: 833 },
};

/** The invented upland over sixty years, on a log scale. */
export const InventedUplandLogScale: Story = {
  args: {
    model: UPLAND_DEMO.model,
    initial: { ...UPLAND_DEMO.initial },
    horizon: 60,
    samples: 601,
    logScale: true,
  },
};
