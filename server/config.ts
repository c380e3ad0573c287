import {
  accessSync,
  constants,
  existsSync,
  mkdirSync,
  readFileSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { randomBytes } from 'node:crypto';
import { dirname, resolve } from 'node:path';
import addressparser from 'nodemailer/lib/addressparser';
import { emailProblems } from './accounts/email-address';
import { readSocketLimits, type SocketLimits } from './socket-limits';

/** Runtime configuration, read and checked once at start-up (architecture.md, "Configuration"). */
export interface Config {
  /** HTTP port; 0 lets the OS choose (tests). */
  readonly port: number;
  /** SQLite database file, or `:memory:`. */
  readonly sqliteFile: string;
  /** `production`, `development` or `test`. */
  readonly nodeEnv: 'production' | 'development' | 'test';
  /** Secret that signs session cookies. */
  readonly sessionSecret: string;
  /** Outgoing mail server URL; undefined means "start the local catcher" in development. */
  readonly smtpUrl: string | undefined;
  /** The sender of every mail, one address with an optional display name. */
  readonly mailFrom: string;
  /** Base URL used in links that leave the server (e-mails, Location headers of docs). */
  readonly publicUrl: string;
  /** Whether to serve the built console, demo portal and Storybook from `dist/`. */
  readonly serveApps: boolean;
  /** Folder holding the built front ends. */
  readonly distDir: string;
  /** pino log level; `silent` in tests. */
  readonly logLevel: string;
  /** Timeouts and the connection cap of the HTTP server (`HTTP_*`, see socket-limits.ts). */
  readonly socket: SocketLimits;
}

/** A configuration problem, naming the variable; start-up prints it without a stack trace. */
export class ConfigError extends Error {
  constructor(
    /** Environment variable at fault. */
    readonly variable: string,
    message: string,
  ) {
    super(`${variable}: ${message}`);
    this.name = 'ConfigError';
  }
}

const ENVS = ['production', 'development', 'test'] as const;

function readPort(raw: string | undefined): number {
  if (raw === undefined || raw === '') return 3000;
  if (!/^\d+$/.test(raw.trim())) {
    throw new ConfigError('PORT', `must be a whole number from 0 to 65535, got "${raw}"`);
  }
  const port = Number(raw);
  if (port > 65535) throw new ConfigError('PORT', `must be at most 65535, got ${port}`);
  return port;
}

/** Fails early when the database file (or the folder it would be created in) is not writable. */
function checkWritable(file: string): void {
  if (file === ':memory:') return;
  const dir = dirname(file);
  try {
    if (!existsSync(dir)) mkdirSync(dir, { recursive: true });
    if (!statSync(dir).isDirectory()) throw Object.assign(new Error(), { code: 'ENOTDIR' });
    accessSync(existsSync(file) ? file : dir, constants.W_OK);
  } catch (err) {
    const reason = (err as NodeJS.ErrnoException).code ?? String(err);
    throw new ConfigError('SQLITE_FILE', `cannot write "${file}" (${reason})`);
  }
}

function readSessionSecret(env: NodeJS.ProcessEnv, nodeEnv: Config['nodeEnv'], dataDir: string) {
  const given = env.SESSION_SECRET;
  if (given) {
    if (nodeEnv === 'production' && given.length < 32) {
      throw new ConfigError('SESSION_SECRET', 'must be at least 32 characters in production');
    }
    return given;
  }
  if (nodeEnv === 'production') {
    throw new ConfigError('SESSION_SECRET', 'must be set in production (no default secret)');
  }
  if (nodeEnv === 'test') return 'test-session-secret-not-for-production-use';
  // Development: generate once and keep it beside the data so sessions survive restarts.
  const file = resolve(dataDir, 'session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, secret + '\n', { mode: 0o600 });
  return secret;
}

/** The sender when `MAIL_FROM` is unset outside production: `.localhost` is reserved (RFC 6761). */
export const DEVELOPMENT_MAIL_FROM = 'Tropline <no-reply@tropline.localhost>';

/**
 * `MAIL_FROM`: exactly one address (`Name <local@domain>` or `local@domain`), on one line. In
 * production it defaults to `no-reply@` the host of `PUBLIC_URL`, the domain the links in the
 * mail point at; elsewhere to {@link DEVELOPMENT_MAIL_FROM}.
 */
function readMailFrom(raw: string | undefined, nodeEnv: Config['nodeEnv'], publicUrl: string) {
  if (raw === undefined || raw.trim() === '') {
    return nodeEnv === 'production'
      ? `Tropline <no-reply@${new URL(publicUrl).hostname}>`
      : DEVELOPMENT_MAIL_FROM;
  }
  const example = 'such as "Tropline <no-reply@tropline.example>"';
  if (/[\r\n]/.test(raw)) throw new ConfigError('MAIL_FROM', `must be on one line, ${example}`);
  const parsed = addressparser(raw);
  const one = parsed.length === 1 && 'address' in parsed[0]! ? parsed[0] : undefined;
  // The same loose shape check as members' addresses: one `@`, no spaces, a dot in the domain.
  if (!one || emailProblems(one.address, '').length > 0) {
    throw new ConfigError('MAIL_FROM', `must be one e-mail address ${example}, got "${raw}"`);
  }
  return raw.trim();
}

/**
 * Reads the environment into a {@link Config}.
 * @throws ConfigError naming the variable when a value is unusable.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const nodeEnv = (env.NODE_ENV || 'development') as Config['nodeEnv'];
  if (!ENVS.includes(nodeEnv)) {
    throw new ConfigError('NODE_ENV', `must be one of ${ENVS.join(', ')}, got "${env.NODE_ENV}"`);
  }
  const port = readPort(env.PORT);
  const sqliteFile = env.SQLITE_FILE || 'data/tropline.sqlite';
  checkWritable(sqliteFile);
  const dataDir = sqliteFile === ':memory:' ? 'data' : dirname(sqliteFile);
  const publicUrl = (env.PUBLIC_URL || `http://localhost:${port}`).replace(/\/+$/, '');
  try {
    new URL(publicUrl);
  } catch {
    throw new ConfigError('PUBLIC_URL', `must be an absolute URL, got "${env.PUBLIC_URL}"`);
  }
  const sessionSecret = readSessionSecret(env, nodeEnv, dataDir);
  const smtpUrl = env.SMTP_URL || undefined;
  if (smtpUrl && !/^smtps?:\/\//.test(smtpUrl)) {
    throw new ConfigError('SMTP_URL', `must start with smtp:// or smtps://, got "${smtpUrl}"`);
  }
  if (nodeEnv === 'production' && !smtpUrl) {
    throw new ConfigError('SMTP_URL', 'must be set in production (no local mail catcher)');
  }
  const mailFrom = readMailFrom(env.MAIL_FROM, nodeEnv, publicUrl);
  return {
    port,
    sqliteFile,
    nodeEnv,
    sessionSecret,
    smtpUrl,
    mailFrom,
    publicUrl,
    serveApps: env.TROPLINE_SERVE_APPS !== '0',
    distDir: env.TROPLINE_DIST_DIR || 'dist',
    logLevel: env.LOG_LEVEL || (nodeEnv === 'test' ? 'silent' : 'info'),
    socket: readSocketLimits(env, (variable, message) => new ConfigError(variable, message)),
  };
}

/** A configuration for tests: in-memory database, quiet logs, no front ends. */
export function testConfig(overrides: Partial<Config> = {}): Config {
  return {
    ...loadConfig({ NODE_ENV: 'test', SQLITE_FILE: ':memory:' }),
    serveApps: false,
    ...overrides,
  };
}
