/**
 * Hand-written LRU (a Map in use order): lru-cache is no dependency of the backend, and the
 * byte bound plus one build per key under concurrent misses is all this needs.
 *
 * Serialised, compressed results answers by run and shape. A run never changes once stored,
 * so an entry is never stale and nothing invalidates it; what may change between requests
 * (the stale-settings notice) is part of the key, and who may read it is checked on every
 * request before the cache is asked.
 */
import { Injectable } from '@nestjs/common';
import { encodedSize, type EncodedBody } from './encoded-body';

/** Room for several hundred 64-channel results with their rasters. */
export const RESULTS_CACHE_BYTES = 64 * 2 ** 20;

export interface ResultsCacheStats {
  hits: number;
  misses: number;
  entries: number;
  bytes: number;
}

@Injectable()
export class ResultsBodyCache {
  private readonly entries = new Map<string, EncodedBody>();
  private readonly building = new Map<string, Promise<EncodedBody>>();
  private bytes = 0;
  private hits = 0;
  private misses = 0;

  constructor(private readonly maxBytes: number = RESULTS_CACHE_BYTES) {}

  /**
   * The body under `key`, built by `build` on a miss. Concurrent misses of one key share one
   * build; a failed build caches nothing (the next request tries again).
   */
  async get(key: string, build: () => Promise<EncodedBody>): Promise<EncodedBody> {
    const found = this.entries.get(key);
    if (found !== undefined) {
      this.hits += 1;
      // Most recently used goes last.
      this.entries.delete(key);
      this.entries.set(key, found);
      return found;
    }
    const pending = this.building.get(key);
    if (pending !== undefined) {
      this.hits += 1;
      return pending;
    }
    this.misses += 1;
    const made = build().then(
      (body) => {
        this.building.delete(key);
        this.keep(key, body);
        return body;
      },
      (error: unknown) => {
        this.building.delete(key);
        throw error;
      },
    );
    this.building.set(key, made);
    return made;
  }

  stats(): ResultsCacheStats {
    return { hits: this.hits, misses: this.misses, entries: this.entries.size, bytes: this.bytes };
  }

  private keep(key: string, body: EncodedBody): void {
    const size = encodedSize(body) + key.length;
    // A body larger than the whole cache is sent but not kept.
    if (size > this.maxBytes) return;
    this.entries.set(key, body);
    this.bytes += size;
    for (const [oldKey, old] of this.entries) {
      if (this.bytes <= this.maxBytes) break;
      this.entries.delete(oldKey);
      this.bytes -= encodedSize(old) + oldKey.length;
    }
  }
}
