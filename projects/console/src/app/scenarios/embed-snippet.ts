import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { embedSnippets } from './embed-snippets';

/** The two ways to put a published scenario on a page, each ready to copy. */
@Component({
  selector: 'tc-embed-snippet',
  imports: [MatButton, MatIcon, RouterLink],
  template: `
    <p>
      Replace <code>YOUR_BROWSER_KEY</code> with a browser key bound to the page's origin (issued on
      <a routerLink="/keys">API keys</a>; a key is shown only when it is issued).
    </p>
    @for (s of forms(); track s.id) {
      <section class="tc-snippet" [attr.aria-labelledby]="'tc-snippet-' + s.id">
        <div class="tc-snippet__head">
          <h3 [id]="'tc-snippet-' + s.id">{{ s.title }}</h3>
          <button mat-stroked-button type="button" (click)="copy(s.id, s.code)">
            <mat-icon fontSet="material-symbols-outlined">content_copy</mat-icon>
            Copy the {{ s.short }} snippet
          </button>
        </div>
        <pre tabindex="0" [attr.aria-label]="s.title + ' code'"><code>{{ s.code }}</code></pre>
      </section>
    }
    <p class="tc-visually-hidden" role="status">{{ copied() }}</p>
    @if (copied()) {
      <p aria-hidden="true" class="tc-copied">{{ copied() }}</p>
    }
  `,
  styles: `
    .tc-snippet__head {
      display: flex;
      align-items: center;
      justify-content: space-between;
      gap: 12px;
      flex-wrap: wrap;
    }
    h3 {
      font: var(--mat-sys-title-small);
      margin: 12px 0 4px;
    }
    pre {
      background: var(--mat-sys-surface-container);
      padding: 12px;
      border-radius: 8px;
      overflow-x: auto;
      font-size: 13px;
    }
    a {
      color: var(--mat-sys-primary);
    }
    .tc-copied {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EmbedSnippet {
  private readonly clipboard = inject(Clipboard);
  /** The scenario's public id. */
  readonly publicId = input.required<string>();
  protected readonly copied = signal('');
  protected readonly forms = computed(() => {
    const s = embedSnippets(globalThis.location?.origin ?? '', this.publicId());
    return [
      { id: 'element', title: 'Any web page (custom element)', short: 'HTML', code: s.element },
      {
        id: 'angular',
        title: 'An Angular app (@tropline/widgets)',
        short: 'Angular',
        code: s.angular,
      },
    ];
  });

  protected copy(id: string, code: string): void {
    const ok = this.clipboard.copy(code);
    this.copied.set(
      ok
        ? `The ${id === 'element' ? 'HTML' : 'Angular'} snippet is copied.`
        : 'Could not copy: select the code and copy it by hand.',
    );
  }
}
