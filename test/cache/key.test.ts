/**
 * The canonical key: stable serialisation, and the routes' canonical forms — key order, unit
 * spellings and defaults give one key; version, route and real differences give another.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { localRoute, type LocalRequest } from '../../src/api/local.js';
import { circularRoute, type CircularRequest } from '../../src/api/orbits.js';
import { spacetimeRoute, type SpacetimeRequest } from '../../src/api/spacetime.js';
import { cacheKey, stableStringify } from '../../src/cache/key.js';
import { VERSION } from '../../src/version.js';

/** The same object with its keys inserted in reverse order, recursively. */
function reversed(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(reversed);
  if (v !== null && typeof v === 'object') {
    return Object.fromEntries(Object.entries(v).reverse().map(([k, x]) => [k, reversed(x)]));
  }
  return v;
}

describe('stableStringify', () => {
  it('does not depend on key insertion order (any JSON value)', () => {
    fc.assert(
      fc.property(fc.jsonValue(), (v) => {
        expect(stableStringify(reversed(v))).toBe(stableStringify(v));
      }),
    );
  });

  it('distinct JSON values give distinct texts', () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.jsonValue(), (a, b) => {
        fc.pre(JSON.stringify(reversed(a)) !== JSON.stringify(b) && JSON.stringify(a) !== JSON.stringify(b));
        expect(stableStringify(a)).not.toBe(stableStringify(b));
      }),
    );
  });

  it('leaves out undefined members, and keeps -0, NaN and infinities apart', () => {
    expect(stableStringify({ b: 1, a: undefined, c: [1, 'x'] })).toBe('{"b":1,"c":[1,"x"]}');
    const texts = [0, -0, Number.NaN, Infinity, -Infinity, null].map((x) => stableStringify({ x }));
    expect(new Set(texts).size).toBe(texts.length);
    expect(stableStringify(0.1 + 0.2)).toBe('0.30000000000000004'); // exact double, shortest form
  });

  it('refuses values with no text', () => {
    const cyclic: Record<string, unknown> = {};
    cyclic.self = cyclic;
    expect(() => stableStringify(cyclic)).toThrow(TypeError);
    expect(() => stableStringify({ f: () => 1 })).toThrow(TypeError);
    expect(() => stableStringify(1n)).toThrow(TypeError);
  });
});

describe('cacheKey', () => {
  it('is 64 hex digits, and changes with the version, the route and the input', () => {
    const input = { body: { gm: 1 } };
    const k = cacheKey(VERSION, '/v1/spacetime', input);
    expect(k).toMatch(/^[0-9a-f]{64}$/);
    expect(cacheKey(VERSION, '/v1/spacetime', { body: { gm: 1 } })).toBe(k);
    expect(cacheKey('0.0.0-other', '/v1/spacetime', input)).not.toBe(k);
    expect(cacheKey(VERSION, '/v1/local', input)).not.toBe(k);
    expect(cacheKey(VERSION, '/v1/spacetime', { body: { gm: 2 } })).not.toBe(k);
  });
});

const localKey = (input: LocalRequest) => cacheKey(VERSION, localRoute.path, localRoute.canonical!(input));
const spacetimeKey = (input: SpacetimeRequest) => cacheKey(VERSION, spacetimeRoute.path, spacetimeRoute.canonical!(input));
const circularKey = (input: CircularRequest) => cacheKey(VERSION, circularRoute.path, circularRoute.canonical!(input));

/** One solar mass, kg, as the units library reads "1 Msun" (nominal GM / G). */
const MSUN_KG = 1.988409870698051e30;

describe('route canonical forms', () => {
  const base: LocalRequest = { body: { mass: '10 Msun', spin: 0.5 }, point: { r: '6 rg', theta: '60 deg' } };
  const k = localKey(base);

  it('/v1/local: key order does not matter', () => {
    expect(localKey({ point: { theta: '60 deg', r: '6 rg' }, body: { spin: 0.5, mass: '10 Msun' } })).toBe(k);
  });

  it('/v1/local: equivalent unit spellings give one key', () => {
    expect(localKey({ ...base, body: { mass: '1e1 Msun', spin: 0.5 } })).toBe(k);
    expect(localKey({ ...base, body: { mass: '10   Msun', spin: 0.5 } })).toBe(k);
    expect(localKey({ ...base, body: { mass: 10 * MSUN_KG, spin: 0.5 } })).toBe(k);
    expect(localKey({ ...base, point: { r: '6 rg', theta: Math.PI / 3 } })).toBe(localKey({ ...base, point: { r: '6 rg', theta: Math.PI / 3 } }));
    // A length in km and the same length in m.
    const geo = (r: number | string) => localKey({ body: 'earth', point: { r } });
    expect(geo('42164 km')).toBe(geo(42_164_000));
  });

  it('/v1/local: defaults give the key of their explicit values', () => {
    const bare: LocalRequest = { body: { mass: '1 Msun' }, point: { r: '10 rg' } };
    const kb = localKey(bare);
    expect(localKey({ body: { mass: '1 Msun', spin: 0, charge: 0 }, point: { r: '10 rg', theta: '90 deg' } })).toBe(kb);
    expect(localKey({ body: { mass: '1 Msun' }, point: { r: '10 rg', theta: Math.PI / 2 } })).toBe(kb);
    expect(localKey({ body: { mass: '1 Msun' }, point: { r: '10 rg', latitude: 0 } })).toBe(kb);
  });

  it('/v1/local: a real difference gives another key', () => {
    expect(localKey({ ...base, body: { mass: '10 Msun', spin: 0.6 } })).not.toBe(k);
    expect(localKey({ ...base, point: { r: '7 rg', theta: '60 deg' } })).not.toBe(k);
    expect(localKey({ ...base, point: { r: '6 rg', theta: '61 deg' } })).not.toBe(k);
    // A preset and a body with the same numbers still differ: the echo names the preset.
    expect(localKey({ body: 'sun', point: { r: '1 AU' } })).not.toBe(localKey({ body: { mass: '1 Msun', radius: '1 Rsun' }, point: { r: '1 AU' } }));
  });

  it('/v1/spacetime: the body alone, with defaults applied', () => {
    expect(spacetimeKey({ body: { mass: '10 Msun' } })).toBe(spacetimeKey({ body: { spin: 0, mass: '1e1 Msun', charge: 0 } }));
    expect(spacetimeKey({ body: { mass: '10 Msun' } })).not.toBe(spacetimeKey({ body: { mass: '10 Msun', spin: 0.1 } }));
  });

  it('/v1/orbits/circular: direction defaults to prograde', () => {
    const input: CircularRequest = { body: { mass: '1 Msun', spin: 0.9 }, point: { r: '8 rg' } };
    expect(circularKey(input)).toBe(circularKey({ ...input, direction: 'prograde' }));
    expect(circularKey(input)).not.toBe(circularKey({ ...input, direction: 'retrograde' }));
  });

  it('the same canonical input on two routes gives two keys', () => {
    const body = { mass: '1 Msun' };
    expect(cacheKey(VERSION, '/v1/local', spacetimeRoute.canonical!({ body }))).not.toBe(spacetimeKey({ body }));
  });
});
