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
        component:
          'A baseline and its alternatives side by side, as small multiples or one level ' +
          'overlaid, and a table of the metrics with each difference from the baseline written ' +
          'out; differences of 10 % or more are bold, shaded and carry an arrow.',
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
