/**
 * Short computations that run on the request thread wait here and run one per turn of the
 * event loop, in the order they arrived.
 *
 * Computed straight from a socket's callback, every request read in one poll phase computes
 * before the loop looks at its sockets again, and Node takes in the first request of a newly
 * accepted connection only once per such round: under 50 connections of uncached projections
 * the first answer on some connections took 4.8–9.4 s while the server spent 0.15 s on each
 * (a bare `node:http` server busy 10 ms per request showed the same, 9.4 s). Taking one
 * computation per turn lets the loop read, accept and write between them; the same load's
 * slowest answer fell to 0.8 s, at the same throughput.
 */
const waiting: (() => void)[] = [];
let scheduled = false;

function runOne(): void {
  scheduled = false;
  waiting.shift()?.(); // never throws: each entry settles its own promise
  if (waiting.length > 0) schedule();
}

function schedule(): void {
  if (scheduled) return;
  scheduled = true;
  setImmediate(runOne);
}

/** What a computation gave, with how long it waited for its turn and then ran. */
export class TurnOutcome<T> {
  constructor(
    readonly value: T,
    readonly waitedMs: number,
    readonly computeMs: number,
  ) {}
}

/**
 * Runs `work` on a later turn of the event loop, after the computations queued before it;
 * settles with what it returns (and its timings) or rejects with what it throws.
 */
export function onComputeTurn<T>(work: () => T): Promise<TurnOutcome<T>> {
  const queued = performance.now();
  return new Promise<TurnOutcome<T>>((resolve, reject) => {
    waiting.push(() => {
      const started = performance.now();
      try {
        const value = work();
        resolve(new TurnOutcome(value, started - queued, performance.now() - started));
      } catch (err) {
        reject(err);
      }
    });
    schedule();
  });
}

/** Computations waiting for their turn (the spec reads it). */
export function computeTurnsWaiting(): number {
  return waiting.length;
}
