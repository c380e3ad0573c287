import request from 'supertest';
import { z } from 'zod';
import type { OpenAPIV3_1 } from 'openapi-types';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as core from '@tropline/core';
import { testConfig } from '../../server/config';
import { createApp, type TroplineApp } from '../../server/create-app';
import { contract } from './openapi-contract';

const doc = contract.doc;
const SAFE = Number.MAX_SAFE_INTEGER;
const DROP = new Set([
  'description',
  'example',
  'examples',
  'default',
  'title',
  'format',
  '$schema',
]);

/** A schema reduced to what constrains values, `$ref`s resolved, for comparing two sources. */
function shape(schema: unknown): unknown {
  const s = contract.deref(schema as object) as Record<string, unknown>;
  if (s === null || typeof s !== 'object') return s;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(s)) {
    if (DROP.has(k)) continue;
    if (
      s.type === 'integer' &&
      (k === 'minimum' || k === 'maximum') &&
      Math.abs(v as number) === SAFE
    )
      continue;
    if (k === 'propertyNames') continue;
    if (k === 'properties') {
      out[k] = Object.fromEntries(Object.entries(v as object).map(([p, ps]) => [p, shape(ps)]));
    } else if (k === 'required') out[k] = [...(v as string[])].sort();
    else if (Array.isArray(v)) out[k] = v.map((x) => (typeof x === 'object' ? shape(x) : x));
    else if (v && typeof v === 'object') out[k] = shape(v);
    else out[k] = v;
  }
  return out;
}

/** Compares two shapes; `{}` on the zod side (z.unknown) accepts whatever the spec says. */
function drift(zod: unknown, spec: unknown, path = ''): string[] {
  if (zod && typeof zod === 'object' && Object.keys(zod).length === 0) return [];
  if (typeof zod !== 'object' || typeof spec !== 'object' || !zod || !spec) {
    return JSON.stringify(zod) === JSON.stringify(spec)
      ? []
      : [`${path}: ${JSON.stringify(zod)} ≠ ${JSON.stringify(spec)}`];
  }
  const keys = new Set([...Object.keys(zod), ...Object.keys(spec)]);
  const out: string[] = [];
  for (const k of keys) {
    // The level count (2–4) is a refinement in zod, a tuple bound in the spec.
    if (path.endsWith('/levels') && (k === 'minItems' || k === 'maxItems')) continue;
    out.push(
      ...drift(
        (zod as Record<string, unknown>)[k],
        (spec as Record<string, unknown>)[k],
        `${path}/${k}`,
      ),
    );
  }
  return out;
}

const PAIRS: [keyof typeof core, string][] = [
  ['chainModelSchema', 'ChainModel'],
  ['producerLevelSchema', 'ProducerLevel'],
  ['consumerLevelSchema', 'ConsumerLevel'],
  ['harvestRuleSchema', 'HarvestRule'],
  ['stockingRuleSchema', 'StockingRule'],
  ['projectionRequestSchema', 'ProjectionRequest'],
  ['projectionResponseSchema', 'ProjectionResponse'],
  ['equilibriaRequestSchema', 'EquilibriaRequest'],
  ['equilibriumSchema', 'Equilibrium'],
  ['equilibriaResponseSchema', 'EquilibriaResponse'],
  ['regimeRequestSchema', 'RegimeRequest'],
  ['regimeResponseSchema', 'RegimeResponse'],
  ['sweepRequestSchema', 'SweepRequest'],
  ['sweepResultSchema', 'SweepResult'],
  ['regimeMapRequestSchema', 'RegimeMapRequest'],
  ['regimeMapResultSchema', 'RegimeMapResult'],
  ['ensembleRequestSchema', 'EnsembleRequest'],
  ['ensembleResultSchema', 'EnsembleResult'],
  ['comparisonRequestSchema', 'ComparisonRequest'],
  ['comparisonResultSchema', 'ComparisonResult'],
];

describe('openapi/openapi.yaml', () => {
  let app: TroplineApp;
  beforeAll(async () => {
    app = createApp(testConfig());
    await app.locals.tropline.ready;
  });
  afterAll(() => app.locals.tropline.close());

  it('compiles every component schema in strict JSON Schema 2020-12', () => {
    for (const [name, schema] of Object.entries(doc.components?.schemas ?? {})) {
      expect(() => contract.validator(schema as object), name).not.toThrow();
    }
  });

  it('resolves every $ref', () => {
    const refs: string[] = [];
    JSON.stringify(doc, (k, v) => (k === '$ref' ? (refs.push(v), v) : v));
    expect(refs.length).toBeGreaterThan(20);
    for (const ref of refs) expect(() => contract.deref({ $ref: ref }), ref).not.toThrow();
  });

  it('has examples that satisfy their own schemas', () => {
    let checked = 0;
    const check = (schema: unknown, value: unknown, where: string) => {
      const fn = contract.validator(schema as object);
      expect(fn(value), `${where}: ${contract.ajv.errorsText(fn.errors)}`).toBe(true);
      checked++;
    };
    for (const { template, method, op } of contract.operations()) {
      const where = `${method.toUpperCase()} ${template}`;
      const bodies: [string, OpenAPIV3_1.MediaTypeObject][] = [];
      const rb = op.requestBody && contract.deref<OpenAPIV3_1.RequestBodyObject>(op.requestBody);
      for (const m of Object.values(rb?.content ?? {})) bodies.push([`${where} request`, m]);
      for (const [status, r] of Object.entries(op.responses ?? {})) {
        const resp = contract.deref<OpenAPIV3_1.ResponseObject>(r);
        for (const [type, m] of Object.entries(resp.content ?? {})) {
          if (type !== 'text/event-stream') bodies.push([`${where} ${status}`, m]);
        }
        for (const [name, hd] of Object.entries(resp.headers ?? {})) {
          const h = contract.deref<OpenAPIV3_1.HeaderObject>(hd);
          if (h.example !== undefined) check(h.schema, h.example, `${where} ${status} ${name}`);
        }
      }
      for (const [label, media] of bodies) {
        if (media.example !== undefined) check(media.schema, media.example, label);
        for (const [n, ex] of Object.entries(media.examples ?? {})) {
          check(media.schema, contract.deref<OpenAPIV3_1.ExampleObject>(ex).value, `${label} ${n}`);
        }
      }
    }
    expect(checked).toBeGreaterThan(20);
  });

  it('documents every operation fully: id, summary, tags, and the keyed answers', () => {
    const ids = new Set<string>();
    for (const { template, method, op } of contract.operations()) {
      const where = `${method.toUpperCase()} ${template}`;
      expect(op.operationId, where).toBeTruthy();
      expect(ids.has(op.operationId!), `duplicate ${op.operationId}`).toBe(false);
      ids.add(op.operationId!);
      expect(op.summary, where).toBeTruthy();
      expect(op.tags?.length, where).toBeGreaterThan(0);
      // Keyed operations inherit the bearer schemes; cookie and public ones declare their own.
      const keyed = op.security === undefined;
      if (!keyed) continue;
      for (const status of ['401', '403', '429'])
        expect(op.responses?.[status], `${where} ${status}`).toBeDefined();
      for (const [status, r] of Object.entries(op.responses ?? {})) {
        if (!status.startsWith('2')) continue;
        const headers = Object.keys(contract.deref<OpenAPIV3_1.ResponseObject>(r).headers ?? {});
        expect(headers, `${where} ${status}`).toEqual(
          expect.arrayContaining(['RateLimit', 'RateLimit-Policy']),
        );
      }
    }
  });

  it('describes only routes the server serves', async () => {
    for (const { template, method } of contract.operations()) {
      const path = '/api/v1' + template.replace(/\{[^}]+\}/g, 'abcdefghijkl');
      const agent = request(app);
      const res = await agent[method as 'get'](path).set('Origin', 'https://unlisted.example');
      expect(res.status, `${method} ${path}`).not.toBe(404);
    }
  });

  it('matches the engine’s zod schemas (request and response shapes do not drift)', () => {
    for (const [zodName, component] of PAIRS) {
      const zodSchema = z.toJSONSchema(core[zodName] as z.ZodType, { unrepresentable: 'any' });
      const specSchema = doc.components?.schemas?.[component];
      expect(specSchema, component).toBeDefined();
      expect(drift(shape(zodSchema), shape(specSchema)), component).toEqual([]);
    }
  });
});
