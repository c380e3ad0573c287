import type { Meta, StoryObj } from '@storybook/angular';
import { darkMode, NOT_ACCEPTED, QUOTA_REFUSED } from '../../../../../.storybook/story-states';
import { problemFromDocument } from '../api/problem-message';
import { JobStrip } from './job-strip';

/**
 * A sweep job that failed on the server, mapped as the client maps it: the problem document the
 * API writes when an analysis's integration cannot finish (server/projections/engine-problem.ts).
 */
const JOB_FAILED = problemFromDocument(
  {
    type: 'https://tropline.dev/problems/integration-failed',
    status: 422,
    title: 'The model could not be integrated',
    detail: 'The analysis stopped: step-limit; shorten the spans or loosen the tolerance.',
    errors: [{ pointer: '/window', message: 'the integration did not finish (step-limit)' }],
  },
  'en',
);

const meta: Meta<JobStrip> = {
  title: 'Widgets/Job strip',
  component: JobStrip,
  argTypes: { cancelJob: { action: 'cancelJob' } },
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** Where a widget's background job stands (a bifurcation sweep, a scenario
comparison), in one strip above its chart: the progress bar with a cancel button while it runs;
the refusal or failure once it fails — its heading, what to do and, for a quota refusal, when
the allowance resets — with the fields at fault; a note once cancelled. While idle or done it
takes no space, so the chart below does not move. The library's charts use it already; a host
composing its own view follows a job with \`jobState()\` and shows it here.

**Inputs.** \`state\` (required): the job's state as \`jobState()\` follows it — \`idle\`,
\`running\` (with \`progress\` 0..1, absent while queued), \`done\`, \`failed\` (with the
mapped API error) or \`cancelled\`. \`label\`: what is being computed, read with the progress
bar (default *Computing…*).

**Outputs.** \`cancelJob\`: the reader pressed *Cancel*; unsubscribing from \`jobState()\`'s
request cancels the job on the server.

**Accessibility.** The progress bar is named by \`label\`; the percentage is announced politely
in steps of a tenth, so a screen reader is not flooded; *Cancel* is a real button with the
library's focus ring. A refusal or failure is an alert named by its heading; the cancelled note
is a status message. Every word comes from the strings object, so a host can translate it.

**Cautions.** The strip shows how a computation goes, not its result: a refused or cancelled
job leaves the chart empty rather than showing an old answer as new. Where the job's result is a
projection, the cautions belong beside the chart it feeds.
`,
      },
    },
  },
};
export default meta;

type Story = StoryObj<JobStrip>;

/** A sweep under way, 42 % done, with its cancel button. */
export const RunningWithProgress: Story = {
  args: { state: { kind: 'running', progress: 0.42 }, label: 'Computing the bifurcation diagram' },
};

/** Queued: no fraction yet, so the bar moves without a value. */
export const Queued: Story = {
  args: { state: { kind: 'running' }, label: 'Comparing the scenarios' },
};

/** Refused: the tenant's allowance is used up, with the time it resets. */
export const QuotaRefused: Story = { args: { state: { kind: 'failed', error: QUOTA_REFUSED } } };

/** Refused: a value the API does not accept, with the field at fault. */
export const NotAccepted: Story = { args: { state: { kind: 'failed', error: NOT_ACCEPTED } } };

/** Failed while running. */
export const Failed: Story = { args: { state: { kind: 'failed', error: JOB_FAILED } } };

/** Cancelled by the reader. */
export const Cancelled: Story = { args: { state: { kind: 'cancelled' } } };

/** Under way on a dark host page. */
export const DarkMode: Story = {
  args: { state: { kind: 'running', progress: 0.7 }, label: 'Computing the bifurcation diagram' },
  decorators: [darkMode],
};
