import { parseArgs } from 'node:util';
import { ConfigError, loadConfig } from './config';
import { openDatabase } from './db/database';
import { ProblemError } from './http/problem';
import { UsageError, type CliCommand, type CommandContext } from './cli/cli-command';
import {
  issueKeyCommand,
  listKeysCommand,
  revokeKeyCommand,
  rotateKeyCommand,
} from './cli/key-commands';
import { createTenantCommand, setQuotaCommand } from './cli/tenant-commands';
import { createUserCommand } from './cli/user-commands';

/** Every operator command; the accounts feature adds `create-user` here. */
export const COMMANDS: readonly CliCommand[] = [
  createTenantCommand,
  setQuotaCommand,
  issueKeyCommand,
  revokeKeyCommand,
  rotateKeyCommand,
  listKeysCommand,
  createUserCommand,
];

function usage(): string {
  return ['usage: npm run cli -- <command> [options]', ...COMMANDS.map((c) => `  ${c.usage}`)].join(
    '\n',
  );
}

/**
 * Runs one command against $SQLITE_FILE (migrating it first) and prints its value as the last
 * line of stdout. Messages go to stderr; exit code 2 for usage errors, 1 for refusals.
 */
export async function runCli(argv: string[], env: NodeJS.ProcessEnv): Promise<number> {
  const [name, ...rest] = argv;
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) {
    process.stderr.write(`${name ? `unknown command "${name}"\n` : ''}${usage()}\n`);
    return 2;
  }
  let options;
  try {
    options = parseArgs({ args: rest, options: command.options, strict: true }).values;
    for (const r of command.required) {
      if (options[r] === undefined) throw new UsageError(`--${r} is required`);
    }
  } catch (err) {
    process.stderr.write(`${(err as Error).message}\nusage: ${command.usage}\n`);
    return 2;
  }
  let config;
  try {
    config = loadConfig(env);
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`tropline: configuration error: ${err.message}\n`);
      return 2;
    }
    throw err;
  }
  const db = openDatabase(config);
  try {
    await db.migrate.latest();
    const value = await command.run({ db, options: options as CommandContext['options'], env });
    process.stdout.write(value + '\n');
    return 0;
  } catch (err) {
    if (err instanceof UsageError) {
      process.stderr.write(`${command.name}: ${err.message}\nusage: ${command.usage}\n`);
      return 2;
    }
    if (err instanceof ProblemError) {
      const fields = (err.extensions.errors as { pointer: string; message: string }[]) ?? [];
      const why = fields.length ? fields.map((f) => f.message).join('; ') : err.detail;
      process.stderr.write(`${command.name}: ${why}\n`);
      return 1;
    }
    throw err;
  } finally {
    await db.destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('cli.ts')) {
  runCli(process.argv.slice(2), process.env).then((code) => process.exit(code));
}
