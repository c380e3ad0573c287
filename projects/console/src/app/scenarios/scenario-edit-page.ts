import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  ElementRef,
  inject,
  Injector,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { ChainModel } from '@tropline/core';
import {
  DEFAULT_TROPLINE_STRINGS,
  formatUnit,
  ParameterForm,
  TROPLINE_STRINGS,
  type ApiFieldError,
} from '@tropline/widgets';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialog, type ConfirmData } from '../common/confirm-dialog';
import { PageData } from '../common/page-data';
import { Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type FieldProblem, type ProblemText } from '../problem/problem-text';
import { ConsoleSession } from '../session/console-session';
import {
  editedBody,
  editingBounds,
  editorValues,
  editProblems,
  fieldId,
  fieldTarget,
  HORIZON_RANGE,
  MAX_CHANGE_NOTE,
  type EditorValues,
  type FieldTarget,
} from './scenario-editor-form';
import { ScenariosApi } from './scenarios-api';
import type { Scenario, ScenarioVersion } from './scenario-types';

/** One problem of the save, with the field it belongs to. */
interface ShownProblem extends FieldProblem {
  readonly target: FieldTarget;
}

async function loadLatest(api: ScenariosApi, id: string) {
  const scenario = await api.get(id);
  const latest = await api.version(id, scenario.latestVersion);
  return { scenario, latest };
}

function levelGroup(l: EditorValues['levels'][number]) {
  return new FormGroup({
    name: new FormControl(l.name, { nonNullable: true, validators: [Validators.required] }),
    unit: new FormControl(l.unit, { nonNullable: true, validators: [Validators.required] }),
    initial: new FormControl<number | null>(l.initial, [Validators.required, Validators.min(0)]),
  });
}

/**
 * Edits the latest version of a scenario into a new one: the text fields, each level's name,
 * unit and start, the horizon, and the model's parameters in the library's parameter form, with
 * a change note. Problems (from the contract's own check before sending, or the server's
 * answer) appear beside their fields and in a summary that links to each.
 */
@Component({
  selector: 'tc-scenario-edit-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButton,
    MatError,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    MatProgressBar,
    MatSuffix,
    ParameterForm,
    ProblemAlert,
    Skeleton,
  ],
  providers: [
    {
      provide: TROPLINE_STRINGS,
      useValue: { ...DEFAULT_TROPLINE_STRINGS, resetToPublished: 'Undo parameter changes' },
    },
  ],
  templateUrl: './scenario-edit-page.html',
  styleUrl: './scenario-edit-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(window:beforeunload)': 'warnBeforeUnload($event)' },
})
export class ScenarioEditPage {
  private readonly api = inject(ScenariosApi);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly session = inject(ConsoleSession);
  private readonly injector = inject(Injector);

  /** The scenario id, from the route. */
  readonly id = input.required<string>();

  protected readonly ids = fieldId;
  protected readonly horizonMax = HORIZON_RANGE.max;
  protected readonly noteMax = MAX_CHANGE_NOTE;
  protected readonly data = new PageData(
    () => loadLatest(this.api, this.id()),
    'load the scenario',
  );
  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    description: new FormControl('', { nonNullable: true }),
    location: new FormControl('', { nonNullable: true }),
    horizon: new FormControl<number | null>(null, [
      Validators.required,
      Validators.min(Number.MIN_VALUE),
      Validators.max(HORIZON_RANGE.max),
    ]),
    levels: new FormArray<ReturnType<typeof levelGroup>>([]),
    changeNote: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(MAX_CHANGE_NOTE)],
    }),
  });
  /** The model with the parameter form's edits; undefined while unchanged. */
  protected readonly edited = signal<ChainModel | undefined>(undefined);
  protected readonly saving = signal(false);
  protected readonly problems = signal<readonly ShownProblem[]>([]);
  /** A failure that belongs to no field (a conflict, the network…). */
  protected readonly failure = signal<ProblemText | undefined>(undefined);
  /** Whether someone saved a newer version while this edit was open. */
  protected readonly conflict = signal(false);
  protected readonly bounds = computed(() => {
    const model = this.data.value()?.latest.content?.model;
    return model ? editingBounds(model) : [];
  });
  protected readonly parameterProblems = computed(() =>
    this.problems().filter((p) => p.target.kind === 'parameter'),
  );
  /** The server's field errors of the last save, which the parameter form puts on its fields. */
  protected readonly serverErrors = signal<readonly ApiFieldError[]>([]);
  private readonly summary = viewChild<ElementRef<HTMLElement>>('summary');
  private readonly parameterForm = viewChild(ParameterForm);
  private saved = false;

  constructor() {
    effect(() => {
      this.id();
      this.session.tenant();
      untracked(() => void this.load());
    });
  }

  /** Loads the latest version into the form (again, after a conflict: edits are dropped). */
  protected async load(): Promise<void> {
    this.conflict.set(false);
    this.failure.set(undefined);
    this.problems.set([]);
    this.serverErrors.set([]);
    await this.data.load();
    const content = this.data.value()?.latest.content;
    if (!content) return;
    const values = editorValues(content);
    const levels = this.form.controls.levels;
    levels.clear();
    values.levels.forEach((l) => levels.push(levelGroup(l)));
    this.form.reset({ ...values, levels: [...values.levels] });
    this.edited.set(undefined);
  }

  protected levelId(i: number): string {
    return this.data.value()?.latest.content?.model.levels[i]?.id ?? '';
  }

  protected readonly unit = formatUnit;

  protected timeUnit(): string {
    return this.data.value()?.latest.content?.model.timeUnit ?? '';
  }

  /** The message under a field: its own check, or the problem reported for its pointer. */
  protected message(control: FormControl<unknown>, what: string): string {
    const e = control.errors ?? {};
    if (typeof e['problem'] === 'string') return e['problem'];
    if (e['required']) return `Enter ${what}.`;
    if (e['min']) return `${capital(what)} must be at least ${e['min'].min}.`;
    if (e['max']) return `${capital(what)} must be at most ${e['max'].max}.`;
    if (e['maxlength']) return `At most ${e['maxlength'].requiredLength} characters.`;
    return '';
  }

  protected async save(): Promise<void> {
    const d = this.data.value();
    const content = d?.latest.content;
    if (!d || !content || this.saving()) return;
    this.failure.set(undefined);
    const model = this.edited() ?? content.model;
    const body = editedBody(content, model, this.values(), d.latest.version);
    const found = [...this.parameterFormProblems(), ...editProblems(body)];
    if (found.length) return this.show(found, d.latest);
    this.saving.set(true);
    try {
      const saved = await this.api.save(d.scenario.id, body);
      this.saved = true;
      await this.router.navigate(['/scenarios', d.scenario.id], {
        state: { announce: `Version ${saved.version.version} saved: ${body.changeNote}` },
      });
    } catch (err) {
      const p = problemText(err, 'save the version');
      // A newer version (409 at /baseVersion) belongs to no field: the alert offers what to do.
      this.conflict.set(p.status === 409);
      if (p.fields.length && p.status !== 409) {
        this.serverErrors.set(p.fields);
        this.show(p.fields, d.latest);
      }
      this.failure.set(p.fields.length && p.status !== 409 ? undefined : p);
    } finally {
      this.saving.set(false);
    }
  }

  /** Moves the focus to the field a summary entry names. */
  protected focus(p: ShownProblem, event: Event): void {
    event.preventDefault();
    const el =
      p.target.kind === 'field'
        ? this.host.nativeElement.querySelector<HTMLElement>(`#${p.target.id}`)
        : p.target.kind === 'parameter'
          ? this.host.nativeElement.querySelector<HTMLElement>(`#${this.parameterId(p.target)}`)
          : null;
    el?.focus();
  }

  protected href(p: ShownProblem): string {
    if (p.target.kind === 'field') return `#${p.target.id}`;
    return p.target.kind === 'parameter' ? `#${this.parameterId(p.target)}` : '#';
  }

  /** The id the parameter form gives a parameter's field (from its pointer). */
  private parameterId(target: FieldTarget & { kind: 'parameter' }): string {
    return this.parameterForm()?.fieldId(target.pointer) ?? 'tc-edit-parameters';
  }

  /** Whether leaving loses edits; asks first when it does. */
  async canLeave(): Promise<boolean> {
    if (this.saved || (!this.form.dirty && !this.edited())) return true;
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: 'Leave without saving?',
        message: 'Your changes to this scenario are not saved as a version and will be lost.',
        confirm: 'Leave without saving',
      },
    });
    return (await firstValueFrom(ref.afterClosed())) === true;
  }

  protected warnBeforeUnload(event: BeforeUnloadEvent): void {
    if (!this.saved && (this.form.dirty || this.edited())) event.preventDefault();
  }

  private values(): EditorValues {
    const v = this.form.getRawValue();
    return { ...v, levels: v.levels.map((l) => ({ ...l })) };
  }

  /**
   * What the parameter form refuses (out of range, or a value the model refuses): it keeps such
   * a value to itself and emits nothing, so a save would otherwise send the last valid model.
   */
  private parameterFormProblems(): FieldProblem[] {
    const form = this.parameterForm();
    if (!form || form.valid()) return [];
    return form
      .problems()
      .filter((p) => !p.fromServer)
      .map((p) => ({ pointer: `/model${p.pointer}`, message: p.message }));
  }

  private show(found: readonly FieldProblem[], latest: ScenarioVersion): void {
    const model = latest.content!.model;
    const shown = found.map((f) => ({
      ...f,
      message: fieldMessage(f),
      target: fieldTarget(f.pointer, model),
    }));
    for (const p of shown) {
      if (p.target.kind !== 'field') continue;
      const control = this.controlFor(p.target.id);
      control?.setErrors({ ...(control.errors ?? {}), problem: p.message });
      control?.markAsTouched();
    }
    this.problems.set(shown);
    afterNextRender(() => this.summary()?.nativeElement.focus(), { injector: this.injector });
  }

  private controlFor(id: string): FormControl<unknown> | undefined {
    const c = this.form.controls;
    const byId: Record<string, FormControl<unknown>> = {
      [fieldId.name]: c.name as FormControl<unknown>,
      [fieldId.description]: c.description as FormControl<unknown>,
      [fieldId.location]: c.location as FormControl<unknown>,
      [fieldId.horizon]: c.horizon as FormControl<unknown>,
      [fieldId.changeNote]: c.changeNote as FormControl<unknown>,
    };
    c.levels.controls.forEach((g, i) => {
      byId[fieldId.levelName(i)] = g.controls.name as FormControl<unknown>;
      byId[fieldId.levelUnit(i)] = g.controls.unit as FormControl<unknown>;
      byId[fieldId.initial(i)] = g.controls.initial as FormControl<unknown>;
    });
    return byId[id];
  }

  /** For the template: the scenario being edited. */
  protected scenario(): Scenario | undefined {
    return this.data.value()?.scenario;
  }
}

/**
 * A contract message as it reads beside its field: without the field's own name in front
 * ("growthRate must be greater than zero" → "Must be greater than zero").
 */
function fieldMessage(f: FieldProblem): string {
  const name = f.pointer.split('/').at(-1) ?? '';
  const rest =
    name && f.message.startsWith(name + ' ') ? f.message.slice(name.length + 1) : f.message;
  return capital(rest);
}

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
