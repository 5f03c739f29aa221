/**
 * Published check values, each with its source named beside it. Values recalled rather than looked up
 * are marked "from memory"; facts of the trade are marked "common practice".
 */
import { describe, expect, it } from 'vitest';
import { computeLocal } from '../src/api/local.js';
import { computeSpacetime } from '../src/api/spacetime.js';
import { computeTidal } from '../src/api/tidal.js';
import { C, G, GM_SUN, HBAR, K_B } from '../src/units/constants.js';

const local = (body: Parameters<typeof computeLocal>[0]['body'], point: Parameters<typeof computeLocal>[0]['point']) =>
  computeLocal({ body, point }).quantities;

describe('the Sun', () => {
  it("Schwarzschild radius 2GM/c² ≈ 2953.25 m from the nominal solar mass parameter (IAU 2015 Resolution B3)", () => {
    const q = computeSpacetime({ body: { mass: '1 Msun' } }).quantities;
    // 2 × 1.3271244e20 / 299792458² = 2953.2500770… m (1e-7 relative covers the quoted rounding);
    // against the constant itself 1e-12: only the G·(GM/G) round trip rounds.
    expect(Math.abs(q.schwarzschildRadius!.value! / 2953.25 - 1)).toBeLessThan(1e-7);
    expect(Math.abs(q.schwarzschildRadius!.value! / ((2 * GM_SUN) / (C * C)) - 1)).toBeLessThan(1e-12);
  });

  it('Hawking temperature of a one-solar-mass Schwarzschild hole ≈ 6.17e-8 K (Hawking 1975, Commun. Math. Phys. 43:199)', () => {
    const q = computeSpacetime({ body: { mass: '1 Msun' } }).quantities;
    const expected = (HBAR * C ** 3) / (8 * Math.PI * G * (GM_SUN / G) * K_B);
    expect(Math.abs(q.hawkingTemperature!.value! / expected - 1)).toBeLessThan(1e-12);
    expect(q.hawkingTemperature!.value!).toBeCloseTo(6.17e-8, 9); // ≈ 6.2e-8 K as usually quoted
  });

  it('gravitational redshift at the solar photosphere ≈ 2.12e-6 (≈ 636 m/s), as measured since Brault (1962) — from memory', () => {
    const q = local('sun', { altitude: 0 });
    // GM/(Rc²) = 1.3271244e20 / (6.957e8 · c²) = 2.1224e-6; z = that to first order.
    expect(q.redshiftToInfinity!.value!).toBeCloseTo(2.1224e-6, 9);
    expect(q.redshiftToInfinity!.value! * C).toBeCloseTo(636.3, 0);
  });
});

describe('the Earth (IERS 2010 GM, WGS84 equatorial radius)', () => {
  it('flow speed equals escape speed ≈ 11.19 km/s at the equatorial surface (common practice: ~11 km/s)', () => {
    const q = local('earth', { altitude: 0 });
    // √(2GM/R) = √(2 × 3.986004418e14 / 6378137) = 11179.9 m/s in the non-rotating part alone.
    expect(q.flowSpeed!.value!).toBeCloseTo(Math.sqrt((2 * 3.986004418e14) / 6378137), 3);
    expect(q.escapeSpeed!.value!).toBe(q.flowSpeed!.value!);
    expect(q.flowSpeed!.value! / 1000).toBeCloseTo(11.18, 2);
  });

  it('hover acceleration ≈ 9.80 m/s² at the equatorial surface (common practice: 9.8 m/s²; GM/R² = 9.798 without rotation)', () => {
    const q = local('earth', { altitude: 0 });
    expect(q.hoverAcceleration!.value!).toBeCloseTo(3.986004418e14 / 6378137 ** 2, 6);
    expect(q.hoverAcceleration!.value!).toBeCloseTo(9.8, 1);
  });

  it('clock offset at the surface ≈ 6.95e-10 (GM/(Rc²); cf. L_G = 6.969290134e-10 on the rotating geoid, IERS 2010)', () => {
    const q = local('earth', { altitude: 0 });
    const x = (2 * 3.986004418e14) / (6378137 * C * C);
    expect(Math.abs(q.staticClockOffset!.value! / (x / 2 + (x * x) / 8) - 1)).toBeLessThan(1e-14);
    // L_G includes the centrifugal potential of the geoid (≈ 1.2e-12 of rotation at the equator
    // plus the J2 term); the static Kerr exterior lacks both, so agreement is to ~0.3%.
    expect(Math.abs(q.staticClockOffset!.value! / 6.969290134e-10 - 1)).toBeLessThan(3e-3);
  });

  it('Pound & Rebka (1960, Phys. Rev. Lett. 4:337): fractional shift over 22.5 m ≈ 2.46e-15', () => {
    const low = local('earth', { altitude: 0 }).staticClockOffset!.value!;
    const high = local('earth', { altitude: 22.5 }).staticClockOffset!.value!;
    // gh/c² = 9.798 × 22.5 / c² = 2.453e-15; the published prediction is 2.46e-15 (with local g).
    expect(low - high).toBeCloseTo(2.4528e-15, 18);
    expect(Math.abs((low - high) / 2.46e-15 - 1)).toBeLessThan(0.01);
  });

  it('a 1 m height difference shifts clocks by ≈ 1.09e-16 (gh/c²; the scale of optical-clock geodesy, common practice)', () => {
    const a = local('earth', { altitude: 0 }).staticClockOffset!.value!;
    const b = local('earth', { altitude: 1 }).staticClockOffset!.value!;
    expect(Math.abs((a - b) / ((9.798 * 1) / (C * C)) - 1)).toBeLessThan(1e-3);
  });
});

describe('tides and curvature', () => {
  it('Schwarzschild tides on a radial free-faller: 2GML/r³ stretch along the radius, GML/r³ squeeze across it (Misner, Thorne & Wheeler 1973, ch. 31, §31.2)', () => {
    // A 2 m probe falling from rest at infinity, 1000 km from a 10-solar-mass hole.
    const gm = 10 * GM_SUN;
    const r = 1e6;
    const L = 2;
    const t = computeTidal({ body: { mass: '10 Msun' }, point: { r: '1000 km' }, length: '2 m', observers: ['river'] });
    const [stretch, sq1, sq2] = t.observers[0]!.principal!;
    expect(stretch!.effect).toBe('stretch');
    expect(stretch!.direction.radial).toBeCloseTo(1, 14);
    // 1e-12: the closed form through GM/c² and GM/c³ conversions (a few roundings).
    expect(Math.abs(stretch!.differentialAcceleration.value! / ((2 * gm * L) / r ** 3) - 1)).toBeLessThan(1e-12);
    for (const s of [sq1!, sq2!]) {
      expect(s.effect).toBe('squeeze');
      expect(Math.abs(s.differentialAcceleration.value! / (-(gm * L) / r ** 3) - 1)).toBeLessThan(1e-12);
    }
  });

  it('Kretschmann scalar 48G²M²/(c⁴r⁶) for Schwarzschild (common practice)', () => {
    const gm = GM_SUN;
    const r = 3e4;
    const k = local({ mass: '1 Msun' }, { r: '30 km' }).kretschmannScalar!.value!;
    expect(Math.abs(k / ((48 * gm * gm) / (C ** 4 * r ** 6)) - 1)).toBeLessThan(1e-12);
  });

  it('Hills mass ≈ 1e8 solar masses for a Sun-like star (Hills 1975, Nature 254:295; Rees 1988, Nature 333:523 — from memory)', () => {
    const t = computeTidal({ body: { mass: '1e6 Msun' }, point: { r: '10 rg' }, star: 'sun' });
    // (R☉c²/(2G))^{3/2} m☉^{-1/2} = 1.14e8 M☉ with the nominal R☉ and GM☉; quoted as "≈ 1e8".
    const hills = t.disruption!.hillsMassSolar!;
    expect(hills).toBeGreaterThan(0.8e8);
    expect(hills).toBeLessThan(1.5e8);
    expect(Math.abs(hills / ((6.957e8 * C * C) / (2 * GM_SUN)) ** 1.5 - 1)).toBeLessThan(1e-12);
  });
});
