import { spawnSync } from 'node:child_process';
import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Metafile } from 'esbuild';

/**
 * Builds the demo portal (`ng build demo-portal`) and holds it to its budget: the JavaScript a
 * visitor's browser loads before any chart — the entry script and the chunks `index.html`
 * preloads — stays within 350 kB gzip, and ECharts stays out of it (the widgets load it on
 * first chart). Angular's own budgets count raw bytes; this one counts what travels.
 */
const ROOT = resolve(import.meta.dirname, '../..');
const DIST = resolve(ROOT, 'dist/demo-portal');
const BUDGET_KB = 350;

const ng = spawnSync('npx', ['ng', 'build', 'demo-portal', '--stats-json'], {
  cwd: ROOT,
  stdio: 'inherit',
  env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
});
if (ng.status !== 0) process.exit(ng.status ?? 1);

const html = readFileSync(resolve(DIST, 'browser/index.html'), 'utf8');
const initial = [...html.matchAll(/<(?:script|link)\b[^>]*\b(?:src|href)="([^"]+\.js)"/g)].map(
  (m) => m[1]!,
);
const stats = JSON.parse(readFileSync(resolve(DIST, 'stats.json'), 'utf8')) as Metafile;
let raw = 0;
let gzip = 0;
const charts: string[] = [];
for (const file of initial) {
  const path = resolve(DIST, 'browser', file);
  raw += statSync(path).size;
  gzip += gzipSync(readFileSync(path), { level: 9 }).length;
  const inputs = Object.keys(stats.outputs[file]?.inputs ?? {});
  if (inputs.some((i) => /node_modules\/(echarts|zrender)\//.test(i))) charts.push(file);
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} kB`;
console.log(
  `demo-portal: initial JavaScript ${initial.length} files, ${kb(raw)} (${kb(gzip)} gzip; ` +
    `budget ${BUDGET_KB} kB)`,
);
if (!initial.length) {
  console.error('demo-portal: index.html names no script');
  process.exit(1);
}
if (charts.length) {
  console.error(`demo-portal: ECharts is in the initial JavaScript (${charts.join(', ')})`);
  process.exit(1);
}
if (gzip > BUDGET_KB * 1024) {
  console.error(`demo-portal: the initial JavaScript is over its ${BUDGET_KB} kB gzip budget`);
  process.exit(1);
}
