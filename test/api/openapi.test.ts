/**
 * The OpenAPI document: the committed file is what the code generates (drift), it is a valid OpenAPI
 * 3.1 document, the service serves it and its rendering, and the quantity catalogue covers every key
 * the compute endpoints return.
 */
import { readFileSync } from 'node:fs';
import { Validator } from '@seriousme/openapi-schema-validator';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApiPath, renderOpenApi } from '../../src/api/openapi-file.js';
import { buildApp } from '../../src/app.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ logger: false });
});
afterAll(async () => {
  await app.close();
});

const committedText = () => readFileSync(openApiPath(), 'utf8');
type Json = Record<string, unknown>;

describe('the committed openapi/openapi.json', () => {
  it('equals what the code generates now', () => {
    const generated = renderOpenApi();
    const committed = committedText();
    if (generated !== committed) {
      // Name the first differing line so the failure says where, not just that.
      const g = generated.split('\n');
      const c = committed.split('\n');
      const i = g.findIndex((line, k) => line !== c[k]);
      const at = i === -1 ? c.length : i;
      expect.fail(
        `openapi/openapi.json is out of date with the zod schemas in src/api: run \`npm run openapi\` and commit the result.\n` +
          `first difference at line ${at + 1}:\n  committed: ${c[at] ?? '<end of file>'}\n  generated: ${g[at] ?? '<end of file>'}`,
      );
    }
    expect(committed).toBe(generated);
  });

  it('is a valid OpenAPI 3.1 document', async () => {
    const validator = new Validator();
    const result = await validator.validate(JSON.parse(committedText()) as Json);
    expect(result.valid, JSON.stringify(result.errors, null, 2)?.slice(0, 2000)).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('every $ref points at a schema in components', () => {
    const doc = JSON.parse(committedText()) as { components: { schemas: Json } };
    const refs = new Set<string>();
    const walk = (node: unknown): void => {
      if (Array.isArray(node)) node.forEach(walk);
      else if (node && typeof node === 'object') {
        for (const [k, v] of Object.entries(node)) {
          if (k === '$ref' && typeof v === 'string') refs.add(v);
          else walk(v);
        }
      }
    };
    walk(doc);
    expect(refs.size).toBeGreaterThan(0);
    for (const ref of refs) {
      expect(ref, ref).toMatch(/^#\/components\/schemas\/[A-Za-z0-9_.-]+$/);
      const name = ref.slice('#/components/schemas/'.length);
      expect(Object.hasOwn(doc.components.schemas, name), `${ref} is not defined`).toBe(true);
    }
  });

  it('documents GET and POST for /v1/local and /v1/spacetime, and the problem responses', () => {
    const doc = JSON.parse(committedText()) as { paths: Record<string, Record<string, { responses: Json }>> };
    for (const path of ['/v1/local', '/v1/spacetime']) {
      for (const method of ['get', 'post']) {
        const op = doc.paths[path]?.[method];
        expect(op, `${method} ${path}`).toBeDefined();
        for (const status of ['200', '400', '422']) expect(Object.keys(op!.responses), `${method} ${path}`).toContain(status);
      }
      expect(Object.keys(doc.paths[path]!.post!.responses)).toEqual(expect.arrayContaining(['413', '415']));
    }
    expect(doc.paths['/v1/quantities']?.get).toBeDefined();
    expect(doc.paths['/problems/{code}']?.get).toBeDefined();
  });
});

describe('served documents', () => {
  it('GET /openapi.json serves the committed document', async () => {
    const res = await app.inject({ method: 'GET', url: '/openapi.json' });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json\b/);
    expect(res.json()).toEqual(JSON.parse(committedText()));
  });

  it('GET /docs returns an HTML page (following a redirect if there is one)', async () => {
    let res = await app.inject({ method: 'GET', url: '/docs' });
    for (let hops = 0; hops < 3 && res.statusCode >= 300 && res.statusCode < 400; hops++) {
      const location = String(res.headers.location);
      res = await app.inject({ method: 'GET', url: new URL(location, 'http://localhost/docs').pathname });
    }
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/html\b/);
    expect(res.body).toMatch(/<html/i);
  });

  it('the docs page is configured with the served document', async () => {
    // @fastify/swagger-ui serves the document it renders under /docs/json.
    const res = await app.inject({ method: 'GET', url: '/docs/json' });
    expect(res.statusCode).toBe(200);
    const doc = res.json<{ info: { title: string }; paths: Json }>();
    expect(doc.info.title).toBe('spacetide');
    expect(Object.keys(doc.paths)).toEqual(expect.arrayContaining(['/v1/local', '/v1/spacetime']));
  });
});

describe('GET /v1/quantities', () => {
  interface Entry {
    name: string;
    unit: string;
    geometricUnit: string | null;
    description: string;
    endpoint: string;
    sweepable: boolean;
  }

  it('lists every quantity key of /v1/local and /v1/spacetime, each with its unit and a description', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/quantities' });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json\b/);
    const catalogue = new Map(res.json<{ quantities: Entry[] }>().quantities.map((e) => [e.name, e]));
    expect(catalogue.size).toBe(res.json<{ quantities: Entry[] }>().quantities.length); // names are unique

    const responses = [
      // A black hole (horizon quantities present) and a body with a surface (surface quantities present).
      { endpoint: '/v1/local', url: '/v1/local?mass=10%20Msun&spin=0.9&r=6%20rg' },
      { endpoint: '/v1/local', url: '/v1/local?body=earth&altitude=400%20km' },
      { endpoint: '/v1/spacetime', url: '/v1/spacetime?mass=1%20Msun&spin=0.6&charge=0.3' },
      { endpoint: '/v1/spacetime', url: '/v1/spacetime?body=sun' },
    ];
    let seen = 0;
    for (const { endpoint, url } of responses) {
      const r = await app.inject({ method: 'GET', url });
      expect(r.statusCode, url).toBe(200);
      const quantities = r.json<{ quantities: Record<string, { unit: string; geometric?: unknown }> }>().quantities;
      for (const [name, q] of Object.entries(quantities)) {
        seen++;
        const entry = catalogue.get(name);
        expect(entry, `${name} (from ${url}) is not in /v1/quantities`).toBeDefined();
        expect(entry!.unit, name).toBe(q.unit);
        expect(entry!.unit.length, name).toBeGreaterThan(0);
        expect(entry!.description.trim().length, name).toBeGreaterThan(10);
        expect(entry!.endpoint, name).toBe(endpoint);
        // The response carries a geometric value exactly for the quantities the catalogue gives a geometric unit.
        expect('geometric' in q, `${name}: geometric present ⇔ geometricUnit`).toBe(entry!.geometricUnit !== null);
      }
    }
    expect(seen).toBeGreaterThan(20);
  });

  it('every catalogue entry is computed by the endpoint it names', async () => {
    const catalogue = (await app.inject({ method: 'GET', url: '/v1/quantities' })).json<{ quantities: Entry[] }>().quantities;
    const local = (await app.inject({ method: 'GET', url: '/v1/local?body=earth&altitude=0' })).json<{ quantities: Json }>();
    const spacetime = (await app.inject({ method: 'GET', url: '/v1/spacetime?body=earth' })).json<{ quantities: Json }>();
    const clocks = (
      await app.inject({
        method: 'POST',
        url: '/v1/clocks',
        payload: { body: 'earth', a: { kind: 'static', point: { altitude: 0 } }, b: { kind: 'circular', point: { altitude: '400 km' } } },
      })
    ).json<Json>();
    const properTime = (
      await app.inject({
        method: 'POST',
        url: '/v1/proper-time',
        payload: { body: 'earth', interval: { kind: 'stationary', observer: { kind: 'static', point: { altitude: 0 } }, farAwayTime: '1 day' } },
      })
    ).json<Json>();
    const fall = (
      await app.inject({ method: 'POST', url: '/v1/proper-time', payload: { body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '10 rg', to: '3 rg', start: 'rest' } } })
    ).json<Json>();
    const orbit = (await app.inject({ method: 'GET', url: '/v1/orbits/circular?mass=1%20Msun&r=10%20rg' })).json<{ quantities: Json }>();
    const light = async (url: string, payload: object) => (await app.inject({ method: 'POST', url, payload })).json<Json>();
    const deflection = await light('/v1/light/deflection', { body: 'sun', ray: { closestApproach: '1 Rsun' } });
    const delay = await light('/v1/light/delay', { body: 'sun', from: '1 AU', to: '1.5 AU', ray: { closestApproach: '1 Rsun' } });
    const shadow = await light('/v1/shadow', { body: { mass: '1 Msun' }, inclination: '17 deg', distance: '1 kpc', points: 8 });
    const tidal = await light('/v1/tidal', { body: { mass: '1e6 Msun' }, point: { r: '10 rg' }, star: 'sun' });
    /** Every key that occurs anywhere in a document. */
    const keys = (doc: unknown, out = new Set<string>()): Set<string> => {
      if (doc && typeof doc === 'object') for (const [k, v] of Object.entries(doc)) (out.add(k), keys(v, out));
      return out;
    };
    const byEndpoint: Record<string, Set<string>> = {
      '/v1/local': new Set(Object.keys(local.quantities)),
      '/v1/spacetime': new Set(Object.keys(spacetime.quantities)),
      '/v1/clocks': keys(clocks),
      '/v1/proper-time': keys([properTime, fall]),
      '/v1/orbits/circular': new Set(Object.keys(orbit.quantities)),
      '/v1/light/deflection': keys(deflection),
      '/v1/light/delay': keys(delay),
      '/v1/shadow': keys(shadow),
      '/v1/tidal': keys(tidal),
    };
    for (const e of catalogue) {
      expect(byEndpoint[e.endpoint], `${e.name}: unknown endpoint ${e.endpoint}`).toBeDefined();
      expect([...byEndpoint[e.endpoint]!], e.name).toContain(e.name);
    }
  });

  it('names the quantities the DESIGN lists', async () => {
    const names = new Set(
      (await app.inject({ method: 'GET', url: '/v1/quantities' })).json<{ quantities: Entry[] }>().quantities.map((e) => e.name),
    );
    for (const n of [
      'flowSpeed',
      'escapeSpeed',
      'staticClockRate',
      'staticClockOffset',
      'zamoClockRate',
      'redshiftToInfinity',
      'hoverAcceleration',
      'frameDragRate',
      'outerHorizon',
      'innerHorizon',
      'ergosurfaceEquator',
      'ergosurfacePole',
      'surfaceGravity',
      'hawkingTemperature',
      'horizonArea',
      'horizonAngularVelocity',
      'irreducibleMass',
    ]) {
      expect(names, n).toContain(n);
    }
  });
});
