/** Weighted time units one chunk should hold at most (about 0.1 s on one core of this machine). */
export const CHUNK_WORK = 250_000;

/**
 * Splits items [0, total) into `parts` interleaved chunks: chunk c holds items c, c + parts,
 * c + 2·parts, … (ascending). Neighbouring items cost alike (a sweep's chaotic values come in
 * bands, each several times dearer than a cycle), so interleaving gives every chunk a share of
 * each band and chunks of near-equal cost, which contiguous ranges do not. Only the work split
 * depends on it; results never do, since items are computed independently and reassembled by
 * index.
 */
export function planChunks(total: number, parts: number): number[][] {
  const count = Math.max(1, Math.min(total, Math.floor(parts)));
  const chunks: number[][] = Array.from({ length: count }, () => []);
  for (let i = 0; i < total; i++) chunks[i % count]!.push(i);
  return chunks.filter((c) => c.length > 0);
}

/**
 * How many chunks a run of `total` items and `work` weighted time units is cut into: at least
 * `perWorker` per worker (so a free worker takes the next and none waits on a straggler), and
 * enough that none holds more than {@link CHUNK_WORK} (so another tenant's run waits at most
 * one chunk per worker for its turn), never more than the items.
 */
export function chunkCount(total: number, work: number, workers: number, perWorker: number) {
  const byWork = Math.ceil(work / CHUNK_WORK);
  return Math.max(1, Math.min(total, Math.max(workers * perWorker, byWork)));
}
