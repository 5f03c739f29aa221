/**
 * Tanh-sinh quadrature against closed-form integrals recorded by test/fixtures/python/proper_time.py
 * (each checked there against mpmath's own quadrature at 40 digits), including integrable endpoint
 * singularities, plus its contract: error estimates, the level cap, orientation, failures.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { tanhSinh, tanhSinhVector, type Integrand } from '../../src/physics/quadrature.js';

const fixture = JSON.parse(readFileSync(new URL('../fixtures/proper_time.json', import.meta.url), 'utf8')) as {
  quadrature: { name: string; a: number; b: number; value: number }[];
};

/** The same integrands in double precision; singular factors use the exact distances to the ends. */
const INTEGRANDS: Record<string, Integrand> = {
  invSqrtUpper: (_x, _lo, up) => 1 / Math.sqrt(up),
  cosOverSqrt: (x, lo) => Math.cos(x) / Math.sqrt(lo),
  logTimesExp: (x, lo) => Math.log(lo) * Math.exp(x),
  sqrtLog: (_x, lo) => Math.sqrt(lo) * Math.log(lo),
  power09: (_x, lo) => lo ** -0.9,
  jacobiBoth: (_x, lo, up) => 1 / (Math.sqrt(up) * Math.sqrt(Math.sqrt(lo))),
  expCos: (x) => Math.exp(x) * Math.cos(3 * x),
  nearPole: (_x, lo) => 1 / (lo + 1e-4),
  runge: (x) => 1 / (1 + x * x),
  // 1/√(2/r − 0.2) = √(5r/(10 − r)), with 10 − r taken from the exact distance to the upper end.
  cycloid: (x, _lo, up) => Math.sqrt((5 * x) / up),
  cubeRoot: (_x, lo) => Math.cbrt(lo),
};

describe('tanh-sinh against closed-form integrals (fixture)', () => {
  it('covers every fixture integral', () => {
    expect(fixture.quadrature.length).toBeGreaterThanOrEqual(10);
    for (const c of fixture.quadrature) expect(INTEGRANDS[c.name], c.name).toBeDefined();
  });

  for (const c of fixture.quadrature) {
    it(`${c.name} on [${c.a}, ${c.b}]`, () => {
      const r = tanhSinh(INTEGRANDS[c.name]!, c.a, c.b);
      expect(r.converged).toBe(true);
      // 1e-12 relative: the requested tolerance; the estimate |S_k − S_{k−1}| is conservative (the
      // error of S_k is about its square), so the result is far better than the tolerance.
      expect(Math.abs(r.value - c.value)).toBeLessThanOrEqual(1e-12 * Math.abs(c.value));
      // The reported error estimate bounds the actual error (up to a few ulp of rounding).
      expect(Math.abs(r.value - c.value)).toBeLessThanOrEqual(r.errorEstimate + 8 * Number.EPSILON * Math.abs(c.value));
      expect(r.evaluations).toBeGreaterThan(0);
    });
  }
});

describe('tanh-sinh contract', () => {
  it('integrates polynomials exactly (to rounding) on random intervals', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 1, maxLength: 6 }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        (coef, a, width) => {
          const b = a + width;
          const f: Integrand = (x) => coef.reduce((acc, c) => acc * x + c, 0);
          const anti = (x: number) => coef.reduce((acc, c, i) => acc + (c * x ** (coef.length - i)) / (coef.length - i), 0);
          const exact = anti(b) - anti(a);
          const scale = coef.reduce((s, c) => s + Math.abs(c), 0) * Math.max(Math.abs(a), Math.abs(b), 1) ** coef.length * width;
          const r = tanhSinh(f, a, b);
          // 1e-12 of the integral of |terms|: the tolerance, measured against the size of what cancels.
          expect(Math.abs(r.value - exact)).toBeLessThanOrEqual(1e-12 * scale + 1e-300);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('reverses sign with the interval and gives 0 on an empty one', () => {
    const f: Integrand = (x) => Math.exp(x);
    const forward = tanhSinh(f, 0, 2);
    const backward = tanhSinh(f, 2, 0);
    expect(backward.value).toBe(-forward.value);
    const empty = tanhSinh(f, 1, 1);
    expect(empty).toMatchObject({ value: 0, converged: true, evaluations: 0 });
  });

  it('reports non-convergence when the level cap is too low', () => {
    const r = tanhSinh((x) => Math.cos(40 * x), 0, 10, { maxLevel: 2 });
    expect(r.converged).toBe(false);
    expect(r.level).toBe(2);
    expect(Number.isFinite(r.value)).toBe(true);
    const full = tanhSinh((x) => Math.cos(40 * x), 0, 10, { maxLevel: 12 });
    expect(full.converged).toBe(true);
    expect(Math.abs(full.value - Math.sin(400) / 40)).toBeLessThan(1e-12);
  });

  it('fails cleanly (NaN, not converged) on a non-finite value inside the interval or non-finite ends', () => {
    const r = tanhSinh((x) => (x > 0.3 && x < 0.7 ? Number.NaN : 1), 0, 1);
    expect(r.value).toBeNaN();
    expect(r.converged).toBe(false);
    expect(tanhSinh(() => 1, 0, Number.POSITIVE_INFINITY).converged).toBe(false);
  });

  it('passes distances to the ends with full precision next to them', () => {
    let smallest = Number.POSITIVE_INFINITY;
    tanhSinh(
      (x, lo, up) => {
        // Consistent with x, and never rounded to zero near an end.
        expect(lo).toBeGreaterThan(0);
        expect(up).toBeGreaterThan(0);
        if (up < 0.25) expect(Math.abs(1e9 + 1 - up - x)).toBeLessThanOrEqual(1e-6);
        smallest = Math.min(smallest, up);
        return 1 / Math.sqrt(up);
      },
      1e9,
      1e9 + 1,
    );
    // Far below the spacing of doubles at 1e9 (1.2e-7): the ends are resolved through the distances.
    expect(smallest).toBeLessThan(1e-20);
  });

  it('the vector form agrees with the scalar form component by component', () => {
    const fs: Integrand[] = [(x) => Math.exp(x), (_x, lo) => 1 / Math.sqrt(lo), (x, _lo, up) => Math.log(up) * x];
    const v = tanhSinhVector(
      (x, lo, up, out) => {
        for (let i = 0; i < fs.length; i++) out[i] = fs[i]!(x, lo, up);
      },
      0,
      1,
      fs.length,
    );
    expect(v.converged).toBe(true);
    const exact = [Math.E - 1, 2, -0.75];
    for (let i = 0; i < fs.length; i++) {
      expect(Math.abs(v.values[i]! - exact[i]!)).toBeLessThanOrEqual(1e-13 * Math.abs(exact[i]!));
      expect(v.convergedEach[i]).toBe(true);
    }
  });

  it('honours a per-component absolute tolerance', () => {
    // The second component is nearly zero: relative convergence alone would chase rounding noise.
    const v = tanhSinhVector(
      (x, _lo, _up, out) => {
        out[0] = Math.exp(x);
        out[1] = Math.sin(2 * Math.PI * x);
      },
      0,
      1,
      2,
      { absoluteTolerances: [0, 1e-12] },
    );
    expect(v.converged).toBe(true);
    expect(Math.abs(v.values[1]!)).toBeLessThan(1e-12);
  });
});
