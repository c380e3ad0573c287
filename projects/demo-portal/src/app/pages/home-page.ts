import { ChangeDetectionStrategy, Component, computed, forwardRef } from '@angular/core';
import { RouterLink } from '@angular/router';
import { ProjectionPanel, TroplineClient } from '@tropline/widgets';
import { PublicCaution } from '../common/public-caution';
import {
  BRACKENLOW_MERE,
  projectionSamples,
  PUBLISHED_BINDING,
  type PublishedBinding,
  publishedBounds,
  PublishedProjectionClient,
  publishedScenario,
  PublishedStatus,
  readyScenario,
} from '../common/published';

/**
 * Home page: what lives in the mere and how its food chain may change. The model, start,
 * horizon and public ranges are the mere's published scenario, read from the API; every what-if
 * goes through the scenario's published projections route, where the server holds the ranges.
 */
@Component({
  selector: 'lla-home-page',
  imports: [ProjectionPanel, PublicCaution, PublishedStatus, RouterLink],
  providers: [
    { provide: PUBLISHED_BINDING, useExisting: forwardRef(() => HomePage) },
    { provide: TroplineClient, useClass: PublishedProjectionClient },
  ],
  template: `
    <h1>Living waters of Brackenlow Mere</h1>
    <p class="lla-lede">
      Green algae feed the water fleas (Daphnia), and young yellow perch eat the water fleas. How
      these three rise and fall together tells our biologists whether the mere is settling down,
      swinging in cycles, or changing in ways no one can predict far ahead.
    </p>
    <p class="lla-lede">
      You can try the settings our analysts have opened to the public, listed beside the chart. Each
      stays within the range the authority has checked; the chart redraws as you change them.
      <a routerLink="/long-run">What happens in the long run?</a>
    </p>
    <lla-public-caution />
    @if (published(); as s) {
      <h2>The next {{ s.horizon }} {{ s.model.timeUnit }}s, as the model sees them</h2>
      <tropline-projection-panel
        [model]="s.model"
        [initial]="initial()"
        [horizon]="s.horizon"
        [samples]="samples()"
        [bounds]="bounds()"
      />
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
export class HomePage implements PublishedBinding {
  protected readonly state = publishedScenario(BRACKENLOW_MERE);
  /** The mere's published scenario once loaded; the panel's projections are bound to it. */
  readonly published = computed(() => readyScenario(this.state()));
  protected readonly initial = computed(() => ({ ...this.published()!.initial }));
  protected readonly samples = computed(() => projectionSamples(this.published()!));
  protected readonly bounds = computed(() => publishedBounds(this.published()!));
}
