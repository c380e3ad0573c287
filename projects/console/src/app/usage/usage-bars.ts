import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { describeBars, type UsageBar } from './usage-view';

/**
 * A horizontal bar chart of compute units. Like the widgets' charts it says in words what it
 * shows (the caption), and its data are readable without the drawing: each bar is a list item
 * with its label and value as text; the drawn bar is decoration. The page puts a table beside it.
 */
@Component({
  selector: 'tc-usage-bars',
  template: `
    <figure class="tc-bars">
      <figcaption>
        <span class="tc-bars__title">{{ heading() }}</span>
        <span class="tc-bars__summary">{{ summary() }}</span>
      </figcaption>
      <ul class="tc-bars__list" [class.tc-bars__list--dense]="dense()">
        @for (b of bars(); track b.label) {
          <li class="tc-bars__row">
            <span class="tc-bars__label">{{ b.label }}</span>
            <span class="tc-bars__track" aria-hidden="true">
              <span class="tc-bars__bar" [style.inline-size.%]="b.length"></span>
            </span>
            <span class="tc-bars__value">{{ b.units.toLocaleString('en') }} units</span>
          </li>
        }
      </ul>
    </figure>
  `,
  styles: `
    .tc-bars {
      margin: 0 0 24px;
    }
    figcaption {
      display: flex;
      flex-direction: column;
      gap: 2px;
      margin-bottom: 8px;
    }
    .tc-bars__title {
      font: var(--mat-sys-title-medium);
    }
    .tc-bars__summary {
      color: var(--mat-sys-on-surface-variant);
    }
    .tc-bars__list {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    .tc-bars__row {
      display: grid;
      grid-template-columns: minmax(120px, 14rem) 1fr 8rem;
      gap: 12px;
      align-items: center;
      min-block-size: 28px;
    }
    .tc-bars__list--dense .tc-bars__row {
      min-block-size: 20px;
      font: var(--mat-sys-body-small);
    }
    .tc-bars__track {
      block-size: 12px;
      background: var(--mat-sys-surface-container-high);
      border-radius: 6px;
      overflow: hidden;
    }
    .tc-bars__bar {
      display: block;
      block-size: 100%;
      background: var(--mat-sys-primary);
      border-radius: 6px;
    }
    .tc-bars__value {
      text-align: end;
      font-variant-numeric: tabular-nums;
    }
    @media (forced-colors: active) {
      .tc-bars__bar {
        background: CanvasText;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UsageBars {
  /** The chart's title. */
  readonly heading = input.required<string>();
  /** What each bar stands for, in words for the summary ("per key"). */
  readonly per = input.required<string>();
  /** The bars. */
  readonly bars = input.required<readonly UsageBar[]>();
  /** Whether rows are compact (a bar per day). */
  readonly dense = input<boolean>(false);
  protected readonly summary = computed(() => describeBars(this.per(), this.bars()));
}
