/**
 * HTTP caching of the compute routes through the whole app: strong ETag and Cache-Control on every
 * 200, 304 on a matching If-None-Match (GET and POST), cached bodies byte-identical to cold ones and
 * to what fastify's own response serialiser produced, GET and POST and equivalent spellings sharing
 * one entry, concurrent identical requests computed once, errors never cached, CACHE_MAX_BYTES=0.
 */
import Fastify, { type FastifyInstance, type LightMyRequestResponse } from 'fastify';
import fastJson from 'fast-json-stringify';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../src/app.js';
import { localRoute } from '../../src/api/local.js';
import { circularRoute } from '../../src/api/orbits.js';
import { COMPUTE_ROUTES } from '../../src/api/registry.js';
import { responseSchema, type ComputeRoute } from '../../src/api/route.js';
import { defaultConfig } from '../../src/config.js';

const ETAG = /^"[0-9a-f]{64}"$/;
const LOCAL_QUERY = 'mass=10%20Msun&spin=0.7&r=5%20rg&theta=60%20deg';
const LOCAL_BODY = { body: { mass: '10 Msun', spin: 0.7 }, point: { r: '5 rg', theta: '60 deg' } };

const fresh = () => buildApp({ logger: false });
const getLocal = (app: FastifyInstance, query = LOCAL_QUERY, headers: Record<string, string> = {}) =>
  app.inject({ method: 'GET', url: `/v1/local?${query}`, headers });
const postLocal = (app: FastifyInstance, payload: unknown = LOCAL_BODY, headers: Record<string, string> = {}) =>
  app.inject({ method: 'POST', url: '/v1/local', payload: payload as object, headers });

afterEach(() => {
  vi.restoreAllMocks();
});

describe('ETag, Cache-Control and 304', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await fresh();
  });
  afterAll(async () => {
    await app.close();
  });

  it('GET: strong ETag and a public one-day Cache-Control; POST: the same ETag with no-cache', async () => {
    const g = await getLocal(app);
    const p = await postLocal(app);
    expect(g.statusCode).toBe(200);
    expect(p.statusCode).toBe(200);
    expect(g.headers.etag).toMatch(ETAG);
    expect(p.headers.etag).toBe(g.headers.etag);
    expect(g.headers['cache-control']).toBe('public, max-age=86400');
    expect(p.headers['cache-control']).toBe('no-cache');
    expect(g.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(p.headers['content-type']).toBe('application/json; charset=utf-8');
  });

  it('a matching If-None-Match gets 304 with no body, for GET and for POST, without computing', async () => {
    const etag = String((await getLocal(app)).headers.etag);
    const compute = vi.spyOn(localRoute, 'compute');
    for (const res of [
      await getLocal(app, LOCAL_QUERY, { 'if-none-match': etag }),
      await postLocal(app, LOCAL_BODY, { 'if-none-match': etag }),
      await getLocal(app, LOCAL_QUERY, { 'if-none-match': `"other", W/${etag}` }),
    ]) {
      expect(res.statusCode).toBe(304);
      expect(res.body).toBe('');
      expect(res.headers.etag).toBe(etag);
      expect(res.headers['cache-control']).toBeTypeOf('string');
      expect(res.headers['content-length']).toBeUndefined();
    }
    // Not even a cold request computes when the client already holds the result.
    const cold = { body: { mass: '3 Msun' }, point: { r: '9 rg' } };
    const coldTag = String((await postLocal(app, cold)).headers.etag);
    compute.mockClear();
    const app2 = await fresh();
    try {
      const res = await postLocal(app2, cold, { 'if-none-match': coldTag });
      expect(res.statusCode).toBe(304);
      expect(compute).not.toHaveBeenCalled();
    } finally {
      await app2.close();
    }
  });

  it('a different If-None-Match gets the full 200', async () => {
    const res = await getLocal(app, LOCAL_QUERY, { 'if-none-match': '"0000"' });
    expect(res.statusCode).toBe(200);
    expect(res.body.length).toBeGreaterThan(100);
  });

  it('every compute route answers with an ETag (quoted 64-hex key)', async () => {
    for (const route of COMPUTE_ROUTES) {
      const payload = SAMPLES[route.path];
      expect(payload, `a sample request for ${route.path}`).toBeDefined();
      const res = await app.inject({ method: 'POST', url: route.path, payload: payload as object });
      expect(res.statusCode, `${route.path}: ${res.body}`).toBe(200);
      expect(res.headers.etag, route.path).toMatch(ETAG);
    }
  });
});

/** One valid POST body for each compute route. */
const SAMPLES: Record<string, unknown> = {
  '/v1/spacetime': { body: { mass: '10 Msun', spin: 0.9, charge: 0.1 } },
  '/v1/local': LOCAL_BODY,
  '/v1/clocks': { body: 'earth', a: { kind: 'static', point: { altitude: 0 } }, b: { kind: 'static', point: { altitude: '1 cm' } } },
  '/v1/proper-time': { body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '2 rg', to: 0, start: 'rest' } },
  '/v1/orbits/circular': { body: { mass: '1 Msun', spin: 0.9 }, point: { r: '8 rg' }, direction: 'retrograde' },
  '/v1/orbits/precession': { body: 'earth', orbit: { semiMajorAxis: '7020 km', inclination: '90 deg' } },
  '/v1/light/deflection': { body: { mass: '1 Msun', spin: 0.5 }, ray: { closestApproach: '10 rg' }, direction: 'prograde' },
  '/v1/light/delay': { body: 'sun', from: '1 AU', to: '1.52 AU', ray: { closestApproach: '1 Rsun' } },
  '/v1/shadow': { body: { mass: '6.5e9 Msun', spin: 0.9 }, inclination: '17 deg', points: 32 },
  '/v1/transform': {
    body: { mass: '4e6 Msun', spin: 0.9, charge: 0.2 },
    from: 'boyerLindquist',
    events: [{ coordinates: ['3 tg', '10 rg', '60 deg', 0], vectors: [[1, 0, 0, 0]], covectors: [[-1, 0, 0, 0]] }, { coordinates: [0, '1.2 rg', 1, 2] }],
    metric: true,
    jacobian: true,
  },
  '/v1/tidal': { body: { mass: '4e6 Msun', spin: 0.9, charge: 0.1 }, point: { r: '3 rg', theta: '60 deg' }, length: '2 m', star: 'sun' },
  '/v1/geodesic': {
    body: { mass: '10 Msun', spin: 0.9 },
    particle: 'massive',
    start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo', speed: '0.3 c', angle: '150 deg' },
    duration: '200 tg',
    samples: 20,
  },
};

describe('cached bodies are the bytes of the fresh response', () => {
  let app: FastifyInstance;
  /** fastify serialising route.compute's result from the response schema itself, as before the cache. */
  let reference: FastifyInstance;
  beforeAll(async () => {
    app = await fresh();
    reference = Fastify({ logger: false });
    for (const route of COMPUTE_ROUTES as readonly ComputeRoute<unknown, unknown>[]) {
      reference.post(route.path, { schema: { response: { 200: responseSchema(route) } } }, async (request, reply) => {
        reply.type('application/json');
        return route.compute(route.body.parse(request.body));
      });
    }
  });
  afterAll(async () => {
    await app.close();
    await reference.close();
  });

  it('every route: cold, cached and fastify-serialised bodies are byte-identical', async () => {
    for (const route of COMPUTE_ROUTES) {
      const payload = SAMPLES[route.path] as object;
      const cold = await app.inject({ method: 'POST', url: route.path, payload });
      const hits = app.resultCache.stats().hits;
      const cached = await app.inject({ method: 'POST', url: route.path, payload });
      expect(app.resultCache.stats().hits, `${route.path} second request is a hit`).toBe(hits + 1);
      const ref = await reference.inject({ method: 'POST', url: route.path, payload });
      expect(ref.statusCode).toBe(200);
      expect(cold.rawPayload.equals(ref.rawPayload), `${route.path} cold vs fastify serialiser`).toBe(true);
      expect(cached.rawPayload.equals(cold.rawPayload), `${route.path} cached vs cold`).toBe(true);
      expect(cached.headers['content-type']).toBe(ref.headers['content-type']);
      expect(cached.headers['content-length']).toBe(ref.headers['content-length']);
    }
  });
});

describe('routes written by JSON.stringify', () => {
  /** Further requests for the routes written by JSON.stringify: other outcomes, light, charged holes, events with nulls. */
  const MORE: Record<string, object[]> = {
    '/v1/geodesic': [
      { body: { mass: '10 Msun', spin: 0.9 }, particle: 'massive', start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo', speed: '0.6 c', angle: '30 deg' }, duration: '400 tg', samples: 30 },
      { body: { mass: '10 Msun', spin: 0.6, charge: 0.5 }, particle: 'light', start: { kind: 'launch', point: { r: '6 rg', theta: '70 deg' }, observer: 'river', angle: '120 deg' }, duration: '300 tg', samples: 25 },
    ],
    '/v1/transform': [
      { body: { mass: '10 Msun', spin: 0.5, charge: 0.8 }, from: 'kerrSchild', events: [{ coordinates: [0, '0.1 rg', 0, '0.2 rg'], vectors: [[1, 0, 0, 1]] }, { coordinates: [0, 0, 0, '3 rg'] }], metric: true, jacobian: true },
    ],
  };
  it('write exactly the bytes of the compiled response-schema serialiser', async () => {
    const json = COMPUTE_ROUTES.filter((r) => r.serializer === 'json');
    expect(json.map((r) => r.path).sort()).toEqual(Object.keys(MORE).sort());
    for (const route of json as readonly ComputeRoute<unknown, unknown>[]) {
      const compiled = fastJson(responseSchema(route));
      for (const payload of [SAMPLES[route.path] as object, ...MORE[route.path]!]) {
        const doc = route.compute(route.body.parse(payload));
        expect(JSON.stringify(doc), `${route.path} ${JSON.stringify(payload)}`).toBe(compiled(doc));
      }
    }
  });
});

describe('one entry per canonical request', () => {
  it('GET, POST, other key order and equivalent spellings and defaults share one entry', async () => {
    const app = await fresh();
    try {
      const compute = vi.spyOn(localRoute, 'compute');
      const responses: LightMyRequestResponse[] = [
        await getLocal(app),
        await postLocal(app),
        await postLocal(app, { point: { theta: '60 deg', r: '5 rg' }, body: { spin: 0.7, mass: '1e1 Msun', charge: 0 } }),
        await getLocal(app, 'theta=60%20deg&r=5%20rg&spin=0.70&mass=1.0e1%20Msun'),
      ];
      for (const res of responses) {
        expect(res.statusCode).toBe(200);
        expect(res.body).toBe(responses[0]!.body);
        expect(res.headers.etag).toBe(responses[0]!.headers.etag);
      }
      expect(compute).toHaveBeenCalledTimes(1);
      expect(app.resultCache.stats()).toMatchObject({ misses: 1, hits: 3, entries: 1 });
      // theta omitted (the equator) and theta = 90 deg: one entry.
      await getLocal(app, 'mass=10%20Msun&r=5%20rg');
      await getLocal(app, 'mass=10%20Msun&r=5%20rg&theta=90%20deg');
      expect(app.resultCache.stats()).toMatchObject({ misses: 2, hits: 4, entries: 2 });
    } finally {
      await app.close();
    }
  });
});

describe('every route keys on its normalised request', () => {
  // Pairs of requests that differ only in spelling, key order or written-out defaults.
  const PAIRS: [string, unknown, unknown][] = [
    [
      '/v1/clocks',
      { body: 'earth', a: { kind: 'static', point: { altitude: 0 } }, b: { kind: 'circular', point: { r: '26561.75 km' } } },
      { b: { point: { r: 26561750 }, kind: 'circular', direction: 'prograde' }, a: { point: { altitude: '0 m', theta: '90 deg' }, kind: 'static' }, body: 'earth' },
    ],
    [
      '/v1/proper-time',
      { body: { mass: '10 Msun' }, interval: { kind: 'freeFall', from: '10 rg', to: '2 rg', start: 'rest' } },
      { interval: { start: 'rest', to: '2 rg', from: '10.0 rg', kind: 'freeFall', theta: '90 deg' }, body: { mass: '1e1 Msun', spin: 0 } },
    ],
    [
      '/v1/light/deflection',
      { body: 'sun', ray: { closestApproach: '1 Rsun' } },
      { body: 'sun', ray: { closestApproach: 6.957e8 }, direction: 'prograde' },
    ],
    [
      '/v1/light/delay',
      { body: 'sun', from: '1 AU', to: '1.5 AU', ray: { closestApproach: '1 Rsun' } },
      { ray: { closestApproach: '695700 km' }, to: '224396806050 m', from: 149597870700, body: 'sun' },
    ],
    ['/v1/shadow', { body: { mass: '1 Msun' }, inclination: '17 deg' }, { body: { mass: '1 Msun' }, inclination: (17 * Math.PI) / 180, points: 256 }],
    [
      '/v1/orbits/precession',
      { body: 'sun', orbit: { semiMajorAxis: '0.387 AU' } },
      { body: 'sun', orbit: { semiMajorAxis: 0.387 * 149597870700, eccentricity: 0, inclination: 0 } },
    ],
  ];
  it.each(PAIRS)('%s: equivalent requests share one entry', async (url, first, second) => {
    const app = await fresh();
    try {
      const a = await app.inject({ method: 'POST', url, payload: first as object });
      const b = await app.inject({ method: 'POST', url, payload: second as object });
      expect(a.statusCode, a.body.slice(0, 300)).toBe(200);
      expect(b.statusCode, b.body.slice(0, 300)).toBe(200);
      expect(b.headers.etag).toBe(a.headers.etag);
      expect(b.body).toBe(a.body);
      expect(app.resultCache.stats()).toMatchObject({ misses: 1, hits: 1 });
    } finally {
      await app.close();
    }
  });
});

describe('request coalescing', () => {
  // With the in-memory store the first request's lookup, computation and store finish in one turn of
  // the event loop, so the other nineteen find the entry stored (hits). Joining a computation still in
  // flight (coalesced) happens with an asynchronous store: test/cache/coalesce.test.ts and the Redis tests.
  it('twenty identical requests at once are computed once', async () => {
    const app = await fresh();
    try {
      const compute = vi.spyOn(localRoute, 'compute');
      const all = await Promise.all(
        Array.from({ length: 20 }, (_, i) => (i % 2 === 0 ? getLocal(app) : postLocal(app))),
      );
      expect(all.every((r) => r.statusCode === 200 && r.body === all[0]!.body)).toBe(true);
      expect(compute).toHaveBeenCalledTimes(1);
      const s = app.resultCache.stats();
      expect(s.misses).toBe(1);
      expect(s.hits + s.misses + s.coalesced).toBe(20);
      expect(s.hits).toBe(19);
    } finally {
      await app.close();
    }
  });
});

describe('errors are never cached', () => {
  it('a 422 from compute is not stored and carries no ETag or Cache-Control', async () => {
    const app = await fresh();
    try {
      const compute = vi.spyOn(circularRoute, 'compute');
      // Valid body and point, but circular orbits are equatorial: compute refuses θ = 60°.
      const off = { body: { mass: '1 Msun' }, point: { r: '10 rg', theta: '60 deg' } };
      for (let i = 0; i < 2; i++) {
        const res = await app.inject({ method: 'POST', url: '/v1/orbits/circular', payload: off });
        expect(res.statusCode).toBe(422);
        expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
        expect(res.headers.etag).toBeUndefined();
        expect(res.headers['cache-control']).toBeUndefined();
      }
      expect(compute).toHaveBeenCalledTimes(2);
      expect(app.resultCache.stats().entries).toBe(0);
    } finally {
      await app.close();
    }
  });

  it('400 and 422 from validation never reach the cache', async () => {
    const app = await fresh();
    try {
      const bad = await getLocal(app, 'mass=10%20Msun&spin=2&r=5%20rg'); // naked singularity: 422
      const malformed = await postLocal(app, { body: { mass: 'ten' }, point: { r: 1 } }); // 400
      expect(bad.statusCode).toBe(422);
      expect(malformed.statusCode).toBe(400);
      for (const res of [bad, malformed]) {
        expect(res.headers.etag).toBeUndefined();
        expect(res.headers['cache-control']).toBeUndefined();
      }
      expect(app.resultCache.stats()).toMatchObject({ hits: 0, misses: 0, entries: 0 });
      // GET errors keep naming the query parameter.
      expect((bad.json() as { errors: { path: string }[] }).errors.map((e) => e.path)).toContain('spin');
    } finally {
      await app.close();
    }
  });
});

describe('CACHE_MAX_BYTES=0', () => {
  it('stores nothing: every request computes, and ETags and 304 still work', async () => {
    const app = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 0 }) });
    try {
      const compute = vi.spyOn(localRoute, 'compute');
      const a = await getLocal(app);
      const b = await getLocal(app);
      expect(compute).toHaveBeenCalledTimes(2);
      expect(b.body).toBe(a.body);
      expect(b.headers.etag).toBe(a.headers.etag);
      expect(app.resultCache.stats()).toMatchObject({ hits: 0, misses: 2, entries: 0, bytes: 0, maxBytes: 0 });
      const revalidated = await getLocal(app, LOCAL_QUERY, { 'if-none-match': String(a.headers.etag) });
      expect(revalidated.statusCode).toBe(304);
    } finally {
      await app.close();
    }
  });

  it('a small bound evicts and counts it', async () => {
    const app = await buildApp({ logger: false, config: defaultConfig({ CACHE_MAX_BYTES: 12_000 }) });
    try {
      for (let i = 1; i <= 6; i++) expect((await getLocal(app, `mass=${i}%20Msun&r=5%20rg`)).statusCode).toBe(200);
      const s = app.resultCache.stats();
      expect(s.bytes).toBeLessThanOrEqual(12_000);
      expect(s.evictions).toBeGreaterThan(0);
      expect(s.entries + s.evictions).toBe(6);
    } finally {
      await app.close();
    }
  });
});
