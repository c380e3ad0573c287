import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressBar } from '@angular/material/progress-bar';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { currentPlanPhrase, planChangeSummary } from './plan-view';
import { TenantApi, type PlanOffer, type TenantPlan } from './tenant-api';

/** What the confirmation is about. */
export interface PlanChangeData {
  readonly plan: TenantPlan;
  readonly offer: PlanOffer;
  /** When this month's count starts again, already in words. */
  readonly resetsOn: string;
  readonly tenantName: string;
}

/**
 * Confirmation of a plan change: the numbers before and after and what follows from them.
 * The server may still refuse (someone used units meanwhile); the refusal shows here.
 */
@Component({
  selector: 'tc-plan-change-dialog',
  imports: [DecimalPipe, MatDialogModule, MatButton, MatProgressBar, ProblemAlert],
  template: `
    <h2 mat-dialog-title>Move to {{ data.offer.name }}?</h2>
    <mat-dialog-content>
      <p>{{ data.tenantName }} is on {{ from }} now.</p>
      <table class="tc-change">
        <caption class="tc-visually-hidden">
          The plan now and after the change
        </caption>
        <thead>
          <tr>
            <th scope="col"><span class="tc-visually-hidden">Limit</span></th>
            <th scope="col" class="tc-num">Now</th>
            <th scope="col" class="tc-num">{{ data.offer.name }}</th>
          </tr>
        </thead>
        <tbody>
          @for (r of summary.rows; track r.label) {
            <tr>
              <th scope="row">{{ r.label }}</th>
              <td class="tc-num">{{ r.now | number }}</td>
              <td class="tc-num" [class.tc-less]="r.after < r.now">{{ r.after | number }}</td>
            </tr>
          }
        </tbody>
      </table>
      <ul class="tc-effects">
        @for (e of summary.effects; track $index) {
          <li>{{ e }}</li>
        }
      </ul>
      <tc-problem-alert [problem]="problem()" />
      @if (busy()) {
        <mat-progress-bar mode="indeterminate" aria-label="Changing the plan" />
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button mat-dialog-close cdkFocusInitial>Cancel</button>
      <button mat-flat-button (click)="confirm()" [disabled]="busy()">
        Move to {{ data.offer.name }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .tc-change {
      border-collapse: collapse;
      width: 100%;
      margin-block: 8px 12px;
    }
    .tc-change th,
    .tc-change td {
      padding: 6px 8px;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
      text-align: start;
    }
    .tc-change th[scope='row'] {
      font-weight: normal;
    }
    .tc-num {
      text-align: end !important;
      font-variant-numeric: tabular-nums;
    }
    .tc-less {
      font-weight: 600;
    }
    .tc-effects {
      padding-inline-start: 20px;
    }
    .tc-effects li {
      margin-block: 4px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanChangeDialog {
  private readonly api = inject(TenantApi);
  private readonly ref = inject<MatDialogRef<PlanChangeDialog, TenantPlan>>(MatDialogRef);
  protected readonly data = inject<PlanChangeData>(MAT_DIALOG_DATA);
  protected readonly from = currentPlanPhrase(this.data.plan);
  protected readonly summary = planChangeSummary(
    this.data.plan,
    this.data.offer,
    this.data.resetsOn,
  );
  protected readonly busy = signal(false);
  protected readonly problem = signal<ProblemText | undefined>(undefined);

  protected async confirm(): Promise<void> {
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      this.ref.close(await this.api.choose(this.data.offer.id));
    } catch (err) {
      this.problem.set(problemText(err, 'change the plan'));
    } finally {
      this.busy.set(false);
    }
  }
}
