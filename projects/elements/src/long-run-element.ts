import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { BifurcationChart, RegimeSummary, type TroplineApiError } from '@tropline/widgets';
import { catchError, map, of, switchMap } from 'rxjs';
import { ElementHost } from './element-host';
import { boundsSweep } from './published-analyses';

/**
 * `<tropline-long-run>`: a published scenario's long-run behaviour — the regime summary in
 * plain words (with the cautions) and a bifurcation chart across the first public range.
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
    } @else if (refusal(); as r) {
      <div class="tropline-element__missing" role="alert">
        <strong>{{ r.title }}</strong>
        <p>{{ r.message }}</p>
      </div>
    } @else {
      <p class="tropline-element__loading" role="status">Loading the published scenario…</p>
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
    const request = s && boundsSweep(s);
    return request ? { request, label: `Long-run peaks: ${s.name}` } : undefined;
  });
}
