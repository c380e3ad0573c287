import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';

/** Grey placeholder rows while a page loads, announced once to screen readers. */
@Component({
  selector: 'tc-skeleton',
  template: `
    <div class="tc-skeleton" role="status" [attr.aria-label]="label()">
      @for (r of rowList(); track r) {
        <div class="tc-skeleton__row"></div>
      }
    </div>
  `,
  styles: `
    .tc-skeleton__row {
      height: 40px;
      margin-block: 8px;
      border-radius: 8px;
      background: linear-gradient(
        90deg,
        var(--mat-sys-surface-container) 0%,
        var(--mat-sys-surface-container-high) 50%,
        var(--mat-sys-surface-container) 100%
      );
      background-size: 200% 100%;
      animation: tc-shimmer 1.6s linear infinite;
    }
    @keyframes tc-shimmer {
      to {
        background-position: -200% 0;
      }
    }
    @media (prefers-reduced-motion: reduce) {
      .tc-skeleton__row {
        animation: none;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Skeleton {
  /** How many placeholder rows. */
  readonly rows = input<number>(4);
  /** What is loading, for screen readers. */
  readonly label = input<string>('Loading…');
  protected readonly rowList = computed(() => Array.from({ length: this.rows() }, (_, i) => i));
}

/** A friendly empty state: an icon, a heading and what to do next (projected). */
@Component({
  selector: 'tc-empty-state',
  imports: [MatIcon],
  template: `
    <section class="tc-empty">
      <mat-icon fontSet="material-symbols-outlined" aria-hidden="true">{{ icon() }}</mat-icon>
      <h2>{{ heading() }}</h2>
      <ng-content />
    </section>
  `,
  styles: `
    .tc-empty {
      text-align: center;
      padding: 32px 16px;
      border: 1px dashed var(--mat-sys-outline-variant);
      border-radius: 16px;
    }
    .tc-empty mat-icon {
      font-size: 40px;
      width: 40px;
      height: 40px;
      color: var(--mat-sys-primary);
    }
    h2 {
      font: var(--mat-sys-title-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EmptyState {
  /** Material Symbols ligature. */
  readonly icon = input<string>('inbox');
  /** The heading. */
  readonly heading = input.required<string>();
}
