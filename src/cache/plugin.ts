/**
 * The result-cache plugin: builds the configured store behind the coalescing front and exposes it as
 * `app.resultCache` (compute routes use it; metrics will read its stats()).
 */
import type { FastifyPluginAsync } from 'fastify';
import fp from 'fastify-plugin';
import { CoalescingCache } from './coalesce.js';
import { createResultCache } from './memory.js';

declare module 'fastify' {
  interface FastifyInstance {
    /** The result cache of the compute routes (coalescing front over the configured store). */
    resultCache: CoalescingCache;
  }
}

export interface ResultCacheOptions {
  /** Bound of the in-memory LRU in bytes; 0 keeps nothing (coalescing and HTTP caching remain). */
  maxBytes: number;
}

const plugin: FastifyPluginAsync<ResultCacheOptions> = async (app, options) => {
  const cache = new CoalescingCache(createResultCache(options.maxBytes));
  app.decorate('resultCache', cache);
  // The store's connections close with the app (after in-flight requests have finished).
  app.addHook('onClose', async () => cache.close());
};

/** Named plugin (not encapsulated, so the decorator is visible to the whole app). */
export const resultCachePlugin = fp(plugin, { name: 'spacetide-result-cache', fastify: '5.x' });
