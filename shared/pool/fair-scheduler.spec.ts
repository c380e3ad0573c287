import { describe, expect, it } from 'vitest';
import { FairScheduler, type Lane } from './fair-scheduler';

// The scheduler's contract, worked by hand: with one slot, the order tasks are handed out is
// fully determined by the rules (interactive first, owners in turn, first come first served
// within an owner). The executor here is a plain asynchronous function that records what it
// was given; the pool's own test drives the same scheduler over real worker threads.
const batch = (owner: string): Lane => ({ owner, priority: 'batch' });

function recorder(slots: number) {
  const order: string[] = [];
  const scheduler = new FairScheduler<string>(slots, async (task) => {
    order.push(task);
    await new Promise((r) => setImmediate(r));
    if (task.endsWith('!')) throw new Error(`${task} failed`);
    return task.toUpperCase();
  });
  return { order, scheduler };
}

describe('fair scheduler', () => {
  it('gives owners turns, one task each, and keeps one owner’s runs in arrival order', async () => {
    const { order, scheduler } = recorder(1);
    const a1 = scheduler.run(batch('a'), ['a1.0', 'a1.1', 'a1.2', 'a1.3']);
    const a2 = scheduler.run(batch('a'), ['a2.0']);
    const b = scheduler.run(batch('b'), ['b.0', 'b.1']);
    const c = scheduler.run(batch('c'), ['c.0']);
    expect(await Promise.all([a1, a2, b, c])).toEqual([
      ['A1.0', 'A1.1', 'A1.2', 'A1.3'],
      ['A2.0'],
      ['B.0', 'B.1'],
      ['C.0'],
    ]);
    // a1.0 went out at once; then a (back of the turn after its first), b, c, a, b, a, a.
    expect(order).toEqual(['a1.0', 'a1.1', 'b.0', 'c.0', 'a1.2', 'b.1', 'a1.3', 'a2.0']);
  });

  it('hands interactive runs out before any batch run’s next task', async () => {
    const { order, scheduler } = recorder(1);
    const flood = scheduler.run(batch('a'), ['a.0', 'a.1', 'a.2']);
    const urgent = scheduler.run({ owner: 'b', priority: 'interactive' }, ['b.0']);
    await Promise.all([flood, urgent]);
    expect(order).toEqual(['a.0', 'b.0', 'a.1', 'a.2']);
  });

  it('keeps every slot busy while tasks wait', async () => {
    const { order, scheduler } = recorder(2);
    const run = scheduler.run(batch('a'), ['a.0', 'a.1', 'a.2']);
    expect(scheduler.running).toBe(2);
    expect(order).toEqual(['a.0', 'a.1']);
    await run;
    expect(scheduler.running).toBe(0);
  });

  it('fails a run at its first failure and drops its tasks not handed out', async () => {
    const { order, scheduler } = recorder(1);
    const bad = scheduler.run(batch('a'), ['a.0!', 'a.1', 'a.2']);
    const other = scheduler.run(batch('b'), ['b.0']);
    await expect(bad).rejects.toThrow('a.0! failed');
    expect(await other).toEqual(['B.0']);
    expect(order).toEqual(['a.0!', 'b.0']);
  });

  it('fails a run when its result handler throws', async () => {
    const { order, scheduler } = recorder(1);
    const onEach = (i: number) => {
      if (i === 1) throw new Error('rejected result');
    };
    await expect(scheduler.run(batch('a'), ['a.0', 'a.1', 'a.2'], { onEach })).rejects.toThrow(
      'rejected result',
    );
    expect(order).toEqual(['a.0', 'a.1']);
  });

  it('drops an aborted run’s waiting tasks and rejects it with the signal’s reason', async () => {
    const { order, scheduler } = recorder(1);
    const controller = new AbortController();
    const run = scheduler.run(batch('a'), ['a.0', 'a.1', 'a.2'], {
      signal: controller.signal,
      onEach: () => controller.abort(),
    });
    await expect(run).rejects.toMatchObject({ name: 'AbortError' });
    expect(order).toEqual(['a.0']);
    const before = new AbortController();
    before.abort();
    await expect(scheduler.run(batch('a'), ['x'], { signal: before.signal })).rejects.toMatchObject(
      { name: 'AbortError' },
    );
    expect(await scheduler.run(batch('a'), [])).toEqual([]);
    expect(order).toEqual(['a.0']);
  });
});
