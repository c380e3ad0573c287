import { describe, expect, it } from 'vitest';
import { CHUNK_WORK, chunkCount, planChunks } from './plan-chunks';

// Worked by hand from the definitions in plan-chunks.ts.
describe('chunk planning', () => {
  it('interleaves items across chunks, each ascending, every item once', () => {
    expect(planChunks(10, 4)).toEqual([
      [0, 4, 8],
      [1, 5, 9],
      [2, 6],
      [3, 7],
    ]);
    expect(planChunks(3, 8)).toEqual([[0], [1], [2]]);
    expect(planChunks(5, 1)).toEqual([[0, 1, 2, 3, 4]]);
    const all = planChunks(1000, 24)
      .flat()
      .sort((a, b) => a - b);
    expect(all).toEqual(Array.from({ length: 1000 }, (_, i) => i));
  });

  it('cuts at least the per-worker count, more when the work is large, never past the items', () => {
    expect(chunkCount(100, 1_000_000, 2, 4)).toBe(8); // 2 workers × 4; 1e6 / 250 000 = 4
    expect(chunkCount(100, 10 * CHUNK_WORK + 1, 2, 4)).toBe(11); // ⌈(10·W + 1) / W⌉
    expect(chunkCount(6, 60_000_000, 2, 4)).toBe(6); // no more chunks than items
    expect(chunkCount(1, 10, 4, 4)).toBe(1);
  });
});
