import { z } from 'zod';
import { chainModelSchema, type ChainModel } from '../model/chain-model';
import { initialStateIssues } from '../model/initial-vector';
import { getParameter, withParameter } from '../model/parameter-pointer';
import { issuesFromZod } from '../model/zod-issues';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';

/** Bounds on one calibration, so its work is known before it runs. */
export const CALIBRATION_LIMITS = {
  /** Most fitted parameters (initial states included). */
  maxFitted: 6,
  /** Most observation rows. */
  maxRows: 2000,
  /** Most optimiser starts. */
  maxStarts: 8,
  /** Most Levenberg–Marquardt iterations per start. */
  maxIterations: 200,
  /** Longest time span of the data, in model time units. */
  maxSpan: 5000,
  /** Most segments of a segmented fit (each adds one fitted start value per level). */
  maxSegments: 100,
} as const;

const finite = (label: string) =>
  z.number({
    error: (iss) =>
      iss.input === undefined ? `${label} is required` : `${label} must be a finite number`,
  });

/** One fitted parameter: a JSON Pointer into the model and the box it is searched in. */
export const fittedParameterSchema = z.strictObject({
  pointer: z.string({ error: 'pointer must be a JSON Pointer string' }),
  min: finite('min'),
  max: finite('max'),
});

/** One fitted initial state: a level id and the box its starting value is searched in. */
export const fittedInitialSchema = z.strictObject({
  level: z.string({ error: 'level must be a level id' }),
  min: finite('min').positive({ error: 'min must be greater than zero' }),
  max: finite('max'),
});

const column = z.array(z.number().nonnegative().nullable(), {
  error: 'each level is an array of numbers ≥ 0 or null (missing)',
});

/**
 * Monitoring series on the model's time axis: strictly increasing `times`, one column per level
 * (null where a survey missed it), optional standard errors in the level's own unit.
 */
export const observationSeriesSchema = z.strictObject({
  times: z.array(finite('time').nonnegative({ error: 'times must not be negative' }), {
    error: 'times must be an array of numbers',
  }),
  levels: z.record(z.string(), column),
  standardErrors: z.record(z.string(), column).optional(),
});

/**
 * The body of a calibration: the model and start it refines, the data, what to fit. With
 * `segmentLength` the data are cut into windows of that length, each integrated from its own
 * start state, fitted alongside the parameters from the surveys at its first row (the remedy
 * for a chaotic fit); `initialStates` then do not apply.
 */
export const calibrationRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: z.record(z.string(), z.unknown(), { error: 'initial must be an object' }),
  observations: observationSeriesSchema,
  parameters: z
    .array(fittedParameterSchema, { error: 'parameters must be an array' })
    .max(CALIBRATION_LIMITS.maxFitted, {
      error: `at most ${CALIBRATION_LIMITS.maxFitted} parameters`,
    }),
  initialStates: z.array(fittedInitialSchema).optional(),
  starts: z.number().int().min(1).max(CALIBRATION_LIMITS.maxStarts).optional(),
  maxIterations: z.number().int().min(1).max(CALIBRATION_LIMITS.maxIterations).optional(),
  segmentLength: finite('segmentLength').positive().optional(),
});

/** A validated calibration request, defaults filled in. */
export interface CalibrationRequest {
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
  readonly observations: z.infer<typeof observationSeriesSchema>;
  readonly parameters: readonly z.infer<typeof fittedParameterSchema>[];
  readonly initialStates: readonly z.infer<typeof fittedInitialSchema>[];
  readonly starts: number;
  readonly maxIterations: number;
  readonly segmentLength?: number;
}

function boxIssues(
  model: ChainModel,
  req: z.infer<typeof calibrationRequestSchema>,
): ValidationIssue[] {
  const out: ValidationIssue[] = [];
  const seen = new Set<string>();
  req.parameters.forEach((p, i) => {
    const at = `/parameters/${i}`;
    if (seen.has(p.pointer)) out.push({ pointer: `${at}/pointer`, message: 'fitted twice' });
    seen.add(p.pointer);
    try {
      getParameter(model, p.pointer);
    } catch {
      out.push({ pointer: `${at}/pointer`, message: `"${p.pointer}" names no model parameter` });
      return;
    }
    if (!(p.min < p.max)) out.push({ pointer: `${at}/max`, message: 'max must exceed min' });
    for (const end of ['min', 'max'] as const) {
      try {
        withParameter(model, p.pointer, p[end]);
      } catch (err) {
        const why = (err as { errors?: ValidationIssue[] }).errors?.[0]?.message ?? 'invalid';
        out.push({ pointer: `${at}/${end}`, message: `outside the model's own bounds: ${why}` });
      }
    }
  });
  const ids = model.levels.map((l) => l.id);
  (req.initialStates ?? []).forEach((s, i) => {
    const at = `/initialStates/${i}`;
    if (!ids.includes(s.level)) out.push({ pointer: `${at}/level`, message: 'unknown level' });
    if (!(s.min < s.max)) out.push({ pointer: `${at}/max`, message: 'max must exceed min' });
  });
  if (req.segmentLength !== undefined && req.initialStates?.length) {
    out.push({
      pointer: '/initialStates',
      message:
        "each segment's start is fitted from its own surveys; fit initial states without segments",
    });
  }
  if (req.parameters.length + (req.initialStates?.length ?? 0) === 0) {
    out.push({ pointer: '/parameters', message: 'name at least one parameter or initial state' });
  }
  if (req.parameters.length + (req.initialStates?.length ?? 0) > CALIBRATION_LIMITS.maxFitted) {
    out.push({
      pointer: '/initialStates',
      message: `at most ${CALIBRATION_LIMITS.maxFitted} fitted values in all`,
    });
  }
  return out;
}

function seriesIssues(
  model: ChainModel,
  obs: z.infer<typeof observationSeriesSchema>,
  segmentLength: number | undefined,
): ValidationIssue[] {
  const out: ValidationIssue[] = [];
  const n = obs.times.length;
  if (n < 2) out.push({ pointer: '/observations/times', message: 'at least two times' });
  if (n > CALIBRATION_LIMITS.maxRows) {
    out.push({ pointer: '/observations/times', message: `at most ${CALIBRATION_LIMITS.maxRows}` });
  }
  for (let i = 1; i < n; i++) {
    if (!(obs.times[i]! > obs.times[i - 1]!)) {
      out.push({ pointer: `/observations/times/${i}`, message: 'times must strictly increase' });
      break;
    }
  }
  if (segmentLength !== undefined && n >= 2) {
    const silent = model.levels
      .map((l) => l.id)
      .filter((id) => !(obs.levels[id] ?? []).some((v) => v !== null && v > 0));
    if (silent.length) {
      out.push({
        pointer: '/segmentLength',
        message:
          `each segment fits every level's start from its surveys, and ${silent.join(', ')} ` +
          'has none; fit the whole span instead',
      });
    }
    const pieces = (obs.times[n - 1]! - obs.times[0]!) / segmentLength;
    if (pieces > CALIBRATION_LIMITS.maxSegments) {
      out.push({
        pointer: '/segmentLength',
        message:
          `at most ${CALIBRATION_LIMITS.maxSegments} segments: at least ` +
          `${(obs.times[n - 1]! - obs.times[0]!) / CALIBRATION_LIMITS.maxSegments} time units`,
      });
    }
  }
  if (n && obs.times[n - 1]! > CALIBRATION_LIMITS.maxSpan) {
    out.push({
      pointer: `/observations/times/${n - 1}`,
      message: `the data may span at most ${CALIBRATION_LIMITS.maxSpan} time units`,
    });
  }
  const ids = model.levels.map((l) => l.id);
  for (const key of ['levels', 'standardErrors'] as const) {
    for (const [id, values] of Object.entries(obs[key] ?? {})) {
      const at = `/observations/${key}/${id}`;
      if (!ids.includes(id)) out.push({ pointer: at, message: `unknown level "${id}"` });
      else if (values.length !== n) {
        out.push({
          pointer: at,
          message: `needs ${n} entries, one per time, not ${values.length}`,
        });
      }
    }
  }
  if (Object.keys(obs.levels).length === 0) {
    out.push({ pointer: '/observations/levels', message: 'observe at least one level' });
  }
  return out;
}

/** Validates a calibration request; every issue carries a pointer relative to the body. */
export function validateCalibrationRequest(body: unknown): ValidationResult<CalibrationRequest> {
  const shape = calibrationRequestSchema.safeParse(body);
  if (!shape.success) return { ok: false, errors: issuesFromZod(shape.error) };
  const modelCheck = chainModelSchema.safeParse(shape.data.model);
  if (!modelCheck.success) return { ok: false, errors: issuesFromZod(modelCheck.error, ['model']) };
  const model = modelCheck.data;
  const errors = [
    ...initialStateIssues(model, shape.data.initial),
    ...seriesIssues(model, shape.data.observations, shape.data.segmentLength),
    ...boxIssues(model, shape.data),
  ];
  if (errors.length) return { ok: false, errors };
  const r = shape.data;
  return {
    ok: true,
    value: {
      model,
      initial: r.initial as Record<string, number>,
      observations: r.observations,
      parameters: r.parameters,
      initialStates: r.initialStates ?? [],
      starts: r.starts ?? 3,
      maxIterations: r.maxIterations ?? 40,
      ...(r.segmentLength === undefined ? {} : { segmentLength: r.segmentLength }),
    },
  };
}

/**
 * Weighted model time a calibration integrates at most (for pricing). Every iteration of every
 * start integrates the span once per fitted value plus once. A segmented fit runs two passes,
 * each a joint descent (one more span per level: a start's column integrates its own segment
 * only) and a descent of the starts alone from two first guesses (1 + levels spans each).
 */
export function calibrationWork(req: CalibrationRequest): number {
  const span = req.observations.times.at(-1) ?? 0;
  const fitted = req.parameters.length + req.initialStates.length;
  if (req.segmentLength === undefined) return req.starts * req.maxIterations * (fitted + 1) * span;
  const levels = req.model.levels.length;
  const perIteration = fitted + levels + 1 + 2 * (levels + 1);
  return 2 * req.starts * req.maxIterations * perIteration * span;
}
