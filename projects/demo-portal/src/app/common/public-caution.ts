import { ChangeDetectionStrategy, Component } from '@angular/core';

/**
 * The authority's own reminder, in plain words, beside every page that shows projections (the
 * widgets show Tropline's cautions too; this says what they mean for a resident).
 */
@Component({
  selector: 'lla-public-caution',
  template: `
    <aside class="lla-public-caution" aria-labelledby="lla-public-caution-heading">
      <h2 id="lla-public-caution-heading">Before you read the charts</h2>
      <ul>
        <li>
          These are what-ifs from a model, made to compare choices. They are not forecasts of what
          will happen.
        </li>
        <li>
          Where the model behaves chaotically, small differences grow fast: beyond the
          predictability horizon shown on the chart, no projection can be trusted.
        </li>
        <li>
          Decisions on harvests, culls and stocking are made by the authority's qualified biologists
          under the law that applies here, not by this page.
        </li>
      </ul>
    </aside>
  `,
  styles: `
    .lla-public-caution {
      margin: 24px 0;
      padding: 12px 20px;
      border-left: 6px solid var(--mat-sys-tertiary);
      background: var(--mat-sys-surface-container-low);
      max-width: 80ch;
    }
    h2 {
      margin: 4px 0 8px;
      font: var(--mat-sys-title-medium);
    }
    ul {
      margin: 0 0 8px;
      padding-left: 20px;
      font: var(--mat-sys-body-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PublicCaution {}
