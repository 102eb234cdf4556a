/**
 * In-process caches bounded in bytes, not entries (issue 17 finding 9: thirty 4 MB scenes read once
 * took the server from 1.0 to 1.4 GB under a 500-entry cap, and kept it). Each cache is an lru-cache
 * with `maxSize` and a size estimate per entry; every cache registers itself so `/api/health` and the
 * bench report size and hit rate. `CACHE_MB` (default 64) is the budget of each cache.
 */
import { LRUCache } from 'lru-cache';

export interface CacheStats {
  name: string;
  entries: number;
  bytes: number;
  maxBytes: number;
  hits: number;
  misses: number;
  hitRate: number;
}

const registry: ByteCache<string, object>[] = [];

export class ByteCache<K extends string, V extends object> {
  private readonly lru: LRUCache<K, V>;
  private hits = 0;
  private misses = 0;

  constructor(
    readonly name: string,
    readonly maxBytes: number,
    sizeOf: (value: V, key: K) => number,
  ) {
    this.lru = new LRUCache<K, V>({ maxSize: maxBytes, sizeCalculation: (v, k) => Math.max(1, Math.ceil(sizeOf(v, k))) });
    registry.push(this as unknown as ByteCache<string, object>);
  }

  get(key: K): V | undefined {
    const v = this.lru.get(key);
    if (v === undefined) this.misses++;
    else this.hits++;
    return v;
  }

  /** A look without counting a hit or a miss (a second look at the same key in one request). */
  peek(key: K): V | undefined {
    return this.lru.peek(key);
  }

  /** Stores an entry; one larger than the whole budget is not stored. */
  set(key: K, value: V): void {
    this.lru.set(key, value);
  }

  delete(key: K): void {
    this.lru.delete(key);
  }

  stats(): CacheStats {
    const total = this.hits + this.misses;
    return {
      name: this.name,
      entries: this.lru.size,
      bytes: this.lru.calculatedSize,
      maxBytes: this.maxBytes,
      hits: this.hits,
      misses: this.misses,
      hitRate: total ? Math.round((this.hits / total) * 1000) / 1000 : 0,
    };
  }
}

/** The byte budget of one cache: `CACHE_MB` (default 64 MB). */
export function cacheBudgetBytes(): number {
  const mb = Number(process.env.CACHE_MB);
  return (Number.isFinite(mb) && mb > 0 ? mb : 64) * 1024 * 1024;
}

export function cacheStats(): CacheStats[] {
  return registry.map((c) => c.stats());
}

/** Bytes a JavaScript string holds (UTF-16 at worst). */
export const stringBytes = (s: string | null | undefined) => (s ? s.length * 2 : 0);
