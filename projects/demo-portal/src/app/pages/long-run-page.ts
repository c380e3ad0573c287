import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import {
  BifurcationChart,
  RegimeSummary,
  type RegimeResponse,
  type SweepRequest,
  TroplineClient,
  type TroplineApiError,
} from '@tropline/widgets';
import type { Equilibrium } from '@tropline/core/contract';
import { catchError, map, of, switchMap } from 'rxjs';
import { PublicCaution } from '../common/public-caution';
import {
  BRACKENLOW_MERE,
  publishedScenario,
  PublishedStatus,
  readyScenario,
} from '../common/published';

interface Assessment {
  readonly regime?: RegimeResponse;
  readonly error?: TroplineApiError;
}

/**
 * The sweep this page draws: page content, not part of the published scenario. The water
 * fleas' handling time sets the benchmark's b1 (b1 = 20·h here): 0.1–0.31 week spans
 * b1 = 2.0–6.2. Transient and window are the benchmark's 2000 and 1000 time units at half
 * length, in weeks (the lake's time scale is 1/r = half a week).
 */
const MERE_HANDLING_TIME_SWEEP: Omit<SweepRequest, 'model' | 'initial'> = {
  parameter: '/levels/1/handlingTime',
  from: 0.1,
  to: 0.31,
  steps: 36,
  observe: 'perch',
  transient: 500,
  window: 250,
};

/** Long-run behaviour: whether the mere settles, cycles or turns chaotic, and why it matters. */
@Component({
  selector: 'lla-long-run-page',
  imports: [BifurcationChart, RegimeSummary, PublicCaution, PublishedStatus],
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
    @if (published(); as s) {
      <h2>What the mere does today</h2>
      <tropline-regime-summary
        [model]="s.model"
        [regime]="assessment().regime"
        [error]="assessment().error"
        [equilibria]="equilibria()"
      />
      <h2>How the answer changes with the water fleas' feeding</h2>
      <p class="lla-lede">
        Each column of dots below is one possible value of how long a water flea takes to eat what
        it catches. The dots are the peaks perch reach in the long run: one dot means steady
        numbers, a few dots mean cycles, a smear of dots means chaos. The marked line is the mere's
        value today.
      </p>
      <tropline-bifurcation-chart
        [request]="sweep()!"
        label="Long-run perch peaks against water-flea handling time"
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
export class LongRunPage {
  private readonly client = inject(TroplineClient);
  protected readonly state = publishedScenario(BRACKENLOW_MERE);
  protected readonly published = computed(() => readyScenario(this.state()));
  protected readonly sweep = computed((): SweepRequest | undefined => {
    const s = this.published();
    return s && { ...MERE_HANDLING_TIME_SWEEP, model: s.model, initial: s.initial };
  });

  private readonly published$ = toObservable(this.published);
  protected readonly assessment = toSignal(
    this.published$.pipe(
      switchMap((s) =>
        s
          ? this.client.regime({ model: s.model, initial: s.initial }).pipe(
              map((regime): Assessment => ({ regime })),
              catchError((error: TroplineApiError) => of<Assessment>({ error })),
            )
          : of<Assessment>({}),
      ),
    ),
    { initialValue: {} as Assessment },
  );
  protected readonly equilibria = toSignal(
    this.published$.pipe(
      switchMap((s) =>
        s
          ? this.client.equilibria({ model: s.model }).pipe(
              map((r) => r.equilibria),
              catchError(() => of<readonly Equilibrium[]>([])),
            )
          : of<readonly Equilibrium[]>([]),
      ),
    ),
    { initialValue: [] as readonly Equilibrium[] },
  );
}
