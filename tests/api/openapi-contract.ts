import { Ajv2020, type ValidateFunction } from 'ajv/dist/2020.js';
import addFormats from 'ajv-formats';
import type { OpenAPIV3_1 } from 'openapi-types';
import { expect } from 'vitest';
import { openapiDocument } from '../../server/docs/openapi-document';

type Operation = OpenAPIV3_1.OperationObject;
type ResponseObject = OpenAPIV3_1.ResponseObject;

const SPEC_ID = 'https://tropline.dev/openapi.json';
const METHODS = ['get', 'put', 'post', 'delete', 'patch', 'options', 'head'] as const;

/** The published contract with a JSON Schema 2020-12 validator over its components. */
export class OpenApiContract {
  readonly doc: OpenAPIV3_1.Document;
  readonly ajv: Ajv2020;
  private readonly compiled = new Map<string, ValidateFunction>();

  constructor(doc: OpenAPIV3_1.Document = openapiDocument()) {
    this.doc = doc;
    // strict: every schema keyword must be known, so a typo in the spec fails the suite.
    this.ajv = new Ajv2020({
      strict: true,
      allErrors: true,
      strictRequired: false,
      // A 1-tuple of the producer followed by consumers is the point of prefixItems here.
      strictTuples: false,
    });
    addFormats.default(this.ajv);
    this.ajv.addVocabulary(['example', 'discriminator', 'xml', 'externalDocs', 'components']);
    this.ajv.addSchema({ $id: SPEC_ID, components: doc.components } as object);
  }

  /** Resolves a local `$ref` (`#/components/...`) to the object it names. */
  deref<T>(value: T | OpenAPIV3_1.ReferenceObject): T {
    let v: unknown = value;
    for (let i = 0; i < 10 && v && typeof v === 'object' && '$ref' in v; i++) {
      const ref = (v as OpenAPIV3_1.ReferenceObject).$ref;
      v = ref
        .slice(2)
        .split('/')
        .reduce<unknown>((o, k) => (o as Record<string, unknown>)?.[k], this.doc);
      if (v === undefined) throw new Error(`unresolved $ref ${ref}`);
    }
    return v as T;
  }

  /** A validator for a schema found in the spec (its `$ref`s resolve into the components). */
  validator(schema: object): ValidateFunction {
    const key = JSON.stringify(schema);
    let fn = this.compiled.get(key);
    if (!fn) {
      const rewritten = JSON.parse(key.replaceAll('"#/components/', `"${SPEC_ID}#/components/`));
      fn = this.ajv.compile(rewritten);
      this.compiled.set(key, fn);
    }
    return fn;
  }

  /** The operation serving a concrete path (`/api/v1/jobs/123`) and method. */
  operation(method: string, path: string): { template: string; op: Operation } | undefined {
    const local = path.replace(/^\/api\/v1/, '').split('?')[0];
    for (const [template, item] of Object.entries(this.doc.paths ?? {})) {
      const re = new RegExp('^' + template.replace(/\{[^}]+\}/g, '[^/]+') + '$');
      const op = (item as Record<string, Operation | undefined>)[method.toLowerCase()];
      if (re.test(local) && op) return { template, op };
    }
    return undefined;
  }

  /** Every operation with its path template and method. */
  operations(): { template: string; method: string; op: Operation }[] {
    const out = [];
    for (const [template, item] of Object.entries(this.doc.paths ?? {})) {
      for (const method of METHODS) {
        const op = (item as Record<string, Operation | undefined>)[method];
        if (op) out.push({ template, method, op });
      }
    }
    return out;
  }

  /**
   * Checks one HTTP answer against the spec: the route, status and media type are documented,
   * the body validates against the documented schema, and documented headers are present.
   * Returns the list of complaints (empty when it conforms).
   */
  check(
    method: string,
    path: string,
    status: number,
    headers: Record<string, string>,
    body: unknown,
  ) {
    const found = this.operation(method, path);
    if (!found) return [`${method} ${path} is not in the spec`];
    const responses = found.op.responses ?? {};
    const declared = responses[String(status)] ?? responses.default;
    if (!declared) return [`${method} ${found.template}: status ${status} is not documented`];
    const response = this.deref<ResponseObject>(declared);
    const problems: string[] = [];
    for (const [name, header] of Object.entries(response.headers ?? {})) {
      const h = this.deref<OpenAPIV3_1.HeaderObject>(header);
      const value = headers[name.toLowerCase()];
      // Headers sent only in some answers of a status (a replay, a cache verdict, a challenge).
      const optional = [
        'WWW-Authenticate',
        'Tropline-Cache',
        'Location',
        'Idempotent-Replayed',
        'Server-Timing',
      ].includes(name);
      if (value === undefined) {
        if (!optional) problems.push(`${status}: header ${name} missing`);
        continue;
      }
      const schema = h.schema as { type?: string } | undefined;
      if (schema?.type === 'integer' && !/^\d+$/.test(value)) {
        problems.push(`${status}: header ${name} is not an integer: ${value}`);
      }
    }
    const type = (headers['content-type'] ?? '').split(';')[0].trim();
    if (!response.content) {
      if (type && status !== 204) problems.push(`${status}: undocumented body of type ${type}`);
      return problems;
    }
    const media = response.content[type];
    if (!media) return [...problems, `${status}: media type "${type}" not documented`];
    if (type === 'text/event-stream' || !media.schema) return problems;
    const validate = this.validator(media.schema as object);
    if (!validate(body)) {
      problems.push(
        `${status} body: ${this.ajv.errorsText(validate.errors)} — ${JSON.stringify(body).slice(0, 300)}`,
      );
    }
    return problems;
  }
}

/** One contract for the whole run. */
export const contract = new OpenApiContract();

interface AnswerLike {
  status: number;
  headers: Record<string, string>;
  body: unknown;
  req: { method: string; path: string };
}

/**
 * A supertest `.expect()` callback: fails the test when the answer departs from the spec.
 * Every request in the API suites goes through it (see api-harness.ts).
 */
export function conformsToContract(res: AnswerLike): void {
  const problems = contract.check(res.req.method, res.req.path, res.status, res.headers, res.body);
  expect(problems, `${res.req.method} ${res.req.path} → ${res.status}`).toEqual([]);
}
