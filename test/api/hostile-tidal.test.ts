/**
 * Property-based hostile and random input for POST /v1/tidal: random bodies, points (inside the
 * horizons and next to the singularity too), observer lists, lengths and stars, and junk in every
 * slot. The answer is always a documented status, never 5xx, and a 200 matches its schema with every
 * null explained.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { useApp } from '../helpers.js';
import { checkResponse, RUNS } from './hostile-checks.js';

const app = useApp();

async function postAndCheck(payload: unknown): Promise<number> {
  const text = JSON.stringify(payload);
  const res = await app().inject({ method: 'POST', url: '/v1/tidal', payload: text, headers: { 'content-type': 'application/json' } });
  checkResponse(res, '/v1/tidal', text);
  return res.statusCode;
}

const junk = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom('1e400 m', 'NaN', '-0', '0x10', 'sqrt(4) m', '6 rg^2', '1 tg', '', ' ', '1e-400 m', '2 c', '-1 m', '0 m'),
);
const sometimes = <T>(arb: fc.Arbitrary<T>) => fc.oneof({ weight: 20, arbitrary: arb as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: junk });
const logUniform = (lo: number, hi: number) =>
  fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((e) => 10 ** e);

const blackHole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }), fc.constantFrom('1e-30 kg', '10 Msun', '4e6 Msun', '1e60 kg'))
  .map(([k, phi, mass]) => ({ mass, spin: k * Math.cos(phi), charge: k * Math.sin(phi) }));
const withSurface = fc
  .tuple(fc.double({ min: 0, max: 50, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true }), logUniform(3, 1e9))
  .map(([spin, charge, R]) => ({ mass: '1 Mearth', spin, charge, radius: `${R * 1.000001 + Math.abs(spin) + Math.abs(charge) + 2} rg` }));
const body = fc.oneof(blackHole, withSurface, fc.constantFrom('earth', 'sun'), junk);
const point = fc.oneof(
  { weight: 8, arbitrary: fc.record({ r: sometimes(fc.oneof(logUniform(1e-300, 1e60).map((r) => `${r} rg`), fc.constantFrom('1 rg', '2 rg', '0.5 rg'))), theta: sometimes(fc.double({ min: 0, max: Math.PI, noNaN: true })) }, { requiredKeys: ['r'] }) },
  { weight: 2, arbitrary: fc.record({ altitude: sometimes(fc.constantFrom(0, '400 km', '1 AU')), latitude: sometimes(fc.constantFrom('40 deg', '-90 deg')) }, { requiredKeys: ['altitude'] }) },
  { weight: 1, arbitrary: junk },
);
const observers = fc.oneof(
  fc.subarray(['static', 'zamo', 'river'], { minLength: 1 }),
  fc.array(fc.oneof(fc.constantFrom('static', 'zamo', 'river', 'distant'), junk), { maxLength: 5 }),
  junk,
);
const length = fc.oneof(fc.constantFrom('1 m', '2 m', '30 km', '1 rg', '1e-9 m'), logUniform(1e-30, 1e30), junk);
const star = fc.oneof(
  fc.constant('sun'),
  fc.record({ mass: fc.oneof(fc.constantFrom('1 Msun', '0.1 Msun', '1e-40 kg', '100 Msun'), logUniform(1e-30, 1e61)), radius: fc.oneof(fc.constantFrom('1 Rsun', '10 km', '1 m', '1 rg'), logUniform(1e-10, 1e20)) }),
  junk,
);

describe('hostile and random input to POST /v1/tidal', () => {
  it('random bodies, points, observers, lengths and stars', async () => {
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(
        fc.record({ body, point, observers, length, star }, { requiredKeys: ['body', 'point'] }),
        async (req) => {
          if ((await postAndCheck(req)) === 200) computed++;
        },
      ),
      RUNS(400),
    );
    expect(computed).toBeGreaterThan(10);
  });

  it('black holes anywhere, down to the singularity, with every observer', async () => {
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(blackHole, logUniform(1e-300, 1e60), fc.double({ min: 0, max: Math.PI, noNaN: true }), async (b, r, theta) => {
        if ((await postAndCheck({ body: b, point: { r: `${r} rg`, theta }, star: 'sun' })) === 200) computed++;
      }),
      RUNS(300),
    );
    expect(computed).toBeGreaterThan(200);
  });

  it('whole-body junk', async () => {
    await fc.assert(
      fc.asyncProperty(fc.jsonValue({ maxDepth: 4 }), async (v) => {
        await postAndCheck(v);
      }),
      RUNS(100),
    );
  });
});
