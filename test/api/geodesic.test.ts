/**
 * POST /v1/geodesic through HTTP: the researcher's request (a probe from 10 rg at 30° from the radial
 * direction around a spin-0.9 hole), horizon crossings against the free-fall clocks, limits and refusals.
 */
import { describe, expect, it } from 'vitest';
import { geodesicResponse, type GeodesicResponse } from '../../src/api/geodesic.js';
import { freeFall } from '../../src/physics/free-fall.js';
import { horizons } from '../../src/physics/spacetime.js';
import { expectRel, useApp } from '../helpers.js';

const app = useApp();

async function post(payload: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await app().inject({ method: 'POST', url: '/v1/geodesic', payload: payload as object });
  return { status: res.statusCode, json: res.json() as Record<string, unknown> };
}
async function path(payload: unknown): Promise<GeodesicResponse> {
  const { status, json } = await post(payload);
  expect(status, JSON.stringify(json).slice(0, 800)).toBe(200);
  return geodesicResponse.parse(json);
}

const hole = { mass: '10 Msun', spin: 0.9 };

describe('a probe launched from 10 rg at 30° from the radial direction, spin 0.9', () => {
  it('inward at 30° from straight in, at 0.3 c: it plunges, and the response says when it crossed the horizon', async () => {
    const r = await path({
      body: hole,
      particle: 'massive',
      start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo', speed: '0.3 c', angle: '150 deg' },
      duration: '2000 tg',
      samples: 200,
    });
    expect(r.outcome).toBe('plunged');
    expect(r.termination.event).toBe('innerHorizon');
    const cross = r.horizonCrossings.outer!;
    expect(cross.r.geometric).toBeCloseTo(horizons({ a: 0.9, q: 0 })!.outer, 12);
    expect(cross.lambda.value).toBeGreaterThan(0);
    // Proper time in seconds is the geometric value times GM/c³ of 10 solar masses (~49 µs).
    expectRel(cross.lambda.value, cross.lambda.geometric! * r.body.tg.value, 1e-15);
    expect(cross.riverTime.value).not.toBeNull();
    // The samples are plottable: x, y, z finite all along, through the horizon.
    expect(r.samples.count).toBeGreaterThan(2);
    for (const c of [r.samples.x, r.samples.y, r.samples.z]) for (const v of c.values) expect(Number.isFinite(v)).toBe(true);
    // Far-away time becomes null at the crossing, with the reason.
    expect(r.samples.farAwayTime.values.at(-1)).toBeNull();
    expect(r.samples.farAwayTime.nullReason).toMatch(/horizon/);
  });

  it('outward at 30° from the radial direction, at 0.6 c: it escapes', async () => {
    const r = await path({
      body: hole,
      particle: 'massive',
      start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo', speed: '0.6 c', angle: '30 deg' },
      duration: '20000 tg',
      samples: 100,
    });
    expect(r.outcome).toBe('escaped');
    expect(r.horizonCrossings.outer).toBeNull();
    expect(r.samples.r.geometric.at(-1)).toBeCloseTo(1000, 8);
    expect(r.constants.energy).toBeGreaterThan(1);
  });

  it('tangential at 30° from the radial direction, at 0.38 c: a bound orbit with turning points', async () => {
    const r = await path({
      body: hole,
      particle: 'massive',
      start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo', speed: '0.38 c', angle: '60 deg' },
      duration: '5000 tg',
      samples: 50,
    });
    expect(r.outcome).toBe('boundOrbit');
    expect(r.events.filter((e) => e.kind === 'radialTurningPoint').length).toBeGreaterThanOrEqual(2);
    expect(r.samples.lambda.geometric.at(-1)).toBe(5000);
    // Default rtol 1e−10 over ~5000 GM/c³: a few 1e−10.
    expect(r.constants.carter.relativeDrift).toBeLessThan(1e-8);
    expect(r.constants.massShell.relativeDrift).toBeLessThan(1e-8);
  });
});

describe('horizon crossing against the free-fall clocks', () => {
  it('released at rest from 10 rg on the equator: the horizon-crossing proper and river times equal the radial free fall', async () => {
    const r = await path({
      body: hole,
      particle: 'massive',
      start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo' },
      tolerance: 1e-12,
      samples: 2,
    });
    const ff = freeFall({ a: 0.9, q: 0 }, { r1: 10, r2: horizons({ a: 0.9, q: 0 })!.outer, theta: Math.PI / 2, start: { kind: 'rest' } });
    if (!ff.ok) throw new Error(ff.message);
    expectRel(r.horizonCrossings.outer!.lambda.geometric, ff.properTime, 1e-10);
    expectRel(r.horizonCrossings.outer!.riverTime.geometric, ff.riverTime!, 1e-10);
  });
});

describe('inside the horizon', () => {
  it('the river free-faller can launch between the horizons; far-away time is null from the start', async () => {
    const r = await path({
      body: hole,
      particle: 'massive',
      start: { kind: 'launch', point: { r: '1.2 rg', theta: '60 deg' }, observer: 'river', speed: '0.5 c', angle: '90 deg' },
      duration: '50 tg',
      samples: 20,
    });
    expect(r.start.point.region).toBe('betweenHorizons');
    expect(r.outcome).toBe('plunged');
    expect(r.termination.event).toBe('innerHorizon');
    expect(r.samples.farAwayTime.values.every((v) => v === null)).toBe(true);
    expect(r.samples.riverTime.values.every((v) => v !== null)).toBe(true);
  });

  it('a ZAMO cannot launch inside the horizon: 422 naming the observer', async () => {
    const { status, json } = await post({ body: hole, particle: 'light', start: { kind: 'launch', point: { r: '1.2 rg' }, observer: 'zamo' } });
    expect(status).toBe(422);
    expect(String(json.detail)).toMatch(/zero-angular-momentum/);
  });
});

describe('light and constants of motion', () => {
  it('light from constants (E, L, K) with signs', async () => {
    const r = await path({
      body: { mass: '4e6 Msun', spin: 0.7 },
      particle: 'light',
      start: { kind: 'constants', point: { r: '30 rg', theta: 1.1 }, energy: 1, angularMomentum: 5, carter: 20, radialDirection: 'inward' },
      duration: '200 tg',
    });
    expect(r.outcome).toBe('inFlight');
    expect(r.samples.parameter).toBe('affineParameter');
    expect(Math.abs(r.constants.massShell.end)).toBeLessThan(1e-10);
  });
});

describe('limits and refusals', () => {
  const base = { body: hole, particle: 'massive', start: { kind: 'launch', point: { r: '10 rg' }, observer: 'zamo', speed: '0.3 c' } };
  it('413 with the limit named for too many samples or steps', async () => {
    for (const [field, value, limit] of [['samples', 10_001, '10000'], ['maxSteps', 2_000_000, '1000000']] as const) {
      const { status, json } = await post({ ...base, [field]: value });
      expect(status).toBe(413);
      expect(json.type).toBe('/problems/request-too-large');
      expect(String(json.detail)).toContain(limit);
    }
  });

  it('422 for a speed ≥ c, a static observer in the ergoregion, a start inside the body or forbidden constants', async () => {
    const cases: [unknown, string][] = [
      [{ ...base, start: { ...base.start, speed: '1 c' } }, '/start/speed'],
      [{ ...base, start: { kind: 'launch', point: { r: '1.9 rg' }, observer: 'static' } }, '/start/observer'],
      [{ body: 'earth', particle: 'massive', start: { kind: 'launch', point: { r: '6000 km' }, observer: 'static' } }, '/start/point/r'],
      [{ ...base, start: { kind: 'constants', point: { r: '10 rg', theta: 1 }, energy: 0.5, angularMomentum: 3, carter: 1, radialDirection: 'inward' } }, '/start/carter'],
      [{ ...base, start: { kind: 'launch', point: { r: '10 rg', theta: 0 }, observer: 'zamo' } }, '/start/point/theta'],
    ];
    for (const [payload, where] of cases) {
      const { status, json } = await post(payload);
      expect(status, JSON.stringify(json)).toBe(422);
      expect((json.errors as { path: string }[])[0]!.path).toBe(where);
    }
  });

  it('400 for light with a speed, an unknown observer, zero samples', async () => {
    for (const payload of [
      { ...base, particle: 'light' },
      { ...base, start: { ...base.start, observer: 'circular' } },
      { ...base, samples: 0 },
    ]) {
      const { status } = await post(payload);
      expect(status).toBe(400);
    }
  });

  it('a step limit ends the path with a clear status, not an error', async () => {
    const r = await path({ ...base, maxSteps: 5, duration: '5000 tg' });
    expect(r.termination.event).toBe('maxSteps');
    expect(r.outcome).toBe('undetermined');
    expect(r.steps.accepted).toBe(5);
    expect(r.notes.join(' ')).toMatch(/Stopped early/);
  });
});
