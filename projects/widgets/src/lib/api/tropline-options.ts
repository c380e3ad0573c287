import { InjectionToken } from '@angular/core';

/** How the widgets reach the Tropline API and how they present numbers. */
export interface TroplineOptions {
  /** Base URL of the API, e.g. `https://tropline.example/api/v1` or `/api/v1`. */
  readonly apiUrl: string;
  /** A browser key (`trb_…`) bound to this site's origin. Public by design. */
  readonly apiKey: string;
  /** BCP 47 locale for numbers and dates; defaults to the document's language. */
  readonly locale?: string;
  /** Whether the widgets show the cautions under every projection (default true). */
  readonly showCautions?: boolean;
  /** Debounce for parameter changes before a new request is sent, in milliseconds. */
  readonly debounceMs?: number;
  /** How charts are drawn: `canvas` (default, fastest) or `svg` (crisp when printed). */
  readonly renderer?: 'canvas' | 'svg';
  /**
   * Colour scheme of the widgets: `auto` (default) follows the host page's `color-scheme` and
   * the reader's system setting at runtime; `light` or `dark` pins one.
   */
  readonly theme?: 'auto' | 'light' | 'dark';
}

/** Options with every default filled in. */
export type ResolvedTroplineOptions = Required<TroplineOptions>;

/** Defaults used where {@link provideTropline} is not called (stories, tests). */
export function defaultTroplineOptions(): ResolvedTroplineOptions {
  return {
    apiUrl: '/api/v1',
    apiKey: '',
    locale: typeof document !== 'undefined' ? document.documentElement.lang || 'en' : 'en',
    showCautions: true,
    debounceMs: 250,
    renderer: 'canvas',
    theme: 'auto',
  };
}

/** The resolved options; `provideTropline()` supplies them. */
export const TROPLINE_OPTIONS = new InjectionToken<ResolvedTroplineOptions>('TROPLINE_OPTIONS', {
  providedIn: 'root',
  factory: defaultTroplineOptions,
});
