/**
 * /v1/orbits/circular, /v1/orbits/precession and the characteristic orbits of /v1/spacetime through
 * HTTP, with published checks.
 */
import { describe, expect, it } from 'vitest';
import { circularResponse, precessionResponse, type CircularResponse, type PrecessionResponse } from '../../src/api/orbits.js';
import { spacetimeResponse } from '../../src/api/spacetime.js';
import { expectRel, useApp } from '../helpers.js';

const app = useApp();

async function get(url: string) {
  const res = await app().inject({ method: 'GET', url });
  return { status: res.statusCode, json: res.json() as Record<string, unknown> };
}
async function post(url: string, payload: unknown) {
  const res = await app().inject({ method: 'POST', url, payload: payload as object });
  return { status: res.statusCode, json: res.json() as Record<string, unknown> };
}
async function circular(url: string): Promise<CircularResponse> {
  const { status, json } = await get(url);
  expect(status, JSON.stringify(json)).toBe(200);
  return circularResponse.parse(json);
}
async function precession(payload: unknown): Promise<PrecessionResponse> {
  const { status, json } = await post('/v1/orbits/precession', payload);
  expect(status, JSON.stringify(json)).toBe(200);
  return precessionResponse.parse(json);
}

describe('characteristic orbits in /v1/spacetime', () => {
  it('Schwarzschild: ISCO 6M, photon orbit 3M, marginally bound 4M, efficiency 1 − √(8/9) ≈ 5.72% (Bardeen, Press & Teukolsky 1972)', async () => {
    const { json } = await get('/v1/spacetime?mass=1%20Msun');
    const q = spacetimeResponse.parse(json).quantities;
    expect(q.iscoPrograde!.geometric).toBeCloseTo(6, 12);
    expect(q.iscoRetrograde!.geometric).toBeCloseTo(6, 12);
    expect(q.photonOrbitPrograde!.geometric).toBeCloseTo(3, 12);
    expect(q.marginallyBoundOrbitPrograde!.geometric).toBeCloseTo(4, 12);
    expectRel(q.iscoEfficiencyPrograde!.value, 1 - Math.sqrt(8 / 9), 1e-12);
  });

  it('spin 0.998: efficiency ≈ 32% (Thorne 1974, ApJ 191:507); extremal Kerr: ISCO M prograde (42.3%) and 9M retrograde', async () => {
    const q998 = spacetimeResponse.parse((await get('/v1/spacetime?mass=10%20Msun&spin=0.998')).json).quantities;
    expect(q998.iscoEfficiencyPrograde!.value).toBeCloseTo(0.32, 2);
    const q1 = spacetimeResponse.parse((await get('/v1/spacetime?mass=10%20Msun&spin=1')).json).quantities;
    expect(q1.iscoRetrograde!.geometric).toBeCloseTo(9, 10);
    expect(q1.iscoPrograde!.geometric).toBeCloseTo(1, 6);
  });

  it('extremal Reissner–Nordström: ISCO 4M (from memory, textbook result)', async () => {
    const q = spacetimeResponse.parse((await get('/v1/spacetime?mass=1%20Msun&charge=1')).json).quantities;
    expect(q.iscoPrograde!.geometric).toBeCloseTo(4, 8);
  });

  it('bodies with a surface: orbits inside the body are null with the reason', async () => {
    const q = spacetimeResponse.parse((await get('/v1/spacetime?body=sun')).json).quantities;
    expect(q.iscoPrograde!.value).toBeNull();
    expect(q.iscoPrograde!.reason).toMatch(/inside the body/);
  });
});

describe('/v1/orbits/circular', () => {
  it('orbital frequency at the ISCO of a 10 solar-mass Schwarzschild hole ≈ 220 Hz (common practice)', async () => {
    const r = await circular('/v1/orbits/circular?mass=10%20Msun&r=6%20rg');
    // 1/(2π 6^{3/2}) c³/(GM): exact closed form; 1e-12.
    expectRel(r.quantities.orbitalFrequency!.value, 1 / (2 * Math.PI * 6 ** 1.5 * 10 * (1.3271244e20 / 299792458 ** 3)), 1e-12);
    expect(r.quantities.orbitalFrequency!.value).toBeCloseTo(220, -1);
  });

  it('Kerr epicyclic frequencies match Okazaki, Kato & Fukue (1987, PASJ 39:457)', async () => {
    const a = 0.7;
    const rr = 8;
    const r = await circular(`/v1/orbits/circular?mass=1%20Msun&spin=${a}&r=${rr}%20rg&direction=prograde`);
    const om = 1 / (rr ** 1.5 + a);
    const kr = om * Math.sqrt(1 - 6 / rr + (8 * a) / rr ** 1.5 - (3 * a * a) / rr ** 2);
    const kth = om * Math.sqrt(1 - (4 * a) / rr ** 1.5 + (3 * a * a) / rr ** 2);
    expectRel(r.quantities.radialEpicyclicFrequency!.geometric, kr / (2 * Math.PI), 1e-12);
    expectRel(r.quantities.verticalEpicyclicFrequency!.geometric, kth / (2 * Math.PI), 1e-12);
    expectRel(r.quantities.nodalPrecessionFrequency!.geometric, (om - kth) / (2 * Math.PI), 1e-10);
    expect(r.orbit).toMatchObject({ exists: true, stable: true, bound: true });
  });

  it('inside the ISCO: unstable, no radial epicyclic frequency; below the photon orbit: null with the reason', async () => {
    const inner = await circular('/v1/orbits/circular?mass=1%20Msun&r=5%20rg');
    expect(inner.orbit.stable).toBe(false);
    expect(inner.quantities.radialEpicyclicFrequency!.value).toBeNull();
    expect(inner.quantities.radialEpicyclicFrequency!.reason).toMatch(/unstable/);
    const unbound = await circular('/v1/orbits/circular?mass=1%20Msun&r=3.5%20rg');
    expect(unbound.orbit.bound).toBe(false);
    const below = await circular('/v1/orbits/circular?mass=1%20Msun&r=2.9%20rg');
    expect(below.orbit.exists).toBe(false);
    expect(below.quantities.orbitalFrequency!.reason).toMatch(/photon orbit/);
  });

  it('off the equator or inside the horizon → 422', async () => {
    expect((await get('/v1/orbits/circular?mass=1%20Msun&r=10%20rg&theta=1')).status).toBe(422);
    const inside = await post('/v1/orbits/circular', { body: { mass: '1 Msun' }, point: { r: '1.5 rg' } });
    expect(inside.status).toBe(422);
    expect(inside.json.errors).toEqual([expect.objectContaining({ path: '/point/r' })]);
    expect(String(inside.json.detail)).toMatch(/horizon/);
  });
});

describe('/v1/orbits/precession', () => {
  it("Mercury's perihelion advance ≈ 43″ per century (Einstein 1915; elements a = 5.7909e10 m, e = 0.2056, P = 87.969 d from memory)", async () => {
    const r = await precession({ body: 'sun', orbit: { semiMajorAxis: '5.7909e10 m', eccentricity: 0.2056, period: '87.969 day' } });
    expect(r.periapsisAdvancePerCentury.arcseconds).toBeCloseTo(42.98, 1);
  });

  it('Gravity Probe B (Everitt et al. 2011, PRL 106:221101): geodetic ≈ 6606 mas/yr, frame dragging ≈ 39.2 mas/yr', async () => {
    // Polar orbit at 642 km altitude (from memory). The published geodetic figure includes the
    // Earth's oblateness (J2), absent here: 0.5%. The published frame-dragging figure is the drift
    // seen by gyroscopes pointed at the guide star IM Pegasi (declination 16.84°, from memory).
    const r = await precession({ body: 'earth', orbit: { semiMajorAxis: '7020 km', inclination: '90 deg' } });
    expectRel(r.geodeticPrecession.milliarcsecondsPerYear, 6606.1, 5e-3);
    expectRel(r.frameDraggingPrecession.milliarcsecondsPerYear * Math.cos((16.84 * Math.PI) / 180), 39.2, 1e-2);
  });

  it('refuses strong fields and orbits through the body', async () => {
    expect((await post('/v1/orbits/precession', { body: { mass: '1 Msun' }, orbit: { semiMajorAxis: '10 rg' } })).status).toBe(422);
    expect((await post('/v1/orbits/precession', { body: 'earth', orbit: { semiMajorAxis: '7000 km', eccentricity: 0.5 } })).status).toBe(422);
  });
});
