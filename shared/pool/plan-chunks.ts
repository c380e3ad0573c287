/**
 * Splits items [0, total) into at most `parts` contiguous ranges of near-equal length, in order.
 * Only the work split depends on it; results never do, since items are computed independently.
 */
export function planChunks(total: number, parts: number): [number, number][] {
  const count = Math.max(1, Math.min(total, parts));
  const chunks: [number, number][] = [];
  for (let c = 0; c < count; c++) {
    const start = Math.floor((c * total) / count);
    const end = Math.floor(((c + 1) * total) / count);
    if (end > start) chunks.push([start, end]);
  }
  return chunks;
}
