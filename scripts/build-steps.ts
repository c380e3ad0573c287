import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

/** Repository root (scripts/ is one level down). */
export const ROOT = resolve(import.meta.dirname, '..');

/** One build target: the folders it reads, the command that builds it, where it writes. */
export interface BuildStep {
  readonly name: string;
  readonly inputs: readonly string[];
  readonly command: readonly string[];
  readonly output: string;
}

const SHARED_INPUTS = ['package-lock.json', 'tsconfig.json', 'angular.json'];

/** Everything `npm start` serves, in dependency order. */
export const BUILD_STEPS: readonly BuildStep[] = [
  {
    name: 'core',
    inputs: ['shared', ...SHARED_INPUTS],
    command: ['npx', 'tsc', '-p', 'shared/tsconfig.build.json'],
    output: 'dist/core',
  },
  {
    name: 'widgets',
    inputs: ['projects/widgets', 'shared', ...SHARED_INPUTS],
    command: ['npx', 'ng', 'build', 'widgets'],
    output: 'dist/widgets',
  },
  {
    name: 'console',
    inputs: ['projects/console', 'projects/widgets', 'shared', ...SHARED_INPUTS],
    command: ['npx', 'ng', 'build', 'console'],
    output: 'dist/console',
  },
  {
    name: 'demo-portal',
    inputs: ['projects/demo-portal', 'projects/widgets', 'shared', ...SHARED_INPUTS],
    command: ['npx', 'tsx', 'projects/demo-portal/build-portal.ts'],
    output: 'dist/demo-portal',
  },
  {
    name: 'elements',
    inputs: ['projects/elements', 'projects/widgets', 'shared', ...SHARED_INPUTS],
    command: ['npx', 'tsx', 'projects/elements/build-elements.ts'],
    output: 'dist/elements',
  },
];

function listFiles(path: string, out: string[]): void {
  if (!existsSync(path)) return;
  const stat = statSync(path);
  if (stat.isFile()) {
    out.push(path);
    return;
  }
  for (const entry of readdirSync(path)) {
    if (entry === 'node_modules' || entry.startsWith('.')) continue;
    listFiles(join(path, entry), out);
  }
}

/** A fingerprint of a step's inputs: every file's path, size and modification time. */
export function fingerprint(step: BuildStep): string {
  const files: string[] = [];
  for (const input of step.inputs) listFiles(resolve(ROOT, input), files);
  const hash = createHash('sha256');
  for (const file of files.sort()) {
    const stat = statSync(file);
    hash.update(`${file}\0${stat.size}\0${stat.mtimeMs}\n`);
  }
  return hash.digest('hex');
}

const stampFile = (step: BuildStep) => resolve(ROOT, 'dist/.stamps', `${step.name}.sha256`);

/** Whether a step's output exists and was built from exactly the current inputs. */
export function isUpToDate(step: BuildStep): boolean {
  const stamp = stampFile(step);
  return (
    existsSync(resolve(ROOT, step.output)) &&
    existsSync(stamp) &&
    readFileSync(stamp, 'utf8') === fingerprint(step)
  );
}

/**
 * Builds every step whose inputs changed since its last build (all of them with `force`).
 * Stops the process with the failing command's status when a build fails.
 */
export function buildAll(options: { force?: boolean; only?: readonly string[] } = {}): void {
  for (const step of BUILD_STEPS) {
    if (options.only && !options.only.includes(step.name)) continue;
    if (!options.force && isUpToDate(step)) {
      console.log(`build: ${step.name} is up to date`);
      continue;
    }
    console.log(`build: ${step.name} (${step.command.join(' ')})`);
    const before = fingerprint(step);
    const run = spawnSync(step.command[0]!, step.command.slice(1), {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
    });
    if (run.status !== 0) {
      console.error(`build: ${step.name} failed (exit ${run.status ?? run.signal})`);
      process.exit(run.status ?? 1);
    }
    mkdirSync(resolve(ROOT, 'dist/.stamps'), { recursive: true });
    writeFileSync(stampFile(step), before);
  }
}
