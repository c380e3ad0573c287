import * as z from 'zod';
import { chainModelSchema, type ChainModel } from '../model/chain-model';
import { initialStateIssues } from '../model/initial-vector';
import { issuesFromZod } from '../model/zod-issues';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';
import {
  MAX_PUBLIC_PARAMETERS,
  publicBoundsIssues,
  publicParameterSchema,
  type PublicParameter,
} from './public-bounds';

/** Longest scenario horizon, in model time units (its public what-ifs answer inline). */
export const MAX_SCENARIO_HORIZON = 2000;

const text = (label: string, max: number) =>
  z
    .string({ error: `${label} must be a string` })
    .trim()
    .max(max, { error: `${label} must be at most ${max} characters` });

/**
 * What one scenario version holds: a named system in real units (the model's levels carry
 * names and units), where it is, its start and horizon, and what the public may change.
 */
export const scenarioContentSchema = z.strictObject({
  name: text('name', 120).min(1, { error: 'name must not be empty' }),
  description: text('description', 4000).optional(),
  location: text('location', 300).optional(),
  model: z.unknown(),
  initial: z.record(z.string(), z.unknown(), {
    error: 'initial must be an object of level id → starting value',
  }),
  horizon: z
    .number({ error: 'horizon must be a finite number' })
    .positive({ error: 'horizon must be greater than zero' })
    .max(MAX_SCENARIO_HORIZON, { error: `horizon must be at most ${MAX_SCENARIO_HORIZON}` }),
  publicParameters: z
    .array(publicParameterSchema, { error: 'publicParameters must be an array' })
    .max(MAX_PUBLIC_PARAMETERS, { error: `at most ${MAX_PUBLIC_PARAMETERS} public parameters` })
    .optional(),
});

/** A validated scenario version's content. */
export interface ScenarioContent {
  readonly name: string;
  readonly description: string;
  readonly location: string;
  readonly model: ChainModel;
  readonly initial: Record<string, number>;
  readonly horizon: number;
  readonly publicParameters: PublicParameter[];
}

/**
 * Validates scenario content. Pointers are relative to `prefix` (the body of a save, or
 * `/scenario` inside an export document), so every issue names its field.
 */
export function validateScenarioContent(
  value: unknown,
  prefix: readonly string[] = [],
): ValidationResult<ScenarioContent> {
  const at = (p: string) => (prefix.length ? `/${prefix.join('/')}${p}` : p);
  const shape = scenarioContentSchema.safeParse(value);
  if (!shape.success) return { ok: false, errors: issuesFromZod(shape.error, prefix) };
  const model = chainModelSchema.safeParse(shape.data.model);
  if (!model.success) {
    return { ok: false, errors: issuesFromZod(model.error, [...prefix, 'model']) };
  }
  const bounds = shape.data.publicParameters ?? [];
  const errors: ValidationIssue[] = [
    ...initialStateIssues(model.data, shape.data.initial, at('/initial')),
    ...publicBoundsIssues(model.data, bounds, at('/publicParameters')),
  ];
  if (errors.length) return { ok: false, errors };
  return {
    ok: true,
    value: {
      name: shape.data.name,
      description: shape.data.description ?? '',
      location: shape.data.location ?? '',
      model: model.data,
      initial: shape.data.initial as Record<string, number>,
      horizon: shape.data.horizon,
      publicParameters: bounds,
    },
  };
}

/** The export format's name and version (Tropline's own scenario file). */
export const SCENARIO_FORMAT = 'tropline.scenario' as const;
/** Version of the export format. */
export const SCENARIO_FORMAT_VERSION = 1 as const;

/**
 * A scenario export file (`.tropline.json`): the format tag, the version, where it came from,
 * and the content of one version. Import reads exactly this and nothing else.
 */
export const scenarioExportSchema = z.strictObject({
  format: z.literal(SCENARIO_FORMAT, { error: `format must be "${SCENARIO_FORMAT}"` }),
  formatVersion: z.literal(SCENARIO_FORMAT_VERSION, {
    error: `formatVersion must be ${SCENARIO_FORMAT_VERSION}`,
  }),
  exportedAt: z.string().max(40).optional(),
  source: z
    .strictObject({
      tenant: z.string().max(80).optional(),
      scenarioId: z.string().max(64).optional(),
      version: z.number().int().positive().optional(),
      status: z.string().max(16).optional(),
    })
    .optional(),
  scenario: z.unknown(),
});

/** A parsed scenario export file. */
export interface ScenarioExport {
  readonly format: typeof SCENARIO_FORMAT;
  readonly formatVersion: typeof SCENARIO_FORMAT_VERSION;
  readonly exportedAt?: string;
  readonly source?: z.infer<typeof scenarioExportSchema>['source'];
  readonly scenario: ScenarioContent;
}

/** Validates an export file for import; pointers into the file (`/scenario/model/levels/1`). */
export function validateScenarioExport(value: unknown): ValidationResult<ScenarioExport> {
  const shape = scenarioExportSchema.safeParse(value);
  if (!shape.success) {
    const errors = issuesFromZod(shape.error);
    // Report the content's issues too, so one import attempt lists every error.
    const inner =
      value && typeof value === 'object' && 'scenario' in value
        ? validateScenarioContent((value as { scenario: unknown }).scenario, ['scenario'])
        : undefined;
    return { ok: false, errors: inner && !inner.ok ? [...errors, ...inner.errors] : errors };
  }
  const content = validateScenarioContent(shape.data.scenario, ['scenario']);
  if (!content.ok) return content;
  return { ok: true, value: { ...shape.data, scenario: content.value } as ScenarioExport };
}

/** Builds the export file of one version's content. */
export function scenarioExport(
  content: ScenarioContent,
  source: NonNullable<ScenarioExport['source']>,
  exportedAt: string,
): ScenarioExport {
  return {
    format: SCENARIO_FORMAT,
    formatVersion: SCENARIO_FORMAT_VERSION,
    exportedAt,
    source,
    scenario: content,
  };
}
