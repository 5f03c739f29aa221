/**
 * Property-based hostile input: random JSON, hostile keys, deep nesting, extreme numbers and odd
 * quantity strings as POST bodies, and junk query strings as GET parameters. Whatever arrives, the
 * service answers with a documented status (never 5xx), problem details for refusals, and for a 200 a
 * document that matches its published schema with every null quantity explained.
 *
 * Runs are bounded (a few hundred requests per property) so the file stays well under 20 s on 2 cores.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { localResponse } from '../../src/api/local.js';
import { useApp } from '../helpers.js';
import { checkResponse, RUNS } from './hostile-checks.js';

const app = useApp();

const postJson = (path: string, text: string) =>
  app().inject({ method: 'POST', url: path, payload: text, headers: { 'content-type': 'application/json' } });

async function postAndCheck(path: string, text: string): Promise<number> {
  const res = await postJson(path, text);
  checkResponse(res, path, text);
  return res.statusCode;
}

const postPath = fc.constantFrom('/v1/local', '/v1/spacetime');

// ---- arbitraries -----------------------------------------------------------------------------------

const loneSurrogate = fc.integer({ min: 0xd800, max: 0xdfff }).map((c) => String.fromCharCode(c));
const oddString = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 20 }),
  fc.string({ unit: fc.oneof(loneSurrogate, fc.constantFrom('\u0000', '\u202e', '\ufeff', '\u00a0', '１', '㎏', 'e', '.', '-', ' ')), maxLength: 20 }),
);

const hostileKey = fc.oneof(
  fc.constantFrom(
    '__proto__',
    'constructor',
    'prototype',
    'toString',
    'hasOwnProperty',
    'valueOf',
    'body',
    'point',
    'mass',
    'spin',
    'charge',
    'radius',
    'r',
    'altitude',
    'theta',
    '',
  ),
  oddString,
);

/** Serialises key/value pairs as a JSON object text, so "__proto__" and duplicate keys reach the parser literally. */
const objectText = (entries: [string, unknown][]) =>
  `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${JSON.stringify(v) ?? 'null'}`).join(',')}}`;

const hostileObjectText = fc
  .array(fc.tuple(hostileKey, fc.jsonValue({ maxDepth: 3 })), { maxLength: 8 })
  .map(objectText);

const hostileNumber = fc.oneof(
  {
    weight: 3,
    arbitrary: fc.constantFrom(
      0,
      -0,
      1,
      -1,
      0.5,
      0.9,
      0.9999999999999999,
      1.0000000000000002,
      1e308,
      -1e308,
      Number.MAX_VALUE,
      5e-324,
      -5e-324,
      Number.MAX_SAFE_INTEGER,
      1e-30,
      1e30,
      2e30,
      1e60,
      1.0000000000000001e60,
      1e61,
      1e20,
      1e-300,
    ),
  },
  { weight: 1, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }) },
  { weight: 1, arbitrary: fc.integer() },
);

const hostileQuantityString = fc.oneof(
  {
    weight: 4,
    arbitrary: fc.constantFrom(
      '1e400 m',
      '1e400',
      '-1e400 kg',
      '1e-400 kg',
      'NaN kg',
      'NaN',
      'Infinity',
      '-Infinity',
      'Infinity m',
      '10 Msun^2',
      '6 rg',
      '1.5 rg',
      '1 rg',
      '0 rg',
      '-6 rg',
      '1e60 rg',
      '1e300 rg',
      '1 tg',
      '1 tg c',
      '1 rg/tg',
      '2 rg rg',
      'sqrt(4) m',
      '1+1 kg',
      '1 kg + 1 kg',
      'import("fs")',
      'f(x) = x',
      '0x10',
      '0b11',
      '1_000 kg',
      '',
      ' ',
      '1 Msun',
      '10 Msun',
      '-1 Msun',
      '1e-31 kg',
      '1 Mearth',
      '60 deg',
      '200 deg',
      '-1 rad',
      '3.141592653589793 rad',
      '1e20 C',
      '-1e20 C',
      '5.86e33 kg m^2/s',
      '0.5 c',
      '35786 km',
      '1 pc',
      '1 kpc',
      '1 ly',
      '1 au',
      '1 AU',
      '1 Rsun',
      '1 Rearth',
      '1 mas',
      '1 uas',
      '1 yr',
      '1 kg^0',
      '1 kg^-1',
      '1 deg^2',
      '1\u00a0kg',
      '１ kg',
      '1 ㎏',
      '1 kg\u0000',
      'constructor',
      '__proto__',
      'toString',
      '1 toString',
      '1 constructor',
      '1 e',
      '1 pi',
      'x'.repeat(64),
      '1'.repeat(64),
      `1${'0'.repeat(63)}`,
      '1'.repeat(400),
      `${'('.repeat(60)}1`,
    ),
  },
  { weight: 1, arbitrary: oddString },
  {
    weight: 2,
    arbitrary: fc
      .tuple(hostileNumber, fc.constantFrom('kg', 'g', 'm', 'km', 'rg', 'tg', 'Msun', 'Mearth', 'deg', 'rad', 'C', 'c', 's', 'mas', 'K'))
      .map(([n, u]) => `${n} ${u}`),
  },
  { weight: 1, arbitrary: fc.string({ maxLength: 12 }).map((s) => `1 ${s}`) },
);

const hostileQuantity = fc.oneof(
  { weight: 3, arbitrary: hostileNumber },
  { weight: 4, arbitrary: hostileQuantityString },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(null, true, false, [], {}, [1], { value: 1, unit: 'kg' }, [1, 'kg']) },
);

/** Plausible values, so that a good share of the hostile bodies get through to the physics. */
const plausibleMass = fc.constantFrom<unknown>('1 Msun', '10 Msun', '4e6 Msun', 2e30, '1 Mearth', '1 kg', 1e-30, 1e60);
const plausibleSpin = fc.oneof(fc.double({ min: 0, max: 1, noNaN: true }), fc.constantFrom<unknown>(0, 1, 0.998, '0.9'));
const plausibleCharge = fc.oneof(fc.double({ min: -1, max: 1, noNaN: true }), fc.constantFrom<unknown>(0, 1, -1, '1e20 C'));
const plausibleLength = fc.oneof(
  fc.double({ min: 0, max: 1e3, noNaN: true }).map((x) => `${x} rg`),
  fc.constantFrom<unknown>('6 rg', '2 rg', '1 rg', '1.5 rg', '0.1 rg', 1e7, '35786 km', '1 AU', '1 Rsun', '10 km'),
);
const plausibleTheta = fc.oneof(fc.double({ min: 0, max: Math.PI, noNaN: true }), fc.constantFrom<unknown>('0 deg', '90 deg', '180 deg', '60 deg'));

const field = (plausible: fc.Arbitrary<unknown>) =>
  fc.oneof({ weight: 4, arbitrary: plausible }, { weight: 1, arbitrary: hostileQuantity });

const bodyArb = fc.oneof(
  { weight: 1, arbitrary: fc.constantFrom<unknown>('sun', 'earth', 'moon', 'Sun', 'EARTH', '', '__proto__') },
  {
    weight: 5,
    arbitrary: fc.record(
      {
        mass: field(plausibleMass),
        spin: field(plausibleSpin),
        charge: field(plausibleCharge),
        radius: field(plausibleLength),
      },
      { requiredKeys: ['mass'] },
    ),
  },
);
const pointArb = fc.oneof(
  { weight: 3, arbitrary: fc.record({ r: field(plausibleLength), theta: field(plausibleTheta) }, { requiredKeys: ['r'] }) },
  { weight: 1, arbitrary: fc.record({ altitude: field(plausibleLength), theta: field(plausibleTheta) }, { requiredKeys: ['altitude'] }) },
  {
    weight: 1,
    arbitrary: fc.record(
      { r: field(plausibleLength), altitude: field(plausibleLength), theta: field(plausibleTheta) },
      { requiredKeys: [] },
    ),
  },
);

// ---- POST bodies -----------------------------------------------------------------------------------

describe('hostile POST bodies to /v1/local and /v1/spacetime', () => {
  it('random JSON values as the whole body', async () => {
    await fc.assert(
      fc.asyncProperty(postPath, fc.jsonValue({ maxDepth: 5, stringUnit: 'binary' }), async (path, v) => {
        await postAndCheck(path, JSON.stringify(v));
      }),
      RUNS(150),
    );
  });

  it('random JSON values in the body, point and quantity slots', async () => {
    const json = fc.jsonValue({ maxDepth: 4 });
    await fc.assert(
      fc.asyncProperty(postPath, json, json, json, json, async (path, body, point, mass, r) => {
        await postAndCheck(path, JSON.stringify({ body, point }));
        await postAndCheck(path, JSON.stringify({ body: { mass, spin: point }, point: { r } }));
      }),
      RUNS(100),
    );
  });

  it('objects with hostile and duplicate keys ("__proto__", "constructor", odd unicode) at every level', async () => {
    await fc.assert(
      fc.asyncProperty(postPath, hostileObjectText, fc.constantFrom(0, 1, 2, 3), async (path, obj, level) => {
        const text = [
          obj,
          `{"body":${obj},"point":{"r":"6 rg"}}`,
          `{"body":"earth","point":${obj}}`,
          `{"body":{"mass":${obj}},"point":{"r":"6 rg"}}`,
        ][level]!;
        await postAndCheck(path, text);
      }),
      RUNS(150),
    );
  });

  it('deeply nested arrays and objects', async () => {
    await fc.assert(
      fc.asyncProperty(
        postPath,
        fc.integer({ min: 1, max: 20_000 }),
        fc.constantFrom('array', 'object'),
        fc.constantFrom('root', 'body', 'mass', 'point'),
        async (path, depth, kind, slot) => {
          const open = kind === 'array' ? '[' : '{"a":';
          const close = kind === 'array' ? ']' : '}';
          const nested = `${open.repeat(depth)}1${close.repeat(depth)}`;
          const text =
            slot === 'root'
              ? nested
              : slot === 'body'
                ? `{"body":${nested},"point":{"r":1}}`
                : slot === 'mass'
                  ? `{"body":{"mass":${nested}},"point":{"r":1}}`
                  : `{"body":"sun","point":${nested}}`;
          await postAndCheck(path, text);
        },
      ),
      RUNS(40),
    );
  });

  it('structured bodies with extreme numbers and odd quantity strings', async () => {
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(bodyArb, pointArb, async (body, point) => {
        if ((await postAndCheck('/v1/local', JSON.stringify({ body, point }))) === 200) computed++;
        await postAndCheck('/v1/spacetime', JSON.stringify({ body }));
      }),
      RUNS(400),
    );
    // The generators must reach the physics, or the 200-branch checks above test nothing.
    expect(computed).toBeGreaterThan(10);
  });

  it('black holes anywhere (spin² + charge² ≤ 1, any r down to the singularity, any θ)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.oneof(fc.double({ min: 5e-324, max: 1e6, noNaN: true }), fc.double({ min: 0, max: 3, noNaN: true })),
        fc.double({ min: 0, max: Math.PI, noNaN: true }),
        fc.constantFrom('1e-30 kg', '1 Msun', '1e60 kg'),
        async (spin, angle, r, theta, mass) => {
          // Spin and charge on (or inside) the unit circle: Kerr–Newman holes up to extremality.
          const a = spin * Math.cos((angle * Math.PI) / 2);
          const qCharge = spin * Math.sin((angle * Math.PI) / 2);
          const text = JSON.stringify({ body: { mass, spin: a, charge: qCharge }, point: { r: `${r} rg`, theta } });
          const status = await postAndCheck('/v1/local', text);
          expect([200, 422], text).toContain(status);
        },
      ),
      RUNS(300),
    );
  });

  it('bodies with a surface anywhere (spin and charge up to the 1e20 limit, radius and r up to 1e60 rg)', async () => {
    const logUniform = (lo: number, hi: number) =>
      fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((e) => 10 ** e);
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(fc.constant(0), logUniform(1e-3, 1e20)),
        fc.oneof(fc.constant(0), logUniform(1e-3, 1e20)),
        fc.boolean(),
        logUniform(1e-3, 1e60),
        fc.oneof(fc.constant(1), logUniform(1, 1e60)),
        fc.double({ min: 0, max: Math.PI, noNaN: true }),
        fc.constantFrom('1e-30 kg', '1 Mearth', '1 Msun', '1e60 kg'),
        async (spin, charge, negative, radius, factor, theta, mass) => {
          const body = { mass, spin, charge: negative ? -charge : charge, radius: `${radius} rg` };
          const point = { r: `${radius * factor} rg`, theta };
          const local = JSON.stringify({ body, point });
          const s1 = await postAndCheck('/v1/local', local);
          expect([200, 422], local).toContain(s1);
          const s2 = await postAndCheck('/v1/spacetime', JSON.stringify({ body }));
          expect([200, 422], local).toContain(s2);
          if (s1 === 200) computed++;
        },
      ),
      RUNS(300),
    );
    expect(computed).toBeGreaterThan(10);
  });
});

// ---- query strings ---------------------------------------------------------------------------------

const queryKey = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom('body', 'mass', 'spin', 'charge', 'radius', 'r', 'altitude', 'theta') },
  { weight: 1, arbitrary: fc.constantFrom('__proto__', 'constructor', 'mass[]', 'mass[a]', 'Mass', '', 'point', 'r.x') },
  { weight: 1, arbitrary: fc.string({ maxLength: 8 }) },
);
const queryValue = fc.oneof(
  { weight: 2, arbitrary: fc.constantFrom('earth', 'sun', '1 Msun', '10 Msun', '6 rg', '0.9', '60 deg', '400 km', '0') },
  { weight: 3, arbitrary: hostileQuantityString },
  { weight: 1, arbitrary: hostileNumber.map(String) },
);
const junk = fc.constantFrom('', '&', '&&', '%', '%Z', '%ZZ', '%E0%A4%A', '%C0%80', '%00', '%FF%FE', '=', '==', '&=x', 'a[b]=c', 'a[]=1&a[]=2', '+', '%2B', ';', '?', '??', '%25', 'mass', 'mass=', 'r=&r=');
/** Lone UTF-16 surrogates cannot be percent-encoded (URIError); send U+FFFD for them as a client would. */
const wellFormed = (text: string) =>
  text.replace(/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g, '\ufffd');
/** Printable ASCII that can stand unencoded in a query (no space, "#", "&" or "="). */
const RAW_SAFE = /^[!-~]*$/;
const encodePart = (text: string, mode: 'encoded' | 'plus' | 'raw') => {
  const t = wellFormed(text);
  if (mode === 'raw' && RAW_SAFE.test(t) && !/[#&=]/.test(t)) return t;
  const e = encodeURIComponent(t);
  return mode === 'plus' ? e.replace(/%20/g, '+') : e;
};
const randomQuery = fc
  .tuple(
    fc.array(fc.tuple(queryKey, queryValue, fc.constantFrom('encoded' as const, 'plus' as const, 'raw' as const)), {
      maxLength: 10,
    }),
    junk,
  )
  .map(([pairs, tail]) => {
    const parts = pairs.map(([k, v, mode]) => `${encodePart(k, mode)}=${encodePart(v, mode)}`);
    if (tail) parts.push(tail);
    return parts.join('&');
  });

/** Mostly plausible body-and-point queries with hostile values mixed in, so that a share of them compute. */
const asText = (v: unknown) => (typeof v === 'string' ? v : typeof v === 'number' ? String(v) : JSON.stringify(v));
const sometimesHostile = (plausible: fc.Arbitrary<unknown>) =>
  fc.oneof({ weight: 6, arbitrary: plausible }, { weight: 1, arbitrary: hostileQuantity });
const blackHoleQuery = fc.record(
  {
    mass: sometimesHostile(plausibleMass),
    // spin² + charge² ≤ 0.98: a hole, so the point can be anywhere.
    spin: sometimesHostile(fc.double({ min: 0, max: 0.7, noNaN: true })),
    charge: sometimesHostile(fc.double({ min: -0.7, max: 0.7, noNaN: true })),
    r: sometimesHostile(plausibleLength),
    theta: sometimesHostile(plausibleTheta),
  },
  { requiredKeys: ['mass', 'r'] },
);
const presetQuery = fc.record(
  {
    body: fc.constantFrom('earth', 'sun'),
    altitude: sometimesHostile(
      fc.oneof(fc.double({ min: 0, max: 1e9, noNaN: true }), fc.constantFrom('0', '400 km', '20200 km', '35786 km', '1 Rsun', '1 AU')),
    ),
    theta: sometimesHostile(plausibleTheta),
  },
  { requiredKeys: ['body', 'altitude'] },
);
const POINT_KEYS = new Set(['r', 'altitude', 'theta']);
const structuredQuery = fc
  .tuple(
    fc.oneof(blackHoleQuery, presetQuery),
    fc.constantFrom('encoded' as const, 'plus' as const, 'raw' as const),
    fc.oneof({ weight: 4, arbitrary: fc.constant('') }, { weight: 1, arbitrary: junk }),
  )
  .map(([fields, mode, tail]) => (path: string) => {
    // /v1/spacetime takes the body only: leave the point out there, or every request would be a 400.
    const entries = Object.entries(fields).filter(([k]) => path === '/v1/local' || !POINT_KEYS.has(k));
    const parts = entries.map(([k, v]) => `${k}=${encodePart(asText(v), mode)}`);
    if (tail) parts.push(tail);
    return parts.join('&');
  });
const queryString = fc.oneof(
  randomQuery.map((qs) => () => qs),
  structuredQuery,
);

describe('hostile query strings', () => {
  it('GET /v1/local, /v1/spacetime and /v1/quantities', async () => {
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(fc.constantFrom('/v1/local', '/v1/spacetime', '/v1/quantities'), queryString, async (path, render) => {
        const url = `${path}?${render(path)}`;
        const res = await app().inject({ method: 'GET', url });
        checkResponse(res, path, url);
        if (res.statusCode === 200 && path !== '/v1/quantities') computed++;
      }),
      RUNS(400),
    );
    expect(computed).toBeGreaterThan(5);
  });
});

describe('after all that', () => {
  it('the app still answers a normal request', async () => {
    const res = await app().inject({ method: 'GET', url: '/v1/local?mass=10%20Msun&spin=0.9&r=6%20rg' });
    expect(res.statusCode).toBe(200);
    expect(localResponse.safeParse(res.json()).success).toBe(true);
    const post = await app().inject({ method: 'POST', url: '/v1/spacetime', payload: { body: 'earth' } });
    expect(post.statusCode).toBe(200);
  });
});
