/**
 * Metrics in the Prometheus text format at GET /metrics (prom-client): requests and their latency by
 * route and status, the result cache's counters and sizes, and the process (event-loop lag, heap,
 * resident memory, GC) from prom-client's default collectors.
 *
 * Each app has its own registry, so several apps in one process (tests) never share counters. The
 * route label is the route pattern (`/problems/:code`), never the raw URL, and "unmatched" for
 * requests no route serves: the number of series stays bounded whatever clients send.
 */
import type { FastifyPluginAsync, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { collectDefaultMetrics, Counter, Gauge, Histogram, Registry } from 'prom-client';

declare module 'fastify' {
  interface FastifyInstance {
    /** The app's metric registry (every series GET /metrics reports). */
    metrics: Registry;
  }
}

export interface MetricsOptions {
  /** Serve GET /metrics (METRICS_ENABLED); the registry counts either way. */
  expose: boolean;
}

/** Latency buckets, seconds: sub-millisecond cached answers up to the request timeout's order. */
const LATENCY_BUCKETS = [0.0005, 0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30];

/** The route pattern a request matched, or "unmatched" (404s, and requests refused before routing). */
export function routeLabel(request: FastifyRequest): string {
  const url = request.routeOptions?.url;
  return request.is404 || typeof url !== 'string' || url === '' ? 'unmatched' : url;
}

const plugin: FastifyPluginAsync<MetricsOptions> = async (app, options) => {
  const registry = new Registry();
  collectDefaultMetrics({ register: registry });

  const labelNames = ['method', 'route', 'status'] as const;
  const requests = new Counter({ name: 'spacetide_http_requests_total', help: 'HTTP requests answered, by method, route pattern and status code.', labelNames, registers: [registry] });
  const latency = new Histogram({
    name: 'spacetide_http_request_duration_seconds',
    help: 'Time from receiving a request to sending its response, seconds, by method, route pattern and status code.',
    labelNames,
    buckets: LATENCY_BUCKETS,
    registers: [registry],
  });

  // Cache counters are kept by the cache; each scrape copies them (reset + inc keeps them counters).
  const cacheCounter = (name: string, help: string, read: () => number) =>
    new Counter({
      name,
      help,
      registers: [registry],
      collect() {
        this.reset();
        this.inc(read());
      },
    });
  const cacheGauge = (name: string, help: string, read: () => number) =>
    new Gauge({
      name,
      help,
      registers: [registry],
      collect() {
        this.set(read());
      },
    });
  const stats = () => app.resultCache.stats();
  cacheCounter('spacetide_cache_hits_total', 'Result-cache lookups answered from the store.', () => stats().hits);
  cacheCounter('spacetide_cache_misses_total', 'Result-cache lookups the store could not answer (each one computed).', () => stats().misses);
  cacheCounter('spacetide_cache_evictions_total', 'Result-cache entries dropped to stay within the byte bound.', () => stats().evictions);
  cacheCounter('spacetide_cache_coalesced_total', 'Requests that joined an identical computation already in flight.', () => stats().coalesced);
  cacheGauge('spacetide_cache_entries', 'Result-cache entries held now.', () => stats().entries);
  cacheGauge('spacetide_cache_bytes', 'Result-cache bytes held now.', () => stats().bytes);
  cacheGauge('spacetide_cache_max_bytes', 'Result-cache byte bound (0: the cache keeps nothing).', () => stats().maxBytes);
  new Gauge({
    name: 'spacetide_cache_ready',
    help: '1 when the result-cache store serves, 0 when it is degraded (every request computed).',
    labelNames: ['backend'],
    registers: [registry],
    collect() {
      const h = app.resultCache.health();
      this.reset();
      this.set({ backend: h.backend }, h.state === 'ready' ? 1 : 0);
    },
  });
  new Gauge({
    name: 'spacetide_overloaded',
    help: '1 while the service sheds load (503 with Retry-After) because a pressure threshold is exceeded.',
    registers: [registry],
    collect() {
      this.set(app.hasDecorator('isUnderPressure') && app.isUnderPressure() ? 1 : 0);
    },
  });

  app.decorate('metrics', registry);
  app.addHook('onResponse', (request, reply, done) => {
    const labels = { method: request.method, route: routeLabel(request), status: String(reply.statusCode) };
    requests.inc(labels);
    latency.observe(labels, reply.elapsedTime / 1000);
    done();
  });
  app.addHook('onClose', async () => registry.clear());

  if (options.expose) {
    app.get('/metrics', async (_request, reply) => {
      const text = await registry.metrics();
      reply.type(registry.contentType).header('cache-control', 'no-store');
      return text;
    });
  }
};

/** Named plugin (not encapsulated: its hook sees every route). */
export const metricsPlugin = fp(plugin, { name: 'spacetide-metrics', fastify: '5.x', dependencies: ['spacetide-result-cache'] });
