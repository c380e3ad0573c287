// `npm run bench`: discovers every bench/suites/*.ts, each exporting `run(): Promise<void>` that
// prints its own table, and runs them one after another (alphabetically) in this process.
// `npm run bench -- engine` runs only suites whose file name contains "engine".
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { cpus } from 'node:os';

const here = dirname(fileURLToPath(import.meta.url));
const filters = process.argv.slice(2).filter((a) => !a.startsWith('-'));
const files = readdirSync(join(here, 'suites'))
  .filter((f) => f.endsWith('.ts') && !f.endsWith('.d.ts') && !f.endsWith('.spec.ts'))
  .filter((f) => filters.length === 0 || filters.some((x) => f.includes(x)))
  .sort();

console.log(
  `Tropline benchmarks — Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}`,
);
let failed = 0;
for (const file of files) {
  const mod = (await import(pathToFileURL(join(here, 'suites', file)).href)) as {
    run?: () => Promise<void>;
  };
  console.log(`\n== ${file.replace(/\.ts$/, '')} ==`);
  if (typeof mod.run !== 'function') {
    console.log(`(skipped: ${file} exports no run())`);
    continue;
  }
  try {
    await mod.run();
  } catch (e) {
    failed++;
    console.error(`suite ${file} failed:`, e);
  }
}
if (failed > 0) process.exitCode = 1;
