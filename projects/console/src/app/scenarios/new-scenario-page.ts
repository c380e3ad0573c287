import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { Router, RouterLink } from '@angular/router';
import { CHAIN_PRESETS } from '@tropline/core';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { presetDraft, scratchDraft } from './scenario-drafts';
import { ScenariosApi } from './scenarios-api';

/** Creates a scenario from one of the library's preset chains, or a plain two-level chain. */
@Component({
  selector: 'tc-new-scenario-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButton,
    MatFormFieldModule,
    MatInput,
    MatProgressBar,
    MatRadioModule,
    ProblemAlert,
  ],
  templateUrl: './new-scenario-page.html',
  styleUrl: './new-scenario-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewScenarioPage {
  private readonly api = inject(ScenariosApi);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly presets = CHAIN_PRESETS;
  protected readonly start = signal<'preset' | 'scratch'>('preset');
  protected readonly saving = signal(false);
  protected readonly problem = signal<ProblemText | undefined>(undefined);

  protected readonly presetForm = this.fb.group({
    preset: [CHAIN_PRESETS[0]!.id, Validators.required],
    name: ['', [Validators.required, Validators.maxLength(120)]],
  });
  protected readonly scratchForm = this.fb.group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    timeUnit: ['year', Validators.required],
    producerName: ['', Validators.required],
    producerUnit: ['', Validators.required],
    consumerName: ['', Validators.required],
    consumerUnit: ['', Validators.required],
  });

  protected async create(event: Event): Promise<void> {
    // A plain form (two form groups inside): keep the browser from submitting it itself.
    event.preventDefault();
    const form = this.start() === 'preset' ? this.presetForm : this.scratchForm;
    form.markAllAsTouched();
    if (form.invalid) return;
    const body =
      this.start() === 'preset'
        ? presetDraft(
            CHAIN_PRESETS.find((p) => p.id === this.presetForm.controls.preset.value)!,
            this.presetForm.controls.name.value,
          )
        : scratchDraft(this.scratchForm.getRawValue());
    this.saving.set(true);
    this.problem.set(undefined);
    try {
      const saved = await this.api.create(body);
      await this.router.navigate(['/scenarios', saved.scenario.id]);
    } catch (err) {
      this.problem.set(problemText(err, 'create the scenario'));
    } finally {
      this.saving.set(false);
    }
  }
}
