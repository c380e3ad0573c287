import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, renameSync, rmSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { build, type Metafile } from 'esbuild';

/**
 * Builds the custom elements as exactly one ES module and one stylesheet, the two files an
 * agency copies to its site: `ng build elements`, then one esbuild pass without code splitting
 * that folds the lazily loaded chunks (the widgets load ECharts on first chart) back into the
 * module, since a plain page should not have to host a folder of hashed chunks.
 *
 * Angular's esbuild metafile (`stats.json`) says what the module is made of; the build prints
 * the largest parts and fails when the engine got in (the elements need only the contract).
 */
const ROOT = resolve(import.meta.dirname, '../..');
const DIST = resolve(ROOT, 'dist/elements');
const OUT = resolve(DIST, 'browser');

/** What only the engine uses: integrators, linear algebra, fitting, the analyses, the pool. */
const ENGINE =
  /^(node_modules\/(odex|ml-matrix|ml-levenberg-marquardt|piscina)\/|shared\/(integrate|equilibria|stability|lyapunov|regime|sweep|compare|pool)\/|shared\/calibrate\/(?!calibration-request))/;

const ng = spawnSync('npx', ['ng', 'build', 'elements', '--stats-json'], {
  cwd: ROOT,
  stdio: 'inherit',
  env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
});
if (ng.status !== 0) process.exit(ng.status ?? 1);

await build({
  entryPoints: [resolve(OUT, 'main.js')],
  outfile: resolve(OUT, 'tropline-elements.js'),
  bundle: true,
  splitting: false,
  format: 'esm',
  minify: true,
  target: 'es2022',
  legalComments: 'none',
  logLevel: 'warning',
});
for (const file of readdirSync(OUT)) {
  if (file === 'main.js' || /^chunk-[A-Z0-9]+\.js$/.test(file)) rmSync(resolve(OUT, file));
}
renameSync(resolve(OUT, 'styles.css'), resolve(OUT, 'tropline-elements.css'));

const kb = (n: number) => `${(n / 1024).toFixed(1)} kB`;
for (const file of ['tropline-elements.js', 'tropline-elements.css']) {
  const path = resolve(OUT, file);
  const gzip = gzipSync(readFileSync(path), { level: 9 }).length;
  console.log(`elements: ${file} ${kb(statSync(path).size)} (${kb(gzip)} gzip)`);
}

// Minified bytes per package (or source folder) over every JavaScript output the module folds in.
const stats = JSON.parse(readFileSync(resolve(DIST, 'stats.json'), 'utf8')) as Metafile;
const parts = new Map<string, number>();
const engine: string[] = [];
for (const [name, output] of Object.entries(stats.outputs)) {
  if (!name.endsWith('.js')) continue;
  for (const [input, { bytesInOutput }] of Object.entries(output.inputs)) {
    if (bytesInOutput > 0 && ENGINE.test(input)) engine.push(input);
    const pkg = /node_modules\/((@[^/]+\/)?[^/]+)/.exec(input)?.[1];
    const part = pkg ?? input.split('/').slice(0, 2).join('/');
    parts.set(part, (parts.get(part) ?? 0) + bytesInOutput);
  }
}
const largest = [...parts].sort((a, b) => b[1] - a[1]).slice(0, 10);
console.log(
  `elements: largest parts (minified) ${largest.map(([p, b]) => `${p} ${kb(b)}`).join(', ')}`,
);
if (engine.length) {
  console.error(`elements: the engine got into the module: ${engine.join(', ')}`);
  console.error("elements: browser code imports '@tropline/core/contract', not '@tropline/core'.");
  process.exit(1);
}
