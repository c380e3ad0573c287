import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import {
  BifurcationChart,
  RegimeSummary,
  TroplineClient,
  type RegimeResponse,
  type TroplineApiError,
} from '@tropline/widgets';
import type { Equilibrium } from '@tropline/core';
import { catchError, map, of } from 'rxjs';
import { PublicCaution } from '../common/public-caution';
import { publishedScenario, sweepRequest } from '../common/published';

interface Assessment {
  readonly regime?: RegimeResponse;
  readonly error?: TroplineApiError;
}

/** Long-run behaviour: whether the mere settles, cycles or turns chaotic, and why it matters. */
@Component({
  selector: 'lla-long-run-page',
  imports: [BifurcationChart, RegimeSummary, PublicCaution],
  template: `
    <h1>Brackenlow Mere in the long run</h1>
    <p class="lla-lede">
      Leave the mere alone for many years and its food chain does one of three things: it settles to
      steady numbers, it repeats the same rise and fall in cycles, or it keeps changing without ever
      repeating. In that last, chaotic case a small error in today's survey grows until, after a
      while, the model can say nothing useful about the future. That while is the predictability
      horizon.
    </p>
    <lla-public-caution />
    <h2>What the mere does today</h2>
    <tropline-regime-summary
      [model]="scenario.model"
      [regime]="assessment().regime"
      [error]="assessment().error"
      [equilibria]="equilibria()"
    />
    <h2>How the answer changes with the water fleas' feeding</h2>
    <p class="lla-lede">
      Each column of dots below is one possible value of how long a water flea takes to eat what it
      catches. The dots are the peaks perch reach in the long run: one dot means steady numbers, a
      few dots mean cycles, a smear of dots means chaos. The marked line is the mere's value today.
    </p>
    <tropline-bifurcation-chart
      [request]="sweep"
      label="Long-run perch peaks against water-flea handling time"
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
export class LongRunPage {
  private readonly client = inject(TroplineClient);
  protected readonly scenario = publishedScenario('brackenlow-mere');
  protected readonly sweep = sweepRequest(this.scenario);

  protected readonly assessment = toSignal(
    this.client.regime({ model: this.scenario.model, initial: this.scenario.initial }).pipe(
      map((regime): Assessment => ({ regime })),
      catchError((error: TroplineApiError) => of<Assessment>({ error })),
    ),
    { initialValue: {} as Assessment },
  );
  protected readonly equilibria = toSignal(
    this.client.equilibria({ model: this.scenario.model }).pipe(
      map((r) => r.equilibria),
      catchError(() => of<readonly Equilibrium[]>([])),
    ),
    { initialValue: [] as readonly Equilibrium[] },
  );
}
