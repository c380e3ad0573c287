import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import type { ChainModel, Equilibrium } from '@tropline/core/contract';
import type { RegimeResponse } from '../api/analysis-types';
import type { TroplineApiError } from '../api/problem-message';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { CautionNotice, DEFAULT_CAUTIONS } from '../caution-notice/caution-notice';
import { regimeSummaryText } from './regime-summary-text';

let nextId = 0;

/**
 * The long-run behaviour in plain words: the regime, the largest Lyapunov exponent with its
 * error, the predictability horizon in the model's time unit, the equilibria with their
 * stability, and the cautions (always shown).
 */
@Component({
  selector: 'tropline-regime-summary',
  imports: [CautionNotice],
  templateUrl: './regime-summary.html',
  styleUrl: './regime-summary.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-regime-summary' },
})
export class RegimeSummary {
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** The model the regime belongs to (names, units, time unit). */
  readonly model = input.required<ChainModel>();
  /** The regime assessment; undefined while it is computed. */
  readonly regime = input<RegimeResponse | undefined>(undefined);
  /** The model's equilibria. */
  readonly equilibria = input<readonly Equilibrium[]>([]);
  /** Why the assessment is not available, when it failed. */
  readonly error = input<TroplineApiError | undefined>(undefined);
  /** Whether the cautions are shown here (a composite showing them once may turn this off). */
  readonly showCautions = input<boolean>(true);
  /** The cautions to show with it. */
  readonly cautions = input<readonly string[]>(DEFAULT_CAUTIONS);

  protected readonly headingId = `tropline-regime-summary-${nextId++}`;
  protected readonly text = computed(() => {
    const regime = this.regime();
    return regime
      ? regimeSummaryText(
          this.model(),
          regime,
          this.equilibria(),
          this.options.locale,
          this.strings,
        )
      : undefined;
  });
}
