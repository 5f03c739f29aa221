/**
 * The Kerr–Newman curvature of src/physics/curvature.ts (principal frame, Ψ2 and Φ11) against the
 * Riemann tensor that test/fixtures/python/curvature.py builds from the Boyer–Lindquist metric with
 * sympy (derivatives) and mpmath (40 digits), and against closed forms.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  fullContraction,
  kretschmannScalar,
  ricciOf,
  ricciSquared,
  riemannAt,
  riemannIndex,
  weylPsi2,
} from '../../src/physics/curvature.js';

interface Case {
  a: number;
  q: number;
  r: number;
  theta: number;
  kretschmann: number;
  ricciSquared: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/curvature.json', import.meta.url), 'utf8')) as { cases: Case[] };

/**
 * Size of the terms that make up K: 48|Ψ2|² + 8Q⁴/Σ⁴. K is their signed sum and passes through zero
 * in Kerr, so its error is measured against this size. 1e-12 of it: the closed form takes ~30 double
 * operations on quantities of this size (a few ulp each, ~1e-14), far below; the fixture's 40 digits
 * contribute nothing.
 */
function size(a: number, q: number, r: number, theta: number): number {
  const cs = Math.cos(theta);
  const p = weylPsi2(a, q, r, cs);
  const sigma = r * r + a * a * cs * cs;
  return 48 * (p.re * p.re + p.im * p.im) + (8 * q ** 4) / sigma ** 4;
}

describe('invariants against the sympy-built Riemann tensor', () => {
  it(`Kretschmann and R_ab R^ab agree at all ${fixture.cases.length} grid points (every region, overspun bodies too)`, () => {
    expect(fixture.cases.length).toBeGreaterThan(100);
    for (const c of fixture.cases) {
      const k = kretschmannScalar(c.a, c.q, c.r, Math.cos(c.theta));
      const s = size(c.a, c.q, c.r, c.theta);
      expect(Math.abs(k - c.kretschmann), JSON.stringify(c)).toBeLessThanOrEqual(1e-12 * s);
      // 4Q⁴/Σ⁴ is one product chain: 1e-12 relative (a few ulp expected).
      const rs = ricciSquared(c.a, c.q, c.r, Math.cos(c.theta));
      if (c.q === 0) expect(rs).toBe(0);
      else expect(Math.abs(rs / c.ricciSquared - 1), JSON.stringify(c)).toBeLessThanOrEqual(1e-12);
    }
  });

  it('the grid includes points where K is negative (Kerr near the axis), so the sign is tested', () => {
    expect(fixture.cases.some((c) => c.kretschmann < 0)).toBe(true);
  });
});

describe('closed forms', () => {
  it('Schwarzschild K = 48/r⁶ and Reissner–Nordström K = (48r² − 96Q²r + 56Q⁴)/r⁸ (common practice)', () => {
    for (const r of [0.1, 1, 2, 3, 17.5, 1e4, 1e40]) {
      expect(Math.abs(kretschmannScalar(0, 0, r, 0.3) / (48 / r ** 6) - 1)).toBeLessThan(1e-14);
      if (r > 1e30) continue; // r⁸ below would overflow in the reference expression itself
      const q = 0.7;
      const rn = (48 * r * r - 96 * q * q * r + 56 * q ** 4) / r ** 8;
      expect(Math.abs(kretschmannScalar(0, q, r, 1.1) - rn)).toBeLessThan(1e-13 * size(0, q, r, 1.1));
    }
  });

  it('Kerr–Newman K equals Henry (2000, ApJ 535, 350, eq. 2 — from memory) in polynomial form', () => {
    const henry = (a: number, q: number, r: number, th: number) => {
      const y = a * Math.cos(th);
      const s = r * r + y * y;
      const y2 = y * y;
      const r2 = r * r;
      return (
        (8 / s ** 6) *
        (6 * (r2 ** 3 - 15 * r2 * r2 * y2 + 15 * r2 * y2 * y2 - y2 ** 3) -
          12 * q * q * r * (r2 * r2 - 10 * r2 * y2 + 5 * y2 * y2) +
          q ** 4 * (7 * r2 * r2 - 34 * r2 * y2 + 7 * y2 * y2))
      );
    };
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.double({ min: 0.05, max: 50, noNaN: true }),
        fc.double({ min: 0, max: Math.PI, noNaN: true }),
        (a, q, r, th) => {
          const k = kretschmannScalar(a, q, r, Math.cos(th));
          // Both forms sum terms of size ~ size(); 1e-11 of it covers the polynomial's own rounding.
          expect(Math.abs(k - henry(a, q, r, th))).toBeLessThanOrEqual(1e-11 * size(a, q, r, th));
        },
      ),
      { numRuns: 300 },
    );
  });

  it('R_ab R^ab = 4Q⁴/Σ⁴, and 0 without charge', () => {
    expect(ricciSquared(0.9, 0, 1.3, 0.4)).toBe(0);
    const sigma = 2.5 ** 2 + 0.5 ** 2 * Math.cos(1) ** 2;
    expect(Math.abs(ricciSquared(0.5, 0.3, 2.5, Math.cos(1)) / ((4 * 0.3 ** 4) / sigma ** 4) - 1)).toBeLessThan(1e-14);
  });
});

describe('the frame Riemann tensor', () => {
  const points = fc.tuple(
    fc.double({ min: 0, max: 1.5, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: 0.1, max: 30, noNaN: true }),
    fc.double({ min: 0, max: Math.PI, noNaN: true }),
  );

  it('has the symmetries of a curvature tensor, its full contraction is K, its Ricci tensor (Q²/Σ²) diag(1, −1, 1, 1), R = 0', () => {
    fc.assert(
      fc.property(points, ([a, q, r, th]) => {
        const t = riemannAt(a, q, r, th);
        const R = (i: number, j: number, k: number, l: number) => t[riemannIndex(i, j, k, l)]!;
        let scale = 0;
        for (const v of t) scale = Math.max(scale, Math.abs(v));
        const tol = 1e-14 * scale;
        for (let i = 0; i < 4; i++)
          for (let j = 0; j < 4; j++)
            for (let k = 0; k < 4; k++)
              for (let l = 0; l < 4; l++) {
                expect(Math.abs(R(i, j, k, l) - R(k, l, i, j))).toBeLessThanOrEqual(tol);
                expect(Math.abs(R(i, j, k, l) + R(j, i, k, l))).toBeLessThanOrEqual(tol);
                // First Bianchi identity R_a[bcd] = 0.
                expect(Math.abs(R(i, j, k, l) + R(i, k, l, j) + R(i, l, j, k))).toBeLessThanOrEqual(3 * tol);
              }
        const k = kretschmannScalar(a, q, r, Math.cos(th));
        expect(Math.abs(fullContraction(t) - k)).toBeLessThanOrEqual(1e-12 * size(a, q, r, th));
        const sigma = r * r + a * a * Math.cos(th) ** 2;
        const phi = (q * q) / (sigma * sigma);
        const ric = ricciOf(t);
        const want = [phi, -phi, phi, phi];
        for (let i = 0; i < 4; i++)
          for (let j = 0; j < 4; j++) expect(Math.abs(ric[i]![j]! - (i === j ? want[i]! : 0))).toBeLessThanOrEqual(4 * tol);
        expect(Math.abs(-ric[0]![0]! + ric[1]![1]! + ric[2]![2]! + ric[3]![3]!)).toBeLessThanOrEqual(4 * tol);
      }),
      { numRuns: 60 },
    );
  });
});

describe('range of doubles', () => {
  it('K is finite up to r ~ 1e50 M and null-worthy (NaN) where it would be subnormal', () => {
    expect(Number.isFinite(kretschmannScalar(0.5, 0.2, 1e50, 1))).toBe(true);
    expect(kretschmannScalar(0.5, 0.2, 1e60, 1)).toBeNaN();
    expect(ricciSquared(0.5, 0.2, 1e60, 1)).toBeNaN();
    expect(ricciSquared(0.5, 0, 1e60, 1)).toBe(0);
    // Near the ring singularity the value overflows rather than returning a wrong finite number.
    expect(Number.isFinite(kretschmannScalar(0.5, 0, 1e-300, 0))).toBe(false);
  });
});
