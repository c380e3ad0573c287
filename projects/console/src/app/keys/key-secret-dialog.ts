import { Clipboard } from '@angular/cdk/clipboard';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import type { IssuedKey } from './key-rows';

/** The one moment a key's plaintext is on screen: copy it, with a clear warning. */
@Component({
  selector: 'tc-key-secret-dialog',
  imports: [MatDialogModule, MatButton, MatIcon, DatePipe],
  template: `
    <h2 mat-dialog-title>Copy your new key now</h2>
    <mat-dialog-content>
      <p class="tc-warning">
        <mat-icon fontSet="material-symbols-outlined" aria-hidden="true">warning</mat-icon>
        <span>
          This is the only time the full key is shown. Tropline keeps only a fingerprint of it, so
          nobody can show it to you again. If you lose it, rotate or revoke it and issue another.
        </span>
      </p>
      <label class="tc-secret-label" for="tc-secret">
        {{ issued.key.kind === 'browser' ? 'Browser key' : 'Server key' }}
        “{{ issued.key.name || issued.key.label }}”
      </label>
      <input
        id="tc-secret"
        class="tc-secret"
        readonly
        [value]="issued.token"
        (focus)="select($event)"
      />
      <p class="tc-copied" role="status">{{ copied() }}</p>
      @if (issued.key.kind === 'browser') {
        <p>
          A browser key is public by design: it works only from
          {{ issued.key.origins.join(', ') }}, only for computing and reading published scenarios,
          at a low request rate.
        </p>
      } @else {
        <p>Keep a server key in your secrets store. Never put it in a web page.</p>
      }
      @if (issued.previous; as prev) {
        <p>
          The key it replaces keeps working until
          <strong>{{ prev.expiresAt | date: 'd MMM y, HH:mm' }}</strong>: switch your systems to the
          new key before then.
        </p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button (click)="copy()">
        <mat-icon fontSet="material-symbols-outlined">content_copy</mat-icon>Copy key
      </button>
      <button mat-flat-button mat-dialog-close>I have stored it</button>
    </mat-dialog-actions>
  `,
  styles: `
    .tc-warning {
      display: flex;
      gap: 8px;
      padding: 12px;
      border-radius: 8px;
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    .tc-warning mat-icon {
      flex: none;
    }
    .tc-secret-label {
      display: block;
      font: var(--mat-sys-label-large);
      margin-bottom: 4px;
    }
    .tc-secret {
      width: 100%;
      box-sizing: border-box;
      font:
        14px/1.4 ui-monospace,
        monospace;
      padding: 8px;
      border: 1px solid var(--mat-sys-outline);
      border-radius: 4px;
      background: var(--mat-sys-surface-container);
      color: var(--mat-sys-on-surface);
    }
    .tc-copied {
      min-height: 1.4em;
      margin: 4px 0;
      color: var(--mat-sys-primary);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class KeySecretDialog {
  private readonly clipboard = inject(Clipboard);
  protected readonly issued = inject<IssuedKey>(MAT_DIALOG_DATA);
  protected readonly copied = signal('');

  protected copy(): void {
    this.copied.set(
      this.clipboard.copy(this.issued.token)
        ? 'Copied to the clipboard.'
        : 'Could not copy: select the key and copy it by hand.',
    );
  }

  protected select(event: FocusEvent): void {
    (event.target as HTMLInputElement).select();
  }
}
