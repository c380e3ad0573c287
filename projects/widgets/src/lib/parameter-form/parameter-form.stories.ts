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
        component: `
**What it is for.** The model's parameters as a form, so a reader can ask "what if?": grouped
by level, each a numeric field with its unit and a slider beside it. On a public page it opens
only the parameters a published scenario allows, within the publisher's ranges; the others are
shown with their values, marked *Fixed by the publisher*.

**Inputs.** \`model\` (required): the published model, whose values are the reset values — pass
the published model, not the edited one, so the form is not rebuilt while someone drags.
\`bounds\`: the public parameters and their ranges (\`pointer\`, \`min\`, \`max\`, optional \`step\` and
\`label\`); absent, every parameter opens from 0 to twice its value. Either way a range stays
within what the model accepts: a parameter that must be above zero (growth and attack rates,
capacity, efficiency) reads *more than 0* and its slider starts a step above it. \`heading\`: the
form's heading (default *Model parameters*). \`fieldErrors\`: a problem document's \`errors[]\`
(e.g. \`TroplineApiError.fieldErrors\`); each is shown under the field its JSON Pointer names
(\`/model/levels/0/growthRate\`, or the pointer into the model itself; \`modelPointer\` says where
the model sits in the request, default \`/model\`) until the reader edits that field. \`idPrefix\`:
start of the field ids (default \`tropline-param\`).

**Field ids.** Each numeric field's id is the prefix and its parameter's pointer, e.g.
\`tropline-param-levels-1-handlingTime\` for \`/levels/1/handlingTime\` (\`parameterFieldId()\`, or the
form's \`fieldId(pointer)\`), so a host's error summary can link to it. A second form on the page
with the same prefix gets \`tropline-param-2-…\`.

**Outputs.** \`modelChange\`: every valid edit, as the whole model with the new values — a
value outside its range or refused by the model is refused on the spot with a message under its
field and never emitted; later edits go on as before. \`validChange\`: the validity, each time it
changes. \`valid()\` and \`problems()\` (signals on the component): whether the values are
acceptable, and every message shown with its field's pointer, id and label (the server's marked
\`fromServer\`). \`resetToPublished\`: the reader pressed *Reset to the published values*.

**Accessibility.** A \`form\` named by its heading; one \`fieldset\` and \`legend\` per level. Each
field has a visible label, its range as a hint and its error as text (\`aria-invalid\` set); the
slider carries the same label and reads its value with the unit. Everything works from the
keyboard (Tab, arrow keys on the slider, typing in the field).

**Cautions.** The form changes a scenario, it forecasts nothing: show it with the projection it
drives and that projection's cautions — the projection panel does.
`,
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

/**
 * The host passes the server's refusal (a problem document's `errors[]`; here the publisher
 * narrowed the ranges after the page loaded): each message sits under the field its pointer
 * names, the field marked invalid and the message tied to it, until the reader edits it.
 */
export const ErrorsFromTheServer: Story = {
  args: {
    ...PublishedBounds.args,
    fieldErrors: [
      {
        pointer: '/model/levels/0/carryingCapacity',
        message: "must be between 20 and 35, the publisher's range",
      },
      {
        pointer: '/model/levels/2/mortality',
        message: "must be between 0.001 and 0.015, the publisher's range",
      },
    ],
  },
};

/** On a dark host page. */
export const DarkMode: Story = { args: PublishedBounds.args, decorators: [darkMode] };

/** 320 px wide. */
export const Narrow: Story = { args: PublishedBounds.args, decorators: [narrow] };
