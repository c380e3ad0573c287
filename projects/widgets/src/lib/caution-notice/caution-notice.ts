import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { PROJECTION_CAUTIONS } from '@tropline/core/contract';
import { TROPLINE_STRINGS } from '../api/tropline-strings';

/** The cautions every projection carries, shown by default wherever projections are shown. */
export const DEFAULT_CAUTIONS: readonly string[] = PROJECTION_CAUTIONS;

/** A short, always-visible list of the cautions that go with a projection. */
@Component({
  selector: 'tropline-caution-notice',
  template: `
    <aside class="tropline-caution-notice" [attr.aria-label]="strings.cautionsLabel">
      <span class="material-symbols-outlined" aria-hidden="true">info</span>
      <ul>
        @for (caution of cautions(); track caution) {
          <li>{{ caution }}</li>
        }
      </ul>
    </aside>
  `,
  styles: `
    .tropline-caution-notice {
      display: flex;
      gap: 12px;
      align-items: flex-start;
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium, 12px);
      background: var(--tropline-caution-surface, #fdf1dc);
      color: var(--tropline-caution-on-surface, #2b1a00);
      font: var(--mat-sys-body-medium);
    }
    ul {
      margin: 0;
      padding-left: 18px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CautionNotice {
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** The cautions to list; the API sends them with every projection. */
  readonly cautions = input<readonly string[]>(DEFAULT_CAUTIONS);
}
