/** How urgent a run is: a caller waiting on a synchronous answer, or a job. */
export type RunPriority = 'interactive' | 'batch';

/** Whose run it is and how urgent; see {@link FairScheduler}. */
export interface Lane {
  /** Whose work it is (the server passes the tenant); owners take turns task by task. */
  readonly owner: string;
  /** Interactive runs go before any batch run's next task. */
  readonly priority: RunPriority;
}

/** How one run is followed. */
export interface RunHooks {
  /** Aborting rejects the run with the signal's reason; tasks not yet handed out are dropped. */
  readonly signal?: AbortSignal;
  /** Called with each task's result as it arrives; throwing fails the run. */
  readonly onEach?: (index: number, result: unknown) => void;
}

interface Run<T> {
  readonly lane: Lane;
  readonly tasks: readonly T[];
  readonly hooks: RunHooks;
  readonly results: unknown[];
  /** Next task to hand out. */
  next: number;
  /** Tasks not yet finished. */
  pending: number;
  settled: boolean;
  finish(error?: unknown): void;
}

const PRIORITIES: readonly RunPriority[] = ['interactive', 'batch'];

/**
 * Hands the tasks of many runs to a fixed number of slots (one per worker thread), one task at a
 * time as a slot frees: the next task goes to whichever worker is free, so a run's cheap and dear
 * tasks even out. Interactive runs go first; among the runs of one priority, owners take turns
 * (round-robin, one task each), and one owner's runs go first come, first served. A run cut into
 * tasks of bounded size therefore waits at most about one task per slot for another owner's
 * flood of runs, however many that owner queued. A failed or aborted run drops its tasks not yet
 * handed out; tasks already running are the executor's to stop (it gets the run's signal).
 */
export class FairScheduler<T> {
  /** Per priority, the owners with tasks waiting, in turn order (a Map keeps insertion order). */
  private readonly waiting: Record<RunPriority, Map<string, Run<T>[]>> = {
    interactive: new Map(),
    batch: new Map(),
  };
  private busy = 0;

  constructor(
    private readonly slots: number,
    private readonly execute: (task: T, signal: AbortSignal | undefined) => Promise<unknown>,
  ) {}

  /** Tasks handed out and not yet finished. */
  get running(): number {
    return this.busy;
  }

  /** Queues a run's tasks; resolves with their results in task order, or rejects with the first failure. */
  run(lane: Lane, tasks: readonly T[], hooks: RunHooks = {}): Promise<unknown[]> {
    return new Promise((resolve, reject) => {
      const { signal } = hooks;
      if (signal?.aborted) return reject(signal.reason);
      if (tasks.length === 0) return resolve([]);
      const onAbort = () => run.finish(signal!.reason);
      const run: Run<T> = {
        lane,
        tasks,
        hooks,
        results: new Array<unknown>(tasks.length),
        next: 0,
        pending: tasks.length,
        settled: false,
        finish: (error) => {
          if (run.settled) return;
          run.settled = true;
          signal?.removeEventListener('abort', onAbort);
          this.drop(run);
          if (error === undefined) resolve(run.results);
          else reject(error);
        },
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      const owners = this.waiting[lane.priority];
      const queued = owners.get(lane.owner);
      if (queued) queued.push(run);
      else owners.set(lane.owner, [run]);
      this.pump();
    });
  }

  /** Removes a run's tasks not yet handed out. */
  private drop(run: Run<T>): void {
    const owners = this.waiting[run.lane.priority];
    const queued = owners.get(run.lane.owner);
    const at = queued?.indexOf(run) ?? -1;
    if (at < 0) return;
    queued!.splice(at, 1);
    if (queued!.length === 0) owners.delete(run.lane.owner);
  }

  /** The next task by priority, then owner turn; the owner moves to the back of the turn. */
  private take(): [Run<T>, number] | undefined {
    for (const priority of PRIORITIES) {
      const owners = this.waiting[priority];
      const first = owners.entries().next();
      if (first.done) continue;
      const [owner, runs] = first.value;
      const run = runs[0]!;
      const index = run.next++;
      if (run.next === run.tasks.length) runs.shift();
      owners.delete(owner);
      if (runs.length) owners.set(owner, runs);
      return [run, index];
    }
    return undefined;
  }

  private pump(): void {
    while (this.busy < this.slots) {
      const next = this.take();
      if (!next) return;
      const [run, index] = next;
      this.busy++;
      const release = () => this.busy--;
      this.execute(run.tasks[index]!, run.hooks.signal)
        .then(
          (result) => {
            release();
            if (run.settled) return;
            run.results[index] = result;
            run.hooks.onEach?.(index, result);
            if (--run.pending === 0) run.finish();
          },
          (error: unknown) => {
            release();
            run.finish(error ?? new Error('task failed'));
          },
        )
        .catch((error: unknown) => run.finish(error ?? new Error('result refused'))) // onEach threw
        .finally(() => this.pump());
    }
  }
}
