/**
 * The one Kerr–Newman core against the closed forms of its special cases, and its structural
 * identities (flow speed = c on the horizon, the river metric is the Boyer–Lindquist metric under the
 * coordinate change, α² = 1 − v²), as property tests over random (a, Q, r, θ).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  boyerLindquistMetric,
  ergosurfaceRadius,
  flowSpeed,
  frameDragRate,
  horizons,
  hoverAcceleration,
  pointFunctions,
  region,
  riverMetric,
  staticClockOffset,
  staticClockRate,
  zamoClockOffset,
  zamoClockRate,
  type KerrNewman,
} from '../../src/physics/spacetime.js';

// 1e-12 relative: closed forms evaluated two ways in double precision, a handful of roundings.
const REL = 1e-12;
const near = (a: number, b: number, rel = REL) => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-300);

const radius = fc.double({ min: 2.5, max: 1e6, noNaN: true });
const theta = fc.double({ min: 0, max: Math.PI, noNaN: true });
/** Black-hole parameters with a² + Q² ≤ 1. */
const blackHole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }), fc.boolean())
  .map(([k, phi, neg]): KerrNewman => ({ a: k * Math.cos(phi), q: (neg ? -1 : 1) * k * Math.sin(phi) }));

describe('special cases of the one core', () => {
  it('Schwarzschild: v = √(2M/r), dτ/dt = √(1 − 2M/r), a = M/(r²√(1 − 2M/r)), no frame dragging', () => {
    fc.assert(
      fc.property(radius, theta, (r, th) => {
        const s = { a: 0, q: 0 };
        const p = pointFunctions(s, r, th);
        expect(near(flowSpeed(p), Math.sqrt(2 / r))).toBe(true);
        expect(near(staticClockRate(p), Math.sqrt(1 - 2 / r))).toBe(true);
        expect(near(zamoClockRate(p), Math.sqrt(1 - 2 / r))).toBe(true);
        expect(near(hoverAcceleration(s, p).magnitude, 1 / (r * r * Math.sqrt(1 - 2 / r)))).toBe(true);
        expect(frameDragRate(s, p)).toBe(0);
      }),
    );
  });

  it('Reissner–Nordström: f = 1 − 2M/r + Q²/r², v = √(2M/r − Q²/r²), a = (M/r² − Q²/r³)/√f', () => {
    fc.assert(
      fc.property(radius, theta, fc.double({ min: -1, max: 1, noNaN: true }), (r, th, q) => {
        const s = { a: 0, q };
        const p = pointFunctions(s, r, th);
        const f = 1 - 2 / r + (q * q) / (r * r);
        expect(near(staticClockRate(p), Math.sqrt(f))).toBe(true);
        expect(near(flowSpeed(p), Math.sqrt(2 / r - (q * q) / (r * r)))).toBe(true);
        expect(near(hoverAcceleration(s, p).magnitude, (1 / (r * r) - (q * q) / (r * r * r)) / Math.sqrt(f), 1e-11)).toBe(true);
        const h = horizons(s)!;
        expect(near(h.outer, 1 + Math.sqrt(1 - q * q))).toBe(true);
      }),
    );
  });

  it('Kerr equator: dτ/dt = √(1 − 2M/r), ω = 2Ma/(r³ + a²r + 2Ma²), α² = r²Δ/(r⁴ + a²r² + 2Ma²r) (Bardeen, Press & Teukolsky 1972)', () => {
    fc.assert(
      fc.property(radius, fc.double({ min: 0, max: 1, noNaN: true }), (r, a) => {
        const s = { a, q: 0 };
        const p = pointFunctions(s, r, Math.PI / 2);
        const delta = r * r - 2 * r + a * a;
        expect(near(staticClockRate(p), Math.sqrt(1 - 2 / r))).toBe(true);
        expect(near(frameDragRate(s, p), (2 * a) / (r * r * r + a * a * r + 2 * a * a))).toBe(true);
        expect(near(zamoClockRate(p) ** 2, (r * r * delta) / (r ** 4 + a * a * r * r + 2 * a * a * r))).toBe(true);
      }),
    );
  });

  it('Kerr axis: g_tt = −Δ/(r² + a²), so static observers exist down to the horizon', () => {
    fc.assert(
      fc.property(radius, fc.double({ min: 0, max: 1, noNaN: true }), (r, a) => {
        const s = { a, q: 0 };
        const p = pointFunctions(s, r, 0);
        expect(near(staticClockRate(p) ** 2, (r * r - 2 * r + a * a) / (r * r + a * a))).toBe(true);
        expect(ergosurfaceRadius(s, 0)).toBeCloseTo(horizons(s)!.outer, 12);
      }),
    );
  });
});

describe('structural identities of the river picture', () => {
  it('the flow reaches c exactly on the outer horizon, for every black hole and latitude', () => {
    fc.assert(
      fc.property(blackHole, theta, (s, th) => {
        const rp = horizons(s)!.outer;
        // 1e-12: v² − 1 = −Δ·(…)/A, and Δ at the rounded r+ is a few ulp.
        expect(Math.abs(flowSpeed(pointFunctions(s, rp, th)) - 1)).toBeLessThan(1e-12);
      }),
    );
  });

  it('the flow is slower than light outside and faster between the horizons', () => {
    fc.assert(
      fc.property(blackHole, theta, fc.double({ min: 0.01, max: 0.99, noNaN: true }), (s, th, t) => {
        const h = horizons(s)!;
        fc.pre(h.outer - h.inner > 1e-3);
        const inside = h.inner + t * (h.outer - h.inner);
        const outside = h.outer + t * 10 + 1e-3;
        const vin = flowSpeed(pointFunctions(s, inside, th));
        if (!Number.isNaN(vin)) expect(vin).toBeGreaterThan(1);
        expect(flowSpeed(pointFunctions(s, outside, th))).toBeLessThan(1);
      }),
    );
  });

  it('α² = 1 − v²: the ZAMO clock rate is the inverse Lorentz factor of the flow', () => {
    fc.assert(
      fc.property(blackHole, radius, theta, (s, r, th) => {
        const p = pointFunctions(s, r, th);
        expect(near(zamoClockRate(p) ** 2, 1 - flowSpeed(p) ** 2, 1e-11)).toBe(true);
        expect(near(p.sigma * p.delta / p.bigA, 1 - flowSpeed(p) ** 2, 1e-11)).toBe(true);
      }),
    );
  });

  it('the river metric is the Boyer–Lindquist metric under dT = dt + F_t dr, dΦ = dφ + F_φ dr', () => {
    fc.assert(
      fc.property(blackHole, fc.double({ min: 0.05, max: 50, noNaN: true }), theta, (s, r, th) => {
        const p = pointFunctions(s, r, th);
        fc.pre(Math.abs(p.delta) > 1e-3 && p.mu > 0);
        const g = boyerLindquistMetric(s, p);
        const rv = riverMetric(s, p)!;
        // t = T − f_t(r), φ = Φ − f_φ(r): ∂t/∂r|river = −F_t, ∂φ/∂r|river = −F_φ.
        const Ft = Math.sqrt(p.rho2 * p.mu) / p.delta;
        const Fp = (s.a * Math.sqrt(p.mu / p.rho2)) / p.delta;
        const TT = g.tt;
        const Tr = -g.tt * Ft - g.tphi * Fp;
        const TPhi = g.tphi;
        const rr = g.rr + g.tt * Ft * Ft + 2 * g.tphi * Ft * Fp + g.phph * Fp * Fp;
        const rPhi = -g.tphi * Ft - g.phph * Fp;
        // The size of the largest terms that cancel (g_rr and g_tt F_t² both diverge at the horizons).
        const scale =
          1 + Math.abs(g.phph) + Math.abs(g.rr) + Math.abs(g.tt) * Ft * Ft + Math.abs(g.phph) * Fp * Fp + 2 * Math.abs(g.tphi * Ft * Fp);
        // The transformed components carry cancellations of order F_t² g_tt; compare on that scale
        // (1e-12 of it: double rounding of terms that cancel to the regular closed form).
        for (const [got, want] of [
          [rv.TT, TT],
          [rv.Tr, Tr],
          [rv.TPhi, TPhi],
          [rv.rr, rr],
          [rv.rPhi, rPhi],
          [rv.thth, g.thth],
          [rv.PhiPhi, g.phph],
        ] as const) {
          expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-12 * scale);
        }
      }),
    );
  });

  it('the river metric is regular on both horizons: finite components where Boyer–Lindquist g_rr diverges', () => {
    fc.assert(
      fc.property(blackHole, theta, (s, th) => {
        const h = horizons(s)!;
        for (const r of [h.outer, h.inner]) {
          // An inner horizon below 1e-100 M (a, Q ~ 1e-160) sits at the singularity in double precision.
          if (r <= 1e-100) continue;
          const p = pointFunctions(s, r, th);
          if (p.mu < 0) continue;
          const rv = riverMetric(s, p)!;
          for (const v of Object.values(rv)) expect(Number.isFinite(v)).toBe(true);
        }
      }),
    );
  });
});

describe('regions', () => {
  it('classifies the points of a spin-0.9 hole', () => {
    const s = { a: 0.9, q: 0 };
    const h = horizons(s)!;
    expect(region(s, 10, Math.PI / 2)).toBe('outside');
    expect(region(s, 1.8, Math.PI / 2)).toBe('ergoregion'); // r+ = 1.436, r_E(equator) = 2
    expect(region(s, 1.8, 0)).toBe('outside'); // the ergosurface meets the horizon on the axis
    expect(region(s, h.outer, 1)).toBe('outerHorizon');
    expect(region(s, 1, 1)).toBe('betweenHorizons');
    expect(region(s, h.inner, 1)).toBe('innerHorizon');
    expect(region(s, 0.2, 1)).toBe('insideInnerHorizon');
    expect(region(s, 5, 1, 6)).toBe('belowSurface');
  });

  it('static observers exist exactly outside the ergosurface', () => {
    fc.assert(
      fc.property(blackHole, radius, theta, (s, rr, th) => {
        const r = 1 + rr / 1e5; // between 1 and ~11: straddles the ergosurface
        const p = pointFunctions(s, r, th);
        const reg = region(s, r, th);
        if (reg === 'outside') expect(staticClockRate(p)).toBeGreaterThan(0);
        if (reg === 'ergoregion') expect(staticClockRate(p)).toBeNaN();
      }),
    );
  });
});

describe('weak fields keep full precision in the offsets', () => {
  it('Earth-like x = 1.39e-9: the offset agrees with the series x/2 + x²/8 + x³/16 to 1e-15 relative', () => {
    const r = 1.44e9;
    const p = pointFunctions({ a: 0, q: 0 }, r, Math.PI / 2);
    const x = 2 / r;
    const series = x / 2 + (x * x) / 8 + (x * x * x) / 16;
    expect(Math.abs(staticClockOffset(p) - series) / series).toBeLessThan(1e-15);
    expect(Math.abs(zamoClockOffset(p) - series) / series).toBeLessThan(1e-15);
  });

  it('offsets stay accurate far below double epsilon (x = 1e-20), where 1 − rate would be 0', () => {
    const p = pointFunctions({ a: 0, q: 0 }, 2e20, 1);
    expect(1 - staticClockRate(p)).toBe(0);
    expect(staticClockOffset(p) / 5e-21 - 1).toBeLessThan(1e-15);
  });
});

describe('A = (r² + a²)² − a²Δ sin²θ next to the ring', () => {
  it('keeps full precision where the two terms of the textbook form cancel', () => {
    // On the equator with q = 0, A = r⁴ + a²r² + 2a²r exactly; at r = 1e-8 the textbook form subtracts
    // two numbers of size a⁴ ≈ 0.66 to leave ~1.6e-8 and would keep only ~8 digits.
    const a = 0.9;
    const r = 1e-8;
    const exact = r ** 4 + a * a * r * r + 2 * a * a * r;
    const p = pointFunctions({ a, q: 0 }, r, Math.PI / 2);
    expect(Math.abs(p.bigA - exact) / exact).toBeLessThan(4 * Number.EPSILON);
  });
});
