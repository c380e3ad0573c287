import { setPriority } from 'node:os';

/** Nice value of the analysis workers: 10, the `nice` command's default step (common practice). */
export const WORKER_NICENESS = 10;

/**
 * Lowers the calling thread's scheduling priority to `niceness` (0..19) and says whether it did.
 * Linux keeps a nice value per thread, and `setpriority(PRIO_PROCESS, 0, n)` — what
 * `os.setPriority(n)` calls — applies to the calling thread only (setpriority(2), NOTES and BUGS:
 * "under the current Linux/NPTL implementation of POSIX threads, the nice value is a per-thread
 * attribute"). Called from a worker thread it therefore leaves the request thread at its own
 * priority, which then gets the core whenever it wants it. Elsewhere the same call would renice
 * the whole process, so on other systems (and for 0) it does nothing. An unprivileged process
 * may always raise its nice value, never lower it, so this never needs rights the server lacks.
 */
export function lowerThreadPriority(niceness: number): boolean {
  if (process.platform !== 'linux' || !(niceness > 0)) return false;
  try {
    setPriority(Math.min(19, Math.round(niceness)));
    return true;
  } catch {
    return false; // a sandbox may refuse it; the pool still works at normal priority
  }
}
