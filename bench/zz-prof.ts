import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { HASTINGS_POWELL_BENCHMARK as B } from '@tropline/core';
import { testConfig } from '../server/config';
import { createApp } from '../server/create-app';
import { QuotasService } from '../server/quotas/quotas-service';
import { DEMO_TENANT } from '../seeds/01-demo-tenant';
const file = join(mkdtempSync(join(tmpdir(), 'p-')), 'p.sqlite');
const app = createApp(testConfig({ sqliteFile: file }));
await app.locals.tropline.ready;
await new QuotasService(app.locals.tropline.db).setPlan(
  DEMO_TENANT.id,
  { monthlyUnits: 1e9, perMinute: 1e9 },
  'b',
);
const key = app.locals.tropline.demoKeys!.serverKey;
const server = app.listen(0);
await new Promise((r) => server.once('listening', r));
const port = (server.address() as any).port;
const body = JSON.stringify({ model: B.model, initial: B.initial, horizon: 1000, samples: 1001 });
const h = { authorization: `Bearer ${key}`, 'content-type': 'application/json' };
for (const path of [
  '/api/v1/health',
  '/api/v1/usage',
  '/api/v1/projections',
  '/api/v1/health',
  '/api/v1/usage',
  '/api/v1/projections',
]) {
  const n = 300;
  let t = performance.now();
  for (let i = 0; i < n; i++) {
    const r = await fetch(
      `http://127.0.0.1:${port}${path}`,
      path.endsWith('projections') ? { method: 'POST', headers: h, body } : { headers: h },
    );
    await r.text();
  }
  console.log(path, ((performance.now() - t) / n).toFixed(3), 'ms');
}
server.close();
await app.locals.tropline.close();
