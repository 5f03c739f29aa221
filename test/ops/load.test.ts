/**
 * Load: the service as a real process on 127.0.0.1 under a steady 300 requests/s for 30 s from
 * autocannon, mixing GET /v1/local and GET /v1/orbits/circular with POST /v1/clocks and
 * POST /v1/spacetime, nearly every request a new point (cache misses, computed). The service must
 * answer every request with a 2xx (no connection errors, timeouts or non-2xx), keep up with the rate,
 * and keep its resident memory bounded with no steady growth; its cache is held at 8 MiB so that it
 * fills and evicts during the run, as a long-running service's does.
 *
 * The rate: a cold GET /v1/local costs the service well under a millisecond of CPU, so 300 req/s is
 * a fraction of one core — held with a wide margin on this 2-core machine while other test files
 * run in parallel. This is a behaviour test (zero errors, bounded memory), never a timing assertion;
 * `npm run bench` measures speed.
 */
import autocannon, { type RequestSpec } from 'autocannon';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sample, startService, type ServiceProcess } from './service-process.js';

const RATE = 300;
const SECONDS = 30;
const CACHE_BYTES = 8 * 1024 * 1024;
/** A generous bound for a service whose cache holds 8 MiB (it starts at ~100 MB). */
const RSS_BOUND = 400 * 1024 * 1024;

let service: ServiceProcess;
beforeAll(async () => {
  // Shedding on event-loop delay reacts to the whole machine's contention (the test files and
  // processes sharing its 2 cores), not to this service's load; it is off here and tested in
  // protection.test.ts. The memory thresholds keep their defaults.
  // The V8 old space is capped at 160 MiB: left alone, V8 lets garbage pile up to ~200 MiB before a
  // major collection (a sawtooth of 250–370 MB resident over a minute at this rate, from ~75 MiB
  // live), which a 30 s window cannot tell from a leak. Under the cap it collects early, and a leak
  // would end the process with an out-of-memory error — and the test with connection errors.
  service = await startService({
    CACHE_MAX_BYTES: String(CACHE_BYTES),
    LOG_LEVEL: 'warn',
    MAX_EVENT_LOOP_DELAY_MS: '0',
    NODE_OPTIONS: '--max-old-space-size=160',
  });
}, 120_000);
afterAll(() => service?.kill());

let n = 0;
/** A fresh radius or altitude for nearly every request, so that the service computes. */
const next = () => (n++ % 100_000) + 1;
const json = { 'content-type': 'application/json' };
const REQUESTS: RequestSpec[] = [
  { method: 'GET', setupRequest: (r) => ({ ...r, path: `/v1/local?mass=10%20Msun&spin=0.9&r=${2 + next() / 1000}%20rg` }) },
  { method: 'GET', setupRequest: (r) => ({ ...r, path: `/v1/local?body=earth&altitude=${next()}%20km&theta=60%20deg` }) },
  {
    method: 'POST',
    headers: json,
    setupRequest: (r) => ({
      ...r,
      body: JSON.stringify({
        body: 'earth',
        a: { kind: 'rotating', point: { altitude: 0, latitude: '40 deg' } },
        b: { kind: 'circular', point: { altitude: `${200 + (next() % 30_000)} km` } },
      }),
    }),
  },
  { method: 'GET', setupRequest: (r) => ({ ...r, path: `/v1/orbits/circular?mass=4e6%20Msun&spin=0.5&r=${7 + next() / 100}%20rg` }) },
  { method: 'POST', headers: json, setupRequest: (r) => ({ ...r, body: JSON.stringify({ body: { mass: `${next()} Msun`, spin: 0.7, charge: 0.1 } }), path: '/v1/spacetime' }) },
];
// Each spec needs a path for autocannon to build it; setupRequest replaces the GET ones.
for (const spec of REQUESTS) spec.path ??= spec.method === 'POST' ? '/v1/clocks' : '/v1/local';

describe(`a steady ${RATE} requests/s for ${SECONDS} s`, () => {
  it('answers every request with a 2xx and keeps memory bounded', { timeout: (SECONDS + 60) * 1000 }, async () => {
    const rss: number[] = [];
    const sampler = setInterval(() => {
      const b = service.rssBytes();
      if (b !== undefined) rss.push(b);
    }, 1000);
    const statuses = new Map<number, number>();
    const instance = autocannon({ url: service.url, connections: 8, overallRate: RATE, duration: SECONDS, timeout: 10, requests: REQUESTS });
    instance.on('response', (_client: unknown, status: number) => statuses.set(status, (statuses.get(status) ?? 0) + 1));
    const result = await instance;
    clearInterval(sampler);

    const summary = `${JSON.stringify(Object.fromEntries(statuses))}; errors ${result.errors}, timeouts ${result.timeouts}; rss MB ${rss.map((b) => Math.round(b / 2 ** 20)).join(' ')}`;
    console.info(`load: ${result.requests.total} requests in ${result.duration} s; ${summary}`);
    expect(result.errors, summary).toBe(0);
    expect(result.timeouts, summary).toBe(0);
    expect(result.non2xx, summary).toBe(0);
    // The service was never stalled. On a machine of its own it answers all 9,000 (the rate is held);
    // the bound is a quarter of them because the 2 cores are shared with the other test files (and,
    // on a developer's machine, with other work): this is not a speed test.
    expect(result.requests.total, summary).toBeGreaterThanOrEqual(0.25 * RATE * SECONDS);

    // Memory: under a generous bound throughout, and no steady growth once the cache is full — the
    // last ten seconds stay within 64 MiB of the highest resident size seen in the first twenty.
    expect(rss.length).toBeGreaterThanOrEqual(SECONDS - 3);
    expect(Math.max(...rss), summary).toBeLessThan(RSS_BOUND);
    const early = Math.max(...rss.slice(0, 20));
    const late = Math.max(...rss.slice(-10));
    expect(late, summary).toBeLessThanOrEqual(early + 64 * 1024 * 1024);

    // The metrics tell the same story: no 5xx, and the cache evicted to stay within its bound.
    const metrics = await (await fetch(`${service.url}/metrics`)).text();
    expect(metrics).not.toMatch(/^spacetide_http_requests_total\{[^}]*status="5\d\d"\}/m);
    expect(sample(metrics, 'spacetide_cache_evictions_total')).toBeGreaterThan(0);
    expect(sample(metrics, 'spacetide_cache_bytes')).toBeLessThanOrEqual(CACHE_BYTES);
    expect(sample(metrics, 'spacetide_http_requests_total{method="GET",route="/v1/local",status="200"}')).toBeGreaterThan(0);
  });
});
