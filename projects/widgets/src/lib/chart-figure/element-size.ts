import { afterNextRender, DestroyRef, inject, signal, type Signal } from '@angular/core';

/** An element's content-box size in CSS pixels. */
export interface ElementSize {
  readonly width: number;
  readonly height: number;
}

/**
 * The size of the element `target` returns, kept current by a ResizeObserver from the first
 * render on (0 × 0 while the element is hidden, e.g. inside a closed tab). Call in an
 * injection context.
 */
export function injectElementSize(target: () => HTMLElement | undefined): Signal<ElementSize> {
  const size = signal<ElementSize>({ width: 0, height: 0 });
  const destroyRef = inject(DestroyRef);
  afterNextRender(() => {
    const el = target();
    if (!el || typeof ResizeObserver === 'undefined') return;
    const update = () => {
      const { width, height } = el.getBoundingClientRect();
      const now = size();
      if (now.width !== width || now.height !== height) size.set({ width, height });
    };
    update();
    const observer = new ResizeObserver(update);
    observer.observe(el);
    destroyRef.onDestroy(() => observer.disconnect());
  });
  return size.asReadonly();
}
