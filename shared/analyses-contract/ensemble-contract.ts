import * as z from 'zod';
import type { ChainModel } from '../model/chain-model';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';
import { distributionIssues, type Distribution } from '../ensemble/distribution';
import { ANALYSIS_LIMITS as L } from './analysis-limits';
import {
  count,
  finite,
  initialField,
  levelRefField,
  levelValuesField,
  pointerField,
  span,
  toleranceField,
} from './analysis-fields';
import {
  levelIdIssues,
  levelRecordIssues,
  parameterIssues,
  validateAnalysisBody,
} from './validate-analysis-body';

const bound = (label: string) => finite(label).optional();

/** An uncertainty distribution: normal, log-normal, uniform; min/max truncate the first two. */
export const distributionSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('normal'),
      mean: finite('mean'),
      sd: finite('sd'),
      min: bound('min'),
      max: bound('max'),
    }),
    z.strictObject({
      kind: z.literal('lognormal'),
      median: finite('median'),
      sigma: finite('sigma'),
      min: bound('min'),
      max: bound('max'),
    }),
    z.strictObject({ kind: z.literal('uniform'), min: finite('min'), max: finite('max') }),
  ],
  { error: 'kind must be "normal", "lognormal" or "uniform"' },
);

/** Body of an ensemble request: Monte Carlo over parameters and initial states. */
export const ensembleRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: initialField,
  horizon: span('horizon'),
  samples: count('samples', 2, L.maxEnsembleSamples).optional(),
  members: count('members', 1, L.maxMembers),
  seed: count('seed', 0, 0xffffffff),
  parameters: z
    .array(z.strictObject({ pointer: pointerField, distribution: distributionSchema }))
    .max(20, { error: 'at most 20 uncertain parameters' })
    .optional(),
  initialStates: z
    .array(z.strictObject({ level: levelRefField, distribution: distributionSchema }))
    .max(4, { error: 'at most one distribution per level' })
    .optional(),
  extinction: levelValuesField.optional(),
  tolerance: toleranceField.optional(),
});

const band = z.object({
  p5: z.array(z.number()),
  p25: z.array(z.number()),
  p50: z.array(z.number()),
  p75: z.array(z.number()),
  p95: z.array(z.number()),
});

/** An ensemble's result: percentile bands and quasi-extinction probabilities per sample time. */
export const ensembleResultSchema = z.object({
  times: z.array(z.number()),
  bands: z.record(z.string(), band),
  belowThreshold: z.record(z.string(), z.array(z.number())),
  thresholds: z.record(z.string(), z.number()),
  members: z.number().int(),
  seed: z.number().int(),
});

/** A validated ensemble request with defaults filled in. */
export interface EnsembleRequest {
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
  readonly horizon: number;
  readonly samples: number;
  readonly members: number;
  readonly seed: number;
  readonly parameters: readonly { readonly pointer: string; readonly distribution: Distribution }[];
  readonly initialStates: readonly {
    readonly level: string;
    readonly distribution: Distribution;
  }[];
  readonly extinction?: Readonly<Record<string, number>>;
  readonly tolerance: number;
}

/** Validates an ensemble request body; pointers relative to the body. */
export function validateEnsembleRequest(input: unknown): ValidationResult<EnsembleRequest> {
  const r = validateAnalysisBody(ensembleRequestSchema, input, (b, model) => {
    const issues: ValidationIssue[] = [...levelRecordIssues(model, b.extinction, '/extinction')];
    (b.parameters ?? []).forEach((p, i) => {
      issues.push(...parameterIssues(model, p.pointer, `/parameters/${i}/pointer`));
      for (const m of distributionIssues(p.distribution)) {
        issues.push({ pointer: `/parameters/${i}/distribution`, message: m });
      }
    });
    const seen = new Set<string>();
    (b.initialStates ?? []).forEach((s, i) => {
      issues.push(...levelIdIssues(model, s.level, `/initialStates/${i}/level`));
      if (seen.has(s.level)) {
        issues.push({ pointer: `/initialStates/${i}/level`, message: 'level given twice' });
      }
      seen.add(s.level);
      for (const m of distributionIssues(s.distribution)) {
        issues.push({ pointer: `/initialStates/${i}/distribution`, message: m });
      }
    });
    return issues;
  });
  if (!r.ok) return r;
  const b = r.value.body;
  return {
    ok: true,
    value: {
      ...b,
      model: r.value.model,
      initial: b.initial as Record<string, number>,
      samples: b.samples ?? 101,
      parameters: b.parameters ?? [],
      initialStates: b.initialStates ?? [],
      tolerance: b.tolerance ?? 1e-8,
    },
  };
}
