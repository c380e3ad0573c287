import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatCardModule } from '@angular/material/card';
import { MatIcon } from '@angular/material/icon';
import { catchError, map, of } from 'rxjs';

interface Health {
  status: string;
  version: string;
  database: { status: string; latencyMs: number };
}

type StatusView =
  { kind: 'checking' } | { kind: 'up'; health: Health } | { kind: 'down'; reason: string };

/** What the console can tell before anyone signs in: whether the service and database answer. */
@Component({
  selector: 'tc-status-page',
  imports: [MatCardModule, MatIcon],
  template: `
    <h1>Service status</h1>
    <mat-card appearance="outlined">
      <mat-card-content>
        @switch (view().kind) {
          @case ('checking') {
            <p>Checking the service…</p>
          }
          @case ('up') {
            @if (view(); as v) {
              @if (v.kind === 'up') {
                <p class="tc-status tc-status--up">
                  <mat-icon fontSet="material-symbols-outlined">check_circle</mat-icon>
                  API {{ v.health.version }} is answering; database round trip
                  {{ v.health.database.latencyMs.toFixed(2) }} ms.
                </p>
              }
            }
          }
          @case ('down') {
            @if (view(); as v) {
              @if (v.kind === 'down') {
                <p class="tc-status tc-status--down" role="alert">
                  <mat-icon fontSet="material-symbols-outlined">error</mat-icon>
                  The API is not answering: {{ v.reason }}
                </p>
              }
            }
          }
        }
      </mat-card-content>
    </mat-card>
  `,
  styles: `
    .tc-status {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    .tc-status--up mat-icon {
      color: var(--mat-sys-primary);
    }
    .tc-status--down mat-icon {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StatusPage {
  private readonly http = inject(HttpClient);

  protected readonly view = toSignal(
    this.http.get<Health>('/api/v1/health').pipe(
      map((health): StatusView => ({ kind: 'up', health })),
      catchError((err: { message?: string }) =>
        of<StatusView>({ kind: 'down', reason: err.message ?? 'unknown error' }),
      ),
    ),
    { initialValue: { kind: 'checking' } as StatusView },
  );
}
