import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { BifurcationChart, RegimeSummary, type TroplineApiError } from '@tropline/widgets';
import { catchError, map, of, switchMap } from 'rxjs';
import { ElementHost } from './element-host';
import { sweepRequest } from './published-scenarios';

/**
 * `<tropline-long-run>`: a published scenario's long-run behaviour — the regime summary in
 * plain words (with the cautions) and the bifurcation chart the publisher chose.
 */
@Component({
  selector: 'tropline-long-run-element',
  imports: [NgComponentOutlet],
  template: `
    @if (published()) {
      <ng-container
        *ngComponentOutlet="
          summary;
          inputs: summaryInputs();
          injector: environment();
          environmentInjector: environment()
        "
      />
      @if (chartInputs(); as c) {
        <ng-container
          *ngComponentOutlet="
            chart;
            inputs: c;
            injector: environment();
            environmentInjector: environment()
          "
        />
      }
    } @else {
      <p class="tropline-element__missing" role="alert">{{ missingMessage() }}</p>
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-element' },
})
export class LongRunElement extends ElementHost {
  protected readonly summary = RegimeSummary;
  protected readonly chart = BifurcationChart;

  private readonly assessment = toSignal(
    toObservable(computed(() => ({ client: this.client(), scenario: this.published() }))).pipe(
      switchMap(({ client, scenario }) =>
        scenario
          ? client.regime({ model: scenario.model, initial: scenario.initial }).pipe(
              map((regime) => ({ regime, error: undefined })),
              catchError((error: TroplineApiError) => of({ regime: undefined, error })),
            )
          : of({ regime: undefined, error: undefined }),
      ),
    ),
  );
  private readonly equilibria = toSignal(
    toObservable(computed(() => ({ client: this.client(), scenario: this.published() }))).pipe(
      switchMap(({ client, scenario }) =>
        scenario
          ? client.equilibria({ model: scenario.model }).pipe(
              map((r) => r.equilibria),
              catchError(() => of([])),
            )
          : of([]),
      ),
    ),
    { initialValue: [] },
  );

  protected readonly summaryInputs = computed(() => ({
    model: this.published()!.model,
    regime: this.assessment()?.regime,
    error: this.assessment()?.error,
    equilibria: this.equilibria(),
  }));
  protected readonly chartInputs = computed(() => {
    const s = this.published();
    const request = s && sweepRequest(s);
    return request ? { request, label: `Long-run peaks: ${s.title}` } : undefined;
  });
}
