/** Dash pattern per level, producer first, so lines differ by more than colour. */
export const LINE_DASHES: readonly (string | number[])[] = ['solid', [8, 4], [2, 3], [10, 3, 2, 3]];

/** Marker shape per level for points (observations, bifurcation maxima). */
export const POINT_SYMBOLS: readonly string[] = ['circle', 'triangle', 'diamond', 'rect'];

const SUPERSCRIPTS: Record<string, string> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

/** Writes "g C m^-2" as "g C m⁻²" for display. */
export function formatUnit(unit: string): string {
  return unit.replace(/\^(-?\d+)/g, (_m, exp: string) =>
    [...exp].map((c) => SUPERSCRIPTS[c]).join(''),
  );
}
