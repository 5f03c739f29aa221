/**
 * Coordinate transformations: round trips, the metric carried by the Jacobians, vectors and covectors,
 * the closed-form special cases (Eddington–Finkelstein, Gullstrand–Painlevé), continuity through the
 * branches of the closed forms, and the places where a chart does not exist.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  blToHub,
  blToKerrSchild,
  blToRiver,
  cartesianToHub,
  fromHub,
  hubToCartesian,
  kerrSchildRadius,
  kerrSchildToBl,
  kerrSchildToRiver,
  riverToBl,
  riverToKerrSchild,
  toHub,
  COORDINATE_SYSTEMS,
  type Vec4,
} from '../../src/physics/coordinates.js';
import { jacobians, metricAt, transformCovector, transformVector, type Mat4 } from '../../src/physics/coordinate-jacobians.js';
import { kerrSchildTimeShift, riverShift } from '../../src/physics/coordinate-integrals.js';
import { horizons, type KerrNewman } from '../../src/physics/spacetime.js';

/** A black hole: spin and charge on or inside the unit circle. */
const hole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }))
  .map(([k, ang]): KerrNewman => ({ a: k * Math.cos(ang), q: k * Math.sin(ang) }));
const theta = fc.double({ min: 0.01, max: Math.PI - 0.01, noNaN: true });
const angle = fc.double({ min: -3, max: 3, noNaN: true });
const time = fc.double({ min: -100, max: 100, noNaN: true });
const radius = fc.oneof(fc.double({ min: 0.01, max: 3, noNaN: true }), fc.double({ min: 3, max: 1e4, noNaN: true }));

/** Distance of r from the nearest horizon (Infinity without one). */
function fromHorizon(s: KerrNewman, r: number): number {
  const h = horizons(s);
  return h ? Math.min(Math.abs(r - h.outer), Math.abs(r - h.inner)) : Number.POSITIVE_INFINITY;
}

const angleDiff = (x: number, y: number) => Math.abs(Math.atan2(Math.sin(x - y), Math.cos(x - y)));

function transpose(m: Mat4): Mat4 {
  return [0, 1, 2, 3].map((i) => [0, 1, 2, 3].map((j) => m[j]![i]!)) as Mat4;
}

describe('round trips (fast-check)', () => {
  it('Boyer–Lindquist → Kerr–Schild → Boyer–Lindquist', () => {
    fc.assert(
      fc.property(hole, time, radius, theta, angle, (s, t, r, th, ph) => {
        // Away from the horizons: r comes back from the quartic to ~1e-15 relative, and t and φ then
        // carry it multiplied by dt/dr = μ/Δ (≤ ~1e3 at this distance): tolerance 1e-9 of the scale.
        fc.pre(fromHorizon(s, r) > 1e-2);
        const ks = blToKerrSchild(s, [t, r, th, ph]);
        expect(ks).not.toBeNull();
        const back = kerrSchildToBl(s, ks!)!;
        expect(back).not.toBeNull();
        const scale = 1 + Math.abs(t) + Math.abs(kerrSchildTimeShift(s, r));
        expect(Math.abs(back[0] - t)).toBeLessThanOrEqual(1e-9 * scale);
        expect(Math.abs(back[1] - r)).toBeLessThanOrEqual(1e-12 * (r + 1));
        expect(Math.abs(back[2] - th)).toBeLessThanOrEqual(1e-9);
        expect(angleDiff(back[3], ph)).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: 400 },
    );
  });

  it('Boyer–Lindquist → river → Boyer–Lindquist (r and θ are shared, so only rounding remains)', () => {
    fc.assert(
      fc.property(hole, time, radius, theta, angle, (s, t, r, th, ph) => {
        fc.pre(fromHorizon(s, r) > 0 && 2 * r >= s.q * s.q);
        const rv = blToRiver(s, [t, r, th, ph]);
        if (rv === null) {
          expect(fromHorizon(s, r)).toBeLessThan(1e-300); // only exactly on a horizon
          return;
        }
        const back = riverToBl(s, rv)!;
        const scale = 1 + Math.abs(t) + Math.abs(rv[0] - t);
        expect(Math.abs(back[0] - t)).toBeLessThanOrEqual(4 * Number.EPSILON * scale);
        expect(back[1]).toBe(r);
        expect(back[2]).toBe(th);
        expect(Math.abs(back[3] - ph)).toBeLessThanOrEqual(4 * Number.EPSILON * (1 + Math.abs(rv[3])));
      }),
      { numRuns: 300 },
    );
  });

  it('river → Kerr–Schild → river, through both horizons', () => {
    fc.assert(
      fc.property(hole, time, fc.double({ min: 0, max: 50, noNaN: true }), theta, angle, (s, T, r, th, Ph) => {
        fc.pre(2 * r > s.q * s.q && r > 1e-3);
        const ks = riverToKerrSchild(s, [T, r, th, Ph])!;
        expect(ks).not.toBeNull();
        const back = kerrSchildToRiver(s, ks)!;
        expect(Math.abs(back[1] - r)).toBeLessThanOrEqual(1e-12 * (r + 1));
        // T depends on r through dT/dr = √μ/(ρ + √μ) < 1: no amplification.
        expect(Math.abs(back[0] - T)).toBeLessThanOrEqual(1e-11 * (1 + Math.abs(T) + Math.abs(ks[0])));
        expect(angleDiff(back[3], Ph)).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: 300 },
    );
  });
});

describe('the Jacobians carry the metric of spacetime.ts into the other charts', () => {
  it("g′ = (∂x/∂x′)ᵀ g (∂x/∂x′) for every pair of charts at random points", () => {
    fc.assert(
      fc.property(hole, radius, theta, angle, (s, r, th, ph) => {
        fc.pre(fromHorizon(s, r) > 1e-6 && 2 * r > s.q * s.q);
        const hub = blToHub(s, [0, r, th, ph]);
        if (!hub.ok) return;
        for (const from of COORDINATE_SYSTEMS) {
          for (const to of COORDINATE_SYSTEMS) {
            const { inverse } = jacobians(s, from, to, hub.value);
            expect(inverse, `${from}→${to}`).not.toBeNull();
            const g = metricAt(from, s, hub.value);
            const want = metricAt(to, s, hub.value);
            const jt = transpose(inverse!);
            for (let i = 0; i < 4; i++) {
              for (let j = 0; j < 4; j++) {
                let sum = 0;
                let size = 0; // Σ|terms|: the scale of the rounding of the sum
                for (let k = 0; k < 4; k++) {
                  for (let l = 0; l < 4; l++) {
                    const term = jt[i]![k]! * g[k]![l]! * inverse![l]![j]!;
                    sum += term;
                    size += Math.abs(term);
                  }
                }
                // 16 products of entries each good to a few ulps: 1e-12 of the terms' size; and the
                // closed form it is compared with is itself good to a few ulps of the metric's largest
                // component (its intermediate terms are of that size).
                const largest = Math.max(...want.flat().map(Math.abs));
                expect(Math.abs(sum - want[i]![j]!), `${from}→${to} g[${i}][${j}] at a=${s.a} Q=${s.q} r=${r}`).toBeLessThanOrEqual(
                  1e-12 * size + 1e-14 * largest,
                );
              }
            }
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  it('forward and inverse Jacobians are inverse matrices; vectors and covectors keep w(v) and g(v, v)', () => {
    fc.assert(
      fc.property(
        hole,
        radius,
        theta,
        angle,
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 8, maxLength: 8 }),
        (s, r, th, ph, comps) => {
          fc.pre(fromHorizon(s, r) > 1e-3 && 2 * r > s.q * s.q);
          const hub = blToHub(s, [0, r, th, ph]);
          if (!hub.ok) return;
          const v = comps.slice(0, 4) as Vec4;
          const w = comps.slice(4) as Vec4;
          for (const from of COORDINATE_SYSTEMS) {
            for (const to of COORDINATE_SYSTEMS) {
              const { forward, inverse } = jacobians(s, from, to, hub.value);
              const v2 = transformVector(forward!, v);
              const w2 = transformCovector(inverse!, w);
              const dot = (x: Vec4, y: Vec4) => x[0] * y[0] + x[1] * y[1] + x[2] * y[2] + x[3] * y[3];
              const size = (x: Vec4, y: Vec4) => Math.abs(x[0] * y[0]) + Math.abs(x[1] * y[1]) + Math.abs(x[2] * y[2]) + Math.abs(x[3] * y[3]);
              expect(Math.abs(dot(w2, v2) - dot(w, v))).toBeLessThanOrEqual(1e-11 * (size(w2, v2) + size(w, v)) + 1e-300);
              // Lowering an index commutes with the change of chart: (g v)′ = g′ v′.
              const g = metricAt(from, s, hub.value);
              const g2 = metricAt(to, s, hub.value);
              const lower = (m: Mat4, x: Vec4) => transformVector(m, x);
              const a = transformCovector(inverse!, lower(g, v));
              const b = lower(g2, v2);
              for (let i = 0; i < 4; i++) {
                const scale = Math.max(1, ...g2[i]!.map((x, j) => Math.abs(x * v2[j]!)), ...a.map(Math.abs));
                expect(Math.abs(a[i]! - b[i]!), `${from}→${to} (gv)[${i}]`).toBeLessThanOrEqual(1e-10 * scale + 1e-300);
              }
            }
          }
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe('the river chart is the chart of the observers falling from rest at infinity', () => {
  it('their covector u_μ = (−1, −√((r² + a²)μ)/Δ, 0, 0) in Boyer–Lindquist (spacetime.ts) is −dT = (−1, 0, 0, 0) in river coordinates', () => {
    fc.assert(
      fc.property(hole, radius, theta, (s, r, th) => {
        fc.pre(fromHorizon(s, r) > 1e-3 && 2 * r > s.q * s.q);
        const hub = blToHub(s, [0, r, th, 0]);
        if (!hub.ok) return;
        const mu = 2 * r - s.q * s.q;
        const delta = r * r - 2 * r + s.a * s.a + s.q * s.q;
        const ur = -Math.sqrt((r * r + s.a * s.a) * mu) / delta;
        const { inverse } = jacobians(s, 'boyerLindquist', 'river', hub.value);
        const w = transformCovector(inverse!, [-1, ur, 0, 0]);
        // u_r is cancelled by dt/dr of the same size: 1e-12 of |u_r|, plus the conditioning of 1/Δ
        // (Δ carries ~4ε(r² + 2) of rounding; seen: 3.6e-8 at a = 0.99992, r = 0.9897, |Δ| = 5e-5).
        const tol = (1e-12 + (4 * Number.EPSILON * (r * r + 2)) / Math.abs(delta)) * (1 + Math.abs(ur));
        expect(w[0]).toBe(-1);
        expect(Math.abs(w[1])).toBeLessThanOrEqual(tol);
        expect(w[2]).toBe(0);
        expect(Math.abs(w[3])).toBeLessThanOrEqual(tol);
      }),
      { numRuns: 300 },
    );
  });
});

describe('closed-form special cases', () => {
  const S: KerrNewman = { a: 0, q: 0 };

  it('Schwarzschild: t̄ = t + 2M ln|r/M − 2| (ingoing Eddington–Finkelstein, t̄ = v − r; common practice)', () => {
    for (const r of [0.3, 1, 1.999, 2.001, 3, 10, 1e6]) {
      expect(Math.abs(kerrSchildTimeShift(S, r) - 2 * Math.log(Math.abs(r - 2)))).toBeLessThanOrEqual(1e-14 * (1 + Math.abs(Math.log(Math.abs(r - 2)))));
    }
  });

  it('Schwarzschild: the Gullstrand–Painlevé time T = t + 2√(2Mr) + 2M ln|(√r − √2M)/(√r + √2M)| (common practice)', () => {
    for (const r of [1e-6, 0.3, 1, 1.999, 2.001, 3, 10, 1e3, 1e8]) {
      const gp = 2 * Math.sqrt(2 * r) + 2 * Math.log(Math.abs((Math.sqrt(r) - Math.SQRT2) / (Math.sqrt(r) + Math.SQRT2)));
      const T = blToRiver(S, [0, r, 1, 0])![0];
      expect(Math.abs(T - gp), `r=${r}`).toBeLessThanOrEqual(1e-13 * (1 + Math.abs(gp)));
    }
  });

  it('the additive constants: φ̄ − φ, Φ − φ, t̄ − t − 2 ln r and T − t − 2√(2r) vanish as r → ∞', () => {
    for (const s of [{ a: 0.9, q: 0.3 }, { a: 1, q: 0 }, { a: 0, q: 1 }, { a: 5, q: 0.5 }]) {
      const r = 1e12;
      const bl = blToHub(s, [0, r, 1, 0]);
      if (!bl.ok) throw new Error('hub');
      expect(Math.abs(bl.value[0] - 2 * Math.log(r))).toBeLessThan(1e-9);
      expect(Math.abs(bl.value[3])).toBeLessThan(1e-11);
      const rv = blToRiver(s, [0, r, 1, 0])!;
      // T − t − 2√(2r) = O(r^−1/2) ≈ 1e-6 here; 2√(2r) ≈ 2.8e6 holds ~1e-10 of rounding.
      expect(Math.abs(rv[0] - 2 * Math.sqrt(2 * r))).toBeLessThan(1e-4);
      expect(Math.abs(rv[3])).toBeLessThan(1e-11);
    }
  });

  it('every expression is continuous in a and Q: through extremality, a → 0 and the branch switch at Q² = 3/4', () => {
    const pairs: [KerrNewman, KerrNewman, number][] = [
      // extremal Kerr against a hair below it: J changes by O(δ²/x³) = O(1e-16)
      [{ a: 1, q: 0 }, { a: Math.sqrt(1 - 1e-16), q: 0 }, 1e-7],
      [{ a: 0, q: 1 }, { a: 0, q: Math.sqrt(1 - 1e-16) }, 1e-7],
      // spin → 0 (the Cartesian point itself moves by O(a) = 1e-9; the river time by O(a²), below)
      [{ a: 0, q: 0.5 }, { a: 1e-9, q: 0.5 }, 1e-8],
      // either side of the switch between the two closed forms of the non-spinning river time
      [{ a: 0, q: Math.sqrt(0.75) * (1 - 1e-15) }, { a: 0, q: Math.sqrt(0.75) * (1 + 1e-15) }, 1e-12],
    ];
    for (const [s1, s2, tol] of pairs) {
      for (const r of [0.55, 0.7, 1.5, 3, 40]) {
        const e: Vec4 = [0, r, 1, 0];
        const k1 = blToKerrSchild(s1, e)!;
        const k2 = blToKerrSchild(s2, e)!;
        const v1 = blToRiver(s1, e)!;
        const v2 = blToRiver(s2, e)!;
        for (let i = 0; i < 4; i++) {
          expect(Math.abs(k1[i]! - k2[i]!), `KS ${i} r=${r} ${JSON.stringify(s2)}`).toBeLessThanOrEqual(tol * (1 + Math.abs(k1[i]!)));
          expect(Math.abs(v1[i]! - v2[i]!), `river ${i} r=${r} ${JSON.stringify(s2)}`).toBeLessThanOrEqual(tol * (1 + Math.abs(v1[i]!)));
        }
      }
    }
  });

  it('spin → 0: the river time by quadrature of the spin terms meets the closed form', () => {
    for (const r of [0.2, 1, 1.7, 5, 300]) {
      const closed = riverShift({ a: 0, q: 0.5 }, r);
      const quad = riverShift({ a: 1e-9, q: 0.5 }, r);
      expect(Math.abs(quad.time - closed.time)).toBeLessThanOrEqual(1e-14 * (1 + Math.abs(closed.time)));
      expect(Math.abs(quad.azimuth)).toBeLessThan(1e-8);
    }
  });

  it('river minus Kerr–Schild is continuous across both horizons (both charts penetrate them)', () => {
    const s = { a: 0.9, q: 0.3 };
    const h = horizons(s)!;
    for (const rh of [h.outer, h.inner]) {
      const below = riverShift(s, rh * (1 - 1e-12)).time;
      const at = riverShift(s, rh).time;
      const above = riverShift(s, rh * (1 + 1e-12)).time;
      expect(Math.abs(below - at)).toBeLessThan(1e-11);
      expect(Math.abs(above - at)).toBeLessThan(1e-11);
    }
  });
});

describe('where a chart does not exist', () => {
  const s = { a: 0.9, q: 0.3 };
  const h = horizons(s)!;

  it('Boyer–Lindquist events on a horizon are refused; the other charts take them', () => {
    for (const r of [h.outer, h.inner]) {
      const out = blToHub(s, [0, r, 1, 0]);
      expect(out).toEqual({ ok: false, reason: 'onHorizon' });
      const ks = riverToKerrSchild(s, [0, r, 1, 0]);
      expect(ks).not.toBeNull();
      const back = cartesianToHub(s, ks!);
      expect(back.ok).toBe(true);
      if (back.ok) {
        expect(Math.abs(back.value[1] - r)).toBeLessThan(1e-14);
        expect(fromHub('boyerLindquist', s, [0, r, 1, 0])).toEqual({ ok: false, reason: 'onHorizon' });
      }
    }
  });

  it('river coordinates do not exist where 2r < Q²', () => {
    const c = { a: 0.3, q: 0.9 };
    expect(toHub('river', c, [0, 0.3, 1, 0])).toEqual({ ok: false, reason: 'noRiverChart' });
    expect(blToRiver(c, [0, 0.3, 1, 0])).toBeNull();
    expect(blToRiver(c, [0, 0.41, 1, 0])).not.toBeNull();
  });

  it('the singularity (Σ = 0) is refused in every chart', () => {
    expect(blToHub(s, [0, 0, Math.PI / 2, 0])).toEqual({ ok: false, reason: 'singularity' });
    expect(cartesianToHub(s, [0, 0.9, 0, 0])).toEqual({ ok: false, reason: 'singularity' });
    expect(cartesianToHub({ a: 0, q: 0 }, [0, 0, 0, 0])).toEqual({ ok: false, reason: 'singularity' });
    expect(blToHub(s, [0, -1, 1, 0])).toEqual({ ok: false, reason: 'negativeRadius' });
  });

  it('the disk r = 0 maps to its upper face; the axis has φ̄ = 0 and no Cartesian Jacobian', () => {
    const disk = cartesianToHub(s, [0, 0.3, 0.4, 0]);
    expect(disk.ok).toBe(true);
    if (!disk.ok) return;
    expect(disk.value[1]).toBe(0);
    expect(Math.sin(disk.value[2]) * 0.9).toBeCloseTo(0.5, 14);
    expect(disk.value[2]).toBeLessThanOrEqual(Math.PI / 2);
    const again = hubToCartesian(s, disk.value);
    expect(again[1]).toBeCloseTo(0.3, 14);
    expect(again[2]).toBeCloseTo(0.4, 14);
    const axis = cartesianToHub(s, [0, 0, 0, -3]);
    expect(axis.ok && axis.value).toEqual([0, 3, Math.PI, 0]);
    if (!axis.ok) return;
    const j = jacobians(s, 'boyerLindquist', 'kerrSchild', axis.value);
    expect(j.forward).not.toBeNull(); // vectors map onto the axis
    expect(j.inverse).toBeNull(); // covectors (and vectors from Cartesian) do not
  });

  it('the Kerr–Schild radius solves the quartic, and a = 0 is the Euclidean radius', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: -10, max: 10, noNaN: true }),
        (a, x, y, z) => {
          const r = kerrSchildRadius(a, x, y, z);
          const R2 = x * x + y * y + z * z;
          const residual = r ** 4 - (R2 - a * a) * r * r - a * a * z * z;
          const size = r ** 4 + Math.abs(R2 - a * a) * r * r + a * a * z * z;
          expect(Math.abs(residual)).toBeLessThanOrEqual(1e-13 * size + 1e-300);
          expect(r).toBeGreaterThanOrEqual(0);
        },
      ),
    );
    expect(kerrSchildRadius(0, 3, 4, 12)).toBe(13);
  });
});
