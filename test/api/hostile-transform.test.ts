/**
 * Property-based hostile and random input for POST /v1/transform: random bodies, charts and events
 * anywhere (on and between the horizons, on the disk and the axis, at the singularity, below a
 * surface), random vectors, and junk in every slot. The answer is always a documented status, never
 * 5xx, and a 200 always matches its schema with every null explained.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { useApp } from '../helpers.js';
import { checkResponse, RUNS } from './hostile-checks.js';

const app = useApp();

async function postAndCheck(payload: unknown): Promise<number> {
  const text = JSON.stringify(payload);
  const res = await app().inject({ method: 'POST', url: '/v1/transform', payload: text, headers: { 'content-type': 'application/json' } });
  checkResponse(res, '/v1/transform', text);
  return res.statusCode;
}

const junk = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom('1e400 m', 'NaN', '-0', '0x10', 'sqrt(4) m', '6 rg^2', '1 tg', '', ' ', '1e-400 s', '1 c', '1e70 rg', '-1e70 rg', '1e300 s', '400 deg', '-1 rad'),
);
const sometimes = <T>(arb: fc.Arbitrary<T>) => fc.oneof({ weight: 20, arbitrary: arb as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: junk });

const blackHole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }), fc.constantFrom('1e-30 kg', '10 Msun', '4e6 Msun', '1e60 kg'))
  .map(([k, phi, mass]) => ({ mass, spin: k * Math.cos(phi), charge: k * Math.sin(phi) }));
const overspun = fc
  .tuple(fc.double({ min: 0, max: 1e3, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: 3, max: 1e4, noNaN: true }))
  .map(([spin, charge, radius]) => ({ mass: '1 Msun', spin, charge, radius: `${radius} rg` }));
const body = fc.oneof({ weight: 6, arbitrary: blackHole }, { weight: 2, arbitrary: fc.constantFrom('earth', 'sun') }, { weight: 1, arbitrary: overspun }, { weight: 1, arbitrary: junk });

const special = fc.constantFrom(0, 1, 2, 1e-300, 5e-324, 0.5, 1.9, 1e60, 1.0000000000000002e60);
const radial = fc.oneof(fc.double({ min: 0, max: 3, noNaN: true }), fc.double({ min: 0, max: 1e6, noNaN: true }), special);
const signed = fc.oneof(radial, radial.map((x) => -x));
const coordinate = (arb: fc.Arbitrary<number>, unit: string) => fc.oneof(arb, arb.map((x) => `${x} ${unit}`));
const polar = fc.oneof(fc.double({ min: 0, max: Math.PI, noNaN: true }), fc.constantFrom(0, Math.PI, Math.PI / 2, '90 deg', '180 deg'));
const sphericalEvent = fc.tuple(
  sometimes(coordinate(fc.double({ min: -1e3, max: 1e3, noNaN: true }), 'tg')),
  sometimes(coordinate(radial, 'rg')),
  sometimes(polar),
  sometimes(fc.double({ min: -10, max: 10, noNaN: true })),
);
const cartesianEvent = fc.tuple(
  sometimes(coordinate(fc.double({ min: -1e3, max: 1e3, noNaN: true }), 'tg')),
  sometimes(coordinate(signed, 'rg')),
  sometimes(coordinate(signed, 'rg')),
  sometimes(coordinate(signed, 'rg')),
);
const component = fc.oneof(
  { weight: 40, arbitrary: fc.double({ min: -1e3, max: 1e3, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom(0, 1e100, -1e100, 1e101, 5e-324) },
);
const vec = fc.tuple(component, component, component, component);
const eventOf = (coords: fc.Arbitrary<unknown>) =>
  fc.record(
    { coordinates: coords, vectors: sometimes(fc.array(vec, { maxLength: 3 })), covectors: sometimes(fc.array(vec, { maxLength: 3 })) },
    { requiredKeys: ['coordinates'] },
  );

describe('hostile and random POST /v1/transform', () => {
  it('random charts, events and vectors around random bodies', async () => {
    let computed = 0;
    const chart = fc.oneof({ weight: 12, arbitrary: fc.constantFrom('boyerLindquist', 'river', 'kerrSchild') }, { weight: 1, arbitrary: junk });
    /** Mostly events of the source chart's shape, sometimes the other shape or junk. */
    const eventsFor = (from: unknown) =>
      fc.array(
        fc.oneof(
          { weight: 12, arbitrary: eventOf(from === 'kerrSchild' ? cartesianEvent : sphericalEvent) },
          { weight: 1, arbitrary: eventOf(from === 'kerrSchild' ? sphericalEvent : cartesianEvent) },
          { weight: 1, arbitrary: junk },
        ),
        { minLength: 1, maxLength: 4 },
      );
    await fc.assert(
      fc.asyncProperty(
        body,
        chart.chain((from) => fc.tuple(fc.constant(from), eventsFor(from))),
        fc.oneof({ weight: 6, arbitrary: fc.constant(undefined) }, { weight: 3, arbitrary: fc.constantFrom(['kerrSchild'], ['river', 'boyerLindquist']) }, { weight: 1, arbitrary: fc.constantFrom([], ['x'], 'river') }),
        fc.boolean(),
        fc.oneof({ weight: 6, arbitrary: fc.constantFrom(undefined, true, false) }, { weight: 1, arbitrary: junk }),
        async (b, [from, events], to, metric, jacobian) => {
          const payload: Record<string, unknown> = { body: b, from, events, metric };
          if (to !== undefined) payload.to = to;
          if (jacobian !== undefined) payload.jacobian = jacobian;
          if ((await postAndCheck(payload)) === 200) computed++;
        },
      ),
      RUNS(400),
    );
    // About one in ten reaches a 200 (junk anywhere, or a point below a surface, refuses the batch).
    expect(computed).toBeGreaterThan(10);
  });

  it('events on the horizons, the disk, the ring and the axis of black holes', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: Math.PI / 2, noNaN: true }),
        fc.constantFrom('outer', 'inner', 'disk', 'ring', 'axis', 'centre'),
        fc.constantFrom('boyerLindquist', 'river', 'kerrSchild'),
        async (k, ang, where, from) => {
          const a = k * Math.cos(ang);
          const q = k * Math.sin(ang);
          const root = Math.sqrt(1 - (a * a + q * q));
          const rOuter = 1 + root;
          const rInner = (a * a + q * q) / rOuter;
          const spherical: Record<string, unknown[]> = {
            outer: [0, `${rOuter} rg`, 1, 0],
            inner: [0, `${rInner} rg`, 1, 0],
            disk: [0, 0, 0.5, 0],
            ring: [0, 0, Math.PI / 2, 0],
            axis: [0, '3 rg', Math.PI, 0],
            centre: [0, 0, 0, 0],
          };
          const cartesian: Record<string, unknown[]> = {
            outer: [0, `${rOuter} rg`, 0, 0],
            inner: [0, 0, 0, `${rInner} rg`],
            disk: [0, `${a / 2} rg`, 0, 0],
            ring: [0, `${a} rg`, 0, 0],
            axis: [0, 0, 0, '-3 rg'],
            centre: [0, 0, 0, 0],
          };
          const coordinates = from === 'kerrSchild' ? cartesian[where] : spherical[where];
          const status = await postAndCheck({
            body: { mass: '10 Msun', spin: a, charge: q },
            from,
            events: [{ coordinates, vectors: [[1, 2, 3, 4]], covectors: [[1, 0, 0, 0]] }],
            metric: true,
            jacobian: true,
          });
          expect([200, 422]).toContain(status);
        },
      ),
      RUNS(300),
    );
  });
});
