/**
 * /v1/light/deflection, /v1/light/delay and /v1/shadow through HTTP, with published checks.
 */
import { describe, expect, it } from 'vitest';
import { deflectionResponse, delayResponse, shadowResponse } from '../../src/api/light.js';
import { expectRel, useApp } from '../helpers.js';

const app = useApp();
async function post(url: string, payload: unknown) {
  const res = await app().inject({ method: 'POST', url, payload: payload as object });
  return { status: res.statusCode, json: res.json() as Record<string, unknown> };
}
async function ok<T>(url: string, payload: unknown, schema: { parse: (x: unknown) => T }): Promise<T> {
  const { status, json } = await post(url, payload);
  expect(status, JSON.stringify(json)).toBe(200);
  return schema.parse(json);
}

describe('deflection', () => {
  it('≈ 1.75″ at the solar limb (4GM/(c²R); Dyson, Eddington & Davidson 1920)', async () => {
    const r = await ok('/v1/light/deflection', { body: 'sun', ray: { closestApproach: '1 Rsun' } }, deflectionResponse);
    // 4GM/(c²R) with IAU 2015 B3 GM and R: 1.7512″; the exact value adds ~1e-6 relative.
    expect(r.deflection.arcseconds).toBeCloseTo(1.7512, 3);
    // 4GM/(c²b) with b = r₀/√(1 − 2GM/(c²r₀)) ≈ R(1 + GM/(c²R)): 4GM/(c²R) to GM/(c²R) = 2.1e-6.
    expectRel(r.weakFieldFirstOrder.value, (4 * 1.3271244e20) / (299792458 ** 2 * 6.957e8), 5e-6);
    expectRel(r.weakFieldFirstOrder.value, (4 * r.body.rg.value) / r.impactParameter.value!, 1e-14);
  });

  it('Schwarzschild: Darwin\'s exact form, and capture below b_c = 3√3 M', async () => {
    const r = await ok('/v1/light/deflection', { body: { mass: '1 Msun' }, ray: { closestApproach: '4 rg' } }, deflectionResponse);
    expect(r.method).toBe('darwin');
    expect(r.deflection.value!).toBeGreaterThan(r.weakFieldSecondOrder.value!);
    expectRel(r.criticalImpactParameter.geometric, 3 * Math.sqrt(3), 1e-14);
    const captured = await ok('/v1/light/deflection', { body: { mass: '1 Msun' }, ray: { impactParameter: '5 rg' } }, deflectionResponse);
    expect(captured.deflection.value).toBeNull();
    expect(captured.deflection.reason).toMatch(/critical/);
  });

  it('a ray that would not come back out gets no angle, says why, and points to closestApproach for a grazing ray', async () => {
    // The solar limb as an impact parameter: r₀ ≈ b − GM/c² lies ~1.5 km below the surface.
    const limb = await ok('/v1/light/deflection', { body: 'sun', ray: { impactParameter: '1 Rsun' } }, deflectionResponse);
    expect(limb.method).toBe('none');
    expect(limb.deflection.value).toBeNull();
    expect(limb.deflection.reason).toMatch(/surface.*closestApproach/);
    expect(limb.notes.join(' ')).toMatch(/No deflection angle/);
    expect(limb.notes.join(' ')).not.toMatch(/quadrature/);
    // An ultra-compact body inside its own photon orbit (radius 2.9 GM/c² < 3): below b_c the ray would
    // plunge, so it ends on the surface — not "into the black hole".
    const compact = await ok('/v1/light/deflection', { body: { mass: '1 Msun', radius: '2.9 rg' }, ray: { impactParameter: '5 rg' } }, deflectionResponse);
    expect(compact.deflection.value).toBeNull();
    expect(compact.deflection.reason).toMatch(/surface/);
    expect(compact.deflection.reason).not.toMatch(/black hole/);
  });

  it('spinning hole: a retrograde ray is bent more than a prograde one at the same closest approach', async () => {
    const body = { mass: '1 Msun', spin: 0.9 };
    const pro = await ok('/v1/light/deflection', { body, ray: { closestApproach: '10 rg' }, direction: 'prograde' }, deflectionResponse);
    const retro = await ok('/v1/light/deflection', { body, ray: { closestApproach: '10 rg' }, direction: 'retrograde' }, deflectionResponse);
    expect(retro.deflection.value!).toBeGreaterThan(pro.deflection.value!);
  });

  it('refuses a closest approach inside the photon orbit, and needs exactly one of b and r₀', async () => {
    expect((await post('/v1/light/deflection', { body: { mass: '1 Msun' }, ray: { closestApproach: '2.5 rg' } })).status).toBe(422);
    expect((await post('/v1/light/deflection', { body: { mass: '1 Msun' }, ray: {} })).status).toBe(400);
  });
});

describe('Shapiro delay', () => {
  it('round trip at Mars superior conjunction ≈ 250 µs (Reasenberg et al. 1979, ApJ 234:L219)', async () => {
    // Earth at 1 AU, Mars at 1.52 AU (from memory), ray grazing the solar limb.
    const r = await ok('/v1/light/delay', { body: 'sun', from: '1 AU', to: '1.52 AU', ray: { closestApproach: '1 Rsun' } }, delayResponse);
    expectRel(r.weakFieldRoundTrip.microseconds, 250, 0.02);
    // The exact coordinate-time integral counts ~2GM/c³ more per leg against √(r² − r₀²): see the notes.
    expect(r.roundTrip.microseconds - r.weakFieldRoundTrip.microseconds).toBeGreaterThan(15);
    expect(r.roundTrip.microseconds - r.weakFieldRoundTrip.microseconds).toBeLessThan(25);
  });
});

describe('shadow', () => {
  it('M87*: 6.5e9 solar masses at 16.8 Mpc → GM/(c²D) ≈ 3.8 µas, Schwarzschild shadow ≈ 39.7 µas (Event Horizon Telescope Collaboration 2019, ApJL 875:L1)', async () => {
    const r = await ok('/v1/shadow', { body: { mass: '6.5e9 Msun' }, inclination: '17 deg', distance: '16.8 Mpc', points: 64 }, shadowResponse);
    expect(r.angularScale.microarcseconds).toBeCloseTo(3.8, 1);
    expect(r.angularDiameter.microarcseconds).toBeCloseTo(39.7, 1);
    expectRel(r.meanRadius.geometric, 3 * Math.sqrt(3), 1e-12);
    expect(r.curve.alpha).toHaveLength(64);
  });

  it('spin changes the diameter by only a few percent at small inclination (EHT 2019, paper V)', async () => {
    const r = await ok('/v1/shadow', { body: { mass: '6.5e9 Msun', spin: 0.9 }, inclination: '17 deg', points: 128 }, shadowResponse);
    const change = 1 - r.meanRadius.geometric! / (3 * Math.sqrt(3));
    expect(change).toBeGreaterThan(0);
    expect(change).toBeLessThan(0.07);
    expect(r.circularityDeviation).toBeLessThan(0.01);
  });

  it('refuses an inclination outside [0°, 180°], a distance inside the photon sphere, and bodies with a surface', async () => {
    expect((await post('/v1/shadow', { body: { mass: '1 Msun' }, inclination: '190 deg' })).status).toBe(422);
    expect((await post('/v1/shadow', { body: { mass: '1 Msun' }, inclination: 0, distance: '2 rg' })).status).toBe(422);
    expect((await post('/v1/shadow', { body: 'sun', inclination: 0 })).status).toBe(422);
  });
});
