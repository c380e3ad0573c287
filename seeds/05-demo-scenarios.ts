import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import {
  LAKE_DEMO,
  UPLAND_DEMO,
  syntheticSeries,
  validateScenarioContent,
  type ChainPreset,
} from '@tropline/core';
import { parseSurveyCsv } from '../server/datasets/survey-csv';
import { writeSurveyCsv } from '../server/datasets/write-survey-csv';
import { DEMO_TENANT } from './01-demo-tenant';

/** One published demo scenario with its synthetic survey data. */
export interface DemoScenario {
  readonly id: string;
  /**
   * The stable public id the demo portal binds to. Fixed here (not random) so the portal's
   * configuration and the docs can name it: `larchmere-brackenlow-mere`, `larchmere-hobcairn-moor`.
   */
  readonly publicId: string;
  readonly preset: ChainPreset;
  readonly location: string;
  readonly horizon: number;
  readonly publicParameters: { pointer: string; min: number; max: number; label: string }[];
  /** Survey times and noise of the synthetic dataset (seeded: the same data on every start). */
  readonly survey: { times: number[]; logSigma: number; seed: number; missing: number };
}

/** The published demo scenarios; every place and number is invented. */
export const DEMO_SCENARIOS: readonly DemoScenario[] = [
  {
    id: '00000000-0000-4000-8000-00000000b001',
    publicId: 'larchmere-brackenlow-mere',
    preset: LAKE_DEMO,
    location: 'Brackenlow Mere, Larchmere district (invented)',
    horizon: 520,
    publicParameters: [
      { pointer: '/levels/0/growthRate', min: 1, max: 3, label: 'Algal growth (nutrient load)' },
      { pointer: '/levels/1/handlingTime', min: 0.1, max: 0.3, label: 'Daphnia handling time' },
      { pointer: '/levels/2/mortality', min: 0.01, max: 0.05, label: 'Perch mortality' },
    ],
    // Fortnightly plankton and perch surveys over six years, 5 % of visits missed: long enough
    // for the chain's chaos to show in a calibration (errors grow e-fold in about 100 weeks),
    // so the demo offers the fit in segments.
    survey: {
      times: Array.from({ length: 157 }, (_, i) => i * 2),
      logSigma: 0.1,
      seed: 8101,
      missing: 0.05,
    },
  },
  {
    id: '00000000-0000-4000-8000-00000000b002',
    publicId: 'larchmere-hobcairn-moor',
    preset: UPLAND_DEMO,
    location: 'Hobcairn Moor, Larchmere uplands (invented)',
    horizon: 100,
    publicParameters: [
      { pointer: '/levels/1/mortality', min: 0.2, max: 0.5, label: 'Deer mortality (culling)' },
      { pointer: '/levels/2/mortality', min: 0.1, max: 0.4, label: 'Wolf mortality' },
    ],
    // Yearly counts with a gap year: uneven sampling on purpose.
    survey: {
      times: [0, 1, 2, 3, 4, 5, 6, 8, 9, 10, 11, 12, 14, 15, 16, 18, 20],
      logSigma: 0.15,
      seed: 8102,
      missing: 0,
    },
  },
];

export async function seed(knex: Knex): Promise<void> {
  const at = new Date().toISOString();
  for (const demo of DEMO_SCENARIOS) {
    const content = validateScenarioContent({
      name: demo.preset.title,
      description: demo.preset.description,
      location: demo.location,
      model: demo.preset.model,
      initial: demo.preset.initial,
      horizon: demo.horizon,
      publicParameters: demo.publicParameters,
    });
    if (!content.ok)
      throw new Error(`demo scenario ${demo.publicId}: ${JSON.stringify(content.errors)}`);
    await knex('scenarios').insert({
      id: demo.id,
      tenant_id: DEMO_TENANT.id,
      public_id: demo.publicId,
      latest_version: 1,
      published_version: 1,
      created_by: 'seed',
      created_at: at,
    });
    await knex('scenario_versions').insert({
      scenario_id: demo.id,
      version: 1,
      status: 'published',
      content: JSON.stringify(content.value),
      change_note: 'Demo scenario (invented system)',
      author: 'seed',
      created_at: at,
      published_at: at,
    });
    const data = syntheticSeries(demo.preset.model, demo.preset.initial, demo.survey);
    const csv = Buffer.from(writeSurveyCsv(data));
    const parsed = await parseSurveyCsv(csv, content.value.model);
    if (!parsed.ok) throw new Error(`demo dataset ${demo.publicId}: ${parsed.errors[0]!.message}`);
    await knex('dataset_versions').insert({
      id: demo.id.replace(/b00(\d)$/, 'd00$1'),
      tenant_id: DEMO_TENANT.id,
      scenario_id: demo.id,
      version: 1,
      scenario_version: 1,
      levels: JSON.stringify(
        Object.keys(parsed.series.levels).map((id) => ({
          id,
          unit: content.value.model.levels.find((l) => l.id === id)!.unit,
        })),
      ),
      filename: `${demo.publicId}-synthetic.csv`,
      original: csv,
      series: JSON.stringify(parsed.series),
      rows: parsed.series.times.length,
      sha256: createHash('sha256').update(csv).digest('hex'),
      change_note: `Synthetic check data: seed ${demo.survey.seed}, log-normal σ = ${demo.survey.logSigma}`,
      author: 'seed',
      created_at: at,
    });
  }
}
