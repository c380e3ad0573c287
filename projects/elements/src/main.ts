// First: configures zod before any contract schema parses (see the file).
import './zod-jitless';
import {
  type ApplicationRef,
  CSP_NONCE,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
  type Type,
} from '@angular/core';
import { createCustomElement } from '@angular/elements';
import { createApplication } from '@angular/platform-browser';
import { ComparisonElement } from './comparison-element';
import { hostCspNonce } from './csp-nonce';
import { LongRunElement } from './long-run-element';
import { ProjectionElement } from './projection-element';

/** The tags this module defines, and the component behind each. */
export const TROPLINE_ELEMENTS: readonly (readonly [string, Type<unknown>])[] = [
  ['tropline-projection', ProjectionElement],
  ['tropline-comparison', ComparisonElement],
  ['tropline-long-run', LongRunElement],
];

/**
 * One zoneless application serves every Tropline element on the page. A page that loads the
 * module twice (two embeds of one CMS block) keeps the first definitions.
 */
async function defineTroplineElements(): Promise<ApplicationRef> {
  const app = await createApplication({
    providers: [
      provideZonelessChangeDetection(),
      provideBrowserGlobalErrorListeners(),
      { provide: CSP_NONCE, useValue: hostCspNonce(document) },
    ],
  });
  for (const [tag, component] of TROPLINE_ELEMENTS) {
    if (customElements.get(tag)) continue;
    customElements.define(tag, createCustomElement(component, { injector: app.injector }));
  }
  return app;
}

defineTroplineElements().catch((err: unknown) => console.error('Tropline elements:', err));
