/**
 * POST /v1/proper-time through HTTP: published values, the design question, refusals.
 */
import { describe, expect, it } from 'vitest';
import { properTimeResponse, type ProperTimeResponse } from '../../src/api/proper-time.js';
import { expectRel, useApp } from '../helpers.js';

const app = useApp();
/** GM_sun/c³ from the IAU 2015 Resolution B3 nominal GM_sun = 1.3271244e20 m³/s². */
const TG_SUN = 1.3271244e20 / 299792458 ** 3;

async function post(payload: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await app().inject({ method: 'POST', url: '/v1/proper-time', payload: payload as object });
  return { status: res.statusCode, json: res.json() as Record<string, unknown> };
}
async function interval(payload: unknown): Promise<ProperTimeResponse> {
  const { status, json } = await post(payload);
  expect(status, JSON.stringify(json)).toBe(200);
  return properTimeResponse.parse(json);
}

describe('free fall', () => {
  it('horizon to singularity of a one-solar-mass hole from rest: πGM/c³ ≈ 15.5 µs (Misner, Thorne & Wheeler 1973, ch. 31)', async () => {
    const r = await interval({ body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '2 rg', to: 0, start: 'rest' } });
    expectRel(r.properTime.value, Math.PI * TG_SUN, 1e-12);
    expect(r.properTime.value! * 1e6).toBeCloseTo(15.47, 2);
    expect(r.farAwayTime.value).toBeNull();
    expect(r.farAwayTime.reason).toMatch(/horizon/);
  });

  it('from rest at infinity, horizon to singularity takes (4/3)GM/c³, and river time equals proper time', async () => {
    const r = await interval({ body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '2 rg', to: 0, start: 'restAtInfinity' } });
    expectRel(r.properTime.geometric, 4 / 3, 1e-14);
    expectRel(r.riverTime!.value, r.properTime.value!, 1e-14);
  });

  it('the design question: 10 rg to the singularity of a 4e6 solar-mass hole, by the falling clock', async () => {
    const r = await interval({ body: { mass: '4e6 Msun' }, interval: { kind: 'freeFall', from: '10 rg', to: 0, start: 'rest' } });
    // Cycloid (MTW 1973 §31.10): τ = π √(r₁³/8) GM/c³ with r₁ = 10.
    expectRel(r.properTime.value, Math.PI * Math.sqrt(1000 / 8) * 4e6 * TG_SUN, 1e-12);
    expect(r.fall!.method).toBe('closedForm');
    expect(r.fall!.to.region).toBe('singularity');
  });

  it('with spin, along the equator by quadrature, with its tolerance and error estimate stated', async () => {
    const r = await interval({
      body: { mass: '4e6 Msun', spin: 0.9 },
      interval: { kind: 'freeFall', from: '10 rg', to: '1 rg', start: 'rest', tolerance: 1e-10 },
    });
    expect(r.fall!.method).toBe('quadrature');
    expect(r.fall!.tolerance).toBe(1e-10);
    expect(r.fall!.errorEstimate.properTime).toBeLessThan(1e-10 * r.properTime.value! * 10);
    expect(r.riverTime!.value).toBeGreaterThan(0);
    expect(r.notes.join(' ')).toMatch(/ZAMO/);
  });

  it('refuses what the fall cannot do: 422 with the reason at the field', async () => {
    const cases: [unknown, string, RegExp][] = [
      [{ body: { mass: '10 Msun', charge: 0.5 }, interval: { kind: 'freeFall', from: '10 rg', to: '0.01 rg', start: 'rest' } }, '/interval/to', /turns back/],
      [{ body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '10 rg', to: '20 rg', start: 'launch', speed: '0.3 c', direction: 'outward' } }, '/interval/to', /turns back/],
      [{ body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '10 rg', to: '20 rg', start: 'rest' } }, '/interval/to', /other direction|turns back/],
      [{ body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '10 rg', to: '2 rg', start: 'launch', speed: '1 c' } }, '/interval/speed', /\[0, c\)/],
      [{ body: { mass: '1 Msun', spin: 0.5 }, interval: { kind: 'freeFall', from: '10 rg', to: '2 rg', start: 'rest', theta: '45 deg' } }, '/interval/theta', /axis/],
      [{ body: { mass: '1 Msun' }, interval: { kind: 'freeFall', from: '1 rg', to: '0.5 rg', start: 'rest' } }, '/interval/from', /inside the outer horizon/],
      [{ body: 'earth', interval: { kind: 'freeFall', from: '7000 km', to: '6000 km', start: 'rest' } }, '/interval/to', /below the body's surface/],
    ];
    for (const [payload, path, message] of cases) {
      const { status, json } = await post(payload);
      expect(status, JSON.stringify(json)).toBe(422);
      expect(json.errors).toEqual([expect.objectContaining({ path })]);
      expect(String(json.detail)).toMatch(message);
    }
  });
});

describe('stationary clocks and orbits', () => {
  it('a clock on the ground loses GM/(Rc²)·1 yr ≈ 21.9 ms per year against a far-away clock', async () => {
    const r = await interval({
      body: 'earth',
      interval: { kind: 'stationary', observer: { kind: 'static', point: { altitude: 0 } }, farAwayTime: '1 yr' },
    });
    const x = 3.986004418e14 / (6378137 * 299792458 ** 2);
    // lag = offset · t without cancellation: 1e-14 relative.
    expectRel(r.lag!.value, (x + x * x / 2) * 31557600, 1e-9);
    expectRel(r.properTime.value! + r.lag!.value!, 31557600, 1e-15);
  });

  it('N revolutions of a circular orbit: far-away time 2πN/Ω with Kepler\'s Ω in the weak field', async () => {
    const r = await interval({ body: 'earth', interval: { kind: 'orbit', point: { r: '26561.75 km' }, revolutions: 2 } });
    const n = Math.sqrt(3.986004418e14 / 2.656175e7 ** 3);
    expectRel(r.farAwayTime.value, (4 * Math.PI) / n, 1e-8); // GR and spin corrections ~1e-10
    expect(r.properTime.value!).toBeLessThan(r.farAwayTime.value!);
  });

  it('needs exactly one of farAwayTime and properTime; no orbit inside the photon orbit', async () => {
    const both = await post({
      body: 'earth',
      interval: { kind: 'stationary', observer: { kind: 'static', point: { altitude: 0 } }, farAwayTime: 1, properTime: 1 },
    });
    expect(both.status).toBe(400);
    const inside = await post({ body: { mass: '1 Msun' }, interval: { kind: 'orbit', point: { r: '2.9 rg' }, revolutions: 1 } });
    expect(inside.status).toBe(422);
    expect(String(inside.json.detail)).toMatch(/photon orbit/);
  });
});
