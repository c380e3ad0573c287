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
