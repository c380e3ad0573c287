import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { type ComparisonRequest, ScenarioComparison } from '@tropline/widgets';
import { PublicCaution } from '../common/public-caution';
import {
  HOBCAIRN_MOOR,
  projectionSamples,
  type PublishedScenario,
  publishedScenario,
  PublishedStatus,
  readyScenario,
} from '../common/published';

/**
 * The culls the authority is weighing for the moor. Page content, not part of the published
 * scenario: a cull of a share of the deer each year adds that share to the deer's yearly death
 * rate in the published model.
 */
const HOBCAIRN_CULLS: readonly { readonly name: string; readonly share: number }[] = [
  { name: 'Cull 5 % of deer a year', share: 0.05 },
  { name: 'Cull 15 % of deer a year', share: 0.15 },
];

/** Years at the end of the horizon over which the comparison averages (page content). */
const MEAN_WINDOW_YEARS = 10;

/** The comparison this page shows, built on the published model, start and horizon. */
export function hobcairnComparison(s: PublishedScenario): ComparisonRequest | undefined {
  const deer = s.model.levels.findIndex((l) => l.id === 'deer');
  const level = s.model.levels[deer];
  if (!level || !('mortality' in level)) return undefined;
  const pointer = `/model/levels/${deer}/mortality`;
  return {
    model: s.model,
    initial: s.initial,
    horizon: s.horizon,
    window: MEAN_WINDOW_YEARS,
    samples: projectionSamples(s),
    regimeTransient: 400,
    regimeWindow: 400,
    scenarios: [
      ...HOBCAIRN_CULLS.map((c) => ({
        name: c.name,
        changes: [{ pointer, value: Number((level.mortality + c.share).toFixed(6)) }],
      })),
      { name: 'No wolves return', changes: [{ pointer: '/initial/wolves', value: 0 }] },
    ],
  };
}

/** Harvest policy: the deer culls under discussion for Hobcairn Moor, side by side. */
@Component({
  selector: 'lla-harvest-page',
  imports: [ScenarioComparison, PublicCaution, PublishedStatus],
  template: `
    <h1>Deer on Hobcairn Moor: comparing culls</h1>
    <p class="lla-lede">
      Red deer browse the moor's heather, and the grey wolves returning from the north eat deer. Too
      many deer and the heather cannot recover; too few and the wolves go hungry. The authority is
      weighing how many deer, if any, to cull each year.
    </p>
    <p class="lla-lede">
      Below, the published model runs ahead for each option and sets it beside "no cull" (the
      baseline). The table says where the options differ most from the baseline: the amount at the
      end, the average over the last ten years, and the lowest point reached.
    </p>
    <lla-public-caution />
    @if (published(); as s) {
      <h2>{{ s.horizon }} {{ s.model.timeUnit }}s under each option</h2>
      @if (request(); as r) {
        <tropline-scenario-comparison [model]="s.model" [request]="r" />
      } @else {
        <p role="alert">The published moor model has no deer to cull.</p>
      }
    } @else {
      <lla-published-status [state]="state()" />
    }
  `,
  styles: `
    .lla-lede {
      font: var(--mat-sys-body-large);
      max-width: 70ch;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HarvestPage {
  protected readonly state = publishedScenario(HOBCAIRN_MOOR);
  protected readonly published = computed(() => readyScenario(this.state()));
  protected readonly request = computed(() => {
    const s = this.published();
    return s && hobcairnComparison(s);
  });
}
