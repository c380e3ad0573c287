import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { ScenarioComparison } from '@tropline/widgets';
import { ElementHost } from './element-host';
import { boundsComparison } from './published-analyses';

/**
 * `<tropline-comparison>`: a published scenario against its own public ranges (each public
 * parameter at its lowest and highest allowed value), with the cautions.
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
    } @else if (published()) {
      <p class="tropline-element__missing" role="alert">
        This published scenario lets the public change nothing, so there is nothing to compare.
      </p>
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
export class ComparisonElement extends ElementHost {
  protected readonly comparison = ScenarioComparison;
  protected readonly inputs = computed(() => {
    const s = this.published();
    const request = s && boundsComparison(s);
    return request ? { model: s.model, request } : undefined;
  });
}
