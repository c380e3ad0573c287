import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { ProjectionPanel } from '@tropline/widgets';
import { ElementHost } from './element-host';
import { projectionSamples } from './published-analyses';
import { publishedBounds } from './published-scenario';

/**
 * `<tropline-projection>`: the projection panel (bounded parameter form, trajectory chart, phase
 * portrait, regime summary and cautions) for one published scenario, loaded from the API by
 * its public id; what-ifs go through the scenario's published projections route.
 */
@Component({
  selector: 'tropline-projection-element',
  imports: [NgComponentOutlet],
  template: `
    @if (published()) {
      <ng-container
        *ngComponentOutlet="
          panel;
          inputs: inputs();
          injector: environment();
          environmentInjector: environment()
        "
      />
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
export class ProjectionElement extends ElementHost {
  protected readonly panel = ProjectionPanel;
  protected readonly inputs = computed(() => {
    const s = this.published()!;
    return {
      model: s.model,
      initial: { ...s.initial },
      horizon: s.horizon,
      samples: projectionSamples(s),
      bounds: publishedBounds(s),
    };
  });
}
