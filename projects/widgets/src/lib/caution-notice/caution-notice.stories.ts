import type { Meta, StoryObj } from '@storybook/angular';
import { darkMode } from '../../../../../.storybook/story-states';
import { CautionNotice } from './caution-notice';

const meta: Meta<CautionNotice> = {
  title: 'Widgets/Caution notice',
  component: CautionNotice,
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** The cautions every projection carries, as a short list that is always
visible: projections are for comparing scenarios, not forecasts; where the system is chaotic
nothing is meaningful past the predictability horizon; harvest, stocking and culling decisions
rest with qualified biologists and local law.

**Inputs.** \`cautions\`: the sentences to list; by default the engine's three, and the API sends
the same with every projection.

**Outputs.** None.

**Accessibility.** A complementary landmark (\`aside\`) named *How to read this projection*, a
plain list, its icon hidden from screen readers.

**Cautions.** This is the caution. Every widget that shows a projection shows it by default; a
host may restyle it through \`--tropline-caution-surface\` and \`--tropline-caution-on-surface\`,
not remove it.
`,
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
