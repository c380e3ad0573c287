import {
  afterNextRender,
  DestroyRef,
  ElementRef,
  inject,
  signal,
  type Signal,
} from '@angular/core';

/** Colours a chart reads from the host's theme, resolved to values ECharts understands. */
export interface ChartPalette {
  /** One colour per food-chain level, producer first (`--tropline-series-1…4`). */
  readonly series: readonly string[];
  /** Axis and legend text (`--mat-sys-on-surface`). */
  readonly text: string;
  /** Secondary text and grid lines (`--mat-sys-outline`). */
  readonly muted: string;
  /** Chart background, for exported images (`--mat-sys-surface`). */
  readonly surface: string;
  /** Font family (`--tropline-font-family`). */
  readonly font: string;
}

/** What a chart uses before its host is in the page (Tropline's light theme). */
export const FALLBACK_PALETTE: ChartPalette = {
  series: ['#2e7d32', '#1565c0', '#b0561d', '#6a3d9a'],
  text: '#1b1c1c',
  muted: '#6f7978',
  surface: '#ffffff',
  font: 'Roboto, sans-serif',
};

/**
 * Resolves the theme's custom properties through a probe element's `color`, so `var()` chains
 * and `light-dark()` come back as plain rgb() values.
 */
export function readPalette(host: HTMLElement): ChartPalette {
  const probe = host.ownerDocument.createElement('span');
  probe.style.display = 'none';
  host.appendChild(probe);
  const resolve = (expression: string, fallback: string) => {
    probe.style.color = '';
    probe.style.color = expression;
    const value = probe.style.color ? getComputedStyle(probe).color : '';
    return value && value !== 'canvastext' ? value : fallback;
  };
  const series = FALLBACK_PALETTE.series.map((fallback, i) =>
    resolve(`var(--tropline-series-${i + 1}, ${fallback})`, fallback),
  );
  const palette: ChartPalette = {
    series,
    text: resolve(`var(--mat-sys-on-surface, ${FALLBACK_PALETTE.text})`, FALLBACK_PALETTE.text),
    muted: resolve(`var(--mat-sys-outline, ${FALLBACK_PALETTE.muted})`, FALLBACK_PALETTE.muted),
    surface: resolve(
      `var(--mat-sys-surface, ${FALLBACK_PALETTE.surface})`,
      FALLBACK_PALETTE.surface,
    ),
    font:
      getComputedStyle(host).getPropertyValue('--tropline-font-family').trim() ||
      FALLBACK_PALETTE.font,
  };
  probe.remove();
  return palette;
}

/**
 * The chart palette of the injecting component's host, read once it is rendered and again
 * whenever the reader's colour scheme or the page's theme attributes change, so a chart follows
 * a host that switches to dark mode at runtime.
 */
export function injectChartPalette(): Signal<ChartPalette> {
  const host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  const destroyRef = inject(DestroyRef);
  const palette = signal<ChartPalette>(FALLBACK_PALETTE);
  afterNextRender(() => {
    const update = () => palette.set(readPalette(host));
    update();
    const view = host.ownerDocument.defaultView;
    const media = view?.matchMedia?.('(prefers-color-scheme: dark)');
    media?.addEventListener?.('change', update);
    const observer =
      typeof MutationObserver === 'undefined' ? undefined : new MutationObserver(update);
    observer?.observe(host.ownerDocument.documentElement, {
      attributes: true,
      attributeFilter: ['class', 'style', 'data-theme'],
    });
    observer?.observe(host.ownerDocument.body, {
      attributes: true,
      attributeFilter: ['class', 'style', 'data-theme'],
    });
    destroyRef.onDestroy(() => {
      media?.removeEventListener?.('change', update);
      observer?.disconnect();
    });
  });
  return palette.asReadonly();
}

/** Whether the reader asked for less motion (charts then draw without animation). */
export function prefersReducedMotion(host: HTMLElement): boolean {
  return !!host.ownerDocument.defaultView?.matchMedia?.('(prefers-reduced-motion: reduce)')
    ?.matches;
}

/**
 * Whether the reader asks for less motion, following the system setting when it changes, for
 * the injecting component's document. Call in an injection context.
 */
export function injectReducedMotion(): Signal<boolean> {
  const host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  const media = host.ownerDocument.defaultView?.matchMedia?.('(prefers-reduced-motion: reduce)');
  const reduced = signal(!!media?.matches);
  const update = () => reduced.set(!!media?.matches);
  media?.addEventListener?.('change', update);
  inject(DestroyRef).onDestroy(() => media?.removeEventListener?.('change', update));
  return reduced.asReadonly();
}
