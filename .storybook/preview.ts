import { applicationConfig, type Preview } from '@storybook/angular';
import { provideTroplineTesting } from '@tropline/widgets/testing';

// Stories compute with the engine in the page (the fake client), so they need no server or key.
const preview: Preview = {
  decorators: [
    applicationConfig({ providers: [provideTroplineTesting({ options: { renderer: 'canvas' } })] }),
  ],
  parameters: {
    controls: { expanded: true },
    layout: 'padded',
  },
  tags: ['autodocs'],
};

export default preview;
