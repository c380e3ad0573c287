import { ChangeDetectionStrategy, Component } from '@angular/core';
import { LAKE_DEMO } from '@tropline/core';
import { ProjectionPanel } from '@tropline/widgets';

/**
 * The mere's plankton chain as the authority's analysts set it up: Tropline's invented lake
 * demo (green algae, Daphnia, juvenile yellow perch in g C m⁻², weekly time step).
 */
const BRACKENLOW_MERE = LAKE_DEMO;

/** Home page: what lives in the mere and how its food chain may change. */
@Component({
  selector: 'lla-home-page',
  imports: [ProjectionPanel],
  template: `
    <h1>Living waters of Brackenlow Mere</h1>
    <p class="lla-lede">
      Green algae feed the water fleas (Daphnia), and young yellow perch eat the water fleas. How
      these three rise and fall together tells our biologists whether the mere is settling down,
      swinging in cycles, or changing in ways no one can predict far ahead.
    </p>
    <h2>The next four years, week by week, as the model sees them</h2>
    <tropline-projection-panel
      [model]="model"
      [initial]="initial"
      [horizon]="208"
      [samples]="833"
    />
  `,
  styles: `
    .lla-lede {
      font: var(--mat-sys-body-large);
      max-width: 70ch;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HomePage {
  protected readonly model = BRACKENLOW_MERE.model;
  protected readonly initial = { ...BRACKENLOW_MERE.initial };
}
