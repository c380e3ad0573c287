import type { StorybookConfig } from '@storybook/angular';

// Storybook for @tropline/widgets: every widget's stories and docs pages, built statically into
// dist/storybook and served by `npm start` at /storybook/.
const config: StorybookConfig = {
  stories: ['../projects/widgets/src/**/*.stories.ts'],
  addons: ['@storybook/addon-docs'],
  framework: { name: '@storybook/angular', options: {} },
  core: { disableTelemetry: true, disableWhatsNewNotifications: true },
  docs: { defaultName: 'Overview' },
};

export default config;
