/**
 * Property-based hostile and random input for POST /v1/geodesic: random launches and constants of motion
 * around random bodies, extreme durations, sample and step counts, and junk in every slot. The answer is
 * always a documented status (never 5xx), and a 200 always matches its schema with every null explained
 * and every sample finite or null. Step counts are kept small in the computed cases so the file stays fast.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { geodesicResponse } from '../../src/api/geodesic.js';
import { useApp } from '../helpers.js';
import { checkResponse, RUNS } from './hostile-checks.js';

const app = useApp();

async function postAndCheck(payload: unknown): Promise<{ status: number; body: string }> {
  const text = JSON.stringify(payload);
  const res = await app().inject({ method: 'POST', url: '/v1/geodesic', payload: text, headers: { 'content-type': 'application/json' } });
  checkResponse(res, '/v1/geodesic', text);
  return { status: res.statusCode, body: res.body };
}

const junk = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom('1e400 m', 'NaN', '-0', '0x10', '6 rg^2', '1 tg', '', ' ', '1e-400 s', '1 c', '2 c', -1, 0, 1e308, -1e308),
);
const sometimes = <T>(arb: fc.Arbitrary<T>) => fc.oneof({ weight: 30, arbitrary: arb as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: junk });
const logUniform = (lo: number, hi: number) => fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((e) => 10 ** e);

const blackHole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }), fc.constantFrom('1e-30 kg', '10 Msun', '4e6 Msun', '1e60 kg'))
  .map(([k, phi, mass]) => ({ mass, spin: k * Math.cos(phi), charge: k * Math.sin(phi) }));
const body = fc.oneof({ weight: 8, arbitrary: blackHole }, { weight: 1, arbitrary: fc.constantFrom('earth', 'sun') }, { weight: 1, arbitrary: junk });
const radius = fc.oneof(logUniform(0.05, 1e6).map((r) => `${r} rg`), fc.constantFrom(0, '0 rg', '1 rg', '2 rg', '3 rg', '6 rg', '7000 km', '1 AU'));
const angle = fc.oneof(fc.double({ min: -7, max: 7, noNaN: true }), fc.constantFrom('0 deg', '30 deg', '90 deg', '150 deg', '180 deg', '181 deg'));
const point = fc.record(
  { r: sometimes(radius), theta: sometimes(fc.double({ min: 0, max: Math.PI, noNaN: true })), phi: sometimes(angle) },
  { requiredKeys: ['r'] },
);
const launch = fc.record(
  {
    kind: fc.constant('launch'),
    point: sometimes(point),
    observer: sometimes(fc.constantFrom('static', 'zamo', 'river')),
    speed: sometimes(fc.oneof(fc.double({ min: 0, max: 1.2, noNaN: true }).map((v) => `${v} c`), fc.constantFrom('0 c', '0.999999 c', 3e8))),
    angle: sometimes(angle),
    azimuth: sometimes(angle),
  },
  { requiredKeys: ['kind', 'point', 'observer'] },
);
const constants = fc.record(
  {
    kind: fc.constant('constants'),
    point: sometimes(point),
    energy: sometimes(fc.double({ min: -2, max: 3, noNaN: true })),
    angularMomentum: sometimes(fc.double({ min: -10, max: 10, noNaN: true })),
    carter: sometimes(fc.double({ min: -5, max: 50, noNaN: true })),
    radialDirection: sometimes(fc.constantFrom('inward', 'outward')),
    polarDirection: sometimes(fc.constantFrom('north', 'south')),
  },
  { requiredKeys: ['kind', 'point', 'energy', 'angularMomentum', 'carter', 'radialDirection'] },
);
const request = fc.record(
  {
    body,
    particle: sometimes(fc.constantFrom('massive', 'massive', 'light')),
    start: fc.oneof({ weight: 8, arbitrary: launch }, { weight: 4, arbitrary: constants }, { weight: 1, arbitrary: junk }),
    duration: sometimes(fc.oneof({ weight: 6, arbitrary: logUniform(1e-6, 1e13).map((d) => `${d} tg`) }, { weight: 1, arbitrary: fc.constantFrom('1 s', '1 yr', 0, -1) })),
    samples: sometimes(fc.oneof({ weight: 6, arbitrary: fc.integer({ min: 2, max: 50 }) }, { weight: 1, arbitrary: fc.constantFrom(1, 10_000, 10_001, 1e9, 2.5) })),
    maxSteps: sometimes(fc.oneof({ weight: 6, arbitrary: fc.integer({ min: 1, max: 400 }) }, { weight: 1, arbitrary: fc.constantFrom(0, 1_000_001, 1e12) })),
    tolerance: sometimes(fc.oneof({ weight: 6, arbitrary: logUniform(1e-14, 1e-6) }, { weight: 1, arbitrary: fc.constantFrom(1e-15, 1e-5) })),
    escapeRadius: sometimes(fc.oneof({ weight: 6, arbitrary: radius }, { weight: 1, arbitrary: fc.constantFrom('1e16 rg') })),
    stopAt: sometimes(fc.constantFrom('outerHorizon', 'innerHorizon')),
  },
  { requiredKeys: ['body', 'particle', 'start', 'maxSteps'] },
);

/** Well-formed requests around black holes, so that most reach the integrator. */
const wellFormed = fc.record({
  body: blackHole,
  particle: fc.constantFrom('massive', 'light'),
  start: fc.oneof(
    fc.record({
      kind: fc.constant('launch'),
      point: fc.record({ r: logUniform(0.3, 1e4).map((r) => `${r} rg`), theta: fc.double({ min: 0.05, max: Math.PI - 0.05, noNaN: true }), phi: angle }),
      observer: fc.constantFrom('static', 'zamo', 'river'),
      angle: fc.double({ min: 0, max: Math.PI, noNaN: true }),
      azimuth: fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
    }),
    fc.record({
      kind: fc.constant('constants'),
      point: fc.record({ r: logUniform(0.3, 1e4).map((r) => `${r} rg`), theta: fc.double({ min: 0.05, max: Math.PI - 0.05, noNaN: true }) }),
      energy: fc.double({ min: 0.05, max: 3, noNaN: true }),
      angularMomentum: fc.double({ min: -8, max: 8, noNaN: true }),
      carter: fc.double({ min: 0, max: 40, noNaN: true }),
      radialDirection: fc.constantFrom('inward', 'outward'),
      polarDirection: fc.constantFrom('north', 'south'),
    }),
  ),
  speed: fc.double({ min: 0, max: 0.999, noNaN: true }),
  duration: logUniform(1e-3, 1e6).map((d) => `${d} tg`),
  samples: fc.integer({ min: 2, max: 50 }),
  maxSteps: fc.integer({ min: 1, max: 400 }),
  tolerance: logUniform(1e-13, 1e-6),
  stopAt: fc.constantFrom('outerHorizon', 'innerHorizon'),
}).map(({ speed, ...r }) =>
  // Speed belongs to a massive particle's launch.
  r.particle === 'massive' && r.start.kind === 'launch' ? { ...r, start: { ...r.start, speed: `${speed} c` } } : r,
);

describe('hostile and random POST /v1/geodesic', () => {
  it('well-formed random launches and constants: schema-valid 200s with finite samples, or a documented refusal', async () => {
    let computed = 0;
    await fc.assert(
      fc.asyncProperty(wellFormed, async (req) => {
        const { status, body: text } = await postAndCheck(req);
        if (status === 200) {
          computed++;
          const doc = geodesicResponse.parse(JSON.parse(text));
          expect(doc.samples.count).toBeLessThanOrEqual(51);
          expect(doc.steps.accepted).toBeLessThanOrEqual(req.maxSteps);
          for (const col of [doc.samples.lambda, doc.samples.r, doc.samples.x]) {
            expect(col.values.length).toBe(doc.samples.count);
            for (const v of col.values) expect(v === null || Number.isFinite(v)).toBe(true);
          }
        } else {
          expect(status).toBe(422);
        }
      }),
      RUNS(200),
    );
    // A good share reach the integrator (so the property tests the physics, not only the refusals).
    expect(computed).toBeGreaterThan(50);
  });

  it('junk in any slot: documented statuses only', async () => {
    await fc.assert(
      fc.asyncProperty(request, async (req) => {
        await postAndCheck(req);
      }),
      RUNS(200),
    );
  });

  it('random JSON in every slot', async () => {
    const json = fc.jsonValue({ maxDepth: 3 });
    await fc.assert(
      fc.asyncProperty(json, json, json, async (a, b, c) => {
        await postAndCheck(a);
        await postAndCheck({ body: '10 Msun', particle: b, start: c });
        await postAndCheck({ body: { mass: '10 Msun' }, particle: 'massive', start: { kind: 'launch', point: { r: a }, observer: 'zamo', speed: b } });
      }),
      RUNS(100),
    );
  });
});
