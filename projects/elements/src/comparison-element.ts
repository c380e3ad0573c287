import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { ScenarioComparison } from '@tropline/widgets';
import { ElementHost } from './element-host';
import { comparisonRequest } from './published-scenarios';

/**
 * `<tropline-comparison>`: the scenario comparison of a published scenario's management
 * alternatives against its baseline, with the cautions.
 */
@Component({
  selector: 'tropline-comparison-element',
  imports: [NgComponentOutlet],
  template: `
    @if (inputs(); as i) {
      <ng-container
        *ngComponentOutlet="
          comparison;
          inputs: i;
          injector: environment();
          environmentInjector: environment()
        "
      />
    } @else {
      <p class="tropline-element__missing" role="alert">{{ reason() }}</p>
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-element' },
})
export class ComparisonElement extends ElementHost {
  protected readonly comparison = ScenarioComparison;
  protected readonly inputs = computed(() => {
    const s = this.published();
    const request = s && comparisonRequest(s);
    return request ? { model: s.model, request } : undefined;
  });
  protected readonly reason = computed(() =>
    this.published()
      ? 'This published scenario has no management alternatives to compare.'
      : this.missingMessage(),
  );
}
