import { ChangeDetectionStrategy, Component } from '@angular/core';
import { ScenarioComparison } from '@tropline/widgets';
import { PublicCaution } from '../common/public-caution';
import { comparisonRequest, publishedScenario } from '../common/published';

/** Harvest policy: the deer culls under discussion for Hobcairn Moor, side by side. */
@Component({
  selector: 'lla-harvest-page',
  imports: [ScenarioComparison, PublicCaution],
  template: `
    <h1>Deer on Hobcairn Moor: comparing culls</h1>
    <p class="lla-lede">
      Red deer browse the moor's heather, and the grey wolves returning from the north eat deer. Too
      many deer and the heather cannot recover; too few and the wolves go hungry. The authority is
      weighing how many deer, if any, to cull each year.
    </p>
    <p class="lla-lede">
      Below, the model runs forty years ahead for each option and sets it beside "no cull" (the
      baseline). The table says where the options differ most from the baseline: the amount at the
      end, the average over the last ten years, and the lowest point reached.
    </p>
    <lla-public-caution />
    <h2>Forty years under each option</h2>
    <tropline-scenario-comparison [model]="scenario.model" [request]="request" />
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
  protected readonly scenario = publishedScenario('hobcairn-moor');
  protected readonly request = comparisonRequest(this.scenario);
}
