/**
 * The result-cache plugin: builds the configured store behind the coalescing front and exposes it as
 * `app.resultCache` (compute routes use it; metrics and readiness read its stats() and health()).
 * The store: Redis when a URL is given (shared by the replicas), else the in-memory LRU of maxBytes,
 * else (maxBytes 0) none.
 */
import type { FastifyPluginAsync } from 'fastify';
import fp from 'fastify-plugin';
import { VERSION } from '../version.js';
import { CoalescingCache } from './coalesce.js';
import { createResultCache } from './memory.js';
import { RedisCache } from './redis.js';
import type { ResultCache } from './types.js';

declare module 'fastify' {
  interface FastifyInstance {
    /** The result cache of the compute routes (coalescing front over the configured store). */
    resultCache: CoalescingCache;
  }
}

/** The shared store's settings (config.ts: REDIS_*, CACHE_TTL_SECONDS). */
export interface RedisStoreOptions {
  url: string;
  keyPrefix: string;
  ttlSeconds: number;
  commandTimeoutMs: number;
  connectTimeoutMs: number;
  maxEntryBytes: number;
}

export interface ResultCacheOptions {
  /** Bound of the in-memory LRU in bytes; 0 keeps nothing (ETags and 304 remain). */
  maxBytes: number;
  /** When given, Redis is the store instead of the in-memory LRU. */
  redis?: RedisStoreOptions;
  /** Service version in keys and values; VERSION unless a test says otherwise. */
  version?: string;
}

const plugin: FastifyPluginAsync<ResultCacheOptions> = async (app, options) => {
  let store: ResultCache;
  if (options.redis) {
    const redis = new RedisCache({ ...options.redis, version: options.version ?? VERSION, logger: app.log });
    // Wait for the connection at most connectTimeoutMs; without it the service starts degraded
    // (computing every request) and connects in the background.
    await redis.connect(options.redis.connectTimeoutMs);
    store = redis;
  } else {
    store = createResultCache(options.maxBytes);
  }
  const cache = new CoalescingCache(store);
  app.decorate('resultCache', cache);
  // The store's connections close with the app (after in-flight requests have finished).
  app.addHook('onClose', async () => cache.close());
};

/** Named plugin (not encapsulated, so the decorator is visible to the whole app). */
export const resultCachePlugin = fp(plugin, { name: 'spacetide-result-cache', fastify: '5.x' });
