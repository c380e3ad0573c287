import { spawnSync } from 'node:child_process';
import { ROOT } from './build-steps';

/** One check of `npm test`: a name, a command, and the checks it needs to have passed. */
interface Check {
  readonly name: string;
  readonly command: readonly string[];
  readonly needs?: readonly string[];
}

// Every check the project has, cheapest first. A check whose prerequisite failed is reported as
// not run, so one broken build does not bury the other results.
const CHECKS: readonly Check[] = [
  { name: 'format', command: ['npx', 'prettier', '--check', '--log-level', 'warn', '.'] },
  { name: 'lint', command: ['npx', 'eslint', '.'] },
  { name: 'types (node)', command: ['npx', 'tsc', '-p', 'tsconfig.node.json'] },
  { name: 'build', command: ['npx', 'tsx', 'scripts/build.ts'] },
  { name: 'unit (core, server)', command: ['npx', 'vitest', 'run'] },
  { name: 'ng test widgets', command: ['npx', 'ng', 'test', 'widgets', '--watch=false'] },
  {
    name: 'ng test console',
    command: ['npx', 'ng', 'test', 'console', '--watch=false'],
    needs: ['build'],
  },
  {
    name: 'ng test demo-portal',
    command: ['npx', 'ng', 'test', 'demo-portal', '--watch=false'],
    needs: ['build'],
  },
  { name: 'storybook build', command: ['npm', 'run', 'storybook:build'] },
  {
    name: 'browser (Chromium)',
    command: ['npx', 'vitest', 'run', '--config', 'vitest.e2e.config.ts'],
    needs: ['build', 'storybook build'],
  },
];

const only = process.argv.slice(2);
const results: { name: string; outcome: 'passed' | 'failed' | 'not run'; seconds: number }[] = [];
for (const check of CHECKS) {
  if (only.length && !only.some((o) => check.name.startsWith(o))) continue;
  const blocked = check.needs?.find((n) => results.find((r) => r.name === n)?.outcome !== 'passed');
  if (blocked && !only.length) {
    results.push({ name: check.name, outcome: 'not run', seconds: 0 });
    continue;
  }
  console.log(`\n▶ ${check.name}: ${check.command.join(' ')}`);
  const started = Date.now();
  const run = spawnSync(check.command[0]!, check.command.slice(1), {
    cwd: ROOT,
    stdio: 'inherit',
    env: { ...process.env, NG_CLI_ANALYTICS: 'false', CI: process.env.CI ?? 'true' },
  });
  results.push({
    name: check.name,
    outcome: run.status === 0 ? 'passed' : 'failed',
    seconds: (Date.now() - started) / 1000,
  });
}

console.log('\nnpm test summary');
for (const r of results) {
  console.log(`  ${r.outcome.padEnd(8)} ${r.name.padEnd(22)} ${r.seconds.toFixed(1)} s`);
}
const failed = results.filter((r) => r.outcome !== 'passed');
if (failed.length) {
  console.log(`\n${failed.length} check(s) did not pass: ${failed.map((r) => r.name).join(', ')}`);
  process.exit(1);
}
console.log('\nall checks passed');
