import type { Request } from 'express';
import { z } from 'zod';
import {
  type ChainModel,
  issuesFromZod,
  type ScenarioContent,
  whatIfChangeSchema,
  whatIfIssues,
  withParameter,
} from '@tropline/core';
import type { KeyPrincipal } from '../auth/key-principal';
import { ProblemError, validationProblem } from '../http/problem';
import { actorOf } from './scenario-access';
import type { ScenariosService } from './scenarios-service';

/** The public's what-if: changes to the parameters the publisher opened, nothing else. */
const changesField = z.array(whatIfChangeSchema).max(12).optional();

/** Body of `POST /published-scenarios/{publicId}/projections`. */
export const whatIfProjectionBody = z.strictObject({
  changes: changesField,
  horizon: z.number().positive().optional(),
  samples: z.number().int().min(2).max(2001).optional(),
});

/**
 * Body of the published `regimes` and `equilibria` routes: the same changes; a horizon or a
 * sample count mean nothing to them and are refused by name.
 */
export const whatIfChangesBody = z.strictObject({ changes: changesField });

/** A published scenario's what-if, checked against the publisher's ranges. */
export interface PublishedWhatIf<B> {
  /** The key that pays for the computation. */
  readonly principal: KeyPrincipal;
  /** The published version's content (model, start, horizon, public ranges). */
  readonly content: ScenarioContent;
  /** The body as parsed. */
  readonly body: B;
  /** The changes asked for, in order. */
  readonly changes: readonly z.infer<typeof whatIfChangeSchema>[];
  /** The published model with the changes applied. */
  readonly model: ChainModel;
}

/**
 * The one check every published what-if route shares: a key to price it against (403 without
 * one), the version published behind the public id (404), the body's shape, every change a
 * listed parameter within its range and `extra` issues, all reported together (400, pointers
 * relative to the body). The server computes from its own copy of the published model.
 */
export async function publishedWhatIf<
  S extends z.ZodType<{ changes?: z.infer<typeof whatIfChangeSchema>[] }>,
>(
  service: ScenariosService,
  req: Request,
  schema: S,
  extra: (
    body: z.infer<S>,
    content: ScenarioContent,
  ) => { pointer: string; message: string }[] = () => [],
): Promise<PublishedWhatIf<z.infer<S>>> {
  const actor = actorOf(req);
  if (!actor.principal) {
    throw new ProblemError(
      403,
      'key-required',
      'A key is needed to compute',
      'What-if computations are priced in compute units; call them with an API key.',
    );
  }
  const { version } = await service.published(actor.tenantId, String(req.params.publicId));
  const shape = schema.safeParse(req.body ?? {});
  if (!shape.success) throw validationProblem(issuesFromZod(shape.error));
  const content = version.content;
  const changes = shape.data.changes ?? [];
  const errors = [
    ...whatIfIssues(content.publicParameters, changes),
    ...extra(shape.data, content),
  ];
  if (errors.length) throw validationProblem(errors);
  let model = content.model;
  for (const change of changes) model = withParameter(model, change.pointer, change.value);
  return { principal: actor.principal, content, body: shape.data, changes, model };
}
