/**
 * A 12 px name's width in CSS pixels, roughly (common practice: about 0.55 em a character; the
 * shipped Roboto averages a little less, so the estimate errs on the wide side).
 */
export const nameWidth = (text: string): number => text.length * 6.6;

/** Height of one line of a 12 px axis name, in CSS pixels. */
export const NAME_LINE = 16;

/**
 * Breaks an axis name at its spaces into lines no wider than `width` pixels (by
 * {@link nameWidth}), joined by the newlines ECharts draws as lines. ECharts' own `overflow:
 * 'break'` does not reach axis names: its axis builder sets their overflow itself (to
 * `truncate`, with no width unless `nameTruncate` gives one), so a long level name and unit
 * ran off a narrow canvas. A parenthesised part — a species' Latin name, a unit — is kept whole
 * where it fits, and a word wider than `width` keeps a line of its own. With no width known (0),
 * the name stays on one line.
 */
export function wrapAxisName(name: string, width: number): string {
  if (!(width > 0) || nameWidth(name) <= width) return name;
  const lines: string[] = [];
  let line = '';
  for (const word of words(name)) {
    const longer = line ? `${line} ${word}` : word;
    if (line && nameWidth(longer) > width) {
      lines.push(line);
      line = word;
    } else {
      line = longer;
    }
  }
  lines.push(line);
  return lines.join('\n');
}

/** Extra height a wrapped name takes beyond its first line, in CSS pixels. */
export const extraNameHeight = (wrapped: string): number =>
  (wrapped.split('\n').length - 1) * NAME_LINE;

/** Style of a wrapped axis name's lines (ECharts' default line height is the font's, too tight). */
export const NAME_LINE_STYLE = { lineHeight: NAME_LINE } as const;

/**
 * Name style of a vertical axis named at its end: from the axis rightwards (centred, a long
 * name ran off the canvas's left edge), extra lines going up into the room the grid keeps.
 */
export const VERTICAL_NAME_STYLE = {
  align: 'left',
  verticalAlign: 'bottom',
  ...NAME_LINE_STYLE,
} as const;

/** A plot's margins in pixels. */
export interface PlotGrid {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/**
 * Both axis names broken to fit the plot a chart `width` pixels wide leaves inside `grid`
 * (unbroken when the width is not known), and the grid with room for their extra lines: the
 * horizontal name's below the plot, the vertical name's above it.
 */
export function fitAxisNames(
  grid: PlotGrid,
  width: number | undefined,
  names: { readonly x: string; readonly y: string },
): { readonly x: string; readonly y: string; readonly grid: PlotGrid } {
  const plot = width ? width - grid.left - grid.right : 0;
  const x = wrapAxisName(names.x, plot);
  const y = wrapAxisName(names.y, plot);
  return {
    x,
    y,
    grid: { ...grid, top: grid.top + extraNameHeight(y), bottom: grid.bottom + extraNameHeight(x) },
  };
}

/** The name's words, a parenthesised group (with its spaces) counting as one. */
function words(name: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let word = '';
  for (const ch of name) {
    if (ch === '(') depth++;
    else if (ch === ')') depth = Math.max(0, depth - 1);
    if (ch === ' ' && depth === 0) {
      out.push(word);
      word = '';
    } else {
      word += ch;
    }
  }
  out.push(word);
  return out;
}
