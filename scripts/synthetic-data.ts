/**
 * Writes seeded synthetic survey data of a preset to stdout in the upload CSV format, so a
 * calibration can be checked on data whose truth is known:
 *
 *   npx tsx scripts/synthetic-data.ts --preset brackenlow-mere-demo --seed 7 --sigma 0.1 \
 *     --every 2 --count 53 [--missing 0.05] [--levels algae,perch]
 *
 * The same arguments always give the same file (pure-rand's xoroshiro128+ per level).
 */
import { parseArgs } from 'node:util';
import { CHAIN_PRESETS, syntheticSeries } from '@tropline/core';
import { writeSurveyCsv } from '../server/datasets/write-survey-csv';

const { values } = parseArgs({
  options: {
    preset: { type: 'string', default: 'brackenlow-mere-demo' },
    seed: { type: 'string', default: '7' },
    sigma: { type: 'string', default: '0.1' },
    every: { type: 'string', default: '1' },
    count: { type: 'string', default: '41' },
    missing: { type: 'string', default: '0' },
    levels: { type: 'string' },
  },
});
const preset = CHAIN_PRESETS.find((p) => p.id === values.preset);
if (!preset) {
  console.error(
    `unknown preset ${values.preset}; one of ${CHAIN_PRESETS.map((p) => p.id).join(', ')}`,
  );
  process.exit(2);
}
const every = Number(values.every);
const times = Array.from({ length: Number(values.count) }, (_, i) => i * every);
const series = syntheticSeries(preset.model, preset.initial, {
  times,
  logSigma: Number(values.sigma),
  seed: Number(values.seed),
  missing: Number(values.missing),
  ...(values.levels ? { levels: values.levels.split(',') } : {}),
});
process.stdout.write(writeSurveyCsv(series));
