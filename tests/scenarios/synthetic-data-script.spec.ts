import { execFileSync } from 'node:child_process';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { syntheticSeries, UPLAND_DEMO } from '@tropline/core';
import { parseSurveyCsv } from '../../server/datasets/survey-csv';
import { writeSurveyCsv } from '../../server/datasets/write-survey-csv';

const ROOT = resolve(import.meta.dirname, '../..');
const ARGS = ['--preset', 'hobcairn-moor-demo', '--seed', '3', '--sigma', '0.15'];
const run = (extra: string[]) =>
  execFileSync('npx', ['tsx', 'scripts/synthetic-data.ts', ...ARGS, ...extra], {
    cwd: ROOT,
    encoding: 'utf8',
  });

describe('scripts/synthetic-data.ts: seeded survey files of a preset', () => {
  it('writes the same file for the same arguments: the library series, as an upload', async () => {
    const first = run(['--every', '2', '--count', '11', '--missing', '0.1']);
    expect(run(['--every', '2', '--count', '11', '--missing', '0.1'])).toBe(first);
    const series = syntheticSeries(UPLAND_DEMO.model, UPLAND_DEMO.initial, {
      times: Array.from({ length: 11 }, (_, i) => i * 2),
      logSigma: 0.15,
      seed: 3,
      missing: 0.1,
    });
    expect(first).toBe(writeSurveyCsv(series));
    // The file is one the upload accepts for the preset's levels, as it stands.
    const parsed = await parseSurveyCsv(Buffer.from(first), UPLAND_DEMO.model);
    expect(parsed.ok).toBe(true);
    expect(run(['--every', '2', '--count', '11', '--seed', '4'])).not.toBe(first);
  });
});
