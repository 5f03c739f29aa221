/**
 * Request aliases (src/cache/request-aliases.ts): a byte-identical repeat of an answered request is
 * served from the in-memory store without validation, and answers exactly what the full path would —
 * same bytes, ETag and headers; 304 on If-None-Match; the full path again once the entry is evicted;
 * problems never aliased; a shared store (no synchronous lookup) never fronted.
 */
import fc from 'fast-check';
import type { FastifyInstance } from 'fastify';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../src/app.js';
import { localRoute } from '../../src/api/local.js';
import { CoalescingCache } from '../../src/cache/coalesce.js';
import { MemoryCache } from '../../src/cache/memory.js';
import { MAX_ALIAS_TEXT_BYTES, RequestAliases, requestText } from '../../src/cache/request-aliases.js';
import type { CacheEntry, ResultCache } from '../../src/cache/types.js';
import { defaultConfig } from '../../src/config.js';

const URL_A = '/v1/local?mass=10%20Msun&spin=0.9&r=6%20rg';
const URL_B = '/v1/local?mass=10%20Msun&spin=0.5&r=6%20rg';
const RAW_BODY = '{"body":{"mass":"10 Msun","spin":0.9},"point":{"r":"6 rg"}}';

afterEach(() => {
  vi.restoreAllMocks();
});

describe('RequestAliases and requestText', () => {
  it('maps a request text to the key it was answered under', () => {
    const aliases = new RequestAliases();
    expect(aliases.keyFor('GET /v1/local?x=1')).toBeUndefined();
    aliases.record('GET /v1/local?x=1', 'k1');
    expect(aliases.keyFor('GET /v1/local?x=1')).toBe('k1');
    expect(aliases.keyFor('GET /v1/local?x=2')).toBeUndefined();
  });

  it('does not keep texts over MAX_ALIAS_TEXT_BYTES', () => {
    const aliases = new RequestAliases();
    aliases.record('x'.repeat(MAX_ALIAS_TEXT_BYTES + 1), 'k');
    expect(aliases.size).toBe(0);
    expect(requestText('GET', `/v1/local?${'a'.repeat(MAX_ALIAS_TEXT_BYTES)}`, undefined)).toBeUndefined();
    expect(requestText('POST', '/v1/local', 'b'.repeat(MAX_ALIAS_TEXT_BYTES + 1))).toBeUndefined();
  });

  it('stays within its byte bound, dropping the least recently used', () => {
    const aliases = new RequestAliases(10_000);
    for (let i = 0; i < 1000; i++) aliases.record(`GET /v1/local?r=${i}`, `key-${i}`.padEnd(64, '0'));
    // Each alias is about 2·(20 + 64) + 96 = 264 "bytes", so ~37 fit.
    expect(aliases.size).toBeGreaterThan(20);
    expect(aliases.size).toBeLessThan(40);
    expect(aliases.keyFor('GET /v1/local?r=999')).toBeDefined();
    expect(aliases.keyFor('GET /v1/local?r=0')).toBeUndefined();
  });

  it('GET and HEAD share a text; POST needs its raw body; other methods have none', () => {
    expect(requestText('GET', '/v1/local?r=3', undefined)).toBe('GET /v1/local?r=3');
    expect(requestText('HEAD', '/v1/local?r=3', undefined)).toBe('GET /v1/local?r=3');
    expect(requestText('POST', '/v1/local', '{}')).toBe('POST /v1/local\n{}');
    expect(requestText('POST', '/v1/local', undefined)).toBeUndefined();
    expect(requestText('PUT', '/v1/local', '{}')).toBeUndefined();
  });

  it('the coalescing front peeks, and fronts aliases, only over a store in this process', () => {
    const entry: CacheEntry = { body: '{}', contentType: 'application/json', etag: '"e"' };
    const memory = new MemoryCache(1 << 20);
    const front = new CoalescingCache(memory);
    expect(front.keepsEntriesHere).toBe(true);
    expect(front.peek('k')).toBeUndefined();
    expect(memory.stats().misses).toBe(0); // a failed peek counts nothing; the full path counts the miss
    void memory.set('k', entry);
    expect(front.peek('k')?.body).toBe(entry.body);
    expect(front.peek('k')?.bytes?.toString('utf8')).toBe('{}');
    expect(memory.stats().hits).toBe(2);
    const remote: ResultCache = {
      get: () => Promise.resolve(undefined),
      set: () => Promise.resolve(),
      stats: () => memory.stats(),
      health: () => ({ backend: 'redis', state: 'ready' }),
      close: () => Promise.resolve(),
    };
    const shared = new CoalescingCache(remote);
    expect(shared.keepsEntriesHere).toBe(false);
    expect(shared.peek('k')).toBeUndefined();
  });
});

describe('through the app', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp({ logger: false });
  });
  afterAll(async () => {
    await app.close();
  });

  it('a repeated GET is a hit served without validation, byte-identical with the same headers', async () => {
    const first = await app.inject({ method: 'GET', url: URL_A });
    expect(first.statusCode).toBe(200);
    expect(first.headers['x-cache']).toBe('miss');
    const toInput = vi.spyOn(localRoute.get!, 'toInput');
    const compute = vi.spyOn(localRoute, 'compute');
    const hitsBefore = app.resultCache.stats().hits;
    const again = await app.inject({ method: 'GET', url: URL_A });
    expect(again.statusCode).toBe(200);
    expect(again.headers['x-cache']).toBe('hit');
    expect(again.body).toBe(first.body);
    for (const h of ['etag', 'cache-control', 'content-type']) expect(again.headers[h]).toBe(first.headers[h]);
    expect(toInput).not.toHaveBeenCalled();
    expect(compute).not.toHaveBeenCalled();
    expect(app.resultCache.stats().hits).toBe(hitsBefore + 1);
  });

  it('a repeated POST with the same raw body is a hit without validation; other spellings still share the entry', async () => {
    const first = await app.inject({ method: 'POST', url: '/v1/local', payload: RAW_BODY, headers: { 'content-type': 'application/json' } });
    expect(first.statusCode).toBe(200);
    const parse = vi.spyOn(localRoute.body, 'safeParse');
    const again = await app.inject({ method: 'POST', url: '/v1/local', payload: RAW_BODY, headers: { 'content-type': 'application/json' } });
    expect(again.headers['x-cache']).toBe('hit');
    expect(again.body).toBe(first.body);
    expect(again.headers['cache-control']).toBe('no-cache');
    expect(parse).not.toHaveBeenCalled();
    // Whitespace and key order differ: not the same text, so validated, but the same canonical entry.
    const respelled = await app.inject({
      method: 'POST',
      url: '/v1/local',
      payload: '{ "point": { "r": "6 rg" }, "body": { "spin": 0.9, "mass": "10 Msun" } }',
      headers: { 'content-type': 'application/json' },
    });
    expect(parse).toHaveBeenCalledTimes(1);
    expect(respelled.headers['x-cache']).toBe('hit');
    expect(respelled.body).toBe(first.body);
    expect(respelled.headers.etag).toBe(first.headers.etag);
  });

  it('If-None-Match on a repeat gets 304 from the alias', async () => {
    const first = await app.inject({ method: 'GET', url: URL_A });
    const etag = String(first.headers.etag);
    const toInput = vi.spyOn(localRoute.get!, 'toInput');
    const res = await app.inject({ method: 'GET', url: URL_A, headers: { 'if-none-match': etag } });
    expect(res.statusCode).toBe(304);
    expect(res.body).toBe('');
    expect(res.headers.etag).toBe(etag);
    expect(toInput).not.toHaveBeenCalled();
  });

  it('problems are never aliased: a repeated bad request is refused each time, by validation', async () => {
    const bad = '/v1/local?mass=10%20Msun&spin=2&r=6%20rg';
    const id = { 'x-request-id': 'alias-check' }; // problem bodies name the request id
    const a = await app.inject({ method: 'GET', url: bad, headers: id });
    const b = await app.inject({ method: 'GET', url: bad, headers: id });
    expect(a.statusCode).toBe(422);
    expect(b.statusCode).toBe(422);
    expect(b.body).toBe(a.body);
    const badPost = '{"body":{"mass":"10 Msun","spinn":0.9},"point":{"r":"6 rg"}}';
    for (let i = 0; i < 2; i++) {
      const res = await app.inject({ method: 'POST', url: '/v1/local', payload: badPost, headers: { 'content-type': 'application/json' } });
      expect(res.statusCode).toBe(400);
      expect(res.json().errors[0].path).toBe('/body/spinn');
    }
  });

  it('HEAD after GET is answered from the alias with the GET headers and no body', async () => {
    const first = await app.inject({ method: 'GET', url: URL_A });
    const toInput = vi.spyOn(localRoute.get!, 'toInput');
    const head = await app.inject({ method: 'HEAD', url: URL_A });
    expect(toInput).not.toHaveBeenCalled();
    expect(head.statusCode).toBe(200);
    expect(head.body).toBe('');
    expect(head.headers.etag).toBe(first.headers.etag);
  });
});

describe('when the entry has gone', () => {
  it('an alias whose entry was evicted takes the full path and answers the same bytes', async () => {
    // Room for about one /v1/local entry (~2.3 KB each), so B evicts A.
    const app = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 3000, MAX_EVENT_LOOP_DELAY_MS: 0 }) });
    try {
      const a1 = await app.inject({ method: 'GET', url: URL_A });
      await app.inject({ method: 'GET', url: URL_B });
      const compute = vi.spyOn(localRoute, 'compute');
      const a2 = await app.inject({ method: 'GET', url: URL_A });
      expect(compute).toHaveBeenCalledTimes(1);
      expect(a2.headers['x-cache']).toBe('miss');
      expect(a2.body).toBe(a1.body);
    } finally {
      await app.close();
    }
  });

  it('with caching off every request is computed', async () => {
    const app = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 0, MAX_EVENT_LOOP_DELAY_MS: 0 }) });
    try {
      await app.inject({ method: 'GET', url: URL_A });
      const compute = vi.spyOn(localRoute, 'compute');
      const again = await app.inject({ method: 'GET', url: URL_A });
      expect(again.headers['x-cache']).toBe('miss');
      expect(compute).toHaveBeenCalledTimes(1);
    } finally {
      await app.close();
    }
  });
});

describe('property: a repeat answers what a cold service answers', () => {
  let cached: FastifyInstance;
  let cold: FastifyInstance;
  beforeAll(async () => {
    cached = await buildApp({ logger: false });
    cold = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 0, MAX_EVENT_LOOP_DELAY_MS: 0 }) });
  });
  afterAll(async () => {
    await cached.close();
    await cold.close();
  });

  it('for random GET and POST /v1/local requests, the second answer is byte-identical to a cold one', async () => {
    // Negative spins are refused (spin is a magnitude): the property covers problems as well.
    const spin = fc.double({ min: -0.2, max: 0.99, noNaN: true });
    const r = fc.double({ min: 2.5, max: 1e6, noNaN: true });
    const theta = fc.integer({ min: 1, max: 179 });
    await fc.assert(
      fc.asyncProperty(spin, r, theta, fc.boolean(), async (a, rr, th, usePost) => {
        const req = usePost
          ? {
              method: 'POST' as const,
              url: '/v1/local',
              payload: JSON.stringify({ body: { mass: '4 Msun', spin: a }, point: { r: `${rr} rg`, theta: `${th} deg` } }),
              headers: { 'content-type': 'application/json', 'x-request-id': 'alias-property' },
            }
          : {
              method: 'GET' as const,
              url: `/v1/local?mass=4%20Msun&spin=${a}&r=${rr}%20rg&theta=${th}%20deg`,
              headers: { 'x-request-id': 'alias-property' },
            };
        await cached.inject(req);
        const repeat = await cached.inject(req);
        const fresh = await cold.inject(req);
        expect(repeat.statusCode).toBe(fresh.statusCode);
        expect(repeat.body).toBe(fresh.body);
        expect(repeat.headers.etag).toBe(fresh.headers.etag);
        if (repeat.statusCode === 200) expect(repeat.headers['x-cache']).toBe('hit');
      }),
      { numRuns: 60 },
    );
  });
});
