import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** A real API process listening on a port the OS chose. */
export interface ServerProcess {
  readonly port: number;
  readonly url: string;
  stop(): Promise<void>;
}

/**
 * Starts `server/main.ts` in its own Node process on `sqliteFile` (PORT=0) and resolves once it
 * prints `listening on <port>`. The test owns the process and stops it by its own pid.
 */
export function startServerProcess(sqliteFile: string): Promise<ServerProcess> {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: '0',
      SQLITE_FILE: sqliteFile,
      TROPLINE_SERVE_APPS: '0',
      LOG_LEVEL: 'silent',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`server did not start: ${out} ${err}`));
    }, 30_000);
    child.stderr!.on('data', (d) => (err += d));
    child.stdout!.on('data', (d) => {
      out += d;
      const m = /listening on (\d+)/.exec(out);
      if (!m) return;
      clearTimeout(timer);
      const port = Number(m[1]);
      resolve({
        port,
        url: `http://127.0.0.1:${port}`,
        stop: () =>
          new Promise((done) => {
            if (child.exitCode !== null) return done();
            child.once('exit', () => done());
            child.kill('SIGTERM');
          }),
      });
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited with ${code}: ${err}`));
    });
  });
}
