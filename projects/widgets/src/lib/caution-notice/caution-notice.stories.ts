import type { Meta, StoryObj } from '@storybook/angular';
import { darkMode } from '../../../../../.storybook/story-states';
import { CautionNotice } from './caution-notice';

const meta: Meta<CautionNotice> = {
  title: 'Widgets/Caution notice',
  component: CautionNotice,
  parameters: {
    docs: {
      description: {
        component:
          'The cautions every projection carries. On by default wherever projections show; a ' +
          'host may restyle them through `--tropline-caution-*`, not remove them.',
      },
    },
  },
};
export default meta;

type Story = StoryObj<CautionNotice>;

/** The engine's cautions. */
export const Default: Story = {};

/** On a dark host page. */
export const DarkMode: Story = { decorators: [darkMode] };
