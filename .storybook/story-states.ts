import { applicationConfig, componentWrapperDecorator } from '@storybook/angular';
import type { TroplineApiError } from '@tropline/widgets';
import { type FakeTroplineClientOptions, provideTroplineTesting } from '@tropline/widgets/testing';
import { ENGINE_ANALYSES } from '../projects/widgets/testing/src/engine-analyses';

/** A story whose fake client behaves differently (slow, failing, never answering). */
export function withClient(client: FakeTroplineClientOptions) {
  return applicationConfig({
    providers: [
      provideTroplineTesting({
        client: { analyses: ENGINE_ANALYSES, ...client },
        options: { renderer: 'canvas' },
      }),
    ],
  });
}

/** Renders the story on a dark surface (`color-scheme: dark`). */
export const darkMode = componentWrapperDecorator(
  (story) => `<div class="tropline-story-dark">${story}</div>`,
);

/** Renders the story 320 px wide, the narrowest the widgets support. */
export const narrow = componentWrapperDecorator(
  (story) => `<div class="tropline-story-narrow">${story}</div>`,
);

/** The API's answer when the tenant's monthly allowance is used up. */
export const QUOTA_REFUSED: TroplineApiError = {
  status: 429,
  title: 'Monthly allowance used up',
  message:
    'The Larchmere Lakes Authority used 50 000 of 50 000 compute units this month. ' +
    'You can try again after 1 Jan 2027, 00:00.',
  fieldErrors: [],
  retryAt: new Date('2027-01-01T00:00:00Z'),
  retryable: true,
};

/** The API's answer for a value it does not accept. */
export const NOT_ACCEPTED: TroplineApiError = {
  status: 400,
  title: 'The request is not valid',
  message: '/horizon: horizon must be at most 100000 time units',
  fieldErrors: [{ pointer: '/horizon', message: 'horizon must be at most 100000 time units' }],
  retryable: false,
};
