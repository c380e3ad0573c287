import { signal } from '@angular/core';
import { problemText, type ProblemText } from '../problem/problem-text';

/**
 * What a page shows from one request: the value, whether it is loading, and the problem when
 * it failed. A newer load wins over an older one still in flight (a tenant switch, a retry).
 */
export class PageData<T> {
  /** The last value loaded. */
  readonly value = signal<T | undefined>(undefined);
  /** Whether a load is running. */
  readonly loading = signal(false);
  /** Why the last load failed. */
  readonly problem = signal<ProblemText | undefined>(undefined);
  private generation = 0;

  constructor(
    private readonly fetch: () => Promise<T>,
    private readonly doing: string,
  ) {}

  /** Loads (again). */
  async load(): Promise<void> {
    const mine = ++this.generation;
    this.loading.set(true);
    this.problem.set(undefined);
    try {
      const value = await this.fetch();
      if (mine === this.generation) this.value.set(value);
    } catch (err) {
      if (mine === this.generation) this.problem.set(problemText(err, this.doing));
    } finally {
      if (mine === this.generation) this.loading.set(false);
    }
  }
}
