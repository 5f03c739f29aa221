/**
 * POST /v1/clocks: clock comparisons between observers, with published checks.
 */
import { describe, expect, it } from 'vitest';
import { clocksResponse, type ClocksResponse } from '../../src/api/clocks.js';
import { expectRel, useApp } from '../helpers.js';

const app = useApp();

async function post(payload: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await app().inject({ method: 'POST', url: '/v1/clocks', payload: payload as object });
  return { status: res.statusCode, json: res.json() as Record<string, unknown> };
}

async function compare(payload: unknown): Promise<ClocksResponse> {
  const { status, json } = await post(payload);
  expect(status, JSON.stringify(json)).toBe(200);
  return clocksResponse.parse(json);
}

describe('GPS against a clock on the rotating Earth (Ashby 2003, Living Rev. Relativity 6:1, §5)', () => {
  const gps = {
    body: 'earth',
    a: { kind: 'rotating', point: { altitude: 0 } },
    b: { kind: 'circular', point: { r: '26561.75 km' } },
  };

  it('the orbiting clock gains ≈ 38.6 µs/day: ≈ +45.7 gravitational, ≈ −7.1 from motion', async () => {
    const c = (await compare(gps)).comparison;
    // Ashby's figures use the geoid potential (with J2); the vacuum Kerr exterior has no J2, so the
    // ground clock differs by ~0.2% of the total: 0.5% tolerance on the total, 0.3% on the parts.
    expectRel(c.gainPerDay.microseconds, 38.6, 5e-3);
    expectRel(c.parts!.gravitational.gainPerDay.microseconds, 45.7, 3e-3);
    expectRel(c.parts!.motion.gainPerDay.microseconds, -7.1, 3e-3);
    // The factory offset that makes the orbiting clock tick at the ground rate is −4.4647e-10:
    // B runs fast by +4.4647e-10.
    expectRel(c.fractionalOffset.value, 4.4647e-10, 5e-3); // the factory offset is minus this
    // The parts add up to the whole to first order in the log.
    const sum = c.parts!.gravitational.logRatio + c.parts!.frameDragging.logRatio + c.parts!.motion.logRatio;
    expectRel(Math.expm1(sum), c.fractionalOffset.value, 1e-15);
  });

  it('the orbit speed is ≈ 3.87 km/s (common practice)', async () => {
    const r = await compare(gps);
    expectRel(r.b.speedRelativeToZamo.value, Math.sqrt(3.986004418e14 / 2.656175e7), 1e-6);
  });
});

describe('weak fields keep full precision', () => {
  it('two static clocks 1 cm apart in height: 1.09e-18, gh/c² to the precision of g', async () => {
    const c = (
      await compare({
        body: 'earth',
        a: { kind: 'static', point: { altitude: 0 } },
        b: { kind: 'static', point: { altitude: '1 cm' } },
      })
    ).comparison;
    // g at the equator of the exterior: GM/R² · (1 + …); gh/c² with g = 9.7983 m/s².
    const g = 3.986004418e14 / 6378137 ** 2;
    expectRel(c.fractionalOffset.value, (g * 0.01) / 299792458 ** 2, 3e-9);
    expect(c.signal).not.toBeNull();
    // Light climbing 1 cm is redshifted by the same fraction.
    expectRel(c.signal!.redshift, c.fractionalOffset.value, 1e-12);
    expectRel(-c.signal!.frequencyShift, c.fractionalOffset.value, 1e-9);
  });

  it('a clock far away runs fast against one on the ground by GM/(Rc²) ≈ 6.95e-10', async () => {
    const c = (await compare({ body: 'earth', a: { kind: 'static', point: { altitude: 0 } }, b: { kind: 'distant' } })).comparison;
    const x = 3.986004418e14 / (6378137 * 299792458 ** 2);
    expectRel(c.fractionalOffset.value, x + 1.5 * x * x, 1e-15);
  });
});

describe('the design question: ISS-like orbit against a ground clock at latitude 40°', () => {
  it('answers with a daily offset and its two parts', async () => {
    const r = await compare({
      body: 'earth',
      a: { kind: 'rotating', point: { altitude: 0, latitude: '40 deg' } },
      b: { kind: 'circular', point: { altitude: '400 km' } },
    });
    // At 400 km the velocity term wins: the orbiting clock loses ≈ 25 µs/day (common practice: ISS
    // clocks lose roughly 25 µs per day against the ground).
    expect(r.comparison.gainPerDay.microseconds).toBeLessThan(-20);
    expect(r.comparison.gainPerDay.microseconds).toBeGreaterThan(-30);
    expect(r.comparison.parts!.gravitational.logRatio).toBeGreaterThan(0);
    expect(r.comparison.parts!.motion.logRatio).toBeLessThan(0);
    expect(r.notes.join(' ')).toMatch(/not a certified timing/);
  });
});

describe('observers that cannot exist are refused', () => {
  const hole = { mass: '10 Msun', spin: 0.9 };
  it.each([
    ['a static observer in the ergoregion', { kind: 'static', point: { r: '1.8 rg' } }, /ergosurface/],
    ['a circular orbit inside the photon orbit', { kind: 'circular', point: { r: '1.3 rg' }, direction: 'retrograde' }, /photon orbit|horizon/],
    ['a circular orbit off the equator', { kind: 'circular', point: { r: '10 rg', theta: 1 } }, /equatorial/],
    ['a rotating observer faster than light', { kind: 'rotating', point: { r: '10 rg' }, angularVelocity: '1e5 rad/s' }, /faster than light/],
    ['any observer inside the horizon', { kind: 'zamo', point: { r: '1 rg' } }, /horizon/],
  ])('%s → 422', async (_name, observer, message) => {
    const { status, json } = await post({ body: hole, a: { kind: 'distant' }, b: observer });
    expect(status).toBe(422);
    expect(String(json.detail)).toMatch(message);
    expect(json.errors).toEqual([expect.objectContaining({ path: '/b/kind' })]);
  });

  it('misplaced fields → 400 by name', async () => {
    const bad = await post({ body: 'earth', a: { kind: 'distant', point: { altitude: 0 } }, b: { kind: 'static', point: { altitude: 0 }, direction: 'prograde' } });
    expect(bad.status).toBe(400);
    const norot = await post({ body: { mass: '1 Msun', radius: '1 Rsun' }, a: { kind: 'rotating', point: { altitude: 0 } }, b: { kind: 'distant' } });
    expect(norot.status).toBe(400);
    expect(JSON.stringify(norot.json)).toMatch(/angularVelocity/);
  });
});
