import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatToolbar } from '@angular/material/toolbar';
import { RouterOutlet } from '@angular/router';

/** The console frame: Tropline's toolbar and the routed page. */
@Component({
  selector: 'tc-root',
  imports: [RouterOutlet, MatToolbar],
  template: `
    <mat-toolbar class="tc-toolbar">
      <img src="favicon.svg" alt="" width="28" height="28" />
      <span class="tc-toolbar__title">Tropline console</span>
      <span class="tc-toolbar__spacer"></span>
      <a class="tc-toolbar__link" href="/api/docs/">API reference</a>
    </mat-toolbar>
    <main class="tc-main"><router-outlet /></main>
  `,
  styles: `
    .tc-toolbar {
      gap: 12px;
      background: var(--mat-sys-primary);
      color: var(--mat-sys-on-primary);
    }
    .tc-toolbar__spacer {
      flex: 1;
    }
    .tc-toolbar__link {
      color: inherit;
      font: var(--mat-sys-label-large);
    }
    .tc-main {
      width: min(1100px, 100% - 32px);
      margin: 24px auto;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {}
