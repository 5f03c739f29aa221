/**
 * GET and POST /v1/spacetime through the whole app: horizon properties of Schwarzschild, extremal
 * and moderate Kerr holes against their closed forms and published values, and a body with a surface.
 */
import type { LightMyRequestResponse } from 'fastify';
import { describe, expect, it } from 'vitest';
import { spacetimeResponse, type SpacetimeResponse } from '../../src/api/spacetime.js';
import { expectRel, useApp } from '../helpers.js';

/** Speed of light, m/s (exact; SI 2019, CODATA 2018). */
const C = 299_792_458;
/** Planck constant, J s (exact; SI 2019, CODATA 2018). */
const H_PLANCK = 6.626_070_15e-34;
/** Reduced Planck constant, J s. */
const HBAR = H_PLANCK / (2 * Math.PI);
/** Boltzmann constant, J/K (exact; SI 2019, CODATA 2018). */
const K_B = 1.380_649e-23;
/** Newtonian constant of gravitation, m^3 kg^-1 s^-2 (CODATA 2018). */
const G = 6.674_30e-11;
/** Nominal solar GM, m^3/s^2 (IAU 2015 Resolution B3). */
const GM_SUN = 1.327_124_4e20;
/** Geocentric GM, m^3/s^2 (IERS Conventions 2010, Table 1.1). */
const GM_EARTH = 3.986_004_418e14;
/** Earth's equatorial radius, m (WGS84). */
const R_EARTH = 6_378_137;



const app = useApp();

function ok(res: LightMyRequestResponse): SpacetimeResponse {
  expect(res.statusCode, res.body).toBe(200);
  expect(res.headers['content-type']).toMatch(/^application\/json\b/);
  expect(res.headers['x-request-id']).toBeTypeOf('string');
  const json: unknown = res.json();
  const parsed = spacetimeResponse.safeParse(json);
  expect(parsed.success, parsed.success ? '' : JSON.stringify(parsed.error.issues)).toBe(true);
  return json as SpacetimeResponse;
}

const get = (query: string) => app().inject({ method: 'GET', url: `/v1/spacetime?${query}` });
const post = (payload: unknown) => app().inject({ method: 'POST', url: '/v1/spacetime', payload: payload as object });

function q(r: SpacetimeResponse, name: string) {
  const v = r.quantities[name];
  expect(v, `quantity ${name}`).toBeDefined();
  return v!;
}

// GM/c² and the like go through M = GM/G and G·M in the service: a couple of roundings, far below 1e-13.
const ROUNDING = 1e-13;

describe('Schwarzschild, 1 Msun', () => {
  it('GET and POST give the same document', async () => {
    const viaGet = ok(await get('mass=1%20Msun'));
    const viaPost = ok(await post({ body: { mass: '1 Msun' } }));
    expect(viaPost).toEqual(viaGet);
    expect(viaGet.body.family).toBe('schwarzschild');
    expect(viaGet.body.kind).toBe('blackHole');
  });

  it('Schwarzschild radius 2GM/c² ≈ 2953.25 m', async () => {
    const res = ok(await get('mass=1%20Msun'));
    const rs = q(res, 'schwarzschildRadius');
    expect(rs.unit).toBe('m');
    expect(rs.geometric).toBe(2);
    expectRel(rs.value, (2 * GM_SUN) / (C * C), ROUNDING); // IAU 2015 Resolution B3 GM_sun
    // 2953.25 m is 2GM_sun/c² rounded to six figures (common practice); 1e-6 covers that rounding.
    expectRel(rs.value, 2953.25, 1e-6);
    // The outer horizon of a Schwarzschild hole is the Schwarzschild radius; the inner one is at r = 0.
    expect(q(res, 'outerHorizon').value).toBe(rs.value);
    expect(q(res, 'innerHorizon').value).toBe(0);
    // The ergosurface coincides with the horizon when a = 0.
    expect(q(res, 'ergosurfaceEquator').geometric).toBe(2);
    expect(q(res, 'ergosurfacePole').geometric).toBe(2);
  });

  it('Hawking temperature ħc³/(8πGMk_B) ≈ 6.17e-8 K', async () => {
    const res = ok(await get('mass=1%20Msun'));
    const t = q(res, 'hawkingTemperature');
    expect(t.unit).toBe('K');
    // Hawking 1975 (Commun. Math. Phys. 43:199): T = ħc³/(8πGMk_B); with GM = GM_sun, CODATA 2018 ħ, c, k_B.
    const expected = (HBAR * C ** 3) / (8 * Math.PI * GM_SUN * K_B);
    expectRel(t.value, expected, ROUNDING);
    expectRel(t.value, 6.17e-8, 1e-3); // quoted to three figures (from memory): 6.17e-8 ± 0.005e-8
    expectRel(t.geometric, 1 / (8 * Math.PI), 1e-15); // κ/2π with κ = 1/4
    // Surface gravity κ = 1/(4M): c⁴/(4GM) in SI.
    expectRel(q(res, 'surfaceGravity').geometric, 0.25, 1e-15);
    expectRel(q(res, 'surfaceGravity').value, C ** 4 / (4 * GM_SUN), ROUNDING);
  });

  it('horizon area 16πM² and irreducible mass M', async () => {
    const res = ok(await post({ body: { mass: '1 Msun' } }));
    const area = q(res, 'horizonArea');
    expect(area.unit).toBe('m^2');
    expectRel(area.geometric, 16 * Math.PI, 1e-15);
    const rg = GM_SUN / (C * C);
    expectRel(area.value, 16 * Math.PI * rg * rg, ROUNDING);
    const mIrr = q(res, 'irreducibleMass');
    expect(mIrr.unit).toBe('kg');
    expectRel(mIrr.geometric, 1, 1e-15);
    expectRel(mIrr.value, res.body.mass.value, 1e-15);
    // The mass in kg is GM/G and carries G (CODATA 2018).
    expectRel(mIrr.value, GM_SUN / G, ROUNDING);
    expect(q(res, 'horizonAngularVelocity').value).toBe(0);
  });

  it('black-hole-only and surface-only quantities: surface ones are null with a reason', async () => {
    const res = ok(await get('mass=1%20Msun'));
    for (const name of ['compactness', 'surfaceEscapeSpeed', 'surfaceClockOffset', 'surfaceHoverAcceleration']) {
      expect(q(res, name).value, name).toBeNull();
      expect(q(res, name).reason, name).toMatch(/surface/);
    }
  });
});

describe('Kerr', () => {
  it('extremal (spin 1): surface gravity and Hawking temperature are zero, r+ = r− = M', async () => {
    const res = ok(await get('mass=1%20Msun&spin=1'));
    expect(res.body.family).toBe('kerr');
    // κ = (r+ − r−)/(2(r+² + a²)) = 0 exactly when a = M (Bardeen, Carter & Hawking 1973 — from memory).
    expect(q(res, 'surfaceGravity').value).toBe(0);
    expect(q(res, 'surfaceGravity').geometric).toBe(0);
    expect(q(res, 'hawkingTemperature').value).toBe(0);
    expect(q(res, 'outerHorizon').geometric).toBe(1);
    expect(q(res, 'innerHorizon').geometric).toBe(1);
    // Ω_H = a/(r+² + a²) = 1/2; A = 4π(r+² + a²) = 8π; M_irr = M/√2.
    expectRel(q(res, 'horizonAngularVelocity').geometric, 0.5, 1e-15);
    expectRel(q(res, 'horizonArea').geometric, 8 * Math.PI, 1e-15);
    expectRel(q(res, 'irreducibleMass').geometric, Math.SQRT1_2, 1e-15);
  });

  it('spin 0.6: r+ = 1.8 M and Ω_H = a/(r+² + a²) = 1/6', async () => {
    const res = ok(await post({ body: { mass: '1 Msun', spin: 0.6 } }));
    // r± = 1 ± sqrt(1 − 0.36) = 1 ± 0.8.
    expectRel(q(res, 'outerHorizon').geometric, 1.8, 1e-15);
    expectRel(q(res, 'innerHorizon').geometric, 0.2, 1e-14); // 1 − 0.8 loses a digit to cancellation
    const omega = q(res, 'horizonAngularVelocity');
    expect(omega.unit).toBe('rad/s');
    expectRel(omega.geometric, 0.6 / (1.8 ** 2 + 0.6 ** 2), 1e-15);
    expectRel(omega.geometric, 1 / 6, 1e-15);
    // In SI: Ω_H c³/(GM).
    expectRel(omega.value, (1 / 6) * (C ** 3 / GM_SUN), ROUNDING);
    // κ = (r+ − r−)/(2(r+² + a²)) = 1.6/7.2 = 2/9.
    expectRel(q(res, 'surfaceGravity').geometric, 2 / 9, 1e-14);
    // Equatorial ergosurface of Kerr is at r = 2M; the polar one meets the horizon.
    expectRel(q(res, 'ergosurfaceEquator').geometric, 2, 1e-15);
    expectRel(q(res, 'ergosurfacePole').geometric, 1.8, 1e-15);
    // The echoed angular momentum J = a GM²/(cG).
    expectRel(res.body.angularMomentum.value, (0.6 * GM_SUN * GM_SUN) / (C * G), ROUNDING);
  });
});

describe('a body with a surface', () => {
  it('earth preset: no horizons (null with reasons), compactness and surface values', async () => {
    const res = ok(await get('body=earth'));
    expect(res.body.kind).toBe('bodyWithSurface');
    expect(res.body.preset).toBe('earth');
    expect(res.body.radius?.value).toBe(R_EARTH);
    for (const name of [
      'outerHorizon',
      'innerHorizon',
      'surfaceGravity',
      'hawkingTemperature',
      'horizonArea',
      'horizonAngularVelocity',
      'irreducibleMass',
    ]) {
      expect(q(res, name).value, name).toBeNull();
      expect(q(res, name).reason, name).toMatch(/\S/);
    }
    // The Schwarzschild radius still exists as a length scale: 2GM/c² ≈ 8.87 mm.
    expectRel(q(res, 'schwarzschildRadius').value, (2 * GM_EARTH) / (C * C), ROUNDING);

    const compactness = q(res, 'compactness');
    expect(compactness.unit).toBe('1');
    expectRel(compactness.value, (2 * GM_EARTH) / (R_EARTH * C * C), ROUNDING); // IERS 2010 GM, WGS84 R
    expectRel(compactness.value, 1.39e-9, 1e-3); // 1.39e-9 quoted to three figures

    const escape = q(res, 'surfaceEscapeSpeed');
    expect(escape.unit).toBe('m/s');
    // sqrt(2GM/R) at the WGS84 equatorial radius; the Earth's spin (a ≈ 738 M, R ≈ 1.4e9 M) changes it
    // by ~(a/R)² ≈ 3e-13, so 1e-9 is ample.
    expectRel(escape.value, Math.sqrt((2 * GM_EARTH) / R_EARTH), 1e-9);
    // "11.2 km/s" (common practice) is quoted for the mean radius; at the equator it is 11.18 km/s: 0.5%.
    expectRel(escape.value, 11_200, 0.005);

    // Surface clock offset ≈ GM/(Rc²) ≈ 6.95e-10 (common practice), without cancellation.
    const x = (2 * GM_EARTH) / (R_EARTH * C * C);
    expectRel(q(res, 'surfaceClockOffset').value, -Math.expm1(0.5 * Math.log1p(-x)), 1e-12);
    // Hover acceleration GM/R² / sqrt(1 − 2GM/(Rc²)) ≈ 9.798 m/s² (no centrifugal part); spin enters
    // through g_rr = Σ/Δ at order (a/R)² ≈ 3e-13, so 1e-11 is ample.
    expectRel(q(res, 'surfaceHoverAcceleration').value, GM_EARTH / R_EARTH ** 2 / Math.sqrt(1 - x), 1e-11);
    expectRel(q(res, 'surfaceHoverAcceleration').value, 9.798, 1e-3); // ≈ 9.798 m/s² (common practice), 4 figures
    expect(res.notes.some((n) => /quadrupole/.test(n))).toBe(true);
  });

  it('1 Mearth with the mean radius 6371 km: escape speed ≈ 11186 m/s', async () => {
    const res = ok(await post({ body: { mass: '1 Mearth', radius: '6371 km' } }));
    expect(res.body.family).toBe('schwarzschild');
    // 11.186 km/s is the textbook escape speed from the mean radius 6371.0 km (common practice).
    expectRel(q(res, 'surfaceEscapeSpeed').value, 11_186, 1e-4); // quoted to 5 figures
    expectRel(q(res, 'surfaceEscapeSpeed').value, Math.sqrt((2 * GM_EARTH) / 6_371_000), 1e-9);
    expectRel(q(res, 'compactness').value, (2 * GM_EARTH) / (6_371_000 * C * C), ROUNDING);
  });

  it('sun preset: horizons absent, surface escape speed ≈ 617.7 km/s', async () => {
    const res = ok(await post({ body: 'sun' }));
    expect(q(res, 'outerHorizon').value).toBeNull();
    // Solar escape speed 617.7 km/s (common practice); 1e-3 covers the rounding of the quoted figure.
    expectRel(q(res, 'surfaceEscapeSpeed').value, 617_700, 1e-3);
  });
});
