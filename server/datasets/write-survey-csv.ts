import type { SurveySeries } from './survey-csv';

/**
 * Writes survey series in the upload format: `time`, one column per level, then
 * `<level>_se` standard errors when present; a missing value is an empty cell.
 */
export function writeSurveyCsv(series: SurveySeries): string {
  const levels = Object.keys(series.levels);
  const errors = Object.keys(series.standardErrors ?? {});
  const header = ['time', ...levels, ...errors.map((l) => `${l}_se`)];
  const cell = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));
  const rows = series.times.map((t, i) =>
    [
      String(t),
      ...levels.map((l) => cell(series.levels[l]![i])),
      ...errors.map((l) => cell(series.standardErrors![l]![i])),
    ].join(','),
  );
  return [header.join(','), ...rows].join('\n') + '\n';
}
