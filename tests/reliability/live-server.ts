import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { testConfig } from '../../server/config';
import { createApp, type AppContext } from '../../server/create-app';
import type { DemoKeys } from '../../server/keys/demo-keys';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** A real API process on a port the OS chose, which the test may also kill outright. */
export interface LiveServer {
  readonly port: number;
  readonly url: string;
  readonly pid: number;
  /** Settles with the exit code (or the signal's name) once the process is gone. */
  readonly exited: Promise<number | string>;
  /** SIGKILL: no handler runs, nothing is flushed; the crash the tests inject. */
  kill(): Promise<void>;
  /** SIGTERM and wait: the orderly stop. */
  stop(): Promise<void>;
  /** Resident memory of the process in bytes, read from /proc (Linux). */
  rssBytes(): number;
}

/** A fresh folder under the system temp dir with the path of a database file in it. */
export function freshDatabaseFile(label: string): string {
  return join(mkdtempSync(join(tmpdir(), `tropline-${label}-`)), 'tropline.sqlite');
}

/**
 * Migrates and seeds `file` in this process, runs `setup` against the prepared app (plans, extra
 * tenants, keys), then releases it, so the API processes start on a ready database.
 */
export async function prepareDatabase<T>(
  file: string,
  setup: (ctx: AppContext, demo: DemoKeys) => Promise<T>,
): Promise<T & { demo: DemoKeys }> {
  const app = createApp(testConfig({ sqliteFile: file }));
  await app.locals.tropline.ready;
  try {
    const demo = app.locals.tropline.demoKeys!;
    return { ...(await setup(app.locals.tropline, demo)), demo };
  } finally {
    await app.locals.tropline.close();
  }
}

/** Starts `server/main.ts` on `file` with PORT=0; resolves once it logs `listening on <port>`. */
export function spawnApi(file: string, env: Record<string, string> = {}): Promise<LiveServer> {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: '0',
      SQLITE_FILE: file,
      TROPLINE_SERVE_APPS: '0',
      LOG_LEVEL: 'silent',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const exited = new Promise<number | string>((resolve) =>
    child.once('exit', (code, signal) => resolve(code ?? signal ?? 'unknown')),
  );
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`the API did not start within 45 s: ${out} ${err}`));
    }, 45_000);
    child.stderr!.on('data', (d) => (err = (err + d).slice(-4000)));
    child.stdout!.on('data', (d) => {
      out += d;
      const m = /listening on (\d+)/.exec(out);
      if (!m) return;
      clearTimeout(timer);
      out = '';
      const port = Number(m[1]);
      const gone = () => child.exitCode !== null || child.signalCode !== null;
      resolve({
        port,
        url: `http://127.0.0.1:${port}`,
        pid: child.pid!,
        exited,
        kill: async () => {
          if (!gone()) child.kill('SIGKILL');
          await exited;
        },
        stop: async () => {
          if (!gone()) child.kill('SIGTERM');
          await exited;
        },
        rssBytes: () => {
          const status = readFileSync(`/proc/${child.pid}/status`, 'utf8');
          return Number(/VmRSS:\s+(\d+) kB/.exec(status)![1]) * 1024;
        },
      });
    });
    void exited.then((code) => {
      clearTimeout(timer);
      reject(new Error(`the API exited with ${code} before listening: ${err}`));
    });
  });
}

/** One answer, read whole. */
export interface Answer {
  readonly status: number;
  readonly headers: Record<string, string>;
  readonly text: string;
  /** The parsed body, or undefined when it is not JSON. */
  readonly json: Record<string, unknown> | undefined;
}

/** How to send one request. */
export interface Send {
  readonly key?: string;
  readonly origin?: string;
  readonly cookie?: string;
  /** A JSON value to send, or a string sent as is with the JSON content type. */
  readonly body?: unknown;
  readonly raw?: boolean;
  readonly headers?: Record<string, string>;
  readonly signal?: AbortSignal;
}

/** Sends one request to a live server and reads the whole answer. */
export async function send(
  base: string,
  method: string,
  path: string,
  opts: Send = {},
): Promise<Answer> {
  const headers: Record<string, string> = { ...opts.headers };
  if (opts.key !== undefined) headers.authorization = `Bearer ${opts.key}`;
  if (opts.origin !== undefined) headers.origin = opts.origin;
  if (opts.cookie !== undefined) headers.cookie = opts.cookie;
  let body: string | undefined;
  if (opts.body !== undefined) {
    body = opts.raw ? String(opts.body) : JSON.stringify(opts.body);
    headers['content-type'] ??= 'application/json';
  }
  const res = await fetch(`${base}/api/v1${path}`, { method, headers, body, signal: opts.signal });
  const out: Record<string, string> = {};
  res.headers.forEach((value, name) => (out[name] = value));
  const text = await res.text();
  let json: Record<string, unknown> | undefined;
  try {
    json = JSON.parse(text) as Record<string, unknown>;
  } catch {
    json = undefined;
  }
  return { status: res.status, headers: out, text, json };
}

/**
 * What is wrong with an answer by the contract's error rules: never a 5xx, and every error an
 * RFC 9457 problem document whose `status` repeats the HTTP status. Empty when all is well.
 */
export function problemComplaints(a: Answer): string[] {
  const out: string[] = [];
  if (a.status >= 500) out.push(`answered ${a.status}: ${a.text.slice(0, 300)}`);
  if (a.status >= 400) {
    if (!/^application\/problem\+json/.test(a.headers['content-type'] ?? '')) {
      out.push(`${a.status} with content-type ${a.headers['content-type']}`);
    } else if (a.json?.status !== a.status || typeof a.json?.title !== 'string') {
      out.push(`${a.status} problem without a matching status and title: ${a.text.slice(0, 200)}`);
    }
  }
  return out;
}

/** What a database file says about itself, read straight from SQLite. */
export interface DatabaseFacts {
  /** `PRAGMA integrity_check`: `ok` when sound. */
  readonly integrity: string;
  /** The tenant's usage ledger summed for the period, and its counter. */
  readonly ledger: number;
  readonly used: number;
}

/**
 * Reads a database file right after a crash, before any server opens it again. Opened writable,
 * as a restarting server would open it, so SQLite may replay the WAL the crash left behind.
 */
export function databaseFacts(file: string, tenantId: string, period: string): DatabaseFacts {
  const db = new Database(file);
  try {
    const rows = db.pragma('integrity_check') as { integrity_check: string }[];
    const sum = db
      .prepare(
        'select coalesce(sum(units), 0) as n from usage_ledger where tenant_id = ? and period = ?',
      )
      .get(tenantId, period) as { n: number };
    const counter = db
      .prepare('select used from usage_counters where tenant_id = ? and period = ?')
      .get(tenantId, period) as { used: number } | undefined;
    return {
      integrity: rows.map((r) => r.integrity_check).join('; '),
      ledger: Number(sum.n),
      used: Number(counter?.used ?? 0),
    };
  } finally {
    db.close();
  }
}

/** Signs in over HTTP: the Cookie header to send and the session's CSRF token. */
export async function signIn(base: string, email: string, password: string) {
  const res = await fetch(`${base}/api/v1/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const body = (await res.json()) as { csrfToken: string };
  return { cookie, csrf: body.csrfToken };
}
