import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  untracked,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { PageData } from '../common/page-data';
import { EmptyState, Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { ConsoleSession } from '../session/console-session';
import { ScenariosApi } from './scenarios-api';

/** The tenant's scenarios: what each is called, its latest version and what is published. */
@Component({
  selector: 'tc-scenarios-page',
  imports: [
    DatePipe,
    MatButton,
    MatIcon,
    MatTableModule,
    RouterLink,
    EmptyState,
    Skeleton,
    ProblemAlert,
  ],
  template: `
    <header class="tc-page-head">
      <h1>Scenarios</h1>
      @if (canWrite()) {
        <a mat-flat-button routerLink="/scenarios/new">
          <mat-icon fontSet="material-symbols-outlined">add</mat-icon>New scenario
        </a>
      }
    </header>
    <p class="tc-lede">
      Each scenario is a food chain in real units with its own history: every save is a version that
      never changes. Publishing a version puts it behind a public id for the portal's widgets.
    </p>
    @if (data.problem(); as p) {
      <tc-problem-alert [problem]="p" />
      <button mat-stroked-button (click)="data.load()">Try again</button>
    } @else if (data.value() === undefined) {
      <tc-skeleton [rows]="4" label="Loading scenarios…" />
    } @else if (data.value()!.length === 0) {
      <tc-empty-state icon="ssid_chart" heading="No scenarios yet">
        @if (canWrite()) {
          <p>Start from a preset chain or build one from scratch.</p>
          <a mat-stroked-button routerLink="/scenarios/new">New scenario</a>
        } @else {
          <p>Analysts of this tenant create scenarios; they will be listed here.</p>
        }
      </tc-empty-state>
    } @else {
      <div class="tc-table-wrap" tabindex="0" role="region" aria-label="Scenarios table">
        <table mat-table [dataSource]="data.value()!" aria-label="Scenarios, newest first">
          <ng-container matColumnDef="name">
            <th mat-header-cell *matHeaderCellDef>Name</th>
            <td mat-cell *matCellDef="let s">
              <a [routerLink]="['/scenarios', s.id]">{{ s.name }}</a>
            </td>
          </ng-container>
          <ng-container matColumnDef="latest">
            <th mat-header-cell *matHeaderCellDef>Latest version</th>
            <td mat-cell *matCellDef="let s">{{ s.latestVersion }}</td>
          </ng-container>
          <ng-container matColumnDef="published">
            <th mat-header-cell *matHeaderCellDef>Published</th>
            <td mat-cell *matCellDef="let s">
              @if (s.publishedVersion) {
                Version {{ s.publishedVersion }} as <code>{{ s.publicId }}</code>
              } @else {
                Not published
              }
            </td>
          </ng-container>
          <ng-container matColumnDef="created">
            <th mat-header-cell *matHeaderCellDef>Created</th>
            <td mat-cell *matCellDef="let s">{{ s.createdAt | date: 'd MMM y' }}</td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
      </div>
    }
  `,
  styles: `
    .tc-table-wrap {
      overflow-x: auto;
    }
    a {
      color: var(--mat-sys-primary);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScenariosPage {
  private readonly api = inject(ScenariosApi);
  private readonly session = inject(ConsoleSession);
  protected readonly columns = ['name', 'latest', 'published', 'created'];
  protected readonly data = new PageData(() => this.api.list(), 'load scenarios');
  protected readonly canWrite = computed(
    () => this.session.role() !== undefined && this.session.can('scenarios:write'),
  );

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => void this.data.load());
    });
  }
}
