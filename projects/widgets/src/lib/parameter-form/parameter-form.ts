import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  ErrorHandler,
  inject,
  input,
  linkedSignal,
  output,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidatorFn,
} from '@angular/forms';
import { MatButton } from '@angular/material/button';
import type { ErrorStateMatcher } from '@angular/material/core';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatSlider, MatSliderThumb } from '@angular/material/slider';
import type { ChainModel } from '@tropline/core/contract';
import { map, startWith, switchMap, tap } from 'rxjs';
import type { ApiFieldError } from '../api/problem-message';
import { TROPLINE_OPTIONS } from '../api/tropline-options';
import { TROPLINE_STRINGS } from '../api/tropline-strings';
import { claimIdPrefix, releaseIdPrefix } from './parameter-form-ids';
import {
  checkParameters,
  contractMessage,
  fieldErrorMessages,
  fieldProblem,
  PARAMETER_ID_PREFIX,
  type ParameterBounds,
  type ParameterField,
  parameterFieldId,
  parameterGroups,
} from './parameter-form-schema';

let nextId = 0;

type Values = Record<string, number | null>;

/** One problem the form shows, with the field it sits under. */
export interface ParameterProblem {
  /** JSON Pointer of the parameter into the model. */
  readonly pointer: string;
  /** Element id of the field's numeric input (link to it with `#id`); null for the whole form. */
  readonly id: string | null;
  /** The field's label. */
  readonly label: string;
  /** The message, as shown under the field. */
  readonly message: string;
  /** Whether it came from the host's `fieldErrors` (the server) rather than the form's checks. */
  readonly fromServer: boolean;
}

/** The form's own verdict on its values, recomputed at every change. */
interface FormState {
  readonly values: Values;
  /** The model with the values, when the form and the model accept them. */
  readonly model: ChainModel | null;
  /** The model's complaints about values in range, by field key ('' for no field). */
  readonly refused: Readonly<Record<string, string>>;
}

/**
 * The model's parameters as a form: grouped by level, each a slider paired with a numeric field
 * and its unit, limited to what the publisher allowed and to what the model contract accepts.
 * Every valid change comes out of `modelChange` as a whole new model; an invalid one shows its
 * message under its field and emits nothing until it is valid again. A host can put the
 * server's field errors on the fields (`fieldErrors`), link to a field by its stable id
 * (`idPrefix` + the parameter's pointer) and read `valid` and `problems`.
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
  host: {
    class: 'tropline-parameter-form',
    '[class.tropline-parameter-form--invalid]': '!valid()',
  },
})
export class ParameterForm {
  private readonly options = inject(TROPLINE_OPTIONS);
  private readonly errorHandler = inject(ErrorHandler);
  /** The wording in use. */
  protected readonly strings = inject(TROPLINE_STRINGS);

  /** The published model; its values are the reset values. */
  readonly model = input.required<ChainModel>();
  /** What the public may change; absent means every parameter, from 0 to twice its value. */
  readonly bounds = input<readonly ParameterBounds[] | undefined>(undefined);
  /** Heading of the form. */
  readonly heading = input<string | undefined>(undefined);
  /**
   * Field errors from the server (a problem document's `errors[]`, e.g. `TroplineApiError`'s
   * `fieldErrors`), each shown under the field its JSON Pointer names until that field is
   * edited. Errors naming no editable field are left to the host.
   */
  readonly fieldErrors = input<readonly ApiFieldError[]>([]);
  /** Where the model sits in the request `fieldErrors` answer (`/model` in Tropline's API). */
  readonly modelPointer = input<string>('/model');
  /**
   * Start of every field id: `<idPrefix>-<pointer tokens>`, e.g.
   * `tropline-param-levels-1-handlingTime`. A second form on the page with the same prefix gets
   * `<idPrefix>-2`; give each form its own prefix to know its ids in advance.
   */
  readonly idPrefix = input<string>(PARAMETER_ID_PREFIX);

  /** Every valid edit, as the whole model with the new values. */
  readonly modelChange = output<ChainModel>();
  /** Emits when the reader resets the form to the published values. */
  readonly resetToPublished = output<void>();
  /** Emits the new validity whenever it changes (the form starts valid). */
  readonly validChange = output<boolean>();

  protected readonly headingId = `tropline-parameter-form-${nextId++}`;
  protected readonly groups = computed(() =>
    parameterGroups(this.model(), this.bounds(), this.strings),
  );
  private readonly fields = computed(() => this.groups().flatMap((g) => g.fields));
  private readonly editable = computed(() => this.fields().filter((f) => f.editable));
  private claimed: string | undefined;
  /** The prefix this form's ids use (claimed so that two forms on a page never share one). */
  private readonly prefix = computed(() => {
    if (this.claimed) releaseIdPrefix(this.claimed);
    this.claimed = claimIdPrefix(this.idPrefix());
    return this.claimed;
  });
  /** One control per editable field, keyed by `field.key`. */
  protected readonly form = computed(() => {
    const controls: Record<string, FormControl<number | null>> = {};
    for (const f of this.editable()) {
      controls[f.key] = new FormControl<number | null>(f.value, [this.validator(f)]);
    }
    return new FormGroup(controls);
  });
  private last: FormState | undefined;
  /**
   * The form's values and verdict as they change. The slider follows them and writes through
   * `slide()`: two inputs bound to one FormControl do not update each other (a view's change
   * reaches the model only), so the slider and its numeric field would drift apart.
   */
  private readonly state = toSignal(
    toObservable(this.form).pipe(
      switchMap((form) =>
        form.valueChanges.pipe(
          startWith(null),
          map((_, i) => ({ state: this.check(form), first: i === 0 })),
          tap(({ state, first }) => this.settle(state, first)),
          map(({ state }) => state),
        ),
      ),
    ),
    { initialValue: { values: {}, model: null, refused: {} } as FormState },
  );
  protected readonly values = computed(() => this.state().values);
  /** The server's messages by field key, dropped field by field as the reader edits. */
  private readonly server = linkedSignal(() =>
    fieldErrorMessages(this.fieldErrors(), this.fields(), this.modelPointer()),
  );
  /**
   * Whether the values are ones the form and the model accept. The server's `fieldErrors` do
   * not count (the form cannot know whether the server would still refuse); `problems` has them.
   */
  readonly valid = computed(() => this.state().model !== null);
  /** Every problem shown, field by field in the form's order, the server's included. */
  readonly problems = computed<readonly ParameterProblem[]>(() => {
    const out: ParameterProblem[] = [];
    for (const f of this.editable()) {
      const message = this.message(f);
      if (message) {
        out.push({
          pointer: f.pointer,
          id: this.fieldId(f.pointer),
          label: f.label,
          message,
          fromServer: !!this.server()[f.key],
        });
      }
    }
    const whole = this.state().refused[''];
    if (whole) out.push({ pointer: '', id: null, label: '', message: whole, fromServer: false });
    return out;
  });
  /** Per field, when Material shows its error: a message to show and the field touched. */
  protected readonly matchers = computed(() => {
    const out: Record<string, ErrorStateMatcher> = {};
    for (const f of this.editable()) {
      out[f.key] = {
        isErrorState: (control: AbstractControl | null) =>
          !!this.server()[f.key] ||
          (!!this.message(f) && !!control && (control.dirty || control.touched)),
      };
    }
    return out;
  });
  private readonly numbers = new Intl.NumberFormat(this.options.locale, {
    maximumSignificantDigits: 6,
  });

  constructor() {
    inject(DestroyRef).onDestroy(() => this.claimed && releaseIdPrefix(this.claimed));
  }

  /** The element id of a parameter's numeric field in this form, e.g. for a link to it. */
  fieldId(pointer: string): string {
    return parameterFieldId(pointer, this.prefix());
  }

  /** The message under a field, or null: the server's, then the form's, then the model's. */
  protected message(field: ParameterField): string | null {
    const server = this.server()[field.key];
    if (server) return server;
    const control = this.form().controls[field.key];
    if (control && !control.valid) {
      return fieldProblem(field, control.value, this.options.locale, this.strings);
    }
    return this.state().refused[field.key] ?? null;
  }

  /** A value as written for the reader. */
  protected format(value: number): string {
    return this.numbers.format(value);
  }

  protected range(field: ParameterField): string {
    return this.strings.rangeHint(
      this.format(field.min),
      this.format(field.max),
      field.minExclusive,
    );
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

  private published(): Values {
    return Object.fromEntries(this.fields().map((f) => [f.key, f.value]));
  }

  private validator(field: ParameterField): ValidatorFn {
    return (control) => {
      const problem = fieldProblem(field, control.value, this.options.locale, this.strings);
      return problem ? { parameter: problem } : null;
    };
  }

  /**
   * The verdict on the current values. Never throws: a value the model refuses becomes a
   * message (an exception here would end the change stream and lose every later edit).
   */
  private check(form: FormGroup): FormState {
    const values = form.getRawValue() as Values;
    if (form.invalid) return { values, model: null, refused: {} };
    try {
      const result = checkParameters(this.model(), this.fields(), {
        ...this.published(),
        ...values,
      });
      if (result.ok) return { values, model: result.model, refused: {} };
      const refused: Record<string, string> = {};
      for (const issue of result.issues) {
        const field = this.editable().find((f) => f.pointer === issue.pointer);
        refused[field?.key ?? ''] ??= contractMessage(issue);
      }
      return { values, model: null, refused };
    } catch (err) {
      this.errorHandler.handleError(err);
      return { values, model: null, refused: { '': this.strings.notANumber } };
    }
  }

  /**
   * After each change: drop the server's message of an edited field, and emit. A form built
   * afresh (a new model or bounds) emits no model: nothing was edited.
   */
  private settle(state: FormState, first: boolean): void {
    const before = this.last;
    this.last = state;
    const valid = state.model !== null;
    if ((before ? before.model !== null : true) !== valid) this.validChange.emit(valid);
    if (first || !before) return;
    const edited = Object.keys(state.values).filter((k) => state.values[k] !== before.values[k]);
    if (edited.some((k) => this.server()[k])) {
      this.server.update((m) =>
        Object.fromEntries(Object.entries(m).filter(([k]) => !edited.includes(k))),
      );
    }
    if (state.model) this.modelChange.emit(state.model);
  }
}
