import { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import type { ChainModel } from '@tropline/core';

/** Most data rows in one upload (a calibration reads at most this many). */
export const MAX_ROWS = 2000;

/** One complaint about an uploaded file: where (1-based line and column) and what. */
export interface CsvIssue {
  readonly pointer: '/file';
  readonly line: number;
  readonly column: number;
  /** The header of the column, when there is one. */
  readonly field?: string;
  readonly message: string;
}

/** Survey series parsed from a CSV upload, in the scenario's units. */
export interface SurveySeries {
  readonly times: number[];
  readonly levels: Record<string, (number | null)[]>;
  readonly standardErrors?: Record<string, (number | null)[]>;
}

/** Parsed series, or every issue found (at most 100, so a broken file answers briefly). */
export type CsvOutcome =
  | { readonly ok: true; readonly series: SurveySeries; readonly columns: string[] }
  | { readonly ok: false; readonly errors: CsvIssue[] };

// A plain decimal or scientific number; "1,5", "12 kg" or "NaN" are text, not numbers.
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
/** Cells that mean "not surveyed". */
const MISSING = new Set(['', 'NA', 'na', 'N/A']);
const SE_SUFFIX = '_se';

interface Column {
  readonly name: string;
  readonly kind: 'time' | 'level' | 'se';
  readonly level?: string;
}

function headerIssues(header: string[], model: ChainModel, columns: Column[]): CsvIssue[] {
  const ids = model.levels.map((l) => l.id);
  const out: CsvIssue[] = [];
  const issue = (column: number, message: string, field?: string) =>
    out.push({ pointer: '/file', line: 1, column, ...(field ? { field } : {}), message });
  if (header.length === 1 && /[;\t|]/.test(header[0]!)) {
    issue(1, 'columns must be separated by commas (found ";", tab or "|")');
    return out;
  }
  const seen = new Set<string>();
  header.forEach((name, i) => {
    const col = i + 1;
    if (seen.has(name)) issue(col, `column "${name}" appears twice`, name);
    seen.add(name);
    if (i === 0) {
      if (name !== 'time') issue(1, `the first column must be "time", not "${name}"`, name);
      columns.push({ name, kind: 'time' });
    } else if (ids.includes(name)) {
      columns.push({ name, kind: 'level', level: name });
    } else if (name.endsWith(SE_SUFFIX) && ids.includes(name.slice(0, -SE_SUFFIX.length))) {
      const level = name.slice(0, -SE_SUFFIX.length);
      if (!header.includes(level)) issue(col, `"${name}" needs a "${level}" column`, name);
      columns.push({ name, kind: 'se', level });
    } else {
      issue(
        col,
        `unknown level "${name}"; this scenario's levels are ${ids.join(', ')} ` +
          `(standard errors as <level>${SE_SUFFIX})`,
        name,
      );
      columns.push({ name, kind: 'level' });
    }
  });
  if (header.length < 2 && !out.length) issue(2, 'add at least one level column after "time"');
  return out;
}

/**
 * Parses an uploaded survey file with csv-parse, streamed record by record: a header of
 * `time` then level ids (and optional `<level>_se` standard errors), a comma delimiter,
 * numbers ≥ 0 in the scenario's units, empty or NA for a missed survey, strictly increasing
 * times (uneven spacing is fine). Every bad cell is reported with its line and column.
 */
export async function parseSurveyCsv(data: Buffer, model: ChainModel): Promise<CsvOutcome> {
  const errors: CsvIssue[] = [];
  const columns: Column[] = [];
  const times: number[] = [];
  const values = new Map<string, (number | null)[]>();
  let header: string[] | undefined;
  let lastTime = -Infinity;
  const parser = Readable.from([data]).pipe(
    parse({ bom: true, trim: true, skip_empty_lines: true, relax_column_count: true, info: true }),
  );
  try {
    for await (const { record, info } of parser as AsyncIterable<{
      record: string[];
      info: { lines: number };
    }>) {
      const line = info.lines;
      if (!header) {
        header = record;
        errors.push(...headerIssues(record, model, columns));
        if (errors.length) break;
        for (const c of columns.slice(1)) values.set(c.name, []);
        continue;
      }
      if (times.length >= MAX_ROWS) {
        errors.push({ pointer: '/file', line, column: 1, message: `at most ${MAX_ROWS} rows` });
        break;
      }
      if (record.length !== columns.length) {
        errors.push({
          pointer: '/file',
          line,
          column: Math.min(record.length, columns.length) + 1,
          message: `expected ${columns.length} columns, found ${record.length}`,
        });
        continue;
      }
      record.forEach((cell, i) => {
        const c = columns[i]!;
        const at = { pointer: '/file' as const, line, column: i + 1, field: c.name };
        if (c.kind === 'time') {
          if (!NUMBER.test(cell)) {
            errors.push({ ...at, message: `time must be a number, not "${cell}"` });
            return;
          }
          const t = Number(cell);
          if (t < 0) errors.push({ ...at, message: 'time must not be negative' });
          else if (t === lastTime) errors.push({ ...at, message: `duplicate time ${cell}` });
          else if (t < lastTime) errors.push({ ...at, message: 'times must increase row by row' });
          lastTime = Math.max(lastTime, t);
          times.push(t);
          return;
        }
        if (MISSING.has(cell)) {
          values.get(c.name)!.push(null);
          return;
        }
        const v = Number(cell);
        if (!NUMBER.test(cell) || !Number.isFinite(v)) {
          errors.push({ ...at, message: `"${cell}" is not a number (leave missing values empty)` });
        } else if (v < 0) {
          errors.push({
            ...at,
            message: `${c.kind === 'se' ? 'a standard error' : 'a count or biomass'} cannot be negative`,
          });
        }
        values.get(c.name)!.push(v);
      });
      if (errors.length >= 100) break;
    }
  } catch (err) {
    const e = err as { lines?: number; message?: string };
    errors.push({
      pointer: '/file',
      line: e.lines ?? 1,
      column: 1,
      message: `not readable as CSV: ${e.message ?? 'malformed'}`,
    });
  }
  if (!header && !errors.length) {
    errors.push({ pointer: '/file', line: 1, column: 1, message: 'the file is empty' });
  } else if (header && !errors.length && times.length === 0) {
    errors.push({ pointer: '/file', line: 2, column: 1, message: 'the file has no data rows' });
  }
  if (errors.length) return { ok: false, errors: errors.slice(0, 100) };
  const levels: Record<string, (number | null)[]> = {};
  const standardErrors: Record<string, (number | null)[]> = {};
  for (const c of columns.slice(1)) {
    if (c.kind === 'level') levels[c.name] = values.get(c.name)!;
    else standardErrors[c.level!] = values.get(c.name)!;
  }
  return {
    ok: true,
    columns: columns.map((c) => c.name),
    series: { times, levels, ...(Object.keys(standardErrors).length ? { standardErrors } : {}) },
  };
}
