import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, renameSync, rmSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { build } from 'esbuild';

/**
 * Builds the custom elements as exactly one ES module and one stylesheet, the two files an
 * agency copies to its site: `ng build elements`, then one esbuild pass without code splitting
 * that folds the lazily loaded chunks (the widgets load ECharts on first chart) back into the
 * module, since a plain page should not have to host a folder of hashed chunks.
 */
const ROOT = resolve(import.meta.dirname, '../..');
const OUT = resolve(ROOT, 'dist/elements/browser');

const ng = spawnSync('npx', ['ng', 'build', 'elements'], {
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

for (const file of ['tropline-elements.js', 'tropline-elements.css']) {
  const path = resolve(OUT, file);
  const gzip = gzipSync(readFileSync(path), { level: 9 }).length;
  const kb = (n: number) => `${(n / 1024).toFixed(1)} kB`;
  console.log(`elements: ${file} ${kb(statSync(path).size)} (${kb(gzip)} gzip)`);
}
