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
 * Validates scenario content, reporting every issue at once: the fields' shapes, the model
 * (even when another field is wrong), then the start and the public ranges against a valid
 * model. Pointers are relative to `prefix` (the body of a save, or `/scenario` inside an export
 * document), so every issue names its field.
 */
export function validateScenarioContent(
  value: unknown,
  prefix: readonly string[] = [],
): ValidationResult<ScenarioContent> {
  const at = (p: string) => (prefix.length ? `/${prefix.join('/')}${p}` : p);
  const shape = scenarioContentSchema.safeParse(value);
  const errors: ValidationIssue[] = shape.success ? [] : issuesFromZod(shape.error, prefix);
  const raw = (value !== null && typeof value === 'object' ? value : {}) as Record<string, unknown>;
  if (!('model' in raw)) return { ok: false, errors };
  const model = chainModelSchema.safeParse(raw.model);
  if (!model.success) {
    return { ok: false, errors: [...errors, ...issuesFromZod(model.error, [...prefix, 'model'])] };
  }
  // The start and the public ranges can be checked against the model whenever they have
  // their shape, whatever else is wrong.
  const initial = z.record(z.string(), z.unknown()).safeParse(raw.initial);
  const bounds = z.array(publicParameterSchema).safeParse(raw.publicParameters ?? []);
  if (initial.success) errors.push(...initialStateIssues(model.data, initial.data, at('/initial')));
  if (bounds.success) {
    errors.push(...publicBoundsIssues(model.data, bounds.data, at('/publicParameters')));
  }
  if (errors.length || !shape.success) return { ok: false, errors };
  return {
    ok: true,
    value: {
      name: shape.data.name,
      description: shape.data.description ?? '',
      location: shape.data.location ?? '',
      model: model.data,
      initial: shape.data.initial as Record<string, number>,
      horizon: shape.data.horizon,
      publicParameters: shape.data.publicParameters ?? [],
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
  // The content's issues are reported with the file's, so one import attempt lists every error.
  const scenario =
    value !== null && typeof value === 'object'
      ? (value as { scenario?: unknown }).scenario
      : undefined;
  const inner = validateScenarioContent(scenario, ['scenario']);
  const own = shape.success ? [] : issuesFromZod(shape.error);
  const errors = [
    // A missing or malformed `scenario` is said once, by the content's own check.
    ...(inner.ok ? own : own.filter((e) => e.pointer !== '/scenario')),
    ...(inner.ok ? [] : inner.errors),
  ];
  if (!shape.success || !inner.ok) return { ok: false, errors };
  return { ok: true, value: { ...shape.data, scenario: inner.value } as ScenarioExport };
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
