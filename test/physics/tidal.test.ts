/**
 * Tidal tensors of static, ZAMO and river observers (src/physics/tidal.ts) against the sympy-built
 * Riemann tensor contracted with tetrads written in Boyer–Lindquist components
 * (test/fixtures/python/curvature.py), and against closed forms and internal consistency.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { riemannAt } from '../../src/physics/curvature.js';
import { flowSpeed, horizons, pointFunctions } from '../../src/physics/spacetime.js';
import { observerTetrad as launchTetrad } from '../../src/physics/tetrads.js';
import {
  disruptionRadius,
  hillsMassRatio,
  observerBoost,
  observerTetrad,
  principalTides,
  tidalTensor,
  tidesAt,
  type TidalObserverKind,
} from '../../src/physics/tidal.js';

interface Case {
  a: number;
  q: number;
  r: number;
  theta: number;
  tidal?: Partial<Record<TidalObserverKind, number[][]>>;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/curvature.json', import.meta.url), 'utf8')) as { cases: Case[] };
const KINDS: TidalObserverKind[] = ['static', 'zamo', 'river'];

const maxAbs = (m: number[][]) => Math.max(...m.flat().map(Math.abs));
const dot = (u: number[], v: number[]) => -u[0]! * v[0]! + u[1]! * v[1]! + u[2]! * v[2]! + u[3]! * v[3]!;

describe('against the sympy-built Riemann tensor', () => {
  const cases = fixture.cases.filter((c) => c.tidal);
  it(`static, ZAMO and river tidal tensors at ${cases.length} points, off-diagonal components and signs included`, () => {
    let compared = 0;
    for (const c of cases) {
      const tides = tidesAt({ a: c.a, q: c.q }, c.r, c.theta, KINDS);
      for (const t of tides) {
        const ref = c.tidal![t.kind];
        // The observer exists exactly where the fixture could build it.
        expect(t.exists, `${t.kind} ${JSON.stringify(c)}`).toBe(ref !== undefined);
        if (!t.exists || !ref) continue;
        // 1e-12 of the largest component: the principal-frame construction and one 4-fold contraction
        // in doubles (observed ≲ 2e-14); the 40-digit fixture contributes nothing.
        const s = maxAbs(ref);
        for (let i = 0; i < 3; i++)
          for (let j = 0; j < 3; j++)
            expect(Math.abs(t.tensor[i]![j]! - ref[i]![j]!), `${t.kind} ${i}${j} ${JSON.stringify(c)}`).toBeLessThanOrEqual(1e-12 * s);
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(150);
    // Kerr off the equator gives nonzero off-diagonal components: the sign of the magnetic part is tested.
    expect(cases.some((c) => c.a > 0 && Math.abs(c.tidal!.static?.[0]?.[1] ?? 0) > 1e-6)).toBe(true);
    // Next to the ring singularity (γ ~ 5e5), where a numerical contraction would lose ~11 digits.
    expect(cases.some((c) => c.r <= 1e-6 && c.tidal!.river)).toBe(true);
    // The river observer is compared inside the horizons as well.
    expect(cases.some((c) => c.a * c.a + c.q * c.q <= 1 && c.r < 1 + Math.sqrt(1 - c.a * c.a - c.q * c.q) && c.tidal!.river)).toBe(true);
  });
});

const points = fc.tuple(
  fc.double({ min: 0, max: 0.99, noNaN: true }),
  fc.double({ min: -0.6, max: 0.6, noNaN: true }),
  fc.double({ min: 0.05, max: 60, noNaN: true }),
  fc.double({ min: 0, max: Math.PI, noNaN: true }),
);

describe('tetrads', () => {
  it('are orthonormal wherever they exist, and exist where they should', () => {
    fc.assert(
      fc.property(points, ([a, q, r, th]) => {
        const s = { a, q };
        for (const kind of KINDS) {
          const t = observerTetrad(s, kind, r, th);
          const p = pointFunctions(s, r, th);
          if (kind === 'river') expect(t.exists).toBe(p.mu >= 0);
          if (!t.exists) continue;
          const v = [t.tetrad.u, t.tetrad.radial, t.tetrad.polar, t.tetrad.azimuthal];
          for (let i = 0; i < 4; i++)
            for (let j = 0; j < 4; j++) {
              const want = i === j ? (i === 0 ? -1 : 1) : 0;
              expect(Math.abs(dot(v[i]!, v[j]!) - want), `${kind} ${i}${j}`).toBeLessThan(1e-12 * Math.max(1, Math.abs(v[0]![0]!) ** 2));
            }
          expect(t.tetrad.u[0]!).toBeGreaterThan(0); // future-directed
        }
      }),
      { numRuns: 300 },
    );
  });

  it('static observers and ZAMOs exist where Δ > 0 (inside the inner horizon too), as for geodesic launches', () => {
    let innerSeen = 0;
    fc.assert(
      fc.property(points, ([a, q, r, th]) => {
        const s = { a, q };
        const p = pointFunctions(s, r, th);
        const h = horizons(s);
        const between = h !== null && r >= h.inner && r <= h.outer;
        for (const kind of ['static', 'zamo'] as const) {
          const want = !between && (kind === 'static' ? p.sigma > p.mu : p.bigA > 0);
          expect(observerTetrad(s, kind, r, th).exists, kind).toBe(want);
          // The geodesic engine's frames (ingoing coordinates) exist at the same points, off the axis.
          if (Math.sin(th) > 1e-6 && p.sigma > 1e-9) expect(launchTetrad(s, kind, r, th).ok, kind).toBe(want);
          if (want && h !== null && r < h.inner) innerSeen++;
        }
      }),
      { numRuns: 500 },
    );
    expect(innerSeen).toBeGreaterThan(0);
  });

  it('river = the ZAMO frame boosted inward along its radial axis by the flow speed (outside the horizon)', () => {
    fc.assert(
      fc.property(points, ([a, q, r, th]) => {
        const s = { a, q };
        const z = observerTetrad(s, 'zamo', r, th);
        const rv = observerTetrad(s, 'river', r, th);
        if (!z.exists || !rv.exists) return;
        const v = flowSpeed(pointFunctions(s, r, th));
        if (!(v < 0.99)) return;
        const g = 1 / Math.sqrt(1 - v * v);
        const { u, radial } = z.tetrad;
        const boosted = {
          ...z.tetrad,
          u: u.map((x, i) => g * (x - v * radial[i]!)),
          radial: radial.map((x, i) => g * (x - v * u[i]!)),
        };
        const R = riemannAt(a, q, r, th);
        const e1 = tidalTensor(R, boosted);
        const e2 = tidalTensor(R, rv.tetrad);
        const sc = maxAbs(e2);
        // γ² ≤ 50 amplifies rounding of the boost: 1e-11 relative.
        for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(Math.abs(e1[i]![j]! - e2[i]![j]!)).toBeLessThanOrEqual(1e-11 * sc);
      }),
      { numRuns: 300 },
    );
  });
});

describe('closed form against the contraction of the frame Riemann tensor', () => {
  it('agree for every observer (the closed form is what the service uses)', () => {
    fc.assert(
      fc.property(points, ([a, q, r, th]) => {
        const R = riemannAt(a, q, r, th);
        for (const t of tidesAt({ a, q }, r, th, KINDS)) {
          const o = observerTetrad({ a, q }, t.kind, r, th);
          expect(o.exists).toBe(t.exists);
          if (!t.exists || !o.exists) continue;
          const b = observerBoost({ a, q }, t.kind, r, th);
          if (!b.exists) throw new Error('boost absent');
          const direct = tidalTensor(R, o.tetrad);
          // The contraction sums terms of size γ⁴|R| that cancel down to γ²|R|: 1e-13 γ² of the largest.
          const tol = 1e-13 * (1 + b.boost.g2) * Math.max(maxAbs(direct), maxAbs(t.tensor));
          for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(Math.abs(t.tensor[i]![j]! - direct[i]![j]!)).toBeLessThanOrEqual(tol);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('closed forms and invariances', () => {
  it('Schwarzschild: −2/r³ along r, 1/r³ across, the same for static, ZAMO and river observers (type D boost invariance)', () => {
    for (const r of [2.5, 6, 100]) {
      for (const t of tidesAt({ a: 0, q: 0 }, r, 1.2, KINDS)) {
        expect(t.exists).toBe(true);
        if (!t.exists) continue;
        const want = [-2 / r ** 3, 1 / r ** 3, 1 / r ** 3];
        for (let i = 0; i < 3; i++)
          for (let j = 0; j < 3; j++) expect(Math.abs(t.tensor[i]![j]! - (i === j ? want[i]! : 0))).toBeLessThan(1e-15 / r ** 3);
        const p = t.principal!;
        expect(p[0]!.value).toBeCloseTo(-2 / r ** 3, 15);
        expect(p[0]!.direction[0]).toBeCloseTo(1, 14);
      }
    }
    // Inside the horizon only the river observer exists, with the same tides.
    const inside = tidesAt({ a: 0, q: 0 }, 1, 0.5, KINDS);
    expect(inside.map((t) => t.exists)).toEqual([false, false, true]);
  });

  it('vacuum: tr E = 0; charged: tr E = R_ab u^a u^b (> 0)', () => {
    fc.assert(
      fc.property(points, ([a, q, r, th]) => {
        const phi = (q * q) / (r * r + a * a * Math.cos(th) ** 2) ** 2;
        for (const kind of KINDS) {
          const o = observerTetrad({ a, q }, kind, r, th);
          if (!o.exists) continue;
          const E = tidalTensor(riemannAt(a, q, r, th), o.tetrad);
          const tr = E[0]![0]! + E[1]![1]! + E[2]![2]!;
          const u = o.tetrad.u;
          // R_ab u^a u^b with R_ab = (Q²/Σ²) diag(1, −1, 1, 1): the energy density of the field, ≥ 0.
          const want = phi * (u[0]! ** 2 - u[1]! ** 2 + u[2]! ** 2 + u[3]! ** 2);
          expect(want).toBeGreaterThanOrEqual(0);
          expect(Math.abs(tr - want)).toBeLessThanOrEqual(1e-13 * (maxAbs(E) + want));
        }
      }),
      { numRuns: 200 },
    );
  });
});

describe('principal tides (mathjs Jacobi on the scaled matrix)', () => {
  it('E v = λ v with orthonormal directions, ascending, at any size of the tide', () => {
    fc.assert(
      fc.property(points, fc.integer({ min: -200, max: 200 }), ([a, q, r, th], exp10) => {
        for (const t of tidesAt({ a, q }, r, th, KINDS)) {
          if (!t.exists) continue;
          const E = t.tensor.map((row) => row.map((x) => x * 10 ** exp10));
          const p = principalTides(E)!;
          const sc = maxAbs(E);
          expect(p[0]!.value).toBeLessThanOrEqual(p[1]!.value);
          expect(p[1]!.value).toBeLessThanOrEqual(p[2]!.value);
          for (const { value, direction: d } of p) {
            for (let i = 0; i < 3; i++) {
              const ev = E[i]![0]! * d[0] + E[i]![1]! * d[1] + E[i]![2]! * d[2];
              // Jacobi stops at off-diagonal 3.3e-13 of the scale: residual ≲ 1e-12 of it.
              expect(Math.abs(ev - value * d[i]!)).toBeLessThanOrEqual(1e-12 * sc);
            }
            expect(Math.abs(Math.hypot(...d) - 1)).toBeLessThan(1e-14);
          }
          for (let i = 0; i < 3; i++)
            for (let j = i + 1; j < 3; j++) {
              const a1 = p[i]!.direction;
              const b1 = p[j]!.direction;
              expect(Math.abs(a1[0] * b1[0] + a1[1] * b1[1] + a1[2] * b1[2])).toBeLessThan(1e-12);
            }
        }
      }),
      { numRuns: 100 },
    );
  });

  it('refuses a non-finite matrix and handles a zero one', () => {
    expect(principalTides([[Infinity, 0, 0], [0, 1, 0], [0, 0, 1]])).toBeNull();
    expect(principalTides([[0, 0, 0], [0, 0, 0], [0, 0, 0]])!.map((p) => p.value)).toEqual([0, 0, 0]);
  });
});

describe('disruption estimate', () => {
  it('r_t = R⋆ (M/m⋆)^{1/3}; the Hills mass puts r_t on the horizon', () => {
    expect(disruptionRadius(10, 1e-6)).toBeCloseTo(1000, 9);
    const comp = 2e-6;
    const ratio = hillsMassRatio(comp, 2); // M_H / m⋆
    // For M = M_H: R⋆ = comp⁻¹ m⋆ = comp⁻¹ M/ratio in units of M, and r_t must equal 2.
    const rStar = 1 / (comp * ratio);
    expect(Math.abs(disruptionRadius(rStar, 1 / ratio) / 2 - 1)).toBeLessThan(1e-14);
  });
});
