/**
 * The default store: an in-memory LRU bounded in bytes (lru-cache with maxSize and a size for each
 * entry), and the store used when the cache is switched off (CACHE_MAX_BYTES=0).
 */
import { LRUCache } from 'lru-cache';
import type { CacheEntry, CacheHealth, CacheStats, ResultCache } from './types.js';

/**
 * Bytes charged to an entry beyond its strings: the LRU's slot arrays and index map, the entry
 * object and its string headers. An estimate; it keeps many tiny entries from looking free.
 */
export const ENTRY_OVERHEAD_BYTES = 128;

/**
 * The size charged for one entry: the UTF-8 bytes of the body (what goes on the wire, and what the
 * store holds: see StoredEntry), plus the key, ETag and content type, plus ENTRY_OVERHEAD_BYTES.
 */
export function entrySize(key: string, entry: CacheEntry): number {
  const body = entry.bytes ? entry.bytes.length : Buffer.byteLength(entry.body, 'utf8');
  return body + key.length + entry.etag.length + entry.contentType.length + ENTRY_OVERHEAD_BYTES;
}

/**
 * An entry as the in-memory store holds it: the body as UTF-8 bytes only (sent as they are on a hit;
 * half the heap of a string with characters beyond Latin-1), the string decoded when asked for.
 */
class StoredEntry implements CacheEntry {
  constructor(
    readonly bytes: Buffer,
    readonly contentType: string,
    readonly etag: string,
  ) {}

  get body(): string {
    return this.bytes.toString('utf8');
  }
}

/** In-memory LRU over at most maxBytes (entrySize each); counts hits, misses and evictions. */
export class MemoryCache implements ResultCache {
  private readonly lru: LRUCache<string, CacheEntry>;
  private hits = 0;
  private misses = 0;
  private evictions = 0;

  /** maxBytes: a positive whole number of bytes. An entry larger than it is not stored. */
  constructor(readonly maxBytes: number) {
    if (!Number.isSafeInteger(maxBytes) || maxBytes <= 0) throw new RangeError(`maxBytes must be a positive whole number, got ${maxBytes}`);
    this.lru = new LRUCache<string, CacheEntry>({
      maxSize: maxBytes,
      sizeCalculation: (entry, key) => entrySize(key, entry),
      dispose: (_entry, _key, reason) => {
        if (reason === 'evict') this.evictions += 1;
      },
    });
  }

  /** The entry under key (and marks it most recently used), counting a hit or a miss. */
  get(key: string): Promise<CacheEntry | undefined> {
    const entry = this.lru.get(key);
    if (entry === undefined) this.misses += 1;
    else this.hits += 1;
    return Promise.resolve(entry);
  }

  /** The entry under key (marked most recently used), counting a hit, or a miss when countMiss. */
  peek(key: string, countMiss = false): CacheEntry | undefined {
    const entry = this.lru.get(key);
    if (entry !== undefined) this.hits += 1;
    else if (countMiss) this.misses += 1;
    return entry;
  }

  /** Stores the entry, evicting the least recently used ones until the total fits in maxBytes. */
  set(key: string, entry: CacheEntry): Promise<void> {
    this.lru.set(key, new StoredEntry(entry.bytes ?? Buffer.from(entry.body, 'utf8'), entry.contentType, entry.etag));
    return Promise.resolve();
  }

  /** Counters and sizes; coalesced is 0 here (the coalescing front counts it). */
  stats(): CacheStats {
    return {
      hits: this.hits,
      misses: this.misses,
      evictions: this.evictions,
      coalesced: 0,
      entries: this.lru.size,
      bytes: this.lru.calculatedSize,
      maxBytes: this.maxBytes,
    };
  }

  /** Always ready: the store is this process's memory. */
  health(): CacheHealth {
    return { backend: 'memory', state: 'ready' };
  }

  /** Drops every entry. */
  close(): Promise<void> {
    this.lru.clear();
    return Promise.resolve();
  }
}

/** The store when caching is off: keeps nothing, so every lookup is a miss. */
export class DisabledCache implements ResultCache {
  private misses = 0;

  /** Always a miss. */
  get(_key: string): Promise<CacheEntry | undefined> {
    this.misses += 1;
    return Promise.resolve(undefined);
  }

  /** Always a miss (counted when countMiss). */
  peek(_key: string, countMiss = false): CacheEntry | undefined {
    if (countMiss) this.misses += 1;
    return undefined;
  }

  /** Keeps nothing. */
  set(_key: string, _entry: CacheEntry): Promise<void> {
    return Promise.resolve();
  }

  /** Misses only; every size is 0. */
  stats(): CacheStats {
    return { hits: 0, misses: this.misses, evictions: 0, coalesced: 0, entries: 0, bytes: 0, maxBytes: 0 };
  }

  /** Ready: keeping nothing is its normal state. */
  health(): CacheHealth {
    return { backend: 'disabled', state: 'ready' };
  }

  /** Nothing to release. */
  close(): Promise<void> {
    return Promise.resolve();
  }
}

/** The configured store: an LRU of maxBytes, or the disabled store when maxBytes is 0. */
export function createResultCache(maxBytes: number): ResultCache {
  return maxBytes === 0 ? new DisabledCache() : new MemoryCache(maxBytes);
}
