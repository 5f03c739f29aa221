/**
 * Property-based hostile and random input for the endpoints that take observers and intervals:
 * POST /v1/clocks, /v1/proper-time, /v1/orbits/*, /v1/light/* and /v1/shadow. Random observers of every kind at random points around
 * random bodies, random falls and orbits, and junk in every slot: the answer is always a documented
 * status, never 5xx, and a 200 always matches its schema with every null explained.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { useApp } from '../helpers.js';
import { checkResponse, RUNS } from './hostile-checks.js';

const app = useApp();

async function postAndCheck(path: string, payload: unknown): Promise<number> {
  const text = JSON.stringify(payload);
  const res = await app().inject({ method: 'POST', url: path, payload: text, headers: { 'content-type': 'application/json' } });
  checkResponse(res, path, text);
  return res.statusCode;
}

const junk = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom('1e400 m', 'NaN', '-0', '0x10', 'sqrt(4) m', '6 rg^2', '1 tg', '', ' ', '1e-400 s', '1 c', '2 c'),
);
const sometimes = <T>(arb: fc.Arbitrary<T>) => fc.oneof({ weight: 20, arbitrary: arb as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: junk });
const logUniform = (lo: number, hi: number) =>
  fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((e) => 10 ** e);

const blackHole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }), fc.constantFrom('1e-30 kg', '10 Msun', '4e6 Msun', '1e60 kg'))
  .map(([k, phi, mass]) => ({ mass, spin: k * Math.cos(phi), charge: k * Math.sin(phi) }));
const body = fc.oneof(blackHole, fc.constantFrom('earth', 'sun'), junk);
const radius = fc.oneof(logUniform(1e-3, 1e8).map((r) => `${r} rg`), fc.constantFrom(0, '0 rg', '1 rg', '2 rg', '3 rg', '6 rg'));
/** Mostly one of r or altitude with an optional angle; sometimes both, or junk, to reach the refusals. */
const point = fc.oneof(
  { weight: 6, arbitrary: fc.record({ r: sometimes(radius), theta: sometimes(fc.double({ min: 0, max: Math.PI, noNaN: true })) }, { requiredKeys: ['r'] }) },
  {
    weight: 4,
    arbitrary: fc.record(
      {
        altitude: sometimes(fc.oneof(fc.constantFrom(0, '1 cm', '400 km', '20200 km'), fc.double({ min: -1e7, max: 1e12, noNaN: true }))),
        latitude: sometimes(fc.constantFrom('40 deg', '-90 deg', '91 deg', 0)),
      },
      { requiredKeys: ['altitude'] },
    ),
  },
  { weight: 1, arbitrary: fc.record({ r: radius, altitude: junk, theta: junk, latitude: junk }, { requiredKeys: [] }) },
);
const anyObserver = fc.record(
  {
    kind: fc.oneof({ weight: 9, arbitrary: fc.constantFrom('static', 'zamo', 'circular', 'rotating', 'distant') }, { weight: 1, arbitrary: junk }),
    point: sometimes(point),
    direction: sometimes(fc.constantFrom('prograde', 'retrograde')),
    angularVelocity: sometimes(fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.constantFrom('15 deg/h', '1 rad/s', '7.292115e-5 rad/s'))),
  },
  { requiredKeys: ['kind'] },
);
/** Mostly well-formed observers of each kind (so comparisons compute), sometimes anything at all. */
const observer = fc.oneof(
  { weight: 3, arbitrary: fc.record({ kind: fc.constantFrom('static', 'zamo'), point }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('circular'), point, direction: fc.constantFrom('prograde', 'retrograde') }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('rotating'), point, angularVelocity: fc.oneof(logUniform(1e-12, 1e3), fc.constantFrom('15 deg/h', '-1e-6 rad/s')) }) },
  { weight: 2, arbitrary: fc.constant({ kind: 'distant' }) },
  { weight: 2, arbitrary: anyObserver },
);

describe('hostile and random observers and intervals', () => {
  it('POST /v1/clocks with random observers around random bodies', async () => {
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(body, observer, observer, async (b, a, o) => {
        if ((await postAndCheck('/v1/clocks', { body: b, a, b: o })) === 200) computed++;
      }),
      RUNS(400),
    );
    expect(computed).toBeGreaterThan(5);
  });

  it('POST /v1/proper-time with random falls, orbits and stationary intervals', async () => {
    const fall = fc.record(
      {
        kind: fc.constant('freeFall'),
        from: sometimes(radius),
        to: sometimes(radius),
        start: fc.oneof({ weight: 9, arbitrary: fc.constantFrom('restAtInfinity', 'rest', 'launch') }, { weight: 1, arbitrary: junk }),
        speed: sometimes(fc.oneof(fc.double({ min: 0, max: 1.2, noNaN: true }).map((v) => `${v} c`), fc.double({ min: -1e9, max: 1e9, noNaN: true }))),
        direction: sometimes(fc.constantFrom('inward', 'outward')),
        theta: sometimes(fc.constantFrom(0, Math.PI / 2, Math.PI, 1, '90 deg')),
        tolerance: sometimes(fc.constantFrom(1e-15, 1e-12, 1e-6, 1e-3, 0, 1)),
      },
      { requiredKeys: ['kind', 'from', 'to', 'start'] },
    );
    const orbit = fc.record({ kind: fc.constant('orbit'), point: sometimes(point), revolutions: sometimes(fc.double({ min: -1, max: 1e16, noNaN: true })) });
    const stationary = fc.record(
      { kind: fc.constant('stationary'), observer, farAwayTime: sometimes(fc.constantFrom(1, '1 day', '1 yr', -5, '100 tg')), properTime: sometimes(fc.constantFrom(1, '1 s')) },
      { requiredKeys: ['kind', 'observer'] },
    );
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(body, fc.oneof(fall, orbit, stationary, junk), async (b, interval) => {
        if ((await postAndCheck('/v1/proper-time', { body: b, interval })) === 200) computed++;
      }),
      RUNS(500),
    );
    expect(computed).toBeGreaterThan(5);
  });

  it('POST /v1/orbits/circular and /v1/orbits/precession with random orbits', async () => {
    let computed = 0;
    const orbitElements = fc.record(
      {
        semiMajorAxis: sometimes(fc.oneof(radius, fc.constantFrom('7020 km', '1 AU', '0.387 AU', '42164 km'))),
        eccentricity: sometimes(fc.double({ min: -0.5, max: 1.5, noNaN: true })),
        inclination: sometimes(fc.constantFrom(0, '90 deg', '200 deg', Math.PI)),
        period: sometimes(fc.constantFrom('87.969 day', '1 yr', 0, '-1 s')),
      },
      { requiredKeys: ['semiMajorAxis'] },
    );
    await fc.assert(
      fc.asyncProperty(body, point, fc.constantFrom(undefined, 'prograde', 'retrograde', 'sideways'), orbitElements, async (b, p, d, orbit) => {
        if ((await postAndCheck('/v1/orbits/circular', d === undefined ? { body: b, point: p } : { body: b, point: p, direction: d })) === 200) computed++;
        if ((await postAndCheck('/v1/orbits/precession', { body: b, orbit })) === 200) computed++;
      }),
      RUNS(300),
    );
    expect(computed).toBeGreaterThan(5);
  });

  it('POST /v1/light/deflection, /v1/light/delay and /v1/shadow with random rays and views', async () => {
    let computed = 0;
    const rayArb = fc.oneof(
      fc.record({ impactParameter: sometimes(fc.oneof(radius, fc.constantFrom('1 Rsun', '5.196152422706632 rg', '5.2 rg'))) }),
      fc.record({ closestApproach: sometimes(fc.oneof(radius, fc.constantFrom('1 Rsun', '3 rg', '3.0000001 rg'))) }),
      fc.record({ impactParameter: junk, closestApproach: junk }, { requiredKeys: [] }),
    );
    await fc.assert(
      fc.asyncProperty(
        body,
        rayArb,
        fc.constantFrom(undefined, 'prograde', 'retrograde'),
        fc.oneof(radius, fc.constantFrom('1 AU', '1.52 AU')),
        fc.oneof(fc.constantFrom(0, '17 deg', '90 deg', Math.PI, '181 deg', -1), junk),
        fc.oneof(fc.constant(undefined), fc.constantFrom('16.8 Mpc', '1 rg', '3 rg', '10 rg', 0), junk),
        fc.oneof(fc.constant(undefined), fc.constantFrom(8, 64, 4096, 7, 4097, 1.5)),
        async (b, r, d, far, inclination, distance, points) => {
          const defl: Record<string, unknown> = { body: b, ray: r };
          if (d !== undefined) defl.direction = d;
          if ((await postAndCheck('/v1/light/deflection', defl)) === 200) computed++;
          if ((await postAndCheck('/v1/light/delay', { body: b, from: '1 AU', to: far, ray: r })) === 200) computed++;
          const view: Record<string, unknown> = { body: b, inclination };
          if (distance !== undefined) view.distance = distance;
          if (points !== undefined) view.points = points;
          if ((await postAndCheck('/v1/shadow', view)) === 200) computed++;
        },
      ),
      RUNS(200),
    );
    expect(computed).toBeGreaterThan(5);
  });
});
