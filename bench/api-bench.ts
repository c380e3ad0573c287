/**
 * `npm run bench:api`: a benchmark-chain projection (horizon 1000, 1001 samples) through the
 * whole stack (bearer key, rate and quota admission on a real SQLite file with WAL and
 * synchronous=FULL, validation, compute, JSON) with autocannon on loopback, against the same
 * computation called in-process in the same run. Prints figures and ratios; asserts nothing.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import {
  HASTINGS_POWELL_BENCHMARK as B,
  validateProjectionRequest,
  projectValidated,
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

function inProcess(n: number): { computeMs: number; withJsonMs: number } {
  const requests = Array.from({ length: n }, (_, i) => {
    const v = validateProjectionRequest(body(i));
    if (!v.ok) throw new Error('invalid bench body');
    return v.value;
  });
  for (let i = 0; i < 50; i++) projectValidated(requests[i % n]!); // warm up the JIT
  let t = performance.now();
  for (const r of requests) projectValidated(r);
  const computeMs = (performance.now() - t) / n;
  t = performance.now();
  for (let i = 0; i < n; i++)
    JSON.stringify(
      projectValidated(validateProjectionRequest(body(i)).ok ? requests[i]! : requests[0]!),
    );
  return { computeMs, withJsonMs: (performance.now() - t) / n };
}

async function startServer(file: string): Promise<{ url: string; stop: () => void }> {
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
      if (m) resolve({ url: `http://127.0.0.1:${m[1]}`, stop: () => child.kill('SIGTERM') });
    });
    child.once('exit', (code) => reject(new Error(`server exited ${code}`)));
  });
}

function run(opts: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon(opts, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

async function main(): Promise<void> {
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

  const base = inProcess(300);
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
  const serial = await uncached(1, 1000);
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
  const cached = await run({
    url: `${server.url}/api/v1/projections`,
    method: 'POST',
    headers,
    body: cachedBody,
    connections: 50,
    duration: 10,
  });
  // Server-side overhead from Server-Timing: what the stack adds beyond the engine, without
  // the loopback network or the scheduler's delays on a shared machine.
  let overhead = 0;
  let computeInServer = 0;
  const samples = 300;
  for (let k = 0; k < samples; k++) {
    const res = await fetch(`${server.url}/api/v1/projections`, {
      method: 'POST',
      headers,
      body: JSON.stringify(body(++i)),
    });
    await res.text();
    const t = Object.fromEntries(
      (res.headers.get('server-timing') ?? '').split(',').map((p) => {
        const [name, dur] = p.trim().split(';dur=');
        return [name, Number(dur)];
      }),
    );
    overhead += (t.total! - t.compute!) / samples;
    computeInServer += t.compute! / samples;
  }
  server.stop();
  const perRequestMs = (r: autocannon.Result) => (r.duration * 1000) / r.requests.total;
  const fmt = (x: number) => x.toFixed(3);
  const non2xx = serial.non2xx + parallel.non2xx + cached.non2xx;
  console.log(`benchmark chain, horizon ${HORIZON}, ${SAMPLES} samples (same run, same machine)`);
  console.log(
    `in-process: compute ${fmt(base.computeMs)} ms, compute + JSON ${fmt(base.withJsonMs)} ms`,
  );
  console.log(
    `API, 1 connection, uncached: mean latency ${fmt(serial.latency.mean)} ms, ` +
      `${fmt(perRequestMs(serial))} ms/request → adds ${fmt(serial.latency.mean - base.computeMs)} ms ` +
      `(ratio ${fmt(serial.latency.mean / base.computeMs)}×)`,
  );
  console.log(
    `server-side, uncached: compute ${fmt(computeInServer)} ms, the rest of the stack ` +
      `(auth, admission, validation, JSON) adds ${fmt(overhead)} ms per request`,
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
  console.log(
    `non-2xx answers: ${non2xx}; errors: ${serial.errors + parallel.errors + cached.errors}`,
  );
}

void main();
