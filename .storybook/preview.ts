import { applicationConfig, type Preview } from '@storybook/angular';
import { provideTroplineTesting } from '@tropline/widgets/testing';
import { ENGINE_ANALYSES } from '../projects/widgets/testing/src/engine-analyses';

// Stories compute with the engine in the page (the fake client), so they need no server or key.
const preview: Preview = {
  decorators: [
    applicationConfig({
      providers: [
        provideTroplineTesting({
          client: { analyses: ENGINE_ANALYSES },
          options: { renderer: 'canvas' },
        }),
      ],
    }),
  ],
  parameters: {
    controls: { expanded: true },
    layout: 'padded',
  },
  tags: ['autodocs'],
};

export default preview;
