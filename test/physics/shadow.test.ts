/**
 * The Kerr–Newman shadow (src/physics/shadow.ts, photon-region.ts, shadow-angular-size.ts) against
 * test/fixtures/python/light.py (Bardeen's spherical photon orbits at 40 digits, the visible range and
 * vertical extent by mpmath findroot, mean radius and circularity by Gauss–Legendre quadrature of the
 * textbook expressions with symbolic derivatives), the closed cases (Schwarzschild, Reissner–Nordström,
 * face-on, extreme Kerr), the static observer's angular radius (Synge), published values, and the
 * refusals.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { equatorialPhotonOrbit } from '../../src/physics/deflection.js';
import { sphericalPhotonOrbit } from '../../src/physics/photon-region.js';
import { shadow, type Shadow, type ShadowResult } from '../../src/physics/shadow.js';
import { distantAngularSize, staticObserverShadowRadius } from '../../src/physics/shadow-angular-size.js';
import { C, GM_SUN, PARSEC } from '../../src/units/constants.js';

interface ShadowCase {
  a: number;
  q: number;
  inclination: number;
  photonRegion: { prograde: number; retrograde: number };
  polarOrbit: number;
  visibleRange: { inner: number; outer: number };
  horizontalDiameter: number;
  verticalDiameter: number;
  centreDisplacement: number;
  meanRadius: number;
  circularityDeviation: number;
  points: { r: number; xi: number; eta: number; alpha: number; beta: number | null }[];
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/light.json', import.meta.url), 'utf8')) as {
  dps: number;
  shadow: ShadowCase[];
  staticShadow: { q: number; r: number; angularRadius: number; photonSphere: number; criticalImpactParameter: number }[];
};

const EPS = Number.EPSILON;
const DEG = Math.PI / 180;
const SQRT27 = Math.sqrt(27);

function ok(r: ShadowResult): Shadow {
  if (!r.ok) throw new Error(`refused: ${r.reason}`);
  return r;
}

describe('shadow against mpmath (fixture)', () => {
  it('covers spins, charges and inclinations, including near-extreme, tiny spin and near face-on', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(fixture.shadow.length).toBeGreaterThanOrEqual(10);
    expect(fixture.shadow.some((c) => c.a >= 0.9999)).toBe(true);
    expect(fixture.shadow.some((c) => c.a <= 0.001)).toBe(true);
    expect(fixture.shadow.some((c) => c.inclination < 1e-4)).toBe(true);
    expect(fixture.shadow.some((c) => c.inclination > Math.PI / 2)).toBe(true);
  });

  for (const c of fixture.shadow) {
    const name = `a=${c.a} q=${c.q} i=${(c.inclination / DEG).toPrecision(4)}°`;
    it(`${name}: region, diameters, centre, mean radius, circularity`, () => {
      const s = ok(shadow({ a: c.a, q: c.q }, c.inclination, 512));
      expect(s.shape).toBe('curve');
      // 8 ulp: closed forms polished by Newton's method on simple roots.
      expect(Math.abs(s.photonRegion.prograde - c.photonRegion.prograde)).toBeLessThanOrEqual(8 * EPS * c.photonRegion.prograde);
      expect(Math.abs(s.photonRegion.retrograde - c.photonRegion.retrograde)).toBeLessThanOrEqual(8 * EPS * c.photonRegion.retrograde);
      expect(Math.abs(s.visibleRange.inner - c.visibleRange.inner)).toBeLessThanOrEqual(8 * EPS * c.visibleRange.inner);
      expect(Math.abs(s.visibleRange.outer - c.visibleRange.outer)).toBeLessThanOrEqual(8 * EPS * c.visibleRange.outer);
      // Diameters and centre: closed-form ends and a golden-section maximum (its value is quadratic in
      // the argument's error): 1e-14 of the size. The centre is a difference of O(5) values.
      const size = c.horizontalDiameter;
      expect(Math.abs(s.horizontalDiameter - c.horizontalDiameter)).toBeLessThanOrEqual(1e-14 * size);
      expect(Math.abs(s.verticalDiameter - c.verticalDiameter)).toBeLessThanOrEqual(1e-14 * size);
      expect(Math.abs(s.centreDisplacement - c.centreDisplacement)).toBeLessThanOrEqual(1e-14 * size);
      // Mean radius and ΔC: the midpoint rule converges exponentially and is doubled until two levels
      // agree to 1e-12 of R̄ (the rounding near the ends of the curve grows with the node count).
      expect(Math.abs(s.meanRadius - c.meanRadius)).toBeLessThanOrEqual(1e-12 * c.meanRadius);
      expect(Math.abs(s.circularityDeviation - c.circularityDeviation)).toBeLessThanOrEqual(1e-12);
      expect(s.diameterAsymmetry).toBe((s.horizontalDiameter - s.verticalDiameter) / s.verticalDiameter);
    });

    it(`${name}: spherical photon orbits and celestial coordinates at given r`, () => {
      const sinI = Math.sin(c.inclination);
      const cos2 = Math.cos(c.inclination) ** 2;
      for (const p of c.points) {
        const o = sphericalPhotonOrbit({ a: c.a, q: c.q }, p.r);
        const h = 1e-7 * p.r;
        const up = sphericalPhotonOrbit({ a: c.a, q: c.q }, p.r + h);
        const down = sphericalPhotonOrbit({ a: c.a, q: c.q }, p.r - h);
        // Each is good to the conditioning of its input (r is a double: 16 ulp of r times the slope)
        // plus 1e-13 of the size of its terms (ξ ~ b_c, η ~ 27).
        const tolXi = 16 * EPS * p.r * Math.abs((up.xi - down.xi) / (2 * h)) + 1e-14 * (Math.abs(p.xi) + 10);
        const tolEta = 16 * EPS * p.r * Math.abs((up.eta - down.eta) / (2 * h)) + 1e-13 * (Math.abs(p.eta) + 10);
        expect(Math.abs(o.xi - p.xi)).toBeLessThanOrEqual(tolXi);
        expect(Math.abs(o.eta - p.eta)).toBeLessThanOrEqual(tolEta);
        // Bardeen's celestial coordinates from them.
        const alpha = -o.xi / sinI;
        expect(Math.abs(alpha - p.alpha)).toBeLessThanOrEqual(tolXi / sinI);
        const beta2 = o.eta + c.a * c.a * cos2 - alpha * alpha * cos2;
        const ref2 = p.beta === null ? 0 : p.beta * p.beta;
        expect(Math.abs(beta2 - ref2)).toBeLessThanOrEqual(tolEta + 2 * Math.abs(alpha) * (tolXi / sinI) * cos2 + 1e-13 * (o.eta + alpha * alpha));
      }
    });
  }

  it('every sampled point lies on the curve: its (α, β) follow from its orbit radius', () => {
    for (const c of fixture.shadow) {
      const s = ok(shadow({ a: c.a, q: c.q }, c.inclination, 64));
      const sinI = Math.sin(c.inclination);
      const cos2 = Math.cos(c.inclination) ** 2;
      for (let k = 0; k < 64; k++) {
        const r = s.orbitRadius[k]!;
        expect(r).toBeGreaterThanOrEqual(s.visibleRange.inner);
        expect(r).toBeLessThanOrEqual(s.visibleRange.outer);
        if (sinI < 1e-3) continue; // there ξ(r) from a rounded r is too coarse a check (see above)
        const o = sphericalPhotonOrbit({ a: c.a, q: c.q }, r);
        const alpha = -o.xi / sinI;
        expect(Math.abs(s.alpha[k]! - alpha)).toBeLessThanOrEqual(1e-12 * 10);
        const beta2 = Math.max(o.eta + c.a * c.a * cos2 - alpha * alpha * cos2, 0);
        expect(Math.abs(s.beta[k]! ** 2 - beta2)).toBeLessThanOrEqual(1e-11 * 30);
      }
    }
  });
});

describe('closed cases', () => {
  it('Schwarzschild: a circle of radius 3√3 at every inclination; Reissner–Nordström: radius b_c(Q)', () => {
    for (const i of [0, 0.3, Math.PI / 2, Math.PI]) {
      const s = ok(shadow({ a: 0, q: 0 }, i, 360));
      expect(s.shape).toBe('circle');
      expect(s.meanRadius).toBe(SQRT27);
      expect(s.horizontalDiameter).toBe(2 * SQRT27);
      expect(s.circularityDeviation).toBe(0);
      for (let k = 0; k < 360; k++) expect(Math.hypot(s.alpha[k]!, s.beta[k]!)).toBeCloseTo(SQRT27, 13);
    }
    for (const q of [0.5, 1]) {
      const s = ok(shadow({ a: 0, q }, 1, 16));
      const ref = fixture.staticShadow.find((x) => x.q === q)!;
      expect(Math.abs(s.meanRadius - ref.criticalImpactParameter)).toBeLessThanOrEqual(4 * EPS * ref.criticalImpactParameter);
    }
  });

  it('the general path meets the circle as a → 0: radius 3√3 to O(a²), centre shifted by 2a sin i', () => {
    for (const a of [1e-3, 1e-6, 1e-9]) {
      for (const i of [0.2, Math.PI / 2]) {
        const s = ok(shadow({ a, q: 0 }, i, 128));
        expect(s.shape).toBe('curve');
        expect(Math.abs(s.meanRadius - SQRT27)).toBeLessThanOrEqual(10 * a * a + 1e-13);
        expect(Math.abs(s.horizontalDiameter - 2 * SQRT27)).toBeLessThanOrEqual(10 * a * a + 1e-13);
        expect(Math.abs(s.verticalDiameter - 2 * SQRT27)).toBeLessThanOrEqual(10 * a * a + 1e-13);
        // First order in a: the shadow moves by 2a sin i towards the retrograde side (ξ(r) = −(r − 3)
        // … expanded about r = 3 gives a shift of 2a in ξ at every β).
        expect(Math.abs(s.centreDisplacement - 2 * a * Math.sin(i))).toBeLessThanOrEqual(10 * a * a + 1e-13);
      }
    }
  });

  it('face-on (i = 0, π, or sin i < 1e-8): a circle of radius √(η + a²) at the polar orbit', () => {
    const s = ok(shadow({ a: 0.9, q: 0.3 }, 0, 100));
    expect(s.shape).toBe('circle');
    const r = s.visibleRange.inner;
    const o = sphericalPhotonOrbit({ a: 0.9, q: 0.3 }, r);
    expect(Math.abs(o.xi)).toBeLessThan(1e-14);
    expect(s.meanRadius).toBeCloseTo(Math.sqrt(o.eta + 0.81), 14);
    const pi = ok(shadow({ a: 0.9, q: 0.3 }, Math.PI, 100));
    expect(pi.meanRadius).toBe(s.meanRadius);
    // Continuity with a nearly face-on view: R̄ changes at O(sin²i).
    const near = ok(shadow({ a: 0.9, q: 0.3 }, 1e-4, 100));
    expect(near.shape).toBe('curve');
    expect(Math.abs(near.meanRadius - s.meanRadius)).toBeLessThan(1e-7);
    // Extreme Kerr face-on: polar orbit r = 1 + √2, radius 2(1 + √2) (from r³ − 3r² + r + 1 = 0).
    const ext = ok(shadow({ a: 1, q: 0 }, 0, 8));
    expect(ext.meanRadius).toBeCloseTo(2 * (1 + Math.SQRT2), 13);
  });

  it('extreme Kerr seen edge-on: straight edge at α = −2 from β = −√3 to √3, right end at α = 7', () => {
    const s = ok(shadow({ a: 1, q: 0 }, Math.PI / 2, 512));
    expect(s.alpha[0]).toBe(-2);
    expect(s.horizontalDiameter).toBeCloseTo(9, 13);
    expect(s.centreDisplacement).toBeCloseTo(2.5, 13);
    // Next to the edge the curve leaves (−2, ±√3): ξ → 2 and η → 3 as r → 1 (the near-extreme forms).
    expect(s.alpha[1]!).toBeLessThan(-1.99);
    expect(Math.abs(s.beta[1]! - Math.sqrt(3))).toBeLessThan(1e-2);
    // The edge is included in the averages in closed form; the rest converges like 1/K² here.
    expect(s.meanRadius).toBeGreaterThan(4.9);
    expect(s.meanRadius).toBeLessThan(5.0);
    const near = ok(shadow({ a: 1 - 1e-9, q: 0 }, Math.PI / 2, 64));
    expect(Math.abs(near.meanRadius - s.meanRadius)).toBeLessThan(1e-5);
  });

  it('i and π − i give the same curve; the curve is symmetric in β and shifts towards +α', () => {
    const a = ok(shadow({ a: 0.7, q: 0.3 }, 1.1, 200));
    const b = ok(shadow({ a: 0.7, q: 0.3 }, Math.PI - 1.1, 200));
    for (let k = 0; k < 200; k++) {
      expect(Math.abs(a.alpha[k]! - b.alpha[k]!)).toBeLessThan(1e-13);
      expect(Math.abs(a.beta[k]! - b.beta[k]!)).toBeLessThan(1e-12);
      if (k > 0) {
        expect(Math.abs(a.beta[k]! + a.beta[200 - k]!)).toBeLessThan(1e-12);
        expect(Math.abs(a.alpha[k]! - a.alpha[200 - k]!)).toBeLessThan(1e-13);
      }
    }
    expect(a.centreDisplacement).toBeGreaterThan(0);
    expect(a.beta[0]).toBe(0);
    expect(a.beta[100]).toBe(0);
    expect(a.beta[50]!).toBeGreaterThan(0);
  });

  it('photon region endpoints are the equatorial photon orbits of the deflection module', () => {
    for (const [a, q] of [
      [0.5, 0],
      [0.6, 0.5],
      [0.1, Math.sqrt(0.99)],
    ] as const) {
      const s = ok(shadow({ a, q }, 1, 16));
      expect(Math.abs(s.photonRegion.prograde - equatorialPhotonOrbit({ a, q }, 'prograde')!.radius)).toBeLessThanOrEqual(4 * EPS * 3);
      expect(Math.abs(s.photonRegion.retrograde - equatorialPhotonOrbit({ a, q }, 'retrograde')!.radius)).toBeLessThanOrEqual(4 * EPS * 4);
    }
  });

  it('random black holes give a closed convex-looking curve with consistent summaries (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: Math.PI, noNaN: true }),
        fc.integer({ min: 8, max: 300 }),
        (a, frac, i, n) => {
          const q = frac * Math.sqrt(Math.max(0, 1 - a * a)) * 0.999;
          const s = ok(shadow({ a, q }, i, n));
          let minA = Infinity;
          let maxA = -Infinity;
          let maxB = 0;
          for (let k = 0; k < n; k++) {
            expect(Number.isFinite(s.alpha[k]!) && Number.isFinite(s.beta[k]!)).toBe(true);
            minA = Math.min(minA, s.alpha[k]!);
            maxA = Math.max(maxA, s.alpha[k]!);
            maxB = Math.max(maxB, Math.abs(s.beta[k]!));
          }
          // Samples lie within the extents (exactly at the ends of the horizontal one).
          expect(maxA - minA).toBeLessThanOrEqual(s.horizontalDiameter * (1 + 1e-12));
          expect(2 * maxB).toBeLessThanOrEqual(s.verticalDiameter * (1 + 1e-12));
          expect(s.meanRadius).toBeGreaterThan(0.45 * Math.min(s.horizontalDiameter, s.verticalDiameter));
          expect(s.meanRadius).toBeLessThan(0.55 * Math.max(s.horizontalDiameter, s.verticalDiameter));
          expect(s.circularityDeviation).toBeGreaterThanOrEqual(0);
          expect(s.circularityDeviation).toBeLessThan(0.1);
          // The Kerr–Newman shadow lies between extreme Kerr face-on (2(1 + √2)) and Schwarzschild.
          expect(s.meanRadius).toBeLessThanOrEqual(SQRT27 * (1 + 1e-12));
        },
      ),
      { numRuns: 80 },
    );
  });
});

describe('angular size', () => {
  for (const c of fixture.staticShadow) {
    it(`Synge: static observer at r=${c.r}, q=${c.q}`, () => {
      const r = staticObserverShadowRadius({ a: 0, q: c.q }, c.r);
      if (!r.ok) throw new Error(r.reason);
      // 4 ulp: atan2 of two products free of cancellation (also next to the photon sphere, where the
      // reference's arcsin of a number next to 1 is evaluated at 40 digits).
      expect(Math.abs(r.angularRadius - c.angularRadius)).toBeLessThanOrEqual(4 * EPS * c.angularRadius);
    });
  }

  it('Synge at the photon sphere is 90°, and far away it tends to the distant size b_c/D (1 − M/D)', () => {
    const at = staticObserverShadowRadius({ a: 0, q: 0 }, 3);
    expect(at.ok && at.angularRadius).toBe(Math.PI / 2);
    for (const d of [1e4, 1e8]) {
      const synge = staticObserverShadowRadius({ a: 0, q: 0 }, d);
      const far = distantAngularSize({ a: 0, q: 0 }, SQRT27, d);
      if (!synge.ok || !far.ok) throw new Error('refused');
      // sin α = (3√3/D)√(1 − 2/D) = (3√3/D)(1 − 1/D + …): the distant form is off by ≈ M/D; the next
      // terms are −1/(2D²) from the root and +27/(6D²) from arcsin, ≈ 4/D².
      expect(Math.abs(synge.angularRadius / far.angle - 1 + 1 / d)).toBeLessThan(5 / d ** 2 + 1e-15);
    }
  });

  it('refuses what it cannot answer', () => {
    const cases: [{ ok: boolean; reason?: string; message?: string }, string][] = [
      [shadow({ a: 0.5, q: 0 }, -0.1, 64), 'inclinationOutOfRange'],
      [shadow({ a: 0.5, q: 0 }, Math.PI + 1e-9, 64), 'inclinationOutOfRange'],
      [shadow({ a: 0.5, q: 0 }, Number.NaN, 64), 'invalidInput'],
      [shadow({ a: 0.5, q: 0 }, 1, 7), 'invalidPointCount'],
      [shadow({ a: 0.5, q: 0 }, 1, 4097), 'invalidPointCount'],
      [shadow({ a: 0.5, q: 0 }, 1, 64.5), 'invalidPointCount'],
      [shadow({ a: 1, q: 0.1 }, 1, 64), 'nakedSingularity'],
      [shadow({ a: -0.1, q: 0 }, 1, 64), 'invalidInput'],
      [staticObserverShadowRadius({ a: 0, q: 0 }, 2.9), 'insidePhotonSphere'],
      [staticObserverShadowRadius({ a: 0.1, q: 0 }, 10), 'spinNotSupported'],
      [staticObserverShadowRadius({ a: 0, q: 1.1 }, 10), 'nakedSingularity'],
      [distantAngularSize({ a: 0.9, q: 0 }, 10, 3.5), 'insidePhotonSphere'], // retrograde orbit at 3.91
      [distantAngularSize({ a: 0, q: 0 }, 10, 0), 'invalidInput'],
    ];
    for (const [r, reason] of cases) {
      expect(r.ok, reason).toBe(false);
      if (!r.ok) {
        expect(r.reason).toBe(reason);
        expect((r.message ?? '').length).toBeGreaterThan(20);
      }
    }
    expect(shadow({ a: 0.5, q: 0 }, Math.PI, 4096).ok).toBe(true);
  });
});

describe('published values', () => {
  it('M87*: 6.5e9 M_sun at 16.8 Mpc gives GM/(c²D) ≈ 3.8 µas and a Schwarzschild shadow diameter ≈ 39.7 µas (EHT Collaboration 2019, ApJL 875:L1)', () => {
    const m = (6.5e9 * GM_SUN) / (C * C); // m
    const d = (16.8e6 * PARSEC) / m; // distance in units of M
    const uas = (180 / Math.PI) * 3600 * 1e6;
    const scale = distantAngularSize({ a: 0, q: 0 }, 1, d);
    const diameter = distantAngularSize({ a: 0, q: 0 }, ok(shadow({ a: 0, q: 0 }, 0.3, 8)).horizontalDiameter, d);
    if (!scale.ok || !diameter.ok) throw new Error('refused');
    expect(scale.angle * uas).toBeCloseTo(3.8, 1);
    expect(diameter.angle * uas).toBeCloseTo(39.7, 1);
  });

  it('Kerr a = 0.99 seen at 17° (M87*): mean diameter only a few percent below 6√3 (EHT Collaboration 2019, ApJL 875:L5 — from memory)', () => {
    const s = ok(shadow({ a: 0.99, q: 0 }, 17 * DEG, 512));
    const change = (2 * s.meanRadius) / (6 * Math.sqrt(3)) - 1;
    // mpmath (fixture): R̄ = 4.84507 M, i.e. 6.8% below 3√3; the brief asked for "within ~4%", which
    // holds only about the middle of the range the EHT quote: every Kerr shadow lies between extreme
    // Kerr face-on, 2(1 + √2) = 4.83 M (−7.1%), and Schwarzschild, 5.20 M — a spread of ±3.6% about its
    // middle (the EHT's "≈ 4%", from memory).
    expect(change).toBeLessThan(-0.06);
    expect(change).toBeGreaterThan(-0.07);
    const lowest = 2 * (1 + Math.SQRT2);
    const middle = (lowest + SQRT27) / 2;
    expect(Math.abs(s.meanRadius - middle) / middle).toBeLessThan(0.04);
    expect((SQRT27 - middle) / middle).toBeCloseTo(0.0366, 3);
    // Its circularity deviation is small, as for M87*'s ring (ΔC ≲ 0.1 used as a test of GR).
    expect(s.circularityDeviation).toBeLessThan(0.01);
  });
});

describe('negligible spin', () => {
  it('spins from 5e-324 to 1e-100 give the Schwarzschild curve (a² underflows; the change is O(a))', () => {
    for (const a of [5e-324, 1e-200, 1e-160, 1e-100, 1e-30]) {
      for (const i of [0, 0.3, Math.PI / 2]) {
        const r = shadow({ a, q: 0 }, i, 16);
        expect(r.ok).toBe(true);
        if (!r.ok) continue;
        // 1e-12: the documented accuracy of the mean radius.
        expect(Math.abs(r.meanRadius / (3 * Math.sqrt(3)) - 1), `a=${a} i=${i}`).toBeLessThan(1e-12);
        for (const x of r.alpha) expect(Number.isFinite(x)).toBe(true);
      }
    }
  });
});
