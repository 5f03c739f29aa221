/**
 * Coordinate transformations against test/fixtures/python/transform.py: sympy derives the Kerr–Schild
 * and river metrics from the Boyer–Lindquist one under the coordinate changes and checks every closed
 * form used here; mpmath (40 digits) gives the events, the Jacobian (by numerical differentiation of
 * the whole map) and the Kerr–Schild metric over a grid of spins, charges, radii (outside, between and
 * inside the horizons, down to 2r = Q²) and angles, including extremal holes and bodies with a surface.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  blToHub,
  blToKerrSchild,
  blToRiver,
  kerrSchildRadius,
  type Vec4,
} from '../../src/physics/coordinates.js';
import { jacobians, metricAt } from '../../src/physics/coordinate-jacobians.js';

interface Event {
  a: number;
  q: number;
  bl: Vec4;
  tbarMinusT: number;
  phibarMinusPhi: number;
  kerrSchild: Vec4;
  phibar: number;
  river: Vec4 | null;
  jacobianBlToKerrSchild: number[][];
  jacobianBlToRiver: number[][] | null;
  kerrSchildMetric: number[][];
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/transform.json', import.meta.url), 'utf8')) as {
  dps: number;
  symbolicChecks: string[];
  events: Event[];
  cartesianRadii: { a: number; cartesian: [number, number, number]; r: number }[];
};

/**
 * 1e-12 relative to max(|expected|, scale): the maps are closed forms (a few logarithms, atanh/atan,
 * trigonometric functions) and, for the river chart, a quadrature at 1e-14, each good to a few ulps of
 * its own terms; where terms cancel (t̄ − t = ln|Δ| + (2 − Q²) J, x = (r cos φ̄ − a sin φ̄) sinθ) the error
 * is a few ulps of the terms, so the scale is the size of the terms: 1 for times and angles, r + a for
 * Cartesian lengths. The reference is exact to 40 digits for the same double inputs (mpmath's numerical
 * derivative to ~30 digits).
 */
const REL = 1e-12;
function near(what: string, actual: number, expected: number, scale = 1, rel = REL): void {
  expect(Number.isFinite(actual), `${what}: ${actual}`).toBe(true);
  const tol = rel * Math.max(Math.abs(expected), scale);
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tol);
}

describe('transform fixture', () => {
  it('records its provenance and the symbolic checks', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(fixture.symbolicChecks.length).toBeGreaterThanOrEqual(8);
    expect(fixture.events.length).toBeGreaterThan(200);
  });

  it('Boyer–Lindquist → Kerr–Schild Cartesian events, t̄ − t and φ̄ − φ', () => {
    for (const e of fixture.events) {
      const s = { a: e.a, q: e.q };
      const what = `a=${e.a} Q=${e.q} r=${e.bl[1]} θ=${e.bl[2]}`;
      const h = blToHub(s, e.bl);
      expect(h.ok, what).toBe(true);
      if (!h.ok) continue;
      near(`${what} t̄−t`, h.value[0] - e.bl[0], e.tbarMinusT);
      near(`${what} φ̄`, h.value[3], e.phibar);
      const ks = blToKerrSchild(s, e.bl)!;
      const lscale = e.bl[1] + e.a;
      near(`${what} t̄`, ks[0], e.kerrSchild[0], Math.max(1, Math.abs(e.tbarMinusT)));
      for (let i = 1; i < 4; i++) near(`${what} x${i}`, ks[i]!, e.kerrSchild[i]!, lscale);
    }
  });

  it('Boyer–Lindquist → river events (null where 2r < Q²)', () => {
    let compared = 0;
    for (const e of fixture.events) {
      const s = { a: e.a, q: e.q };
      const what = `a=${e.a} Q=${e.q} r=${e.bl[1]} θ=${e.bl[2]}`;
      const rv = blToRiver(s, e.bl);
      if (e.river === null) {
        expect(rv, what).toBeNull();
        continue;
      }
      expect(rv, what).not.toBeNull();
      // T − t = (t̄ − t) + (T − t̄): the scale is the larger of the two terms.
      const scale = Math.max(1, Math.abs(e.tbarMinusT), Math.abs(e.river[0] - e.bl[0] - e.tbarMinusT));
      near(`${what} T`, rv![0], e.river[0], scale);
      expect(rv![1]).toBe(e.river[1]);
      expect(rv![2]).toBe(e.river[2]);
      near(`${what} Φ`, rv![3], e.river[3], Math.max(1, Math.abs(e.phibarMinusPhi)));
      compared++;
    }
    expect(compared).toBeGreaterThan(200);
  });

  it('Jacobians ∂(t̄, x, y, z)/∂(t, r, θ, φ) and ∂(T, r, θ, Φ)/∂(t, r, θ, φ)', () => {
    for (const e of fixture.events) {
      const s = { a: e.a, q: e.q };
      const what = `a=${e.a} Q=${e.q} r=${e.bl[1]} θ=${e.bl[2]}`;
      const h = blToHub(s, e.bl);
      if (!h.ok) throw new Error(what);
      const ks = jacobians(s, 'boyerLindquist', 'kerrSchild', h.value).forward!;
      // The r-column carries μ/Δ and a/Δ: near a horizon Δ is a small difference of O(r² + 1) terms
      // whose inputs (r, a², Q²) are rounded, so 1/Δ is known to ~4ε(r² + 2)/|Δ| relative — the
      // condition of the problem, added to the 1e-12.
      const r = e.bl[1];
      const delta = Math.abs(r * r - 2 * r + e.a * e.a + e.q * e.q);
      const rel = REL + (4 * Number.EPSILON * (r * r + 2)) / delta;
      // Row scale: the largest entry of the row (entries are sums of products of the row's terms).
      for (let i = 0; i < 4; i++) {
        const rowScale = Math.max(1, ...e.jacobianBlToKerrSchild[i]!.map(Math.abs));
        for (let j = 0; j < 4; j++) near(`${what} J[${i}][${j}]`, ks[i]![j]!, e.jacobianBlToKerrSchild[i]![j]!, rowScale, rel);
      }
      if (e.jacobianBlToRiver) {
        const rv = jacobians(s, 'boyerLindquist', 'river', h.value).forward!;
        for (let i = 0; i < 4; i++) {
          for (let j = 0; j < 4; j++) near(`${what} Jriver[${i}][${j}]`, rv[i]![j]!, e.jacobianBlToRiver[i]![j]!, 1, rel);
        }
      }
    }
  });

  it('Kerr–Schild metric η + f k ⊗ k at each event', () => {
    for (const e of fixture.events) {
      const s = { a: e.a, q: e.q };
      const h = blToHub(s, e.bl);
      if (!h.ok) throw new Error('hub');
      const g = metricAt('kerrSchild', s, h.value);
      for (let i = 0; i < 4; i++) {
        for (let j = 0; j < 4; j++) near(`a=${e.a} r=${e.bl[1]} g[${i}][${j}]`, g[i]![j]!, e.kerrSchildMetric[i]![j]!, 1);
      }
    }
  });

  it('the Kerr–Schild radius of Cartesian points (roots of the quartic by mpmath)', () => {
    for (const c of fixture.cartesianRadii) {
      // The stable root formulas: a few roundings relative to r itself.
      near(`a=${c.a} (${c.cartesian.join(', ')})`, kerrSchildRadius(c.a, ...c.cartesian), c.r, 0);
    }
  });
});
