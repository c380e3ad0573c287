/** What a key does to a chart's visible window. */
export type ZoomKey = 'in' | 'out' | 'left' | 'right' | 'reset';

/** A visible window in percent of the full axis, 0 ≤ start < end ≤ 100. */
export interface ZoomWindow {
  /** Start, in percent. */
  readonly start: number;
  /** End, in percent. */
  readonly end: number;
}

/** Narrowest window the keys zoom to, in percent. */
const MIN_SPAN = 2;

/**
 * The keyboard equivalent of wheel zoom and drag: zoom in or out about the window's centre by
 * half (or double) its span, move by a fifth of the span, or show everything.
 */
export function zoomWindow(current: ZoomWindow, key: ZoomKey): ZoomWindow {
  const span = current.end - current.start;
  const centre = (current.start + current.end) / 2;
  const clamp = (start: number, width: number): ZoomWindow => {
    const w = Math.min(100, Math.max(MIN_SPAN, width));
    const s = Math.min(100 - w, Math.max(0, start));
    return { start: s, end: s + w };
  };
  switch (key) {
    case 'in':
      return clamp(centre - span / 4, span / 2);
    case 'out':
      return clamp(centre - span, span * 2);
    case 'left':
      return clamp(current.start - span / 5, span);
    case 'right':
      return clamp(current.start + span / 5, span);
    case 'reset':
      return { start: 0, end: 100 };
  }
}
