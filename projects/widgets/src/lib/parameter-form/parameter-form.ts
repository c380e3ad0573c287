import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { outputFromObservable, toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatSlider, MatSliderThumb } from '@angular/material/slider';
import type { ChainModel } from '@tropline/core/contract';
import { filter, map, startWith, switchMap } from 'rxjs';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import {
  applyParameters,
  fieldProblem,
  type ParameterBounds,
  type ParameterField,
  parameterGroups,
} from './parameter-form-schema';

let nextId = 0;

type Values = Record<string, number | null>;

/**
 * The model's parameters as a form: grouped by level, each a slider paired with a numeric field
 * and its unit, limited to what the publisher allowed. Every valid change comes out of
 * `modelChange` as a whole new model; "reset" returns to the published values. Feed `model` the
 * published model, not the edited one, so the form is not rebuilt while someone drags a slider.
 */
@Component({
  selector: 'tropline-parameter-form',
  imports: [
    ReactiveFormsModule,
    MatButton,
    MatError,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    MatSlider,
    MatSliderThumb,
    MatSuffix,
  ],
  templateUrl: './parameter-form.html',
  styleUrl: './parameter-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tropline-parameter-form' },
})
export class ParameterForm {
  private readonly options = inject(TROPLINE_OPTIONS);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** The published model; its values are the reset values. */
  readonly model = input.required<ChainModel>();
  /** What the public may change; absent means every parameter, from 0 to twice its value. */
  readonly bounds = input<readonly ParameterBounds[] | undefined>(undefined);
  /** Heading of the form. */
  readonly heading = input<string | undefined>(undefined);

  protected readonly headingId = `tropline-parameter-form-${nextId++}`;
  protected readonly groups = computed(() =>
    parameterGroups(this.model(), this.bounds(), this.strings),
  );
  private readonly fields = computed(() => this.groups().flatMap((g) => g.fields));
  /** One control per editable field, keyed by `field.key`. */
  protected readonly form = computed(() => {
    const controls: Record<string, FormControl<number | null>> = {};
    for (const f of this.fields()) {
      if (!f.editable) continue;
      controls[f.key] = new FormControl<number | null>(f.value, [
        Validators.required,
        Validators.min(f.min),
        Validators.max(f.max),
      ]);
    }
    return new FormGroup(controls);
  });
  /**
   * The form's values as they change. The slider follows them and writes through `slide()`:
   * two inputs bound to one FormControl do not update each other (a view's change reaches the
   * model only), so the slider and its numeric field would drift apart.
   */
  protected readonly values = toSignal(
    toObservable(this.form).pipe(
      switchMap((form) =>
        form.valueChanges.pipe(
          startWith(null),
          map(() => form.getRawValue() as Values),
        ),
      ),
    ),
    { initialValue: {} as Values },
  );
  private readonly numbers = new Intl.NumberFormat(this.options.locale, {
    maximumSignificantDigits: 6,
  });

  /** Every valid edit, as the whole model with the new values. */
  readonly modelChange = outputFromObservable<ChainModel>(
    toObservable(this.form).pipe(
      switchMap((form) => form.valueChanges.pipe(map(() => form))),
      filter((form) => form.valid),
      map((form) =>
        applyParameters(this.model(), this.fields(), {
          ...this.published(),
          ...(form.getRawValue() as Values),
        }),
      ),
    ),
  );
  /** Emits when the reader resets the form to the published values. */
  readonly resetToPublished = output<void>();

  private published(): Values {
    return Object.fromEntries(this.fields().map((f) => [f.key, f.value]));
  }

  /** The message under a field, or null. */
  protected problem(field: ParameterField): string | null {
    const control = this.form().controls[field.key];
    if (!control || control.valid) return null;
    return fieldProblem(field, control.value, this.options.locale, this.strings);
  }

  /** A value as written for the reader. */
  protected format(value: number): string {
    return this.numbers.format(value);
  }

  protected readonly display = (value: number): string => this.numbers.format(value);

  /** A slider moved: the value goes to its control, and from there to the numeric field. */
  protected slide(key: string, value: number): void {
    const control = this.form().controls[key];
    control?.setValue(value);
    control?.markAsDirty();
  }

  protected reset(): void {
    this.form().reset(this.published());
    this.resetToPublished.emit();
  }
}
