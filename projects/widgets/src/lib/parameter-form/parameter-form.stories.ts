import type { Meta, StoryObj } from '@storybook/angular';
import { type ChainModel, LAKE_DEMO, UPLAND_DEMO } from '@tropline/core';
import { darkMode, narrow } from '../../../../../.storybook/story-states';
import { ParameterForm } from './parameter-form';

const meta: Meta<ParameterForm> = {
  title: 'Widgets/Parameter form',
  component: ParameterForm,
  parameters: {
    docs: {
      description: {
        component:
          'Every parameter grouped by level, a slider paired with a numeric field and its unit. ' +
          'A published scenario passes `bounds`: only those parameters open, within their range; ' +
          'the rest are shown fixed. Valid edits come out of `modelChange`.',
      },
    },
  },
};
export default meta;

type Story = StoryObj<ParameterForm>;

const harvested: ChainModel = {
  ...UPLAND_DEMO.model,
  harvest: [{ level: UPLAND_DEMO.model.levels[1]!.id, kind: 'effort', rate: 0.05 }],
};

/** An analyst's view: everything editable, harvest included. */
export const EveryParameter: Story = { args: { model: harvested } };

/** As published on the portal: two parameters open, within the publisher's ranges. */
export const PublishedBounds: Story = {
  args: {
    model: LAKE_DEMO.model,
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

/** On a dark host page. */
export const DarkMode: Story = { args: PublishedBounds.args, decorators: [darkMode] };

/** 320 px wide. */
export const Narrow: Story = { args: PublishedBounds.args, decorators: [narrow] };
