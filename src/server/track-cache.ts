/**
 * Answers of the track routes kept in memory, least recently used first out, bounded in bytes.
 * Safe because a request with its seed gives the same bytes for a generator version (the
 * core's guarantee 7): a repeat is answered without a worker. Requests without a seed draw a new
 * one and are never repeats, so the routes do not store them.
 */

/** What a cached answer holds: the bytes sent, the track's id (the ETag's root) and the file name. */
export interface CachedTrack {
  readonly id: string;
  readonly bytes: Uint8Array;
  readonly fileName: string;
}

/** Bytes counted per entry beyond its answer: key, id, file name, map entry (an estimate). */
const ENTRY_OVERHEAD_BYTES = 512;

export class TrackCache {
  private readonly entries = new Map<string, CachedTrack>();
  private bytes = 0;
  private hitCount = 0;
  private missCount = 0;

  /** @param capacityBytes the most the answers (and their keys) may take; 0 keeps nothing */
  constructor(readonly capacityBytes: number) {}

  /** The answer stored under `key`, now the most recently used; undefined when there is none. */
  get(key: string): CachedTrack | undefined {
    const found = this.entries.get(key);
    if (found === undefined) {
      this.missCount++;
      return undefined;
    }
    this.hitCount++;
    this.entries.delete(key);
    this.entries.set(key, found);
    return found;
  }

  /** Stores an answer, dropping the least recently used ones until it fits; one larger than the whole cache is not kept. */
  set(key: string, value: CachedTrack): void {
    const size = sizeOf(key, value);
    if (size > this.capacityBytes) return;
    const old = this.entries.get(key);
    if (old !== undefined) {
      this.entries.delete(key);
      this.bytes -= sizeOf(key, old);
    }
    for (const [k, v] of this.entries) {
      if (this.bytes + size <= this.capacityBytes) break;
      this.entries.delete(k);
      this.bytes -= sizeOf(k, v);
    }
    this.entries.set(key, value);
    this.bytes += size;
  }

  /** Entries, bytes held, and lookups that found or missed an answer. */
  stats(): { entries: number; bytes: number; capacityBytes: number; hits: number; misses: number } {
    return { entries: this.entries.size, bytes: this.bytes, capacityBytes: this.capacityBytes, hits: this.hitCount, misses: this.missCount };
  }
}

function sizeOf(key: string, value: CachedTrack): number {
  return value.bytes.byteLength + 2 * key.length + ENTRY_OVERHEAD_BYTES;
}
