/**
 * RFC 9457 problem details: every way a request can be refused, with its status, problem type,
 * content type and the field paths in `errors`.
 */
import { readFileSync } from 'node:fs';
import type { FastifyInstance, LightMyRequestResponse } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApiPath } from '../../src/api/openapi-file.js';
import { buildApp } from '../../src/app.js';
import { PROBLEMS, type ProblemCode } from '../../src/errors.js';

interface Problem {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance?: string;
  requestId: string;
  errors?: { path: string; message: string }[];
}

let app: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ logger: false });
});
afterAll(async () => {
  await app.close();
});

/** Asserts the problem-details contract for `code` and returns the body. */
function problem(res: LightMyRequestResponse, code: ProblemCode): Problem {
  const expected = PROBLEMS[code];
  expect(res.statusCode, res.body).toBe(expected.status);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json\b/);
  const body = res.json<Problem>();
  expect(body.type).toBe(`/problems/${code}`);
  expect(body.title).toBe(expected.title);
  expect(body.status).toBe(res.statusCode);
  expect(body.detail).toBeTypeOf('string');
  expect(body.detail.length).toBeGreaterThan(0);
  expect(body.requestId).toBeTypeOf('string');
  expect(body.requestId.length).toBeGreaterThan(0);
  expect(res.headers['x-request-id']).toBe(body.requestId);
  if (body.errors !== undefined) {
    expect(body.errors.length).toBeGreaterThan(0);
    for (const e of body.errors) {
      expect(e.path).toBeTypeOf('string');
      expect(e.message).toBeTypeOf('string');
    }
  }
  return body;
}

const paths = (p: Problem) => (p.errors ?? []).map((e) => e.path);

const postRaw = (url: string, payload: string, contentType = 'application/json') =>
  app.inject({ method: 'POST', url, payload, headers: { 'content-type': contentType } });
const post = (url: string, payload: unknown) => app.inject({ method: 'POST', url, payload: payload as object });
const get = (url: string) => app.inject({ method: 'GET', url });

describe('malformed requests (400, 415)', () => {
  it('malformed JSON → 400 malformed-json', async () => {
    for (const url of ['/v1/local', '/v1/spacetime']) {
      const p = problem(await postRaw(url, '{"body": {"mass": "1 Msun",'), 'malformed-json');
      expect(p.instance).toBe(url);
    }
  });

  it('an empty body → 400 malformed-json', async () => {
    problem(await postRaw('/v1/spacetime', ''), 'malformed-json');
  });

  it('a JSON value that is not an object → 400 invalid-request at the root', async () => {
    for (const payload of ['null', '[]', '42', '"sun"']) {
      const p = problem(await postRaw('/v1/spacetime', payload), 'invalid-request');
      expect(paths(p), payload).toEqual(['/']);
    }
  });

  it('text/plain → 415 unsupported-media-type', async () => {
    // PROBLEMS["unsupported-media-type"]: "POST bodies must be sent as application/json".
    problem(await postRaw('/v1/spacetime', '{"body":"sun"}', 'text/plain'), 'unsupported-media-type');
  });

  it('other non-JSON content types → 415 unsupported-media-type', async () => {
    for (const ct of ['application/x-www-form-urlencoded', 'application/xml', 'multipart/form-data; boundary=x']) {
      problem(await postRaw('/v1/local', '{"body":"sun"}', ct), 'unsupported-media-type');
    }
  });

  it('an unknown field in the body → 400 naming /body/spinn', async () => {
    const p = problem(
      await post('/v1/local', { body: { mass: '10 Msun', spinn: 0.9 }, point: { r: '6 rg' } }),
      'invalid-request',
    );
    expect(paths(p)).toContain('/body/spinn');
    expect(p.detail).toContain('spinn');
  });

  it('an unknown top-level field → 400 naming it', async () => {
    const p = problem(await post('/v1/spacetime', { body: 'sun', extra: 1 }), 'invalid-request');
    expect(paths(p)).toContain('/extra');
  });

  it('an unknown query parameter → 400 naming it', async () => {
    for (const url of ['/v1/local?mass=1%20Msun&r=6%20rg&spinn=0.5', '/v1/spacetime?mass=1%20Msun&spinn=0.5']) {
      const p = problem(await get(url), 'invalid-request');
      expect(paths(p), url).toContain('spinn');
      expect(p.detail, url).toContain('spinn');
    }
  });

  it('r is not a query parameter of /v1/spacetime → 400 naming it', async () => {
    const p = problem(await get('/v1/spacetime?mass=1%20Msun&r=6%20rg'), 'invalid-request');
    expect(paths(p)).toContain('r');
  });

  it('an unknown unit → 400 at /body/mass', async () => {
    const p = problem(await post('/v1/local', { body: { mass: '10 parsecs' }, point: { r: '6 rg' } }), 'invalid-request');
    expect(paths(p)).toEqual(['/body/mass']);
    expect(p.detail).toContain('parsecs');
  });

  it('an unknown unit in a query → 400 naming the parameter', async () => {
    const p = problem(await get('/v1/spacetime?mass=10%20parsecs'), 'invalid-request');
    expect(paths(p)).toEqual(['mass']);
  });

  it('a length given as a mass → 400 at /body/mass', async () => {
    const p = problem(await post('/v1/spacetime', { body: { mass: '10 m' } }), 'invalid-request');
    expect(paths(p)).toEqual(['/body/mass']);
  });

  it('a mass given as r → 400 at /point/r', async () => {
    const p = problem(await post('/v1/local', { body: { mass: '1 Msun' }, point: { r: '3 kg' } }), 'invalid-request');
    expect(paths(p)).toEqual(['/point/r']);
  });

  it('a wrong JSON type → 400 at its path', async () => {
    const p = problem(await post('/v1/spacetime', { body: { mass: true } }), 'invalid-request');
    expect(paths(p)).toContain('/body');
  });

  it('a missing mass → 400', async () => {
    problem(await get('/v1/spacetime?spin=0.5'), 'invalid-request');
    problem(await post('/v1/spacetime', { body: { spin: 0.5 } }), 'invalid-request');
  });

  it('both r and altitude → 400', async () => {
    const p = problem(await post('/v1/local', { body: 'earth', point: { r: '7000 km', altitude: '1 km' } }), 'invalid-request');
    expect(paths(p)[0]).toMatch(/^\/point/);
  });

  it('altitude for a black hole → 400 at /point/altitude', async () => {
    const p = problem(await post('/v1/local', { body: { mass: '10 Msun' }, point: { altitude: '1 km' } }), 'invalid-request');
    expect(paths(p)).toEqual(['/point/altitude']);
  });

  it('neither r nor altitude → 400', async () => {
    problem(await post('/v1/local', { body: 'earth', point: {} }), 'invalid-request');
    problem(await get('/v1/local?body=earth'), 'invalid-request');
  });

  it('a preset and a mass together in a query → 400', async () => {
    problem(await get('/v1/spacetime?body=earth&mass=1%20kg'), 'invalid-request');
  });

  it('an unknown preset → 400', async () => {
    problem(await get('/v1/spacetime?body=moon'), 'invalid-request');
    problem(await post('/v1/spacetime', { body: 'moon' }), 'invalid-request');
  });

  it('a JSON null body is reported as null, not as a missing body', async () => {
    const p = problem(await postRaw('/v1/spacetime', 'null'), 'invalid-request');
    expect(p.detail).toMatch(/null/);
    expect(p.detail).not.toMatch(/undefined/);
  });

  it('spin and charge strings are read like every other quantity: no hex, binary or octal literals', async () => {
    // mass "0x10" is refused by the unit parser; spin and charge must not accept what mass refuses.
    expect(
      (await post('/v1/spacetime', { body: { mass: '0x10' } })).statusCode,
      'control: mass "0x10" is refused',
    ).toBe(400);
    for (const [field, text] of [
      ['spin', '0x10'],
      ['spin', '0b1'],
      ['charge', '0o7'],
    ] as const) {
      const res = await post('/v1/spacetime', { body: { mass: '1 Msun', radius: '1 AU', [field]: text } });
      const p = problem(res, 'invalid-request');
      expect(paths(p), `${field} "${text}"`).toEqual([`/body/${field}`]);
    }
  });

  it('a spin or charge that is not a finite number is malformed (400), as for mass', async () => {
    const control = problem(await post('/v1/spacetime', { body: { mass: '1e400' } }), 'invalid-request');
    expect(paths(control)).toEqual(['/body/mass']);
    for (const [field, text] of [
      ['spin', 'Infinity'],
      ['spin', '1e400'],
      ['charge', '-Infinity'],
    ] as const) {
      const res = await post('/v1/spacetime', { body: { mass: '1 Msun', radius: '1 AU', [field]: text } });
      const p = problem(res, 'invalid-request');
      expect(paths(p), `${field} "${text}"`).toEqual([`/body/${field}`]);
    }
  });

  it('a repeated query parameter → 400 naming it', async () => {
    const p = problem(await get('/v1/spacetime?mass=1%20Msun&mass=2%20Msun'), 'invalid-request');
    expect(paths(p)).toEqual(['mass']);
  });
});

describe('unphysical input (422)', () => {
  it('negative mass → 422 at /body/mass', async () => {
    const p = problem(await post('/v1/spacetime', { body: { mass: -1 } }), 'unphysical-input');
    expect(paths(p)).toEqual(['/body/mass']);
    const q = problem(await get('/v1/spacetime?mass=-1%20Msun'), 'unphysical-input');
    expect(paths(q)).toEqual(['mass']);
  });

  it('zero mass → 422', async () => {
    problem(await post('/v1/spacetime', { body: { mass: 0 } }), 'unphysical-input');
  });

  it('spin 0.8 + charge 0.8 without a radius → 422 naming spin and charge', async () => {
    const p = problem(await post('/v1/spacetime', { body: { mass: '1 Msun', spin: 0.8, charge: 0.8 } }), 'unphysical-input');
    expect(paths(p)).toEqual(expect.arrayContaining(['/body/spin', '/body/charge']));
    const q = problem(await get('/v1/local?mass=1%20Msun&spin=0.8&charge=0.8&r=10%20rg'), 'unphysical-input');
    expect(paths(q)).toEqual(expect.arrayContaining(['spin', 'charge']));
  });

  it('the same spin and charge with a radius is a body with a surface, not an error', async () => {
    const res = await post('/v1/spacetime', { body: { mass: '1 Msun', spin: 0.8, charge: 0.8, radius: '10 km' } });
    expect(res.statusCode, res.body).toBe(200);
  });

  it('a point inside the body (earth, altitude −1 km) → 422 at /point/altitude', async () => {
    const p = problem(await post('/v1/local', { body: 'earth', point: { altitude: '-1 km' } }), 'unphysical-input');
    expect(paths(p)).toEqual(['/point/altitude']);
    const q = problem(await get('/v1/local?body=earth&altitude=-1%20km'), 'unphysical-input');
    expect(paths(q)).toEqual(['altitude']);
  });

  it('a point inside the body given as r → 422 at /point/r', async () => {
    const p = problem(await post('/v1/local', { body: 'earth', point: { r: '6000 km' } }), 'unphysical-input');
    expect(paths(p)).toEqual(['/point/r']);
  });

  it('theta 200 deg → 422 at /point/theta', async () => {
    const p = problem(await post('/v1/local', { body: 'earth', point: { altitude: 0, theta: '200 deg' } }), 'unphysical-input');
    expect(paths(p)).toEqual(['/point/theta']);
    const q = problem(await get('/v1/local?body=earth&altitude=0&theta=200%20deg'), 'unphysical-input');
    expect(paths(q)).toEqual(['theta']);
  });

  it('r = 0 (the singularity) → 422', async () => {
    problem(await post('/v1/local', { body: { mass: '1 Msun' }, point: { r: 0 } }), 'unphysical-input');
  });

  it('a radius inside the horizon → 422 at /body/radius', async () => {
    const p = problem(await post('/v1/spacetime', { body: { mass: '1 Msun', radius: '1 km' } }), 'unphysical-input');
    expect(paths(p)).toEqual(['/body/radius']);
  });
});

describe('size limits (413)', () => {
  it('a body over the limit (a 100 KB JSON string field) → 413 request-too-large', async () => {
    const payload = JSON.stringify({ body: { mass: 'x'.repeat(100_000) }, point: { r: '6 rg' } });
    const p = problem(await postRaw('/v1/local', payload), 'request-too-large');
    expect(p.detail).toMatch(/BODY_LIMIT_BYTES = \d+ bytes/);
  });

  it('a quantity string over 64 characters inside the limit → 400 naming the field', async () => {
    const p = problem(await post('/v1/spacetime', { body: { mass: `1${'0'.repeat(70)} kg` } }), 'invalid-request');
    expect(paths(p)).toEqual(['/body/mass']);
  });
});

describe('routes and problem types', () => {
  it('an unknown route → 404 not-found', async () => {
    const p = problem(await get('/v1/nope'), 'not-found');
    expect(p.detail).toContain('/v1/nope');
  });

  it('a method the route does not have → 404 not-found', async () => {
    problem(await app.inject({ method: 'DELETE', url: '/v1/local' }), 'not-found');
  });

  it('GET /problems/unphysical-input describes it', async () => {
    const res = await get('/problems/unphysical-input');
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json\b/);
    const body = res.json<{ type: string; title: string; status: number; description: string }>();
    expect(body).toEqual({
      type: '/problems/unphysical-input',
      title: PROBLEMS['unphysical-input'].title,
      status: 422,
      description: PROBLEMS['unphysical-input'].description,
    });
  });

  it('every problem type is served at its type URI', async () => {
    for (const [code, p] of Object.entries(PROBLEMS)) {
      const res = await get(`/problems/${code}`);
      expect(res.statusCode, code).toBe(200);
      expect(res.json<{ status: number }>().status, code).toBe(p.status);
    }
  });

  it('an unknown problem type → 404 not-found', async () => {
    problem(await get('/problems/no-such-problem'), 'not-found');
    problem(await get('/problems/__proto__'), 'not-found');
    problem(await get('/problems/constructor'), 'not-found');
  });

  it('every code in PROBLEMS appears in the committed OpenAPI Problem type enum', () => {
    const doc = JSON.parse(readFileSync(openApiPath(), 'utf8')) as {
      components: { schemas: { Problem: { properties: { type: { enum: string[] } } } } };
    };
    const types = doc.components.schemas.Problem.properties.type.enum;
    for (const code of Object.keys(PROBLEMS)) expect(types, code).toContain(`/problems/${code}`);
    expect(types).toHaveLength(Object.keys(PROBLEMS).length);
  });

  it('a problem echoes a safe x-request-id as its requestId', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/nope', headers: { 'x-request-id': 'trace-77' } });
    expect(problem(res, 'not-found').requestId).toBe('trace-77');
  });
});
