import type { Meta, StoryObj } from '@storybook/angular';
import {
  type ChainPreset,
  findEquilibria,
  LAKE_DEMO,
  project,
  ROSENZWEIG_MACARTHUR,
} from '@tropline/core';
import { darkMode } from '../../../../../.storybook/story-states';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';
import { PhasePortrait } from './phase-portrait';

function projected(preset: ChainPreset, horizon: number, samples: number): TrajectoryData {
  const r = project({ model: preset.model, initial: preset.initial, horizon, samples });
  return {
    times: r.times,
    timeUnit: preset.model.timeUnit,
    series: preset.model.levels.map((l) => ({
      id: l.id,
      name: l.name,
      unit: l.unit,
      values: r.series[l.id]!,
    })),
  };
}

const meta: Meta<PhasePortrait> = {
  title: 'Widgets/Phase portrait',
  component: PhasePortrait,
  parameters: {
    docs: {
      description: {
        component: `
**What it is for.** Any two levels against each other, which shows the shape of the long-run
behaviour at a glance — a point it settles to, a closed loop it cycles on, or a tangle that
never repeats. The early transient is faded; equilibria are marked filled when stable and hollow
when not; for a two-level chain the nullclines show where each level stops changing. A chain of
three or more levels also offers *Three levels*: three levels in a box drawn in orthographic
projection on the same chart, turned and tilted to see the shape from any side.

**Inputs.** \`model\` (required; names, units, nullclines), \`data\` (the trajectory; a skeleton
while undefined), \`equilibria\` to mark, \`x\` and \`y\` (level ids; default the producer and the
level above it), \`depth\` (the box's third level; default the third), \`view\` (\`plane\` or
\`box\` to open with), \`viewAngles\` (the box's opening turn and tilt in degrees),
\`transientEnd\` (model time; default a quarter of the span) and \`label\` (the accessible
name, default *Phase portrait*).

**Outputs.** None. The reader picks the two levels with ordinary selects above the chart.

**Accessibility.** Labelled native selects; the chart is an image (\`role="img"\`) described by a
caption naming the two levels, the faded transient and how many equilibria are stable. Stable
and unstable equilibria differ by fill (● and ○), not colour alone. The table view lists the
plotted points. In the box view the sliders *Turn* and *Tilt* and the arrow keys on the focused
chart (Home restores the view) move it, and the caption says from where it is seen.

**Cautions.** The portrait shows the model's behaviour, not the system's future; show the
projection cautions wherever it appears (the projection panel does).
`,
      },
    },
  },
};
export default meta;

type Story = StoryObj<PhasePortrait>;

/** The two-level chain: a limit cycle around the unstable interior equilibrium. */
export const TwoLevelCycleWithNullclines: Story = {
  args: {
    model: ROSENZWEIG_MACARTHUR.model,
    data: projected(ROSENZWEIG_MACARTHUR, 200, 2001),
    equilibria: findEquilibria(ROSENZWEIG_MACARTHUR.model),
  },
};

/** The lake's water fleas against its perch: the chaotic attractor. */
export const ChaoticLake: Story = {
  args: {
    model: LAKE_DEMO.model,
    data: projected(LAKE_DEMO, 2000, 4001),
    equilibria: findEquilibria(LAKE_DEMO.model),
    x: 'daphnia',
    y: 'perch',
    transientEnd: 400,
  },
};

/** The lake's three levels in the box, seen from a corner a little above. */
export const ThreeLevelsInABox: Story = {
  args: {
    model: LAKE_DEMO.model,
    data: projected(LAKE_DEMO, 2000, 4001),
    equilibria: findEquilibria(LAKE_DEMO.model),
    view: 'box',
    transientEnd: 400,
  },
};

/** Still computing. */
export const Loading: Story = { args: { model: LAKE_DEMO.model, data: undefined } };

/** On a dark host page. */
export const DarkMode: Story = {
  args: TwoLevelCycleWithNullclines.args,
  decorators: [darkMode],
};
