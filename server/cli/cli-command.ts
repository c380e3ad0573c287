import type { Knex } from 'knex';

/** What a command receives: parsed options and an open, migrated database. */
export interface CommandContext {
  readonly db: Knex;
  /** Option values by name; repeatable options are arrays. */
  readonly options: Record<string, string | string[] | boolean | undefined>;
  readonly env: NodeJS.ProcessEnv;
}

/**
 * One operator command. `run` returns the value to print: the last line of stdout, so scripts
 * can take it with `tail -n 1` (api-contract.md).
 */
export interface CliCommand {
  readonly name: string;
  readonly usage: string;
  /** Options for node:util parseArgs. */
  readonly options: Record<string, { type: 'string' | 'boolean'; multiple?: boolean }>;
  /** Options that must be given. */
  readonly required: readonly string[];
  run(ctx: CommandContext): Promise<string>;
}

/** A usage error: printed with the command's usage line, exit code 2. */
export class UsageError extends Error {
  override readonly name = 'UsageError';
}

/** Reads a required string option. */
export function stringOption(ctx: CommandContext, name: string): string {
  const value = ctx.options[name];
  if (typeof value !== 'string' || value === '') throw new UsageError(`--${name} is required`);
  return value;
}

/** Reads an optional whole-number option. */
export function integerOption(ctx: CommandContext, name: string): number | undefined {
  const value = ctx.options[name];
  if (value === undefined) return undefined;
  if (typeof value !== 'string' || !/^\d+$/.test(value)) {
    throw new UsageError(`--${name} must be a whole number, got "${String(value)}"`);
  }
  return Number(value);
}
