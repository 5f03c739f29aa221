/**
 * The Redis store against a real redis-server (started here on a free port, no persistence): values
 * and keys carry the version, entries expire, oversize entries are not stored; and the service keeps
 * answering when Redis is killed mid-run (computing, degraded, counting failures), then reconnects
 * and caches again when it returns.
 */
import { Writable } from 'node:stream';
import type { FastifyInstance } from 'fastify';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../src/app.js';
import { localRoute } from '../../src/api/local.js';
import { defaultConfig } from '../../src/config.js';
import { decodeValue, encodeValue, FAILURES_BEFORE_DEGRADED, PROBE_INTERVAL_MS, reconnectDelay, RECONNECT_MAX_DELAY_MS, RedisCache, type CacheLogger } from '../../src/cache/redis.js';
import type { CacheEntry } from '../../src/cache/types.js';
import { VERSION } from '../../src/version.js';
import { requireRedisServer, TestRedis } from '../redis-server.js';

const entry = (body: string): CacheEntry => ({ body, contentType: 'application/json; charset=utf-8', etag: `"${'a'.repeat(64)}"` });
const KEY = 'f'.repeat(64);

/** A logger that keeps its lines. */
function recordingLogger(): CacheLogger & { lines: Array<{ level: string; msg: string }> } {
  const lines: Array<{ level: string; msg: string }> = [];
  return {
    lines,
    info: (_obj, msg) => lines.push({ level: 'info', msg }),
    warn: (_obj, msg) => lines.push({ level: 'warn', msg }),
  };
}

/** Polls until check() holds, or fails after timeoutMs (for events that follow a kill or restart). */
async function until(check: () => boolean, what: string, timeoutMs = 8_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!check()) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for: ${what}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

describe('stored value format', () => {
  it('round-trips body, content type and ETag, including newlines and non-ASCII in the body', () => {
    const e = entry('{"a":"x\ny ²"}\n');
    expect(decodeValue('1.2.3', encodeValue('1.2.3', e))).toEqual({ entry: e, mismatch: false });
  });

  it('refuses a value written by another version, or not written by this store', () => {
    const value = encodeValue('1.2.3', entry('{}'));
    expect(decodeValue('1.2.4', value)).toEqual({ mismatch: true });
    expect(decodeValue('1.2.3', 'no header')).toEqual({ mismatch: true });
    expect(decodeValue('1.2.3', 'not json\n{}')).toEqual({ mismatch: true });
    expect(decodeValue('1.2.3', 'null\n{}')).toEqual({ mismatch: true });
    expect(decodeValue('1.2.3', '{"v":"1.2.3"}\n{}')).toEqual({ mismatch: true });
  });
});

describe('reconnectDelay', () => {
  it('grows exponentially from 50 ms and never exceeds the cap plus jitter', () => {
    const noJitter = (): number => 0;
    expect(reconnectDelay(0, noJitter)).toBe(50);
    expect(reconnectDelay(3, noJitter)).toBe(400);
    expect(reconnectDelay(10, noJitter)).toBe(RECONNECT_MAX_DELAY_MS);
    expect(reconnectDelay(1e6, () => 0.999)).toBeLessThan(RECONNECT_MAX_DELAY_MS + 100);
  });
});

describe('the test Redis', () => {
  it('without redis-server the tests fail saying how to install it (no silent skip)', () => {
    const saved = process.env.PATH;
    process.env.PATH = '/nonexistent';
    try {
      expect(() => requireRedisServer()).toThrow(/redis-server not found.*apt-get install -y redis-server/);
    } finally {
      process.env.PATH = saved;
    }
    expect(() => requireRedisServer()).not.toThrow();
  });
});

describe('RedisCache against redis-server', () => {
  let redis: TestRedis;
  const stores: RedisCache[] = [];
  const open = async (overrides: Partial<ConstructorParameters<typeof RedisCache>[0]> = {}): Promise<RedisCache> => {
    const store = new RedisCache({
      url: redis.url,
      version: '9.9.9-test',
      keyPrefix: 'st-test:',
      ttlSeconds: 60,
      commandTimeoutMs: 500,
      connectTimeoutMs: 1_000,
      maxEntryBytes: 1024 * 1024,
      logger: recordingLogger(),
      ...overrides,
    });
    stores.push(store);
    expect(await store.connect(5_000)).toBe(true);
    return store;
  };

  beforeAll(async () => {
    redis = await TestRedis.start();
  });
  afterEach(async () => {
    for (const s of stores.splice(0)) await s.close();
  });
  afterAll(async () => {
    await redis?.kill();
  });

  it('stores and reads back an entry under <prefix><version>:<key>, with the TTL', async () => {
    const store = await open();
    expect(store.health()).toEqual({ backend: 'redis', state: 'ready' });
    expect(await store.get(KEY)).toBeUndefined();
    await store.set(KEY, entry('{"x":1}'));
    expect(await store.get(KEY)).toEqual(entry('{"x":1}'));
    expect(store.stats()).toMatchObject({ hits: 1, misses: 1, errors: 0 });
    // Seen from outside: the key layout and an expiry within the configured 60 s.
    expect(await redis.command('EXISTS', `st-test:9.9.9-test:${KEY}`)).toBe(':1\r\n');
    const ttl = Number((await redis.command('TTL', `st-test:9.9.9-test:${KEY}`)).slice(1));
    expect(ttl).toBeGreaterThan(0);
    expect(ttl).toBeLessThanOrEqual(60);
  });

  it('entries expire after the TTL', async () => {
    const store = await open({ ttlSeconds: 1 });
    await store.set(KEY + '1', entry('{}'));
    expect(await store.get(KEY + '1')).toBeDefined();
    await new Promise((r) => setTimeout(r, 1_200));
    expect(await store.get(KEY + '1')).toBeUndefined();
  });

  it('another version neither sees the entry (other key) nor accepts a value it did not write', async () => {
    const v1 = await open({ version: '1.0.0' });
    const v2 = await open({ version: '2.0.0' });
    await v1.set(KEY, entry('{"from":"v1"}'));
    expect(await v2.get(KEY)).toBeUndefined();
    // A value under v2's key written by v1 (a misconfiguration, a collision): refused, counted.
    await redis.command('SET', `st-test:2.0.0:${KEY}`, encodeValue('1.0.0', entry('{"from":"v1"}')));
    expect(await v2.get(KEY)).toBeUndefined();
    expect(v2.redisCounters().mismatches).toBe(1);
    expect(v2.stats()).toMatchObject({ hits: 0, misses: 2 });
  });

  it('does not store an entry larger than maxEntryBytes, and counts it', async () => {
    const store = await open({ maxEntryBytes: 1000 });
    await store.set(KEY + 'big', entry('x'.repeat(2000)));
    expect(await store.get(KEY + 'big')).toBeUndefined();
    expect(store.redisCounters().oversize).toBe(1);
    await store.set(KEY + 'small', entry('x'.repeat(500)));
    expect(await store.get(KEY + 'small')).toBeDefined();
  });

  it('counts error replies (Redis out of memory) without turning degraded: Redis is there', async () => {
    const store = await open();
    await redis.command('CONFIG', 'SET', 'maxmemory', '1'); // noeviction (the default): every write refused
    try {
      for (let i = 0; i < FAILURES_BEFORE_DEGRADED + 1; i++) await store.set(`${KEY}oom${i}`, entry('{}'));
    } finally {
      await redis.command('CONFIG', 'SET', 'maxmemory', '0');
    }
    expect(store.stats().errors).toBe(FAILURES_BEFORE_DEGRADED + 1);
    expect(store.health().state).toBe('ready');
    expect(await store.get(`${KEY}oom0`)).toBeUndefined();
  });

  it('a stalled Redis costs each command at most its timeout, turns degraded, and recovers when it answers', async () => {
    const logger = recordingLogger();
    const store = await open({ commandTimeoutMs: 200, logger });
    await store.set(KEY + 'stall', entry('{"s":1}'));
    redis.pause();
    try {
      for (let i = 0; i < FAILURES_BEFORE_DEGRADED; i++) expect(await store.get(KEY + 'stall')).toBeUndefined();
      expect(store.stats()).toMatchObject({ errors: FAILURES_BEFORE_DEGRADED, hits: 0 });
      expect(store.health()).toMatchObject({ state: 'degraded', detail: expect.stringMatching(/failed in a row/) });
      // Degraded: one probe goes through (and times out), the commands after it are skipped.
      expect(await store.get(KEY + 'stall')).toBeUndefined();
      expect(store.redisCounters().skipped).toBe(0);
      await store.set(KEY + 'other', entry('{}'));
      expect(await store.get(KEY + 'stall')).toBeUndefined();
      expect(store.redisCounters()).toMatchObject({ skipped: 2, errors: FAILURES_BEFORE_DEGRADED + 3 });
    } finally {
      redis.resume();
    }
    // The next probe that succeeds brings it back.
    await new Promise((r) => setTimeout(r, PROBE_INTERVAL_MS + 50));
    expect(await store.get(KEY + 'stall')).toEqual(entry('{"s":1}'));
    expect(store.health().state).toBe('ready');
    expect(logger.lines.map((l) => l.level)).toEqual(['info', 'warn', 'info']);
  });

  it('starts degraded when Redis is down, answers misses without throwing, and connects when it comes up', async () => {
    await redis.kill();
    const logger = recordingLogger();
    const store = new RedisCache({
      url: redis.url,
      version: '9.9.9-test',
      keyPrefix: 'st-test:',
      ttlSeconds: 60,
      commandTimeoutMs: 300,
      connectTimeoutMs: 300,
      maxEntryBytes: 1024,
      logger,
    });
    stores.push(store);
    try {
      expect(await store.connect(300)).toBe(false);
      expect(store.health()).toMatchObject({ backend: 'redis', state: 'degraded' });
      expect(await store.get(KEY)).toBeUndefined();
      await store.set(KEY, entry('{}'));
      expect(store.stats().errors).toBe(2);
    } finally {
      await redis.restart();
    }
    expect(await store.waitReady(8_000)).toBe(true);
    expect(store.health().state).toBe('ready');
    expect(logger.lines.map((l) => l.level)).toEqual(['warn', 'info']);
  });
});

describe('the service with REDIS_URL, Redis killed and restarted mid-run', () => {
  let redis: TestRedis;
  let app: FastifyInstance;
  const logLines: Array<{ level: number; msg: string }> = [];

  beforeAll(async () => {
    redis = await TestRedis.start();
    const stream = new Writable({
      write(chunk: Buffer, _enc, done) {
        for (const line of chunk.toString().split('\n')) if (line) logLines.push(JSON.parse(line) as { level: number; msg: string });
        done();
      },
    });
    app = await buildApp({
      config: defaultConfig({ REDIS_URL: redis.url, REDIS_COMMAND_TIMEOUT_MS: 300, REDIS_KEY_PREFIX: 'svc-test:' }),
      logger: { level: 'info', stream },
    });
  });
  afterAll(async () => {
    await app?.close();
    await redis?.kill();
  });

  const ask = (spin: number) =>
    app.inject({ method: 'GET', url: `/v1/spacetime?mass=10%20Msun&spin=${spin}` });

  it('caches in Redis, keeps answering (computed, degraded, counted) without it, and resumes when it returns', async () => {
    expect(app.resultCache.health()).toEqual({ backend: 'redis', state: 'ready' });
    const cold = await ask(0.5);
    expect(cold.statusCode).toBe(200);
    expect(cold.headers['x-cache']).toBe('miss');
    const warm = await ask(0.5);
    expect(warm.headers['x-cache']).toBe('hit');
    expect(warm.body).toBe(cold.body);
    expect(await redis.command('KEYS', `svc-test:${VERSION}:*`)).toMatch(/^\*1\r\n/);

    await redis.kill();
    await until(() => app.resultCache.health().state === 'degraded', 'health degraded after the kill');
    expect(app.resultCache.health().detail).toMatch(/reconnecting/);
    const errorsBefore = app.resultCache.stats().errors ?? 0;
    for (let i = 0; i < 3; i++) {
      const r = await ask(0.5);
      expect(r.statusCode).toBe(200);
      expect(r.headers['x-cache']).toBe('miss');
      expect(r.body).toBe(cold.body);
    }
    // Each request failed to read and to write Redis.
    expect(app.resultCache.stats().errors).toBe(errorsBefore + 6);
    expect(logLines.some((l) => l.level === 40 && /Redis unreachable/.test(l.msg))).toBe(true);

    await redis.restart();
    await until(() => app.resultCache.health().state === 'ready', 'reconnected after the restart');
    expect(logLines.some((l) => l.level === 30 && /reconnected to Redis/.test(l.msg))).toBe(true);
    // The restarted Redis kept nothing (no persistence): computed once more, then served from Redis.
    expect((await ask(0.5)).headers['x-cache']).toBe('miss');
    const again = await ask(0.5);
    expect(again.headers['x-cache']).toBe('hit');
    expect(again.body).toBe(cold.body);
  });

  it('twenty identical requests at once: one computation, the others join it or read it from Redis', async () => {
    const compute = vi.spyOn(localRoute, 'compute');
    try {
      const before = app.resultCache.stats();
      const all = await Promise.all(
        Array.from({ length: 20 }, () => app.inject({ method: 'GET', url: '/v1/local?mass=7%20Msun&spin=0.3&r=9%20rg' })),
      );
      expect(all.every((r) => r.statusCode === 200 && r.body === all[0]!.body)).toBe(true);
      expect(compute).toHaveBeenCalledTimes(1);
      const after = app.resultCache.stats();
      // The Redis read is asynchronous, so requests arriving while it is in flight join it.
      expect(after.coalesced - before.coalesced).toBeGreaterThan(0);
      expect(after.misses - before.misses + (after.hits - before.hits) + (after.coalesced - before.coalesced)).toBe(20);
    } finally {
      // A failed assertion must not leave the spy on for the tests after it.
      compute.mockRestore();
    }
  });

  it('caches a large sweep (megabytes) in Redis and serves it byte-identical', async () => {
    const sweep = {
      body: { mass: '10 Msun' },
      quantities: ['flowSpeed', 'staticClockRate', 'hoverAcceleration', 'zamoClockRate'],
      axes: [
        { variable: 'r', from: '1 rg', to: '1000 rg', count: 200, spacing: 'log' },
        { variable: 'spin', from: 0, to: 0.99, count: 100 },
      ],
    };
    const cold = await app.inject({ method: 'POST', url: '/v1/sweep', payload: sweep });
    expect(cold.statusCode, cold.body.slice(0, 300)).toBe(200);
    expect(cold.headers['x-cache']).toBe('miss');
    expect(cold.body.length).toBeGreaterThan(1_000_000);
    const warm = await app.inject({ method: 'POST', url: '/v1/sweep', payload: sweep });
    expect(warm.headers['x-cache']).toBe('hit');
    expect(warm.body).toBe(cold.body);
  });
});
