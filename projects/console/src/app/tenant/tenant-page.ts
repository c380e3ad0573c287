import { DatePipe, DecimalPipe, formatDate } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { firstValueFrom } from 'rxjs';
import { PageData } from '../common/page-data';
import { Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { ConsoleSession } from '../session/console-session';
import { PlanChangeDialog, type PlanChangeData } from './plan-change-dialog';
import { currentPlanName, offerCards, sharePercent, type OfferCard } from './plan-view';
import { TenantApi, type TenantChange, type TenantPlan } from './tenant-api';

/** When the month's count starts again, in words (UTC, as the server counts). */
function resetsOn(iso: string): string {
  return `${formatDate(iso, 'd MMMM y, HH:mm', 'en-US', 'UTC')} UTC`;
}

/**
 * The owner's page: the tenant's name and contact address for quota alerts, its plan with this
 * month's units, and the plans on offer, each chosen through a confirmation.
 */
@Component({
  selector: 'tc-tenant-page',
  imports: [
    DatePipe,
    DecimalPipe,
    ReactiveFormsModule,
    MatButton,
    MatFormFieldModule,
    MatIcon,
    MatInput,
    MatProgressBar,
    Skeleton,
    ProblemAlert,
  ],
  templateUrl: './tenant-page.html',
  styleUrl: './tenant-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TenantPage {
  private readonly api = inject(TenantApi);
  private readonly dialog = inject(MatDialog);
  protected readonly session = inject(ConsoleSession);

  protected readonly settings = new PageData(() => this.api.settings(), 'load the tenant');
  protected readonly plan = new PageData(() => this.api.plan(), 'load the plan');
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(200), Validators.pattern(/\S/)]],
    contactEmail: ['', [Validators.email, Validators.maxLength(254)]],
  });
  protected readonly saving = signal(false);
  protected readonly formProblem = signal<ProblemText | undefined>(undefined);
  protected readonly savedNote = signal('');
  protected readonly planNote = signal('');

  protected readonly cards = computed(() => {
    const p = this.plan.value();
    return p ? offerCards(p) : [];
  });
  protected readonly planName = computed(() => {
    const p = this.plan.value();
    return p ? currentPlanName(p) : '';
  });
  protected readonly share = computed(() => {
    const p = this.plan.value();
    return p ? sharePercent(p.usage.used, p.current.monthlyUnits) : 0;
  });
  protected readonly resetsOn = computed(() => {
    const p = this.plan.value();
    return p ? resetsOn(p.usage.resetsAt) : '';
  });

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => {
        void this.settings.load();
        void this.plan.load();
      });
    });
    effect(() => {
      const s = this.settings.value();
      if (s) untracked(() => this.form.reset({ name: s.name, contactEmail: s.contactEmail ?? '' }));
    });
  }

  protected async save(): Promise<void> {
    const before = this.settings.value();
    if (!before) return;
    if (this.form.invalid) return this.form.markAllAsTouched();
    const { name, contactEmail } = this.form.getRawValue();
    const change: { -readonly [K in keyof TenantChange]: TenantChange[K] } = {};
    if (name.trim() !== before.name) change.name = name.trim();
    const email = contactEmail.trim() || null;
    if (email !== before.contactEmail) change.contactEmail = email;
    this.formProblem.set(undefined);
    if (Object.keys(change).length === 0) {
      this.savedNote.set('Nothing has changed, so nothing was saved.');
      return;
    }
    this.saving.set(true);
    try {
      this.settings.value.set(await this.api.update(change));
      this.savedNote.set('Saved.');
      // The toolbar and tenant menu show the name from the session.
      if (change.name) await this.session.refresh();
    } catch (err) {
      this.savedNote.set('');
      this.formProblem.set(problemText(err, 'save the tenant'));
    } finally {
      this.saving.set(false);
    }
  }

  protected async choose(card: OfferCard, plan: TenantPlan): Promise<void> {
    const ref = this.dialog.open<PlanChangeDialog, PlanChangeData, TenantPlan>(PlanChangeDialog, {
      data: {
        plan,
        offer: card.offer,
        resetsOn: resetsOn(plan.usage.resetsAt),
        tenantName: this.session.tenant()?.name ?? 'The tenant',
      },
      maxWidth: '560px',
    });
    const changed = await firstValueFrom(ref.afterClosed());
    if (!changed) return;
    this.plan.value.set(changed);
    this.planNote.set(`The tenant is now on ${card.offer.name}; its limits apply from now on.`);
  }
}
