/**
 * GET and POST /v1/local through the whole app (inject, no port): the DESIGN "done when" case,
 * GET/POST agreement, presets with altitude, unit equivalences, quantities that are null with a
 * reason, and the response contract (zod schema, content type, request id).
 */
import type { LightMyRequestResponse } from 'fastify';
import { describe, expect, it } from 'vitest';
import { localResponse, type LocalResponse } from '../../src/api/local.js';
import { expectRel, useApp } from '../helpers.js';

/** Speed of light, m/s (exact; SI 2019, CODATA 2018). */
const C = 299_792_458;
/** Nominal solar GM, m^3/s^2 (IAU 2015 Resolution B3). */
const GM_SUN = 1.327_124_4e20;
/** Nominal solar radius, m (IAU 2015 Resolution B3). */
const R_SUN = 6.957e8;
/** Geocentric GM, m^3/s^2 (IERS Conventions 2010, Table 1.1). */
const GM_EARTH = 3.986_004_418e14;
/** Earth's equatorial radius, m (WGS84). */
const R_EARTH = 6_378_137;



const app = useApp();

/** Asserts the 200 JSON contract and returns the response parsed by the published zod schema. */
function ok(res: LightMyRequestResponse): LocalResponse {
  expect(res.statusCode, res.body).toBe(200);
  expect(res.headers['content-type']).toMatch(/^application\/json\b/);
  expect(res.headers['x-request-id']).toBeTypeOf('string');
  expect(String(res.headers['x-request-id']).length).toBeGreaterThan(0);
  const json: unknown = res.json();
  const parsed = localResponse.safeParse(json);
  expect(parsed.success, parsed.success ? '' : JSON.stringify(parsed.error.issues)).toBe(true);
  return json as LocalResponse;
}

const get = (query: string, headers: Record<string, string> = {}) =>
  app().inject({ method: 'GET', url: `/v1/local?${query}`, headers });
const post = (payload: unknown) => app().inject({ method: 'POST', url: '/v1/local', payload: payload as object });

function q(r: LocalResponse, name: string) {
  const v = r.quantities[name];
  expect(v, `quantity ${name}`).toBeDefined();
  return v!;
}

/**
 * Kerr (Q = 0) closed forms at (r, θ), M = 1 (Bardeen, Press & Teukolsky 1972, ApJ 178:347 — from memory):
 * Δ = r² − 2r + a², Σ = r² + a² cos²θ, A = (r² + a²)² − a²Δ sin²θ; lapse √(ΣΔ/A), ω = 2ar/A,
 * static rate √(1 − 2r/Σ), and the DESIGN flow speed √((r² + a²)·2r / A).
 */
function kerr(a: number, r: number, theta: number) {
  const s2 = Math.sin(theta) ** 2;
  const delta = r * r - 2 * r + a * a;
  const sigma = r * r + a * a * Math.cos(theta) ** 2;
  const A = (r * r + a * a) ** 2 - a * a * delta * s2;
  return {
    flowSpeed: Math.sqrt(((r * r + a * a) * 2 * r) / A),
    zamoClockRate: Math.sqrt((sigma * delta) / A),
    staticClockRate: Math.sqrt(1 - (2 * r) / sigma),
    frameDragRate: (2 * a * r) / A,
  };
}

// A dozen floating-point operations on both sides: agreement to 1e-12 leaves room for rounding only.
const CLOSED_FORM_TOL = 1e-12;

describe('the DESIGN "done when" case: GET /v1/local?mass=10 Msun&spin=0.9&r=6 rg', () => {
  it('returns flow speed and clock rates with units and geometric values that match the Kerr closed forms', async () => {
    const res = ok(await get('mass=10%20Msun&spin=0.9&r=6%20rg'));
    const expected = kerr(0.9, 6, Math.PI / 2);

    const flow = q(res, 'flowSpeed');
    expect(flow.unit).toBe('m/s');
    expectRel(flow.geometric, expected.flowSpeed, CLOSED_FORM_TOL);
    expectRel(flow.value, expected.flowSpeed * C, CLOSED_FORM_TOL);

    const rate = q(res, 'staticClockRate');
    expect(rate.unit).toBe('1');
    expectRel(rate.value, expected.staticClockRate, CLOSED_FORM_TOL);
    expectRel(rate.value, Math.sqrt(2 / 3), CLOSED_FORM_TOL); // equator: 1 − 2/6 = 2/3 independent of a
    // dimensionless: no geometric value (DESIGN: "geometric ... where it has a dimension")
    expect(rate.geometric).toBeUndefined();

    const zamo = q(res, 'zamoClockRate');
    expect(zamo.unit).toBe('1');
    expectRel(zamo.value, expected.zamoClockRate, CLOSED_FORM_TOL);
    // lapse² + v_flow² = 1 (catalogue: α = sqrt(1 − v²/c²))
    expectRel(zamo.value! ** 2 + flow.geometric! ** 2, 1, CLOSED_FORM_TOL);

    const drag = q(res, 'frameDragRate');
    expect(drag.unit).toBe('rad/s');
    expectRel(drag.geometric, expected.frameDragRate, CLOSED_FORM_TOL);
    expectRel(drag.value, expected.frameDragRate / res.body.tg.value, CLOSED_FORM_TOL);

    // Escape speed equals the flow speed outside the horizon (DESIGN, physics conventions).
    expect(q(res, 'escapeSpeed').value).toBe(flow.value);

    // The echo: 10 Msun, a/M = 0.9, r = 6 rg exactly, equator, outside the ergoregion.
    expect(res.body.kind).toBe('blackHole');
    expect(res.body.family).toBe('kerr');
    expect(res.body.spin).toBe(0.9);
    expectRel(res.body.gm.value, 10 * GM_SUN, 1e-15); // GM passes through G·(GM/G): one or two roundings
    expectRel(res.body.rg.value, (10 * GM_SUN) / C ** 2, 1e-15);
    expect(res.point.r.geometric).toBe(6);
    expectRel(res.point.r.value, (6 * 10 * GM_SUN) / C ** 2, 1e-15);
    expect(res.point.theta.value).toBe(Math.PI / 2);
    expect(res.point.theta.degrees).toBe(90);
    expect(res.point.region).toBe('outside');
    expect(res.service.name).toBe('spacetide');
    expect(res.notes.length).toBeGreaterThan(0);
  });

  it('reports offsets as 1 − rate and the redshift as 1/rate − 1', async () => {
    const res = ok(await get('mass=10%20Msun&spin=0.9&r=6%20rg'));
    const rate = q(res, 'staticClockRate').value!;
    // At 18% offsets there is no cancellation to speak of: plain arithmetic is good to ~1e-15.
    expectRel(q(res, 'staticClockOffset').value, 1 - rate, 1e-14);
    expectRel(q(res, 'zamoClockOffset').value, 1 - q(res, 'zamoClockRate').value!, 1e-14);
    expectRel(q(res, 'redshiftToInfinity').value, 1 / rate - 1, 1e-14);
  });
});

describe('GET and POST agree', () => {
  it('gives the same document for the same body and point', async () => {
    const viaGet = ok(await get('mass=10%20Msun&spin=0.9&r=6%20rg'));
    const viaPost = ok(await post({ body: { mass: '10 Msun', spin: 0.9 }, point: { r: '6 rg' } }));
    expect(viaPost).toEqual(viaGet);
  });

  it('gives the same document for a preset with altitude and theta', async () => {
    const viaGet = ok(await get('body=earth&altitude=400%20km&theta=60%20deg'));
    const viaPost = ok(await post({ body: 'earth', point: { altitude: '400 km', theta: '60 deg' } }));
    expect(viaPost).toEqual(viaGet);
  });
});

describe('presets with altitude', () => {
  it('earth at the surface: the static clock offset is 1 − sqrt(1 − 2GM/(Rc²)) to full precision', async () => {
    const res = ok(await get('body=earth&altitude=0'));
    expect(res.body.preset).toBe('earth');
    expect(res.body.kind).toBe('bodyWithSurface');
    expectRel(res.body.gm.value, GM_EARTH, 1e-15);
    expect(res.body.radius?.value).toBe(R_EARTH);
    expect(res.point.altitude?.value).toBe(0);
    expect(res.point.r.value).toBe(R_EARTH);
    // In the equatorial plane g_tt = −(1 − 2M/r) for any spin (Q = 0), so the offset has a closed form,
    // evaluated here without cancellation.
    const x = (2 * GM_EARTH) / (R_EARTH * C * C);
    const offset = -Math.expm1(0.5 * Math.log1p(-x));
    // The naive 1 − rate would lose ~9 digits here (offset ~7e-10); 1e-12 demands the cancellation-free form.
    expectRel(q(res, 'staticClockOffset').value, offset, 1e-12);
    expectRel(q(res, 'staticClockOffset').value, 6.9535e-10, 1e-4); // GM/(Rc²) ≈ 6.95e-10, common practice
    // The Earth's spin (a ≈ 738 M at R ≈ 1.4e9 M) changes the flow speed by ~(a/R)² ≈ 3e-13.
    expectRel(q(res, 'flowSpeed').value, Math.sqrt((2 * GM_EARTH) / R_EARTH), 1e-9);
  });

  it('earth: a GNSS-height clock gains ~45.7 µs/day on a ground clock from gravity alone', async () => {
    const ground = ok(await post({ body: 'earth', point: { altitude: 0 } }));
    // GPS semi-major axis 26 561.75 km (from memory), as an altitude above the WGS84 equatorial radius.
    const orbit = ok(await post({ body: 'earth', point: { altitude: `${26_561.75 - R_EARTH / 1000} km` } }));
    expectRel(orbit.point.r.value, 26_561_750, 1e-12);
    expectRel(orbit.point.altitude?.value, 26_561_750 - R_EARTH, 1e-12);
    const gainPerDay = (q(ground, 'staticClockOffset').value! - q(orbit, 'staticClockOffset').value!) * 86_400;
    // ~45.7 µs/day gravitational part of the GPS clock correction (common practice); 2% covers the
    // choice of Earth radius and the rounding of the quoted figure.
    expectRel(gainPerDay, 45.7e-6, 0.02);
  });

  it('sun at the surface: the gravitational redshift is ~636 m/s in velocity units', async () => {
    const res = ok(await post({ body: 'sun', point: { altitude: '0 km' } }));
    expect(res.body.preset).toBe('sun');
    expectRel(res.body.gm.value, GM_SUN, 1e-15);
    expect(res.body.radius?.value).toBe(R_SUN);
    const z = q(res, 'redshiftToInfinity').value!;
    const x = (2 * GM_SUN) / (R_SUN * C * C);
    // 1 + z = (1 − 2M/r)^(−1/2) in the equatorial plane, for any spin (Q = 0).
    expectRel(z, Math.expm1(-0.5 * Math.log1p(-x)), 1e-12);
    // Solar gravitational redshift c·z ≈ 636 m/s (common practice); 0.5% covers the quoted rounding.
    expectRel(z * C, 636, 0.005);
  });

  it('sun 1 Rsun above the surface: r = 2 R and the echo carries the altitude', async () => {
    const res = ok(await get('body=sun&altitude=1%20Rsun'));
    expect(res.point.altitude?.value).toBe(R_SUN);
    expect(res.point.r.value).toBe(2 * R_SUN);
    expect(res.point.region).toBe('outside');
    const x = (2 * GM_SUN) / (2 * R_SUN * C * C);
    expectRel(q(res, 'staticClockOffset').value, -Math.expm1(0.5 * Math.log1p(-x)), 1e-12);
  });
});

describe('unit equivalences', () => {
  it('r in rg and r in metres give the same answer', async () => {
    const inRg = ok(await get('mass=10%20Msun&spin=0.9&r=6%20rg'));
    const metres = 6 * inRg.body.rg.value;
    const inMetres = ok(await post({ body: { mass: '10 Msun', spin: 0.9 }, point: { r: metres } }));
    const inKm = ok(await get(`mass=10%20Msun&spin=0.9&r=${encodeURIComponent(`${metres / 1000} km`)}`));
    for (const other of [inMetres, inKm]) {
      // r/rg = 6 up to a rounding or two in the metre round trip (and km → m); quantities follow it.
      expectRel(other.point.r.geometric, 6, 1e-14);
      for (const [name, v] of Object.entries(inRg.quantities)) {
        const w = other.quantities[name]!;
        expect(w.unit).toBe(v.unit);
        // Derivatives of these smooth functions are O(1) at r = 6: a 1e-14 change in r moves them < 1e-12.
        expectRel(w.value, v.value!, 1e-12);
      }
    }
  });

  it('theta "60 deg" and theta π/3 rad give the same answer', async () => {
    const deg = ok(await get('mass=10%20Msun&spin=0.9&r=6%20rg&theta=60%20deg'));
    const rad = ok(await post({ body: { mass: '10 Msun', spin: 0.9 }, point: { r: '6 rg', theta: Math.PI / 3 } }));
    // 60° is converted by the unit parser; one rounding apart from Math.PI/3.
    expectRel(deg.point.theta.value, Math.PI / 3, 1e-15);
    expectRel(deg.point.theta.degrees, 60, 1e-14);
    for (const [name, v] of Object.entries(rad.quantities)) {
      expectRel(deg.quantities[name]!.value, v.value!, 1e-12); // a 1-ulp change in θ moves these by ~1e-16
    }
    // And the values are those of θ = 60°, not of the equator.
    const expected = kerr(0.9, 6, Math.PI / 3);
    expectRel(q(deg, 'flowSpeed').geometric, expected.flowSpeed, CLOSED_FORM_TOL);
    expectRel(q(deg, 'zamoClockRate').value, expected.zamoClockRate, CLOSED_FORM_TOL);
    expectRel(q(deg, 'staticClockRate').value, expected.staticClockRate, CLOSED_FORM_TOL);
    expectRel(q(deg, 'frameDragRate').geometric, expected.frameDragRate, CLOSED_FORM_TOL);
    expect(q(deg, 'staticClockRate').value).not.toBeCloseTo(q(ok(await get('mass=10%20Msun&spin=0.9&r=6%20rg')), 'staticClockRate').value!, 6);
  });
});

describe('quantities that do not exist at the point are null with a reason', () => {
  it('in the ergoregion of a spin-0.9 hole: no static observer, but a ZAMO', async () => {
    // a = 0.9: r+ = 1 + sqrt(0.19) ≈ 1.436, equatorial ergosurface at r = 2; r = 1.5 lies between.
    const res = ok(await get('mass=1%20Msun&spin=0.9&r=1.5%20rg'));
    expect(res.point.region).toBe('ergoregion');
    for (const name of ['staticClockRate', 'staticClockOffset', 'redshiftToInfinity', 'hoverAcceleration']) {
      const v = q(res, name);
      expect(v.value, name).toBeNull();
      expect(v.reason, name).toBeTypeOf('string');
      expect(v.reason!.length, name).toBeGreaterThan(0);
    }
    expect(q(res, 'staticClockRate').reason).toMatch(/ergo/i);
    expect(q(res, 'hoverAcceleration').geometric).toBeNull();
    const expected = kerr(0.9, 1.5, Math.PI / 2);
    const zamo = q(res, 'zamoClockRate');
    expect(zamo.reason).toBeUndefined();
    expectRel(zamo.value, expected.zamoClockRate, CLOSED_FORM_TOL);
    const flow = q(res, 'flowSpeed');
    expectRel(flow.geometric, expected.flowSpeed, CLOSED_FORM_TOL);
    expect(flow.value!).toBeLessThan(C);
    expect(q(res, 'escapeSpeed').value).toBe(flow.value);
    expectRel(q(res, 'frameDragRate').geometric, expected.frameDragRate, CLOSED_FORM_TOL);
  });

  it('between the horizons: space flows faster than light and nothing escapes', async () => {
    // a = 0.9: r− ≈ 0.564 < r = 1 < r+ ≈ 1.436.
    const res = ok(await post({ body: { mass: '1 Msun', spin: 0.9 }, point: { r: '1 rg' } }));
    expect(res.point.region).toBe('betweenHorizons');
    const flow = q(res, 'flowSpeed');
    expect(flow.geometric!).toBeGreaterThan(1);
    expect(flow.value!).toBeGreaterThan(C);
    expectRel(flow.geometric, kerr(0.9, 1, Math.PI / 2).flowSpeed, CLOSED_FORM_TOL);
    const escape = q(res, 'escapeSpeed');
    expect(escape.value).toBeNull();
    expect(escape.geometric).toBeNull();
    expect(escape.reason).toMatch(/horizon/);
    for (const name of ['staticClockRate', 'zamoClockRate', 'redshiftToInfinity']) {
      expect(q(res, name).value, name).toBeNull();
      expect(q(res, name).reason, name).toBeTypeOf('string');
    }
  });

  it('every null quantity carries a reason and every number is finite', async () => {
    const cases = [
      'mass=1%20Msun&spin=0.9&r=1.5%20rg',
      'mass=1%20Msun&spin=0.9&r=1%20rg',
      'mass=1%20Msun&spin=0.9&r=0.3%20rg',
      'mass=1%20Msun&charge=0.9&r=0.3%20rg',
      'mass=1%20Msun&r=2%20rg',
    ];
    for (const c of cases) {
      const res = ok(await get(c));
      for (const [name, v] of Object.entries(res.quantities)) {
        if (v.value === null) expect(v.reason, `${c} ${name}`).toMatch(/\S/);
        else expect(Number.isFinite(v.value), `${c} ${name}`).toBe(true);
      }
    }
  });
});

describe('response headers', () => {
  it('is application/json and carries a generated x-request-id', async () => {
    const a = await get('body=earth&altitude=0');
    const b = await get('body=earth&altitude=0');
    ok(a);
    ok(b);
    expect(a.headers['x-request-id']).not.toBe(b.headers['x-request-id']);
  });

  it('echoes a safe incoming x-request-id', async () => {
    const res = await get('body=earth&altitude=0', { 'x-request-id': 'lab-pipeline.run:42_a' });
    ok(res);
    expect(res.headers['x-request-id']).toBe('lab-pipeline.run:42_a');
  });

  it('replaces an unsafe incoming x-request-id instead of echoing it', async () => {
    const res = await get('body=earth&altitude=0', { 'x-request-id': 'evil id <script>' });
    ok(res);
    expect(res.headers['x-request-id']).not.toBe('evil id <script>');
    expect(String(res.headers['x-request-id'])).toMatch(/^[A-Za-z0-9._:-]{1,64}$/);
  });
});

describe('curvature invariants', () => {
  it('kretschmannScalar in m⁻⁴ (48 rg²/r⁶ for Schwarzschild) and ricciSquared 0 without charge', async () => {
    const q = ok(await get('mass=10%20Msun&r=10%20rg')).quantities;
    const rg = (10 * GM_SUN) / (C * C);
    expect(q.kretschmannScalar!.unit).toBe('m^-4');
    // 1e-12: 48/r⁶ in units of M, then one division by rg⁴.
    expectRel(q.kretschmannScalar!.value, (48 * rg ** 2) / (10 * rg) ** 6, 1e-12);
    expectRel(q.kretschmannScalar!.geometric, 48 / 1e6, 1e-14);
    expect(q.ricciSquared!.value).toBe(0);
  });

  it('with charge ricciSquared = 4Q⁴/Σ⁴ (geometric) and both are defined inside the horizons', async () => {
    const q = ok(await get('mass=10%20Msun&spin=0.6&charge=0.5&r=0.9%20rg&theta=1')).quantities;
    const sigma = 0.81 + 0.36 * Math.cos(1) ** 2;
    expectRel(q.ricciSquared!.geometric, (4 * 0.5 ** 4) / sigma ** 4, 1e-13);
    expect(Number.isFinite(q.kretschmannScalar!.value)).toBe(true);
  });

  it('far away, where they underflow double precision, they are null with the reason', async () => {
    const q = ok(await get('mass=1%20Msun&charge=0.5&r=1e58%20rg')).quantities;
    for (const n of ['kretschmannScalar', 'ricciSquared'] as const) {
      expect(q[n]!.value).toBeNull();
      expect(q[n]!.reason).toMatch(/below the range of double precision/);
    }
  });
});
