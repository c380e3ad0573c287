import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink } from '@angular/router';
import { ProjectionPanel } from '@tropline/widgets';
import { PublicCaution } from '../common/public-caution';
import { publishedScenario } from '../common/published';

/** Home page: what lives in the mere and how its food chain may change. */
@Component({
  selector: 'lla-home-page',
  imports: [ProjectionPanel, PublicCaution, RouterLink],
  template: `
    <h1>Living waters of Brackenlow Mere</h1>
    <p class="lla-lede">
      Green algae feed the water fleas (Daphnia), and young yellow perch eat the water fleas. How
      these three rise and fall together tells our biologists whether the mere is settling down,
      swinging in cycles, or changing in ways no one can predict far ahead.
    </p>
    <p class="lla-lede">
      You can try two things our analysts have opened to the public: how much algae the water's
      nutrients can carry, and how fast perch die of natural causes. Each stays within the range the
      authority has checked; the chart redraws as you change them.
      <a routerLink="/long-run">What happens in the long run?</a>
    </p>
    <lla-public-caution />
    <h2>The next four years, week by week, as the model sees them</h2>
    <tropline-projection-panel
      [model]="scenario.model"
      [initial]="initial"
      [horizon]="scenario.horizon"
      [samples]="scenario.samples"
      [bounds]="scenario.bounds"
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
  protected readonly scenario = publishedScenario('brackenlow-mere');
  protected readonly initial = { ...this.scenario.initial };
}
