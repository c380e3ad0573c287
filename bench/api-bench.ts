/**
 * `npm run bench:api`: a benchmark-chain projection (horizon 1000, 1001 samples) through the
 * whole stack (bearer key, rate and quota admission on a real SQLite file with WAL and
 * synchronous=FULL, validation, compute, JSON) with autocannon on loopback, against the same
 * computation called in-process in the same run. Prints figures and ratios; asserts nothing.
 * The machine's load average is printed with them: on shared cores the figures move with it.
 */
import { execSync, spawn } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { Agent, request } from 'node:http';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import {
  HASTINGS_POWELL_BENCHMARK as B,
  validateProjectionRequest,
  projectValidated,
  type ProjectionRequest,
} from '@tropline/core';
import { testConfig } from '../server/config';
import { createApp } from '../server/create-app';
import { QuotasService } from '../server/quotas/quotas-service';
import { DEMO_TENANT } from '../seeds/01-demo-tenant';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const HORIZON = 1000;
const SAMPLES = 1001;
const body = (i: number) => ({
  model: B.model,
  // A start that differs in the 12th digit: the same work, but no two bodies alike (no cache).
  initial: { ...B.initial, x: B.initial.x! + i * 1e-12 },
  horizon: HORIZON,
  samples: SAMPLES,
});

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/**
 * The in-process baseline: compute alone, and compute then `JSON.stringify`, in alternating
 * rounds (so a burst of load from elsewhere lands on both), each the median of its rounds.
 */
function inProcess(rounds: number, perRound: number): { computeMs: number; withJsonMs: number } {
  const requests: ProjectionRequest[] = Array.from({ length: perRound }, (_, i) => {
    const v = validateProjectionRequest(body(i));
    if (!v.ok) throw new Error('invalid bench body');
    return v.value;
  });
  for (let i = 0; i < 100; i++) JSON.stringify(projectValidated(requests[i % perRound]!)); // JIT
  const compute: number[] = [];
  const withJson: number[] = [];
  for (let r = 0; r < rounds; r++) {
    let t = performance.now();
    for (const q of requests) projectValidated(q);
    compute.push((performance.now() - t) / perRound);
    t = performance.now();
    for (const q of requests) JSON.stringify(projectValidated(q));
    withJson.push((performance.now() - t) / perRound);
  }
  return { computeMs: median(compute), withJsonMs: median(withJson) };
}

/** CPU seconds a process has used (user + system, all its threads), from Linux's /proc. */
function cpuSeconds(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  const ticks = Number(execSync('getconf CLK_TCK').toString().trim());
  return (Number(fields[11]) + Number(fields[12])) / ticks; // utime and stime (fields 14, 15)
}

async function startServer(file: string): Promise<{ url: string; pid: number; stop: () => void }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'development',
      PORT: '0',
      SQLITE_FILE: file,
      TROPLINE_SERVE_APPS: '0',
      LOG_LEVEL: 'silent',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return new Promise((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d) => {
      out += d;
      const m = /listening on (\d+)/.exec(out);
      if (m) {
        const url = `http://127.0.0.1:${m[1]}`;
        resolve({ url, pid: child.pid!, stop: () => child.kill('SIGTERM') });
      }
    });
    child.once('exit', (code) => reject(new Error(`server exited ${code}`)));
  });
}

function run(opts: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon(opts, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

/** Answers other than 200, by status, e.g. `429×3`; `none` when every answer was a 200. */
function otherStatuses(results: autocannon.Result[]): string {
  const counts = new Map<string, number>();
  for (const r of results) {
    for (const [code, { count }] of Object.entries(r.statusCodeStats ?? {})) {
      if (code !== '200') counts.set(code, (counts.get(code) ?? 0) + count);
    }
  }
  return [...counts].map(([c, n]) => `${c}×${n}`).join(', ') || 'none';
}

/** Server-Timing of one answer as `{ name: ms }`. */
function serverTiming(value: string | null): Record<string, number> {
  return Object.fromEntries(
    (value ?? '').split(',').map((p) => {
      const [name, dur] = p.trim().split(';dur=');
      return [name!, Number(dur)];
    }),
  );
}

async function main(): Promise<void> {
  const loadAtStart = loadavg();
  const dir = mkdtempSync(join(tmpdir(), 'tropline-bench-'));
  const file = join(dir, 'bench.sqlite');
  // Prepare the database (migrate, seed, demo keys) and lift the demo plan's limits.
  const app = createApp({ ...testConfig({ sqliteFile: file }), nodeEnv: 'development' });
  await app.locals.tropline.ready;
  await new QuotasService(app.locals.tropline.db).setPlan(
    DEMO_TENANT.id,
    { monthlyUnits: 1_000_000_000, perMinute: 1_000_000_000 },
    'bench',
  );
  await app.locals.tropline.close();
  const { serverKey } = JSON.parse(readFileSync(join(dir, 'demo-keys.json'), 'utf8'));

  const base = inProcess(9, 40);
  const server = await startServer(file);
  const headers = { authorization: `Bearer ${serverKey}`, 'content-type': 'application/json' };
  let i = 0;
  const uncached = (connections: number, amount: number) =>
    run({
      url: `${server.url}/api/v1/projections`,
      method: 'POST',
      connections,
      amount,
      headers,
      requests: [{ setupRequest: (req) => ({ ...req, body: JSON.stringify(body(++i)) }) }],
    });
  await uncached(1, 200); // warm the server
  let cpu = cpuSeconds(server.pid);
  const serial = await uncached(1, 1000);
  const serialCpuMs = ((cpuSeconds(server.pid) - cpu) * 1000) / serial.requests.total;
  const parallel = await uncached(50, 3000);
  const cachedBody = JSON.stringify(body(0));
  await run({
    url: `${server.url}/api/v1/projections`,
    method: 'POST',
    headers,
    body: cachedBody,
    amount: 100,
    connections: 1,
  });
  cpu = cpuSeconds(server.pid);
  const cached = await run({
    url: `${server.url}/api/v1/projections`,
    method: 'POST',
    headers,
    body: cachedBody,
    connections: 50,
    duration: 10,
  });
  const cachedCpuMs = ((cpuSeconds(server.pid) - cpu) * 1000) / cached.requests.total;
  // Server-side time from Server-Timing, one request at a time: what the stack adds beyond the
  // engine, without the loopback network or the client. The mean is the target's measure; the
  // median shows how much of it is the scheduler's occasional delay on a shared machine.
  // node:http sends head and body in one write (as autocannon does), so the server's clock does
  // not include waiting for a body sent after its head.
  const agent = new Agent({ keepAlive: true });
  const timings: Record<string, number>[] = [];
  for (let k = 0; k < 300; k++) {
    const timing = await new Promise<string | undefined>((resolve, reject) => {
      const req = request(`${server.url}/api/v1/projections`, { method: 'POST', headers, agent });
      req.once('response', (res) => {
        res.resume().once('end', () => resolve(res.headers['server-timing'] as string));
      });
      req.once('error', reject);
      req.end(JSON.stringify(body(++i)));
    });
    timings.push(serverTiming(timing ?? null));
  }
  agent.destroy();
  server.stop();
  const mean = (f: (t: Record<string, number>) => number) =>
    timings.reduce((s, t) => s + f(t), 0) / timings.length;
  const beyondCompute = (t: Record<string, number>) => t.total! - t.compute!;
  const fmt = (x: number) => x.toFixed(3);
  const load = (l: number[]) => l.map((x) => x.toFixed(2)).join(' ');
  console.log(`benchmark chain, horizon ${HORIZON}, ${SAMPLES} samples (same run, same machine)`);
  console.log(`load average at start ${load(loadAtStart)}, at end ${load(loadavg())}`);
  console.log(
    `in-process: compute ${fmt(base.computeMs)} ms, compute + JSON ${fmt(base.withJsonMs)} ms`,
  );
  console.log(
    `API, 1 connection, uncached: mean latency ${fmt(serial.latency.mean)} ms → adds ` +
      `${fmt(serial.latency.mean - base.computeMs)} ms over in-process compute ` +
      `(ratio ${fmt(serial.latency.mean / base.computeMs)}×)`,
  );
  const both = (f: (t: Record<string, number>) => number) =>
    `${fmt(mean(f))} ms (median ${fmt(median(timings.map(f)))})`;
  console.log(
    `server-side, uncached: compute ${both((t) => t.compute!)}; the stack beyond compute adds ` +
      `${both(beyondCompute)} per request: JSON ${both((t) => t.json!)}, waiting for ` +
      `admission ${both((t) => t.admit!)}, waiting for a compute turn ${both((t) => t.queue!)}, ` +
      `the rest (logging, headers, body, key, validation, hash) ` +
      `${both((t) => beyondCompute(t) - t.json! - t.admit! - t.queue!)}`,
  );
  console.log(
    `server CPU per request (all threads, from /proc; steadier than wall time on busy cores): ` +
      `uncached ${fmt(serialCpuMs)} ms (${fmt(serialCpuMs - base.computeMs)} beyond in-process ` +
      `compute), cached repeat ${fmt(cachedCpuMs)} ms`,
  );
  console.log(
    `API, 50 connections, uncached: ${parallel.requests.average.toFixed(0)} req/s, ` +
      `p50 ${parallel.latency.p50} ms, p99 ${parallel.latency.p99} ms`,
  );
  console.log(
    `API, 50 connections, cached repeats: ${cached.requests.average.toFixed(0)} req/s, ` +
      `p50 ${cached.latency.p50} ms, p99 ${cached.latency.p99} ms, ` +
      `ratio to in-process compute ${fmt(cached.requests.average / (1000 / base.computeMs))}×`,
  );
  const all = [serial, parallel, cached];
  const failures = (r: autocannon.Result) => `${r.errors} (timeouts ${r.timeouts})`;
  console.log(
    `answers other than 200: ${otherStatuses(all)}; errors: 1 connection ${failures(serial)}, ` +
      `50 uncached ${failures(parallel)}, 50 cached ${failures(cached)}; slowest answers: ` +
      `${serial.latency.max} / ${parallel.latency.max} / ${cached.latency.max} ms`,
  );
}

void main();
