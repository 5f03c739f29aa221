/**
 * The front every compute route talks to: identical requests that arrive together share one lookup
 * (and, on a miss, one computation), whatever store sits behind it. With a store in this process
 * (resolveNow) a lookup and computation finish in one turn of the event loop, so there is never
 * anything in flight to share and no promise is made.
 */
import type { CacheEntry, CacheHealth, CacheStats, ResultCache } from './types.js';

/**
 * Wraps a store with request coalescing: a Map of in-flight lookups keyed by the cache key. A request
 * whose key is already in flight waits for that lookup instead of starting its own, and is counted in
 * `coalesced`; so hits + misses + coalesced is the number of requests resolved, and misses is the
 * number of computations.
 */
/**
 * How a request's entry was found, as the `x-cache` response header tells it: 'hit' from the store,
 * 'miss' computed for this request, 'coalesced' shared with an identical request already in flight.
 */
export type CacheStatus = 'hit' | 'miss' | 'coalesced';

/** An entry and how it was found. */
export interface Resolved {
  entry: CacheEntry;
  status: CacheStatus;
}

export class CoalescingCache implements ResultCache {
  private readonly inFlight = new Map<string, Promise<Resolved>>();
  private coalesced = 0;

  constructor(readonly store: ResultCache) {}

  /**
   * The entry for key: joins an identical lookup in flight, else asks the store, else calls produce
   * (synchronously; it may throw, and then every request that joined gets the same error and nothing
   * is stored) and stores its result. A store that fails to read or write never fails the request.
   */
  async resolve(key: string, produce: () => CacheEntry): Promise<CacheEntry> {
    return (await this.resolveWithStatus(key, produce)).entry;
  }

  /** resolve(), also telling whether the entry was a hit, a miss (computed) or coalesced. */
  resolveWithStatus(key: string, produce: () => CacheEntry): Promise<Resolved> {
    const pending = this.inFlight.get(key);
    if (pending !== undefined) {
      this.coalesced += 1;
      return pending.then(({ entry }) => ({ entry, status: 'coalesced' as const }));
    }
    const lookup = this.lookup(key, produce);
    this.inFlight.set(key, lookup);
    const clear = (): void => {
      if (this.inFlight.get(key) === lookup) this.inFlight.delete(key);
    };
    lookup.then(clear, clear);
    return lookup;
  }

  /** Store first, then produce and store. */
  private async lookup(key: string, produce: () => CacheEntry): Promise<Resolved> {
    let hit: CacheEntry | undefined;
    try {
      hit = await this.store.get(key);
    } catch {
      hit = undefined; // the store is an optimisation: an unreadable one means compute
    }
    if (hit !== undefined) return { entry: hit, status: 'hit' };
    const entry = produce();
    try {
      await this.store.set(key, entry);
    } catch {
      // an unwritable store only costs the next request a computation
    }
    return { entry, status: 'miss' };
  }

  /** Whether the store keeps entries in this process (request aliasing pays only then). */
  get keepsEntriesHere(): boolean {
    return this.store.peek !== undefined && this.store.health().backend === 'memory';
  }

  /** The store's synchronous lookup without counting a miss; undefined when it has none or holds nothing. */
  peek(key: string): CacheEntry | undefined {
    return this.store.peek?.(key, false);
  }

  /**
   * For a store with a synchronous lookup (ResultCache.peek): the stored entry, or `produce`'s, stored — all in
   * this turn of the event loop, with no promise. Nothing can coalesce here: a lookup and computation
   * that finish in one turn never overlap another request's. Falls back to resolveWithStatus for
   * other stores.
   */
  resolveNow(key: string, produce: () => CacheEntry): Resolved | Promise<Resolved> {
    const store = this.store;
    if (store.peek === undefined) return this.resolveWithStatus(key, produce);
    const hit = store.peek(key, true);
    if (hit !== undefined) return { entry: hit, status: 'hit' };
    const entry = produce();
    store.set(key, entry).catch(() => undefined); // completes at once; an unwritable store only costs a recomputation
    return { entry, status: 'miss' };
  }

  /** Reads the store directly (no coalescing). */
  get(key: string): Promise<CacheEntry | undefined> {
    return this.store.get(key);
  }

  /** Writes the store directly. */
  set(key: string, entry: CacheEntry): Promise<void> {
    return this.store.set(key, entry);
  }

  /** The store's counters with this front's coalesced count. */
  stats(): CacheStats {
    return { ...this.store.stats(), coalesced: this.coalesced };
  }

  /** The store's health. */
  health(): CacheHealth {
    return this.store.health();
  }

  /** Closes the store. */
  close(): Promise<void> {
    return this.store.close();
  }
}
