/**
 * The in-memory store: bounded in bytes (entrySize each), least recently used evicted first, with
 * hit, miss and eviction counters; and the disabled store.
 */
import { describe, expect, it } from 'vitest';
import { createResultCache, DisabledCache, ENTRY_OVERHEAD_BYTES, entrySize, MemoryCache } from '../../src/cache/memory.js';
import type { CacheEntry } from '../../src/cache/types.js';

const KEY_LENGTH = 64;
const key = (i: number): string => String(i).padStart(KEY_LENGTH, '0');
const entry = (bodyBytes: number, char = 'x'): CacheEntry => ({
  body: char.repeat(bodyBytes),
  contentType: 'application/json; charset=utf-8',
  etag: `"${'e'.repeat(KEY_LENGTH)}"`,
});

describe('entrySize', () => {
  it('counts UTF-8 bytes of the body plus key, ETag, content type and the fixed overhead', () => {
    const e = entry(1000);
    expect(entrySize(key(1), e)).toBe(1000 + 64 + 66 + 31 + ENTRY_OVERHEAD_BYTES);
    // "²" is two bytes in UTF-8.
    expect(entrySize(key(1), entry(10, '²')) - entrySize(key(1), entry(10))).toBe(10);
  });
});

describe('MemoryCache', () => {
  it('never holds more than maxBytes, and counts each eviction', async () => {
    const size = entrySize(key(0), entry(1000));
    const cache = new MemoryCache(10 * size + Math.floor(size / 2)); // room for 10 entries, not 11
    for (let i = 0; i < 25; i++) {
      await cache.set(key(i), entry(1000));
      expect(cache.stats().bytes).toBeLessThanOrEqual(cache.maxBytes);
    }
    const s = cache.stats();
    expect(s.entries).toBe(10);
    expect(s.bytes).toBe(10 * size);
    expect(s.evictions).toBe(15);
    // The newest ten remain; the oldest went first.
    expect(await cache.get(key(24))).toBeDefined();
    expect(await cache.get(key(15))).toBeDefined();
    expect(await cache.get(key(14))).toBeUndefined();
  });

  it('evicts the least recently used entry, not the oldest written', async () => {
    const size = entrySize(key(0), entry(100));
    const cache = new MemoryCache(3 * size);
    await cache.set(key(1), entry(100));
    await cache.set(key(2), entry(100));
    await cache.set(key(3), entry(100));
    await cache.get(key(1)); // 1 is now the most recently used; 2 the least
    await cache.set(key(4), entry(100));
    expect(await cache.get(key(2))).toBeUndefined();
    expect(await cache.get(key(1))).toBeDefined();
    expect(cache.stats().evictions).toBe(1);
  });

  it('keeps a body with characters beyond ASCII exactly, and charges its UTF-8 bytes', async () => {
    const cache = new MemoryCache(1 << 20);
    const e: CacheEntry = { body: '{"note":"θ from the spin axis; 1 − rate; τ ≈ 2⁻¹"}', contentType: 'application/json; charset=utf-8', etag: '"u"' };
    await cache.set(key(2), e);
    const got = await cache.get(key(2));
    expect(got?.body).toBe(e.body);
    expect(got?.bytes?.length).toBe(Buffer.byteLength(e.body, 'utf8'));
    expect(cache.stats().bytes).toBe(entrySize(key(2), e));
  });

  it('keeps the bytes an entry brings (no second encoding) and charges their length', async () => {
    const cache = new MemoryCache(1 << 20);
    const body = '{"axes":[1,2,3]}';
    const bytes = Buffer.from(body, 'latin1');
    await cache.set(key(3), { body, bytes, contentType: 'application/json; charset=utf-8', etag: '"b"' });
    const got = await cache.get(key(3));
    expect(got?.bytes).toBe(bytes);
    expect(got?.body).toBe(body);
    expect(cache.stats().bytes).toBe(entrySize(key(3), { body, contentType: 'application/json; charset=utf-8', etag: '"b"' }));
  });

  it('counts hits and misses and returns the stored entry unchanged, with its UTF-8 bytes', async () => {
    const cache = new MemoryCache(1 << 20);
    const e = entry(50);
    expect(await cache.get(key(1))).toBeUndefined();
    await cache.set(key(1), e);
    for (let i = 0; i < 2; i++) {
      const got = await cache.get(key(1));
      expect({ body: got?.body, contentType: got?.contentType, etag: got?.etag }).toEqual(e);
      expect(got?.bytes?.equals(Buffer.from(e.body, 'utf8'))).toBe(true);
    }
    expect(cache.stats()).toEqual({
      hits: 2,
      misses: 1,
      evictions: 0,
      coalesced: 0,
      entries: 1,
      bytes: entrySize(key(1), e),
      maxBytes: 1 << 20,
    });
  });

  it('does not store an entry larger than the whole cache (and evicts nothing for it)', async () => {
    const cache = new MemoryCache(2000);
    await cache.set(key(1), entry(100));
    await cache.set(key(2), entry(5000));
    expect(await cache.get(key(2))).toBeUndefined();
    expect(await cache.get(key(1))).toBeDefined();
    expect(cache.stats().evictions).toBe(0);
  });

  it('refuses a bound that is not a positive whole number', () => {
    expect(() => new MemoryCache(0)).toThrow(RangeError);
    expect(() => new MemoryCache(1.5)).toThrow(RangeError);
  });
});

describe('DisabledCache and createResultCache', () => {
  it('0 bytes gives a store that keeps nothing and counts misses', async () => {
    const cache = createResultCache(0);
    expect(cache).toBeInstanceOf(DisabledCache);
    await cache.set(key(1), entry(10));
    expect(await cache.get(key(1))).toBeUndefined();
    expect(cache.stats()).toEqual({ hits: 0, misses: 1, evictions: 0, coalesced: 0, entries: 0, bytes: 0, maxBytes: 0 });
  });

  it('a positive bound gives the LRU', () => {
    const cache = createResultCache(4096);
    expect(cache).toBeInstanceOf(MemoryCache);
    expect(cache.stats().maxBytes).toBe(4096);
  });
});

describe('health and close', () => {
  it('the in-memory and disabled stores are always ready; close empties the LRU', async () => {
    const lru = new MemoryCache(1 << 20);
    await lru.set(key(1), entry(10));
    expect(lru.health()).toEqual({ backend: 'memory', state: 'ready' });
    await lru.close();
    expect(lru.stats().entries).toBe(0);
    expect(new DisabledCache().health()).toEqual({ backend: 'disabled', state: 'ready' });
  });
});
