import { describe, expect, it } from 'vitest';
import { computeTurnsWaiting, onComputeTurn, TurnOutcome } from './compute-turns';

describe('onComputeTurn', () => {
  it('runs computations in arrival order, one per turn of the event loop', async () => {
    const order: string[] = [];
    const first = onComputeTurn(() => {
      order.push('first');
      // Work the loop has to do between turns (a socket read, say) runs before the next one.
      setImmediate(() => order.push('between'));
      return 1;
    });
    const second = onComputeTurn(() => {
      order.push('second');
      return 2;
    });
    expect(computeTurnsWaiting()).toBe(2);
    expect(order).toEqual([]); // nothing runs in the caller's turn
    const [a, b] = await Promise.all([first, second]);
    expect(order).toEqual(['first', 'between', 'second']);
    expect(a).toBeInstanceOf(TurnOutcome);
    expect([a.value, b.value]).toEqual([1, 2]);
    expect(a.waitedMs).toBeGreaterThanOrEqual(0);
    expect(b.waitedMs).toBeGreaterThanOrEqual(a.waitedMs);
    expect(computeTurnsWaiting()).toBe(0);
  });

  it('rejects with what the computation throws and goes on with the next', async () => {
    const failing = onComputeTurn(() => {
      throw new RangeError('stiff');
    });
    const next = onComputeTurn(() => 'next');
    await expect(failing).rejects.toThrow(RangeError);
    expect((await next).value).toBe('next');
  });
});
