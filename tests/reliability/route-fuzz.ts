import fc from 'fast-check';
import type { OpenAPIV3_1 } from 'openapi-types';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { DEMO_USERS } from '../../seeds/03-demo-users';
import { contract } from '../api/openapi-contract';
import { SCENARIO_CONTENT } from './crash-load';
import { problemComplaints, send, signIn, type Answer, type Send } from './live-server';

/** The demo portal's origin, listed on the seeded browser key. */
export const PORTAL_ORIGIN = 'http://localhost:3000';

/** The credentials and real object ids a fuzz run aims at. */
export interface FuzzTarget {
  readonly base: string;
  readonly serverKey: string;
  readonly browserKey: string;
  readonly owner: { cookie: string; csrf: string };
  readonly operator: { cookie: string; csrf: string };
  /** Real ids by path parameter name, offered to read-only operations. */
  readonly ids: Readonly<Record<string, string>>;
}

/** Signs in the owner and the operator and makes a published scenario to aim reads at. */
export async function fuzzTarget(base: string, serverKey: string, browserKey: string) {
  const user = (role: string) => DEMO_USERS.find((u) => u.role === role)!;
  const owner = await signIn(base, user('owner').email, user('owner').password);
  const operator = await signIn(base, user('operator').email, user('operator').password);
  const created = await send(base, 'POST', '/scenarios', {
    key: serverKey,
    body: { ...SCENARIO_CONTENT, changeNote: 'Fuzz target' },
  });
  const scenario = created.json!.scenario as { id: string };
  const published = await send(base, 'POST', `/scenarios/${scenario.id}/versions/1/publish`, {
    key: serverKey,
  });
  const publicId = String((published.json as { publicId?: string })?.publicId ?? 'none');
  const ids = { id: scenario.id, version: '1', publicId, slug: 'larchmere' };
  return { base, serverKey, browserKey, owner, operator, ids } satisfies FuzzTarget;
}

/** One generated request. */
export interface FuzzRequest {
  readonly method: string;
  readonly path: string;
  readonly opts: Send;
}

// Unicode edge cases: lone surrogates, joiners, right-to-left marks, NUL, combining marks.
const oddText = fc.oneof(
  { arbitrary: fc.string({ unit: 'binary', maxLength: 40 }), weight: 3 },
  {
    arbitrary: fc.constantFrom(
      '\u0000',
      '\ud800',
      '\udfff',
      '\u202e',
      '\u200d',
      'e\u0301'.repeat(50),
    ),
    weight: 3,
  },
  {
    arbitrary: fc.constantFrom(
      '__proto__',
      'constructor',
      '../../etc/passwd',
      '%00',
      "' or 1=1 --",
    ),
    weight: 3,
  },
  // Rarely past Node's 16 KB request-head limit, so most requests still reach the routes.
  { arbitrary: fc.integer({ min: 1000, max: 40_000 }).map((n) => 'x'.repeat(n)), weight: 1 },
);

const oddNumber = fc.oneof(
  fc.double(),
  fc.constantFrom(1e308, -1e308, 5e-324, -0, 2 ** 53 + 1, 1e21),
  fc.integer(),
);

/** Deep nesting as raw text, so the client's own JSON.stringify never recurses that far. */
function nested(depth: number): string {
  return '{"model":' + '[{"a":'.repeat(depth) + '1' + '}]'.repeat(depth) + '}';
}

/** A benchmark model with one leaf replaced: stiff, exploding or nonsense parameters. */
const oddModel = fc
  .record({
    level: fc.integer({ min: 0, max: 2 }),
    field: fc.constantFrom('growthRate', 'attackRate', 'handlingTime', 'efficiency', 'mortality'),
    value: fc.oneof(oddNumber, fc.constantFrom(1e6, 1e9, -5, 0)),
  })
  .map(({ level, field, value }) => {
    const model = structuredClone(HASTINGS_POWELL_BENCHMARK.model) as unknown as {
      levels: Record<string, unknown>[];
    };
    model.levels[level]![field] = value;
    return model;
  });

/** A body for any route: JSON garbage, nesting, odd numbers, odd models, odd text. */
const oddBody: fc.Arbitrary<{ body: unknown; raw?: boolean }> = fc.oneof(
  fc.jsonValue({ maxDepth: 4 }).map((body) => ({ body })),
  fc.integer({ min: 100, max: 20_000 }).map((d) => ({ body: nested(d), raw: true })),
  fc
    .constantFrom('NaN', '{"horizon": Infinity}', '{"a":1e999}', '{', '[1,2', '\ud800')
    .map((body) => ({ body, raw: true })),
  fc
    .record({
      model: oddModel,
      horizon: fc.oneof(oddNumber, fc.constantFrom(1e5, 1e12)),
      samples: fc.oneof(oddNumber, fc.constantFrom(20_001, 1e9)),
      tolerance: fc.oneof(oddNumber, fc.constant(1e-13)),
    })
    .map((r) => ({ body: { ...r, initial: HASTINGS_POWELL_BENCHMARK.initial } })),
  fc
    .record({ name: oddText, changeNote: oddText, horizon: oddNumber, model: oddModel })
    .map((r) => ({ body: { ...SCENARIO_CONTENT, ...r } })),
  fc
    .dictionary(oddText, fc.oneof(oddText, oddNumber, fc.constant(null)), { maxKeys: 5 })
    .map((body) => ({ body })),
);

/** Header values fetch can carry (ByteStrings), still odd. */
const oddHeader = fc.oneof(
  fc.string({ unit: 'grapheme-ascii', maxLength: 60 }).map((s) => s.replace(/[\r\n]/g, '')),
  fc.constantFrom('', ' ', 'x'.repeat(8000), '\u00ff\u00fe', 'Bearer', 'Bearer  '),
);

function encodeSegment(s: string): string {
  try {
    return encodeURIComponent(s);
  } catch {
    return '%ED%A0%80'; // a lone surrogate as raw UTF-8: invalid on purpose
  }
}

const SESSION_ENDING = new Set(['delete /session', 'post /session/sign-out-everywhere']);

/** Requests for one operation of the spec: hostile path ids, query, headers and body. */
function operationRequests(
  target: FuzzTarget,
  template: string,
  method: string,
  op: OpenAPIV3_1.OperationObject,
): fc.Arbitrary<FuzzRequest> {
  const params = [...template.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]!);
  const query = (op.parameters ?? [])
    .map((p) => contract.deref(p) as OpenAPIV3_1.ParameterObject)
    .filter((p) => p.in === 'query')
    .map((p) => p.name);
  // Real ids only for reads: a fuzzed DELETE must not revoke the key the run is using.
  const idFor = (name: string) =>
    method === 'get' && target.ids[name]
      ? fc.oneof(fc.constant(target.ids[name]), oddText)
      : fc.oneof(fc.uuid(), oddText, fc.constant('abcdefghijkm'));
  const console = op.security !== undefined && op.security.length > 0;
  const keyed = op.security === undefined;
  const key = fc.oneof(
    fc.constant({ key: target.serverKey }),
    fc.constant({ key: target.browserKey, origin: PORTAL_ORIGIN }),
    oddHeader.map((k) => ({ key: k })),
  );
  const session = (who: { cookie: string; csrf: string }) =>
    fc.record({
      cookie: fc.constant(who.cookie),
      headers: fc.record({
        'x-csrf-token': fc.oneof(fc.constant(who.csrf), oddHeader),
        'tropline-tenant': fc.oneof(fc.constant('larchmere'), oddHeader),
      }),
    });
  const credential: fc.Arbitrary<Partial<Send>> = SESSION_ENDING.has(`${method} ${template}`)
    ? fc.constant({})
    : keyed
      ? fc.oneof(key, session(target.owner)) // scenario routes take either
      : console
        ? fc.oneof(session(target.owner), session(target.operator))
        : fc.constant({});
  return fc
    .record({
      ids: fc.tuple(...params.map(idFor)),
      query: fc.array(fc.tuple(fc.constantFrom(...query, 'x'), oddText), { maxLength: 3 }),
      credential,
      extra: fc.dictionary(
        fc.constantFrom('content-type', 'idempotency-key', 'accept', 'tropline-tenant', 'range'),
        oddHeader,
        { maxKeys: 2 },
      ),
      body: method === 'get' || method === 'delete' ? fc.constant(undefined) : oddBody,
    })
    .map(({ ids, query: q, credential: c, extra, body }) => {
      let path = template;
      params.forEach((p, i) => (path = path.replace(`{${p}}`, encodeSegment(ids[i]!))));
      const search = q.map(([k, v]) => `${encodeSegment(k)}=${encodeSegment(v)}`).join('&');
      const headers = { ...extra, ...c.headers };
      return {
        method: method.toUpperCase(),
        path: search ? `${path}?${search}` : path,
        opts: { ...c, headers, body: body?.body, raw: body?.raw },
      };
    });
}

/** Requests for every operation of the published contract (preflights included). */
export function everyRouteRequests(target: FuzzTarget): fc.Arbitrary<FuzzRequest> {
  const ops = contract.operations().filter((o) => o.method !== 'head');
  return fc.oneof(...ops.map((o) => operationRequests(target, o.template, o.method, o.op)));
}

/** Tally of a fuzz run. */
export interface FuzzTally {
  tried: number;
  fiveHundreds: number;
  /** Requests the server dropped without an answer. */
  noAnswer: number;
  complaints: string[];
  readonly statuses: Map<number, number>;
}

/** Sends one request and records what is wrong with its answer by the contract's rules. */
export async function fuzzOnce(base: string, r: FuzzRequest, tally: FuzzTally): Promise<void> {
  let a: Answer;
  try {
    a = await send(base, r.method, r.path, r.opts);
  } catch (err) {
    // A dropped connection or a hang cut short is a failure of the server, not a pass.
    tally.complaints.push(`${r.method} ${r.path.slice(0, 80)}: no answer (${String(err)})`);
    tally.noAnswer++;
    return;
  }
  tally.tried++;
  tally.statuses.set(a.status, (tally.statuses.get(a.status) ?? 0) + 1);
  if (a.status >= 500) tally.fiveHundreds++;
  for (const c of problemComplaints(a)) {
    const line = `${r.method} ${r.path.slice(0, 80)}: ${c.slice(0, 200)}`;
    if (tally.complaints.length < 20) tally.complaints.push(line);
  }
}

/** An empty tally. */
export function newTally(): FuzzTally {
  return { tried: 0, fiveHundreds: 0, noAnswer: 0, complaints: [], statuses: new Map() };
}
