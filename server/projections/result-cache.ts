/** Options of a {@link ResultCache}. */
export interface ResultCacheOptions {
  /** Most bytes of serialised answers kept. */
  readonly maxBytes: number;
  /** How long an answer stays, in ms. */
  readonly ttlMs: number;
  readonly now: () => number;
}

interface Entry {
  readonly body: Buffer;
  readonly expires: number;
}

/**
 * Answers of synchronous computations as the bytes sent (serialised and encoded once), by
 * request hash (which includes the
 * tenant, so one tenant never sees another's entry). Least recently used entries go first once
 * the byte budget is reached. The engine is deterministic, so a hit is exactly the answer a
 * recomputation would give.
 */
export class ResultCache {
  private readonly entries = new Map<string, Entry>();
  private bytes = 0;

  constructor(private readonly options: ResultCacheOptions) {}

  /** The cached answer's bytes, or undefined. */
  get(hash: string): Buffer | undefined {
    const entry = this.entries.get(hash);
    if (!entry) return undefined;
    if (entry.expires <= this.options.now()) {
      this.delete(hash, entry);
      return undefined;
    }
    // Re-insert to mark it most recently used (Map keeps insertion order).
    this.entries.delete(hash);
    this.entries.set(hash, entry);
    return entry.body;
  }

  /** Keeps an answer; one larger than a quarter of the budget is not worth evicting for. */
  set(hash: string, body: Buffer): void {
    const size = body.length;
    if (size > this.options.maxBytes / 4) return;
    const old = this.entries.get(hash);
    if (old) this.delete(hash, old);
    this.entries.set(hash, { body, expires: this.options.now() + this.options.ttlMs });
    this.bytes += size;
    for (const [key, entry] of this.entries) {
      if (this.bytes <= this.options.maxBytes) break;
      this.delete(key, entry);
    }
  }

  /** Number of entries held. */
  get size(): number {
    return this.entries.size;
  }

  private delete(hash: string, entry: Entry): void {
    this.entries.delete(hash);
    this.bytes -= entry.body.length;
  }
}
