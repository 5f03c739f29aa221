/**
 * The result cache's contract. The in-memory LRU (memory.ts) is the default store; a shared store
 * (Redis, say) can replace it by implementing ResultCache, and the coalescing front (coalesce.ts)
 * works over any of them.
 */

/** One cached response: the exact bytes sent with a 200, and the headers that describe them. */
export interface CacheEntry {
  /** The serialised response body, sent as is. */
  body: string;
  /** Content-Type of the body, e.g. "application/json; charset=utf-8". */
  contentType: string;
  /** The strong ETag, quoted (`"<hex>"`). */
  etag: string;
  /**
   * The body as UTF-8 bytes, when the store keeps it so: the in-memory store does, so a hit is
   * written to the socket as is instead of being encoded from a string on every response. A producer
   * that has them at hand (the sweep's ASCII document) passes them, and the in-memory store keeps those.
   */
  readonly bytes?: Buffer;
}

/**
 * Counters and sizes of a cache, for metrics. A shared store (Redis) counts this process's hits,
 * misses and errors; the entries it holds are shared and evicted by the server, so entries, bytes,
 * maxBytes and evictions are 0 for it (see redis.ts).
 */
export interface CacheStats {
  /** Lookups answered from the store. */
  hits: number;
  /** Lookups the store could not answer (each one is a computation). */
  misses: number;
  /** Entries dropped to keep the store within maxBytes. */
  evictions: number;
  /** Requests that joined an identical lookup already in flight instead of starting their own. */
  coalesced: number;
  /** Entries held now. */
  entries: number;
  /** Bytes held now, as the store counts them (see memory.ts). */
  bytes: number;
  /** The bound on bytes; 0 when the store keeps nothing (or the bound is the shared store's own). */
  maxBytes: number;
  /** Store operations that failed (each failed read became a computation); absent for local stores. */
  errors?: number;
}

/** Whether a store can serve now, for the readiness probe and metrics. */
export interface CacheHealth {
  /** Which store: the in-memory LRU, the switched-off store, or a shared one. */
  backend: 'memory' | 'disabled' | 'redis';
  /**
   * 'ready': serving from the store. 'degraded': the store is unreachable and every request is
   * computed (answers stay correct, only slower); a shared store reports it while it reconnects.
   */
  state: 'ready' | 'degraded';
  /** Why the store is degraded, in words (no secrets such as a password in a URL). */
  detail?: string;
}

/** A store of computed responses keyed by the canonical request key (key.ts). */
export interface ResultCache {
  /** The entry under key, or undefined; counts a hit or a miss. */
  get(key: string): Promise<CacheEntry | undefined>;
  /**
   * Synchronous lookup, offered only by a store in this process (the in-memory LRU and the
   * switched-off store), whose set() also completes at once: the entry under key or undefined. Counts
   * a hit, and a miss only when `countMiss` (request aliasing peeks without counting: on a miss it
   * takes the full path, which counts it).
   */
  peek?(key: string, countMiss?: boolean): CacheEntry | undefined;
  /** Stores the entry under key (a store may decline, e.g. an entry larger than its bound). */
  set(key: string, entry: CacheEntry): Promise<void>;
  /** Current counters and sizes. */
  stats(): CacheStats;
  /** Whether the store serves now. */
  health(): CacheHealth;
  /** Releases connections and timers; the store is not used afterwards. */
  close(): Promise<void>;
}
