/**
 * `npm run soak`: the full form of tests/reliability. Thousands of hostile requests, sustained
 * load with autocannon, chained SIGKILL cycles, the victim's p99 with and without a flood, quota
 * exactness across three processes and the whole authorization matrix; then one summary table.
 * The tests assert correctness; this prints figures. Aim: under ten minutes on two cores.
 */
import { cpus, loadavg } from 'node:os';
import autocannon from 'autocannon';
import Database from 'better-sqlite3';
import fc from 'fast-check';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { testConfig } from '../server/config';
import { QuotasService } from '../server/quotas/quotas-service';
import { serve } from '../server/serve';
import { DEMO_TENANT } from '../seeds/01-demo-tenant';
import { buildFixture, runMatrix } from '../tests/reliability/access-matrix';
import {
  crashCycle,
  noAcknowledgements,
  prepareCrashDatabase,
} from '../tests/reliability/crash-load';
import {
  percentile,
  prepareFlood,
  runFlood,
  type FloodReport,
} from '../tests/reliability/job-flood';
import {
  freshDatabaseFile,
  prepareDatabase,
  send,
  spawnApi,
} from '../tests/reliability/live-server';
import {
  everyRouteRequests,
  fuzzOnce,
  fuzzTarget,
  newTally,
} from '../tests/reliability/route-fuzz';
import {
  bystander,
  idleConnections,
  neverReads,
  rawGet,
  trickleBody,
  trickleHead,
} from '../tests/reliability/slow-clients';

const FUZZ_RUNS = Number(process.env.SOAK_FUZZ ?? 3000);
const CRASH_CYCLES = Number(process.env.SOAK_CRASHES ?? 8);
const LOAD_SECONDS = Number(process.env.SOAK_LOAD_SECONDS ?? 20);
const FLOOD_MS = Number(process.env.SOAK_FLOOD_MS ?? 15_000);

const totals = { requests: 0, fiveHundreds: 0, faults: 0, badInputs: 0, lost: 0, broken: 0 };
const PER_TENANT_ACTIVE = 4; // server/auth/keyed-api.ts
const rows: [string, string][] = [];
const log = (line: string) => console.log(`soak: ${line}`);

function cannon(opts: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) =>
    autocannon(opts, (err, result) => (err ? reject(err) : resolve(result))),
  );
}

async function quotaExactness(): Promise<void> {
  const limit = 500;
  const file = freshDatabaseFile('soak-quota');
  const { demo } = await prepareDatabase(file, async ({ db }) => {
    await new QuotasService(db).setPlan(
      DEMO_TENANT.id,
      { monthlyUnits: limit, perMinute: 1_000_000 },
      'soak',
    );
    return {};
  });
  const servers = await Promise.all([1, 2, 3].map(() => spawnApi(file)));
  const total = 2000;
  let admitted = 0;
  let other = 0;
  for (let wave = 0; wave < total / 250; wave++) {
    const answers = await Promise.all(
      Array.from({ length: 250 }, (_, i) => {
        const model = structuredClone(HASTINGS_POWELL_BENCHMARK.model);
        (model.levels[0] as { growthRate: number }).growthRate = 1 + (wave * 250 + i) * 1e-6;
        return send(servers[i % 3]!.url, 'POST', '/equilibria', {
          key: demo.serverKey,
          body: { model },
        });
      }),
    );
    admitted += answers.filter((a) => a.status === 200).length;
    other += answers.filter((a) => a.status !== 200 && a.status !== 429).length;
    totals.fiveHundreds += answers.filter((a) => a.status >= 500).length;
  }
  await Promise.all(servers.map((s) => s.stop()));
  if (admitted !== limit || other) totals.broken++;
  totals.requests += total;
  rows.push([
    'quota, 3 processes',
    `${total} requests for ${limit} units: ${admitted} admitted, ${other} neither 200 nor 429`,
  ]);
}

async function sustainedLoad(): Promise<{ rps: number; p99: number }> {
  const file = freshDatabaseFile('soak-load');
  const { demo } = await prepareDatabase(file, async ({ db }) => {
    const plan = { monthlyUnits: 1e9, perMinute: 1e9 };
    await new QuotasService(db).setPlan(DEMO_TENANT.id, plan, 'soak');
    return {};
  });
  const server = await spawnApi(file);
  let n = 0;
  const headers = { authorization: `Bearer ${demo.serverKey}`, 'content-type': 'application/json' };
  const result = await cannon({
    url: server.url,
    connections: 16,
    duration: LOAD_SECONDS,
    requests: [
      {
        method: 'POST',
        path: '/api/v1/projections',
        headers,
        setupRequest: (req) => {
          // Distinct bodies, so every request is admitted, metered and computed, not cached.
          const { model, initial } = HASTINGS_POWELL_BENCHMARK;
          const body = { model, initial, horizon: 20 - ++n * 1e-9, samples: 21 };
          return { ...req, body: JSON.stringify(body) };
        },
      },
    ],
  });
  const rss = server.rssBytes();
  await server.stop();
  const fives = (result as unknown as Record<string, number>)['5xx'] ?? 0;
  totals.requests += result.requests.total;
  totals.fiveHundreds += fives;
  rows.push([
    'sustained load',
    `${result.requests.total} projections in ${LOAD_SECONDS} s over 16 connections: ` +
      `${result.requests.average.toFixed(0)} req/s, p50 ${result.latency.p50} ms, ` +
      `p99 ${result.latency.p99} ms, ${result.non2xx} non-2xx, ${result.errors} errors, ` +
      `RSS ${(rss / 2 ** 20).toFixed(0)} MB`,
  ]);
  return { rps: result.requests.average, p99: result.latency.p99 };
}

async function crashes(): Promise<void> {
  const file = freshDatabaseFile('soak-crash');
  const { admin } = await prepareCrashDatabase(file);
  const ack = noAcknowledgements();
  let server = await spawnApi(file);
  let requests = 0;
  let integrity = 'ok';
  for (let i = 0; i < CRASH_CYCLES; i++) {
    const cycle = await crashCycle(server, file, admin, ack, {
      writers: 8,
      killAfterMs: 300 + ((i * 617) % 2200),
    });
    server = cycle.restarted;
    requests += cycle.report.requests;
    totals.fiveHundreds += cycle.report.fiveHundreds;
    totals.lost += cycle.report.lost.length;
    for (const l of cycle.report.lost) log(`LOST ${l}`);
    if (cycle.report.integrity !== 'ok') integrity = cycle.report.integrity;
    log(`crash ${i + 1}/${CRASH_CYCLES}: ${cycle.report.acknowledged} acknowledged writes`);
  }
  await server.stop();
  totals.requests += requests;
  totals.faults += CRASH_CYCLES;
  rows.push([
    'SIGKILL cycles',
    `${CRASH_CYCLES} kills over ${requests} writes; acknowledged: ${ack.units} units, ` +
      `${ack.issued.size} keys, ${ack.revoked.size} revocations, ${ack.versions.length} saves; ` +
      `integrity_check ${integrity}`,
  ]);
}

async function fuzz(): Promise<void> {
  const file = freshDatabaseFile('soak-fuzz');
  const { demo } = await prepareDatabase(file, async () => ({}));
  const server = await spawnApi(file);
  const target = await fuzzTarget(server.url, demo.serverKey, demo.browserKey);
  const tally = newTally();
  const rssBefore = server.rssBytes();
  await fc.assert(
    fc.asyncProperty(everyRouteRequests(target), (r) => fuzzOnce(server.url, r, tally)),
    { numRuns: FUZZ_RUNS },
  );
  const alive = (await send(server.url, 'GET', '/health')).status === 200;
  const rssAfter = server.rssBytes();
  await server.stop();
  totals.requests += tally.tried;
  totals.badInputs += tally.tried;
  totals.fiveHundreds += tally.fiveHundreds;
  for (const c of tally.complaints) log(`FUZZ ${c}`);
  totals.broken += tally.complaints.length + (alive ? 0 : 1);
  const statuses = [...tally.statuses].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`);
  rows.push([
    'hostile input',
    `${tally.tried} requests over every route: ${tally.complaints.length} contract complaints, ` +
      `${tally.noAnswer} dropped; alive ${alive}; RSS ${(rssBefore / 2 ** 20).toFixed(0)} → ` +
      `${(rssAfter / 2 ** 20).toFixed(0)} MB; statuses ${statuses.join(' ')}`,
  ]);
}

/** Alternating rounds of the victim alone and under the flood, so drifting load hits both. */
const FLOOD_ROUNDS = 3;

async function flood(): Promise<void> {
  const file = freshDatabaseFile('soak-flood');
  const { keys } = await prepareDatabase(file, async ({ db }, demo) => ({
    keys: await prepareFlood(db, demo.serverKey),
  }));
  const server = await spawnApi(file);
  const reader = new Database(file, { readonly: true });
  const activeIds = () =>
    (
      reader
        .prepare("select id from jobs where tenant_id = ? and status in ('queued','running')")
        .all(keys.floodTenantId) as { id: string }[]
    ).map((r) => r.id);
  const activeJobs = async () => activeIds().length;
  // The factor depends on free cores: the load average says how busy the machine was.
  const loadBefore = loadavg()[0]!;
  const alone: FloodReport[] = [];
  const flooded: FloodReport[] = [];
  const roundMs = FLOOD_MS / FLOOD_ROUNDS;
  for (let round = 0; round < FLOOD_ROUNDS; round++) {
    alone.push(await runFlood(server.url, keys, { durationMs: roundMs, flooders: 0 }));
    flooded.push(
      await runFlood(server.url, keys, { durationMs: roundMs, flooders: 6, activeJobs }),
    );
    // The next round's victim runs alone again: cancel what the flood left running.
    for (const id of activeIds()) {
      await send(server.url, 'DELETE', `/jobs/${id}`, { key: keys.floodKey });
    }
    while (activeIds().length) await new Promise((r) => setTimeout(r, 50));
  }
  const loadAfter = loadavg()[0]!;
  reader.close();
  await server.stop();
  const a = mergeFloodReports(alone);
  const f = mergeFloodReports(flooded);
  if (f.maxActive > PER_TENANT_ACTIVE) totals.broken++;
  if (f.victim.ok !== f.victim.sent || a.victim.ok !== a.victim.sent) totals.broken++;
  const p99a = percentile(a.victim.latenciesMs, 99);
  const p99f = percentile(f.victim.latenciesMs, 99);
  totals.requests += a.victim.sent + f.victim.sent + f.flood.sent;
  totals.fiveHundreds += [...f.flood.other, ...f.victim.other, ...a.victim.other].filter(
    (s) => s >= 500,
  ).length;
  rows.push([
    'victim vs flood',
    `victim p99 ${p99a.toFixed(0)} ms alone, ${p99f.toFixed(0)} ms under a flood ` +
      `(×${(p99f / p99a).toFixed(1)}; p50 ${percentile(a.victim.latenciesMs, 50).toFixed(1)} → ` +
      `${percentile(f.victim.latenciesMs, 50).toFixed(1)} ms); victim answered ` +
      `${f.victim.ok}/${f.victim.sent}; flood: ${f.flood.accepted} jobs taken, ` +
      `${f.flood.refusedBusy} refused at the bound, at most ${f.maxActive} active; ` +
      `${FLOOD_ROUNDS} rounds; load average ${loadBefore.toFixed(1)} → ${loadAfter.toFixed(1)} ` +
      `on ${cpus().length} cores`,
  ]);
}

/** One report of several rounds: counts added, latencies pooled, the largest bound seen. */
function mergeFloodReports(reports: FloodReport[]): FloodReport {
  return {
    victim: {
      sent: reports.reduce((n, r) => n + r.victim.sent, 0),
      ok: reports.reduce((n, r) => n + r.victim.ok, 0),
      other: reports.flatMap((r) => r.victim.other),
      latenciesMs: reports.flatMap((r) => r.victim.latenciesMs),
    },
    flood: {
      sent: reports.reduce((n, r) => n + r.flood.sent, 0),
      accepted: reports.reduce((n, r) => n + r.flood.accepted, 0),
      refusedBusy: reports.reduce((n, r) => n + r.flood.refusedBusy, 0),
      other: reports.flatMap((r) => r.flood.other),
    },
    maxActive: Math.max(...reports.map((r) => r.maxActive)),
  };
}

/** Hostile clients on raw sockets, all at once, beside one well-behaved client. */
async function slowClients(): Promise<void> {
  const file = freshDatabaseFile('soak-slow');
  const { demo } = await prepareDatabase(file, async () => ({}));
  // The server's limits shortened, so each cut-off comes within seconds.
  const server = await spawnApi(file, {
    HTTP_HEADERS_TIMEOUT_MS: '1500',
    HTTP_REQUEST_TIMEOUT_MS: '3000',
    HTTP_KEEP_ALIVE_TIMEOUT_MS: '2500',
    HTTP_IDLE_TIMEOUT_MS: '3000',
  });
  const heads = Array.from({ length: 20 }, () => trickleHead(server.port));
  const bodies = Array.from({ length: 20 }, () => trickleBody(server.port, demo.serverKey));
  const idle = idleConnections(server.port, 200);
  const readers = Array.from({ length: 4 }, () =>
    neverReads(server.port, rawGet('/api/openapi.json').repeat(200)),
  );
  const all = Promise.all([...heads, ...bodies, idle, ...readers]);
  const deadline = new Promise<'held'>((r) => setTimeout(() => r('held'), 120_000).unref());
  const seen = await bystander(server.url, demo.serverKey, Promise.race([all, deadline]));
  const cut = await Promise.race([all, deadline]);
  await server.stop();
  // Settled only when every hostile connection was cut off; then count the 408 answers.
  const timedOut =
    cut === 'held'
      ? 0
      : cut
          .slice(0, heads.length + bodies.length)
          .filter((c) => (c as { statusLine: string }).statusLine.startsWith('HTTP/1.1 408'))
          .length;
  if (cut === 'held' || seen.other.length) totals.broken++;
  totals.requests += seen.answered + seen.other.length;
  totals.fiveHundreds += seen.other.filter((s) => s >= 500).length;
  rows.push([
    'slow clients',
    `${heads.length} trickled heads, ${bodies.length} trickled bodies, 200 idle connections, ` +
      `${readers.length} pipelining readers that stopped: ${cut === 'held' ? 'some still held' : 'all cut off'}` +
      ` (${timedOut} answered 408); bystander answered ${seen.answered}/` +
      `${seen.answered + seen.other.length}`,
  ]);
}

async function matrix(): Promise<void> {
  const running = await serve(
    testConfig({ sqliteFile: freshDatabaseFile('soak-matrix'), port: 0 }),
  );
  const base = `http://127.0.0.1:${running.port}`;
  const ctx = running.app.locals.tropline;
  const built = await buildFixture(base, ctx.db, ctx.demoKeys!);
  const { cells, mismatches } = await runMatrix(base, built.fixture, built.creds);
  await running.stop();
  for (const m of mismatches) log(`MATRIX ${JSON.stringify(m)}`);
  totals.broken += mismatches.length;
  totals.requests += cells;
  rows.push([
    'authorization matrix',
    `${cells} cells (${built.creds.length} callers × every guarded route): ` +
      `${mismatches.length} mismatches, ${mismatches.filter((m) => m.leak).length} leaks`,
  ]);
}

async function main(): Promise<void> {
  const started = Date.now();
  const stages: [string, () => Promise<unknown>][] = [
    ['quota exactness', quotaExactness],
    ['authorization matrix', matrix],
    ['hostile input', fuzz],
    ['crash cycles', crashes],
    ['sustained load', sustainedLoad],
    ['victim vs flood', flood],
    ['slow clients', slowClients],
  ];
  let load = { rps: NaN, p99: NaN };
  for (const [name, stage] of stages) {
    const t = Date.now();
    log(`${name}…`);
    const out = await stage();
    if (name === 'sustained load') load = out as typeof load;
    log(`${name} done in ${((Date.now() - t) / 1000).toFixed(0)} s`);
  }
  console.log('\nTropline soak summary');
  for (const [name, figures] of rows) console.log(`  ${name.padEnd(22)} ${figures}`);
  console.log('');
  const summary: [string, string][] = [
    ['requests sent', String(totals.requests)],
    ['load held', `${load.rps.toFixed(0)} req/s, p99 ${load.p99} ms`],
    ['faults injected', `${totals.faults} SIGKILLs`],
    ['bad inputs tried', String(totals.badInputs)],
    ['5xx seen', String(totals.fiveHundreds)],
    ['writes lost', String(totals.lost)],
    ['promises broken', `${totals.broken} (quota, bound, victim, matrix, problem documents)`],
    ['wall time', `${((Date.now() - started) / 1000).toFixed(0)} s`],
  ];
  for (const [k, v] of summary) console.log(`  ${k.padEnd(18)} ${v}`);
  process.exit(totals.fiveHundreds || totals.lost || totals.broken ? 1 : 0);
}

void main();
