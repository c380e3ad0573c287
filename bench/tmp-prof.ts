import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import { HASTINGS_POWELL_BENCHMARK as B } from '@tropline/core';
import { testConfig } from '../server/config';
import { createApp } from '../server/create-app';
import { QuotasService } from '../server/quotas/quotas-service';
import { DEMO_TENANT } from '../seeds/01-demo-tenant';
const mode = process.argv[2] ?? 'uncached';
const body = (i: number) => ({ model: B.model, initial: { ...B.initial, x: B.initial.x! + i * 1e-12 }, horizon: 1000, samples: 1001 });
const run = (o: autocannon.Options) => new Promise<autocannon.Result>((res, rej) => autocannon(o, (e, r) => (e ? rej(e) : res(r))));
async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'tropline-prof-'));
  const file = join(dir, 'bench.sqlite');
  const app = createApp({ ...testConfig({ sqliteFile: file }), nodeEnv: 'development' });
  await app.locals.tropline.ready;
  await new QuotasService(app.locals.tropline.db).setPlan(DEMO_TENANT.id, { monthlyUnits: 1e9, perMinute: 1e9 }, 'bench');
  await app.locals.tropline.close();
  const { serverKey } = JSON.parse(readFileSync(join(dir, 'demo-keys.json'), 'utf8'));
  const child = spawn(process.execPath, ['--cpu-prof', '--cpu-prof-dir=/tmp/prof/out', '--import', 'tsx', 'server/main.ts'], {
    env: { ...process.env, NODE_ENV: 'development', PORT: '0', SQLITE_FILE: file, TROPLINE_SERVE_APPS: '0', LOG_LEVEL: 'silent' }, stdio: ['ignore', 'pipe', 'inherit'] });
  const url = await new Promise<string>((res) => { let out = ''; child.stdout!.on('data', (d) => { out += d; const m = /listening on (\d+)/.exec(out); if (m) res(`http://127.0.0.1:${m[1]}`); }); });
  const headers = { authorization: `Bearer ${serverKey}`, 'content-type': 'application/json' };
  let i = 0;
  if (mode === 'uncached') {
    const r = await run({ url: `${url}/api/v1/projections`, method: 'POST', connections: Number(process.argv[3] ?? 1), amount: 1500, headers, requests: [{ setupRequest: (q) => ({ ...q, body: JSON.stringify(body(++i)) }) }] });
    console.log('uncached', r.latency.mean, r.requests.average);
  } else {
    const r = await run({ url: `${url}/api/v1/projections`, method: 'POST', connections: 50, duration: 10, headers, body: JSON.stringify(body(0)) });
    console.log('cached', r.requests.average, r.latency.p50, r.latency.p99);
  }
  child.kill('SIGINT');
  await new Promise((r) => child.once('exit', r));
}
void main();
