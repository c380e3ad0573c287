import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { ProjectionPanel } from '@tropline/widgets';
import { ElementHost } from './element-host';

/**
 * `<tropline-projection>`: the projection panel (bounded parameter form, trajectory chart, phase
 * portrait, regime summary and cautions) for one published scenario.
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
    } @else {
      <p class="tropline-element__missing" role="alert">{{ missingMessage() }}</p>
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
      samples: s.samples,
      bounds: s.bounds,
    };
  });
}
