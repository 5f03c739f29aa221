/**
 * Protection through inject(): load shedding (503 problem with Retry-After; probes and metrics still
 * answer), the optional per-client rate limit (429 with Retry-After; probes spared), CORS for
 * calculator pages, security headers, /docs under its own Content-Security-Policy, and the 503 given
 * to requests that arrive while the app closes.
 */
import { createHash } from 'node:crypto';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { FastifyInstance, LightMyRequestResponse } from 'fastify';
import helmet from 'helmet';
import { Client } from 'undici';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { defaultConfig, type Config } from '../../src/config.js';
import { securityHeaders } from '../../src/plugins/protection.js';
import { useApp } from '../helpers.js';

const LOCAL = '/v1/local?body=earth&altitude=400%20km';
const build = (overrides: Partial<Config>, sampleMs?: number) =>
  buildApp({ logger: false, config: defaultConfig({ MAX_EVENT_LOOP_DELAY_MS: 0, ...overrides }), ...(sampleMs ? { pressureSampleIntervalMs: sampleMs } : {}) });

function expectProblem(res: LightMyRequestResponse, status: number, code: string): void {
  expect(res.statusCode, res.body).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  expect(res.json()).toMatchObject({ status, type: `/problems/${code}` });
}

describe('load shedding', () => {
  // A heap bound of 1 byte is always exceeded: the app sheds from its first sample on.
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await build({ MAX_HEAP_USED_BYTES: 1, RETRY_AFTER_S: 7 }, 20);
    await new Promise((r) => setTimeout(r, 100));
  });
  afterAll(async () => app.close());

  it('answers compute routes with a 503 overloaded problem and Retry-After', async () => {
    for (const req of [{ method: 'GET' as const, url: LOCAL }, { method: 'POST' as const, url: '/v1/spacetime', payload: { body: 'sun' } }]) {
      const res = await app.inject(req);
      expectProblem(res, 503, 'overloaded');
      expect(res.headers['retry-after']).toBe('7');
      expect(res.json<{ detail: string }>().detail).toMatch(/heap/);
    }
  });

  it('still answers the liveness probe and the metrics (which say so)', async () => {
    expect((await app.inject({ method: 'GET', url: '/healthz' })).statusCode).toBe(200);
    const metrics = await app.inject({ method: 'GET', url: '/metrics' });
    expect(metrics.statusCode).toBe(200);
    expect(metrics.body).toMatch(/^spacetide_overloaded 1$/m);
    expect(metrics.body).toMatch(/^spacetide_http_requests_total\{method="GET",route="\/v1\/local",status="503"\} \d+$/m);
  });

  it('makes the readiness probe answer 503 with the cache state, so a balancer looks elsewhere', async () => {
    const res = await app.inject({ method: 'GET', url: '/readyz' });
    expectProblem(res, 503, 'overloaded');
    expect(res.headers['retry-after']).toBe('7');
    expect(res.json()).toMatchObject({ cache: { backend: 'memory', state: 'ready' } });
  });

  it('is off when every threshold is 0', async () => {
    const relaxed = await build({ MAX_HEAP_USED_BYTES: 0, MAX_RSS_BYTES: 0 }, 20);
    await new Promise((r) => setTimeout(r, 60));
    const res = await relaxed.inject({ method: 'GET', url: LOCAL });
    await relaxed.close();
    expect(res.statusCode).toBe(200);
  });

  it('sheds on event-loop delay when the loop is held up', async () => {
    const app2 = await buildApp({ logger: false, config: defaultConfig({ MAX_EVENT_LOOP_DELAY_MS: 50 }), pressureSampleIntervalMs: 100 });
    // Hold the loop 80 ms at a time for 600 ms, as a stream of over-long computations would: every
    // delay sampled meanwhile is ~80 ms, over the 50 ms limit.
    for (let i = 0; i < 8; i++) {
      const until = Date.now() + 80;
      while (Date.now() < until);
      await new Promise((r) => setImmediate(r));
    }
    const res = await app2.inject({ method: 'GET', url: LOCAL });
    const health = await app2.inject({ method: 'GET', url: '/healthz' });
    await app2.close();
    expectProblem(res, 503, 'overloaded');
    expect(res.json<{ detail: string }>().detail).toMatch(/event-loop delay/);
    expect(health.statusCode).toBe(200);
  });
});

describe('rate limiting', () => {
  it('is off by default', async () => {
    const app = await build({});
    const codes = new Set<number>();
    for (let i = 0; i < 150; i++) codes.add((await app.inject({ method: 'GET', url: LOCAL })).statusCode);
    await app.close();
    expect([...codes]).toEqual([200]);
  });

  it('with RATE_LIMIT_MAX, refuses a client over its rate with 429 and Retry-After; probes are spared', async () => {
    const app = await build({ RATE_LIMIT_MAX: 3, RATE_LIMIT_WINDOW_MS: 60_000 });
    const a = { remoteAddress: '192.0.2.10' };
    const b = { remoteAddress: '192.0.2.11' };
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) statuses.push((await app.inject({ method: 'GET', url: LOCAL, ...a })).statusCode);
    const over = await app.inject({ method: 'POST', url: '/v1/spacetime', payload: { body: 'earth' }, ...a });
    const other = await app.inject({ method: 'GET', url: LOCAL, ...b });
    const probes = [];
    for (let i = 0; i < 5; i++) for (const url of ['/healthz', '/readyz', '/metrics']) probes.push((await app.inject({ method: 'GET', url, ...a })).statusCode);
    await app.close();
    expect(statuses).toEqual([200, 200, 200]);
    expectProblem(over, 429, 'too-many-requests');
    expect(Number(over.headers['retry-after'])).toBeGreaterThan(0);
    expect(Number(over.headers['retry-after'])).toBeLessThanOrEqual(60);
    expect(other.statusCode).toBe(200);
    expect(new Set(probes)).toEqual(new Set([200]));
  });
});

describe('rate limiting behind a reverse proxy', () => {
  it('counts each client by X-Forwarded-For when TRUST_PROXY_HOPS is set, and the proxy itself otherwise', async () => {
    const proxy = { remoteAddress: '10.0.0.2' };
    const from = (ip: string) => ({ ...proxy, headers: { 'x-forwarded-for': ip } });
    const trusting = await build({ RATE_LIMIT_MAX: 1, TRUST_PROXY_HOPS: 1 });
    const a1 = await trusting.inject({ method: 'GET', url: LOCAL, ...from('198.51.100.1') });
    const b1 = await trusting.inject({ method: 'GET', url: LOCAL, ...from('198.51.100.2') });
    const a2 = await trusting.inject({ method: 'GET', url: LOCAL, ...from('198.51.100.1') });
    await trusting.close();
    expect([a1.statusCode, b1.statusCode, a2.statusCode]).toEqual([200, 200, 429]);

    const plain = await build({ RATE_LIMIT_MAX: 1 });
    const c1 = await plain.inject({ method: 'GET', url: LOCAL, ...from('198.51.100.1') });
    const c2 = await plain.inject({ method: 'GET', url: LOCAL, ...from('198.51.100.2') });
    await plain.close();
    expect([c1.statusCode, c2.statusCode]).toEqual([200, 429]);
  });
});

describe('CORS', () => {
  const origin = 'https://calc.example.org';

  it('is off by default: no Access-Control headers', async () => {
    const app = await build({});
    const res = await app.inject({ method: 'GET', url: LOCAL, headers: { origin } });
    await app.close();
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('allows the configured origins only, and answers preflights for JSON POSTs', async () => {
    const app = await build({ CORS_ORIGINS: [origin] });
    const ok = await app.inject({ method: 'GET', url: LOCAL, headers: { origin } });
    const other = await app.inject({ method: 'GET', url: LOCAL, headers: { origin: 'https://elsewhere.example.net' } });
    const preflight = await app.inject({
      method: 'OPTIONS',
      url: '/v1/clocks',
      headers: { origin, 'access-control-request-method': 'POST', 'access-control-request-headers': 'content-type' },
    });
    await app.close();
    expect(ok.headers['access-control-allow-origin']).toBe(origin);
    expect(String(ok.headers['access-control-expose-headers'])).toMatch(/etag/i);
    expect(ok.headers['cross-origin-resource-policy']).toBe('cross-origin');
    expect(other.headers['access-control-allow-origin']).toBeUndefined();
    expect(preflight.statusCode).toBe(204);
    expect(preflight.headers['access-control-allow-origin']).toBe(origin);
    expect(String(preflight.headers['access-control-allow-methods'])).toMatch(/POST/);
    expect(String(preflight.headers['access-control-allow-headers'])).toMatch(/content-type/i);
  });

  it('allows any origin when CORS_ORIGINS is "*"', async () => {
    const app = await build({ CORS_ORIGINS: ['*'] });
    const res = await app.inject({ method: 'GET', url: LOCAL, headers: { origin: 'https://anywhere.example.com' } });
    await app.close();
    expect(res.headers['access-control-allow-origin']).toBe('*');
  });
});

describe('security headers', () => {
  const app = useApp();

  it('are on every response, problems included', async () => {
    for (const url of [LOCAL, '/v1/local?body=earth&altitude=-1%20km', '/nowhere']) {
      const res = await app().inject({ method: 'GET', url });
      // The API set (OWASP REST Security Cheat Sheet, "Security Headers"; from memory).
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['x-frame-options']).toBe('DENY');
      expect(res.headers['content-security-policy']).toBe("default-src 'none';frame-ancestors 'none'");
      expect(res.headers['strict-transport-security']).toMatch(/max-age=/);
      expect(res.headers['cross-origin-resource-policy']).toBe('same-origin');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      expect(res.headers['x-powered-by']).toBeUndefined();
      expect(res.headers['x-xss-protection']).toBeUndefined();
    }
  });

  it('leave /docs working: the page and every asset it loads answer 200 under a CSP that allows them', async () => {
    let res = await app().inject({ method: 'GET', url: '/docs' });
    let path = '/docs';
    for (let hops = 0; hops < 3 && res.statusCode >= 300 && res.statusCode < 400; hops++) {
      path = new URL(String(res.headers.location), `http://localhost${path}`).pathname;
      res = await app().inject({ method: 'GET', url: path });
    }
    expect(res.statusCode).toBe(200);
    // The pages get helmet's full default set (swagger-ui replaces the CSP with its own).
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toMatch(/script-src 'self'/);
    expect(csp).toMatch(/style-src 'self'/);
    const html = res.body;
    const assets = [...html.matchAll(/<(?:script|link)[^>]*(?:src|href)="([^"]+)"/g)].map((m) => m[1] as string);
    expect(assets.length).toBeGreaterThanOrEqual(3);
    for (const asset of assets) {
      const url = new URL(asset, `http://localhost${path}`);
      expect(url.origin, `${asset} is loaded from the service itself ('self')`).toBe('http://localhost');
      const a = await app().inject({ method: 'GET', url: url.pathname });
      expect(a.statusCode, asset).toBe(200);
    }
    // Inline scripts and styles run only if the CSP names their hash.
    for (const m of html.matchAll(/<(script|style)(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/\1>/g)) {
      const body = m[2] as string;
      if (body.trim() === '') continue;
      const hash = `'sha256-${createHash('sha256').update(body).digest('base64')}'`;
      expect(csp).toContain(hash);
    }
    expect(assets.some((a) => a.endsWith('swagger-initializer.js'))).toBe(true);
    // The document the page renders.
    expect((await app().inject({ method: 'GET', url: '/docs/json' })).statusCode).toBe(200);
  });
});

describe('while closing', () => {
  it('a request that arrives on a kept-alive connection after close has begun gets a 503 problem; the one in flight finishes', async () => {
    const app = await build({ RETRY_AFTER_S: 3 });
    let arrived: () => void = () => {};
    const slowArrived = new Promise<void>((r) => {
      arrived = r;
    });
    app.get('/test/slow', async () => {
      arrived();
      await new Promise((r) => setTimeout(r, 300));
      return { done: true };
    });
    await app.listen({ port: 0, host: '127.0.0.1' });
    const { port } = app.server.address() as AddressInfo;
    // One connection, two requests pipelined on it: the second reaches the server only after the first.
    const client = new Client(`http://127.0.0.1:${port}`, { pipelining: 2 });
    try {
      const slow = client.request({ method: 'GET', path: '/test/slow' });
      const next = client.request({ method: 'GET', path: LOCAL });
      await slowArrived;
      const closed = app.close();
      const [s, n] = await Promise.all([slow, next]);
      const nBody = (await n.body.json()) as { type: string; status: number };
      expect(s.statusCode).toBe(200);
      expect(await s.body.json()).toEqual({ done: true });
      expect(n.statusCode).toBe(503);
      expect(n.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(n.headers['retry-after']).toBe('3');
      expect(nBody).toMatchObject({ status: 503, type: '/problems/service-unavailable' });
      await closed;
    } finally {
      await client.close().catch(() => {});
      await app.close();
    }
  });
});

describe('security headers computed once', () => {
  it('are exactly the headers helmet\'s middleware sets on a real response', async () => {
    const options = { crossOriginResourcePolicy: { policy: 'same-origin' as const } };
    const server = createServer((req, res) => helmet(options)(req, res, () => res.end('{}')));
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const res = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`);
      const set: Record<string, string> = {};
      const transport = new Set(['date', 'connection', 'keep-alive', 'content-length', 'transfer-encoding']);
      res.headers.forEach((value, name) => {
        if (!transport.has(name)) set[name] = value;
      });
      expect(securityHeaders(options)).toEqual(set);
      expect(Object.keys(set).length).toBeGreaterThanOrEqual(10);
    } finally {
      server.close();
    }
  });
});
