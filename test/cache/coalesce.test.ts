/**
 * The coalescing front: identical lookups in flight share one store read and one computation;
 * errors reach every joined request and are never stored; a failing store never fails a request.
 */
import { describe, expect, it, vi } from 'vitest';
import { CoalescingCache } from '../../src/cache/coalesce.js';
import { createResultCache, MemoryCache } from '../../src/cache/memory.js';
import type { CacheEntry, CacheHealth, CacheStats, ResultCache } from '../../src/cache/types.js';

const entry = (body: string): CacheEntry => ({ body, contentType: 'application/json; charset=utf-8', etag: '"k"' });

/** A store whose reads wait until release() is called, so lookups overlap deterministically. */
class SlowStore implements ResultCache {
  readonly inner = new MemoryCache(1 << 20);
  private gate: Promise<void>;
  release!: () => void;
  constructor() {
    this.gate = new Promise((resolve) => (this.release = resolve));
  }
  async get(key: string): Promise<CacheEntry | undefined> {
    await this.gate;
    return this.inner.get(key);
  }
  set(key: string, e: CacheEntry): Promise<void> {
    return this.inner.set(key, e);
  }
  stats(): CacheStats {
    return this.inner.stats();
  }
  health(): CacheHealth {
    return this.inner.health();
  }
  close(): Promise<void> {
    return this.inner.close();
  }
}

describe('CoalescingCache', () => {
  it('twenty overlapping identical lookups read the store once and compute once', async () => {
    const store = new SlowStore();
    const cache = new CoalescingCache(store);
    const produce = vi.fn(() => entry('{"x":1}'));
    const all = Promise.all(Array.from({ length: 20 }, () => cache.resolve('k', produce)));
    store.release();
    const got = await all;
    expect(produce).toHaveBeenCalledTimes(1);
    expect(new Set(got).size).toBe(1); // the very same entry object for all twenty
    expect(cache.stats()).toMatchObject({ misses: 1, hits: 0, coalesced: 19, entries: 1 });
  });

  it('different keys do not coalesce', async () => {
    const store = new SlowStore();
    const cache = new CoalescingCache(store);
    const produce = vi.fn((): CacheEntry => entry('{}'));
    const all = Promise.all([cache.resolve('a', produce), cache.resolve('b', produce)]);
    store.release();
    await all;
    expect(produce).toHaveBeenCalledTimes(2);
    expect(cache.stats().coalesced).toBe(0);
  });

  it('after a lookup completes, the next one is a plain hit', async () => {
    const cache = new CoalescingCache(new MemoryCache(1 << 20));
    const produce = vi.fn(() => entry('{"x":2}'));
    await cache.resolve('k', produce);
    await cache.resolve('k', produce);
    expect(produce).toHaveBeenCalledTimes(1);
    expect(cache.stats()).toMatchObject({ hits: 1, misses: 1, coalesced: 0 });
  });

  it('an error reaches every joined request, is not stored, and the next request computes again', async () => {
    const store = new SlowStore();
    const cache = new CoalescingCache(store);
    const boom = new Error('unphysical');
    const failing = vi.fn((): CacheEntry => {
      throw boom;
    });
    const all = Promise.allSettled(Array.from({ length: 5 }, () => cache.resolve('k', failing)));
    store.release();
    const results = await all;
    expect(results.every((r) => r.status === 'rejected' && r.reason === boom)).toBe(true);
    expect(failing).toHaveBeenCalledTimes(1);
    expect(cache.stats().entries).toBe(0);
    const ok = vi.fn(() => entry('{}'));
    await cache.resolve('k', ok);
    expect(ok).toHaveBeenCalledTimes(1);
  });

  it('a store that throws on read and write still answers by computing', async () => {
    const broken: ResultCache = {
      get: () => Promise.reject(new Error('store down')),
      set: () => Promise.reject(new Error('store down')),
      stats: () => ({ hits: 0, misses: 0, evictions: 0, coalesced: 0, entries: 0, bytes: 0, maxBytes: 0 }),
      health: () => ({ backend: 'redis', state: 'degraded', detail: 'store down' }),
      close: () => Promise.resolve(),
    };
    const cache = new CoalescingCache(broken);
    await expect(cache.resolve('k', () => entry('{"y":3}'))).resolves.toMatchObject({ body: '{"y":3}' });
  });
});

describe('CoalescingCache.resolveWithStatus (the x-cache header)', () => {
  it('tells a miss (computed), the requests that joined it (coalesced), and a later hit', async () => {
    const store = new SlowStore();
    const cache = new CoalescingCache(store);
    const first = cache.resolveWithStatus('k', () => entry('{"x":1}'));
    const joined = cache.resolveWithStatus('k', () => entry('{"x":2}'));
    store.release();
    expect((await first).status).toBe('miss');
    const j = await joined;
    expect(j.status).toBe('coalesced');
    expect(j.entry.body).toBe('{"x":1}');
    const later = await cache.resolveWithStatus('k', () => entry('{"x":3}'));
    expect(later.status).toBe('hit');
    expect({ body: later.entry.body, contentType: later.entry.contentType, etag: later.entry.etag }).toEqual(entry('{"x":1}'));
  });
});

describe('CoalescingCache.resolveNow (stores with a synchronous lookup)', () => {
  it('in-memory store: a miss computed and stored, then hits, with no promise and correct counts', () => {
    const cache = new CoalescingCache(new MemoryCache(1 << 20));
    const produce = vi.fn(() => entry('{"x":2}'));
    const first = cache.resolveNow('k', produce);
    expect(first).not.toBeInstanceOf(Promise);
    expect(first).toMatchObject({ status: 'miss', entry: { body: '{"x":2}' } });
    const second = cache.resolveNow('k', produce);
    expect(second).toMatchObject({ status: 'hit', entry: { body: '{"x":2}' } });
    expect(produce).toHaveBeenCalledTimes(1);
    expect(cache.stats()).toMatchObject({ hits: 1, misses: 1, coalesced: 0 });
  });

  it('switched-off store: every request computed and counted as a miss', () => {
    const cache = new CoalescingCache(createResultCache(0));
    const produce = vi.fn(() => entry('{}'));
    for (let i = 0; i < 3; i++) expect(cache.resolveNow('k', produce)).toMatchObject({ status: 'miss' });
    expect(produce).toHaveBeenCalledTimes(3);
    expect(cache.stats()).toMatchObject({ hits: 0, misses: 3 });
    expect(cache.keepsEntriesHere).toBe(false);
  });

  it('a store without one: resolveNow is resolveWithStatus (overlapping lookups coalesce)', async () => {
    const store = new SlowStore();
    const cache = new CoalescingCache(store);
    const produce = vi.fn(() => entry('{"y":1}'));
    const a = cache.resolveNow('k', produce);
    const b = cache.resolveNow('k', produce);
    expect(a).toBeInstanceOf(Promise);
    store.release();
    expect((await a).status).toBe('miss');
    expect((await b).status).toBe('coalesced');
    expect(produce).toHaveBeenCalledTimes(1);
  });

  it('a computation that throws reaches the caller and stores nothing', () => {
    const cache = new CoalescingCache(new MemoryCache(1 << 20));
    expect(() =>
      cache.resolveNow('k', () => {
        throw new Error('refused');
      }),
    ).toThrow('refused');
    expect(cache.peek('k')).toBeUndefined();
    expect(cache.stats().entries).toBe(0);
  });
});
