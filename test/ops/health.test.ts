/**
 * Probes and metrics through inject(): /healthz, /readyz with the cache backend's state, and
 * /metrics in the Prometheus text format with bounded route labels and the cache counters.
 */
import { describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { defaultConfig } from '../../src/config.js';
import { useApp } from '../helpers.js';
import { sample } from './service-process.js';

const app = useApp();

describe('GET /healthz', () => {
  it('says the process is alive, not to be cached', async () => {
    const res = await app().inject({ method: 'GET', url: '/healthz' });
    expect(res.statusCode).toBe(200);
    expect(res.json()).toMatchObject({ status: 'alive', service: { name: 'spacetide' } });
    expect(res.headers['cache-control']).toBe('no-store');
  });
});

describe('GET /readyz', () => {
  it('is ready, naming the cache backend and its state', async () => {
    const res = await app().inject({ method: 'GET', url: '/readyz' });
    expect(res.statusCode).toBe(200);
    expect(res.json()).toMatchObject({ status: 'ready', cache: { backend: 'memory', state: 'ready' } });
  });

  it('reports the switched-off cache', async () => {
    const off = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 0, MAX_EVENT_LOOP_DELAY_MS: 0 }) });
    const res = await off.inject({ method: 'GET', url: '/readyz' });
    await off.close();
    expect(res.json()).toMatchObject({ status: 'ready', cache: { backend: 'disabled', state: 'ready' } });
  });

  it('stays ready with a degraded cache (every request computed, answers correct) and says so', async () => {
    const a = await buildApp({ logger: false });
    a.resultCache.health = () => ({ backend: 'redis', state: 'degraded', detail: 'reconnecting' });
    const res = await a.inject({ method: 'GET', url: '/readyz' });
    const metrics = await a.inject({ method: 'GET', url: '/metrics' });
    await a.close();
    expect(res.statusCode).toBe(200);
    expect(res.json()).toMatchObject({ status: 'ready', cache: { backend: 'redis', state: 'degraded', detail: 'reconnecting' } });
    expect(sample(metrics.body, 'spacetide_cache_ready{backend="redis"}')).toBe(0);
  });
});

describe('GET /metrics', () => {
  it('is the Prometheus text format with the process, request and cache series', async () => {
    const url = '/v1/local?body=earth&altitude=123%20km';
    await app().inject({ method: 'GET', url });
    await app().inject({ method: 'GET', url });
    await app().inject({ method: 'GET', url: '/problems/overloaded' });
    await app().inject({ method: 'GET', url: '/v1/local?body=earth&altitude=-5%20km' });
    await app().inject({ method: 'GET', url: '/no/such/path/abc123' });
    const res = await app().inject({ method: 'GET', url: '/metrics' });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/);
    const text = res.body;
    // Every line is a comment or `name{labels} value`.
    for (const line of text.split('\n').filter((l) => l !== '')) {
      expect(line).toMatch(/^(# (HELP|TYPE) [a-zA-Z_:][a-zA-Z0-9_:]* .*|[a-zA-Z_:][a-zA-Z0-9_:]*(\{.*\})? [-+0-9.eE]+|.* (NaN|[+-]Inf))$/);
    }
    // Requests by route pattern and status, never by raw URL.
    expect(sample(text, 'spacetide_http_requests_total{method="GET",route="/v1/local",status="200"}')).toBeGreaterThanOrEqual(2);
    expect(sample(text, 'spacetide_http_requests_total{method="GET",route="/v1/local",status="422"}')).toBeGreaterThanOrEqual(1);
    expect(sample(text, 'spacetide_http_requests_total{method="GET",route="/problems/:code",status="200"}')).toBeGreaterThanOrEqual(1);
    expect(sample(text, 'spacetide_http_requests_total{method="GET",route="unmatched",status="404"}')).toBeGreaterThanOrEqual(1);
    expect(text).not.toContain('abc123');
    expect(text).not.toContain('123%20km');
    expect(text).toMatch(/^spacetide_http_request_duration_seconds_bucket\{le="0\.001",method="GET",route="\/v1\/local",status="200"\} \d+$/m);
    // The second identical request was a cache hit; the first a miss.
    expect(sample(text, 'spacetide_cache_hits_total')).toBeGreaterThanOrEqual(1);
    expect(sample(text, 'spacetide_cache_misses_total')).toBeGreaterThanOrEqual(1);
    expect(sample(text, 'spacetide_cache_evictions_total')).toBe(0);
    expect(sample(text, 'spacetide_cache_entries')).toBeGreaterThanOrEqual(1);
    expect(sample(text, 'spacetide_cache_max_bytes')).toBe(134_217_728);
    expect(sample(text, 'spacetide_cache_ready{backend="memory"}')).toBe(1);
    expect(sample(text, 'spacetide_overloaded')).toBe(0);
    // Event-loop lag and heap from the process collectors.
    expect(sample(text, 'nodejs_eventloop_lag_seconds')).toBeGreaterThanOrEqual(0);
    expect(sample(text, 'nodejs_heap_size_used_bytes')).toBeGreaterThan(0);
    expect(sample(text, 'process_resident_memory_bytes')).toBeGreaterThan(0);
  });

  it('counts evictions when the cache is over its bound', async () => {
    const small = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 12_000, MAX_EVENT_LOOP_DELAY_MS: 0 }) });
    for (let i = 1; i <= 12; i++) await small.inject({ method: 'GET', url: `/v1/local?body=earth&altitude=${i}%20km` });
    const text = (await small.inject({ method: 'GET', url: '/metrics' })).body;
    await small.close();
    expect(sample(text, 'spacetide_cache_evictions_total')).toBeGreaterThan(0);
    expect(sample(text, 'spacetide_cache_bytes')).toBeLessThanOrEqual(12_000);
  });

  it('is not served when METRICS_ENABLED is false', async () => {
    const quiet = await buildApp({ logger: false, config: defaultConfig({ METRICS_ENABLED: false, MAX_EVENT_LOOP_DELAY_MS: 0 }) });
    const res = await quiet.inject({ method: 'GET', url: '/metrics' });
    await quiet.close();
    expect(res.statusCode).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  });
});
