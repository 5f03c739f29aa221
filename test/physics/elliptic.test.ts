/**
 * Carlson's symmetric elliptic integrals and the Legendre forms against mpmath (elliprf, elliprj,
 * elliprd, elliprc, ellipf, ellipe, ellipk at 40 digits; test/fixtures/python/light.py), plus the
 * identities that tie them together and the domain contract.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  carlsonRC,
  carlsonRD,
  carlsonRF,
  carlsonRJ,
  ellipticE,
  ellipticEIncomplete,
  ellipticF,
  ellipticK,
} from '../../src/physics/elliptic.js';

interface Args {
  args: number[];
  value: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/light.json', import.meta.url), 'utf8')) as {
  dps: number;
  elliptic: {
    rf: Args[];
    rj: Args[];
    rd: Args[];
    rc: Args[];
    legendre: { phi: number; m: number; F: number; E: number }[];
    complete: { m: number; K: number; E: number }[];
  };
};
const E = fixture.elliptic;

// 1e-14 relative: the duplication algorithm stops when its truncation error is below 2^−53 (Carlson
// 1995), so what remains is rounding: a few operations per step over at most ~30 steps, which stays
// within a few tens of ulp (2.2e-16 each). The reference is exact to 40 digits for the same inputs.
const REL = 1e-14;
function near(actual: number, expected: number, rel = REL): void {
  expect(Math.abs(actual - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(rel * Math.abs(expected));
}

describe('Carlson integrals against mpmath (fixture)', () => {
  it('has cases for every form', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(E.rf.length).toBeGreaterThanOrEqual(8);
    expect(E.rj.length).toBeGreaterThanOrEqual(6);
    expect(E.rd.length).toBeGreaterThanOrEqual(4);
    expect(E.rc.length).toBeGreaterThanOrEqual(6);
  });
  for (const c of E.rf) it(`R_F(${c.args.join(', ')})`, () => near(carlsonRF(c.args[0]!, c.args[1]!, c.args[2]!), c.value));
  for (const c of E.rj) it(`R_J(${c.args.join(', ')})`, () => near(carlsonRJ(c.args[0]!, c.args[1]!, c.args[2]!, c.args[3]!), c.value));
  for (const c of E.rd) it(`R_D(${c.args.join(', ')})`, () => near(carlsonRD(c.args[0]!, c.args[1]!, c.args[2]!), c.value));
  for (const c of E.rc) it(`R_C(${c.args.join(', ')})`, () => near(carlsonRC(c.args[0]!, c.args[1]!), c.value));
});

describe('Legendre forms against mpmath (fixture)', () => {
  for (const c of E.legendre) {
    it(`F(${c.phi}, ${c.m}) and E(${c.phi}, ${c.m})`, () => {
      // 2e-14: the reduction φ − jπ and sin, cos of φ add a few ulp to the Carlson error above.
      near(ellipticF(c.phi, c.m), c.F, 2e-14);
      near(ellipticEIncomplete(c.phi, c.m), c.E, 2e-14);
    });
  }
  for (const c of E.complete) {
    it(`K(${c.m}) and E(${c.m})`, () => {
      near(ellipticK(c.m), c.K);
      near(ellipticE(c.m), c.E);
    });
  }
});

describe('identities', () => {
  const pos = fc.double({ min: 1e-6, max: 1e6, noNaN: true });
  it('R_F is symmetric and homogeneous of degree −1/2', () => {
    fc.assert(
      fc.property(pos, pos, pos, fc.double({ min: 1e-3, max: 1e3, noNaN: true }), (x, y, z, l) => {
        const v = carlsonRF(x, y, z);
        near(carlsonRF(z, x, y), v, 1e-14);
        near(carlsonRF(y, z, x), v, 1e-14);
        near(carlsonRF(l * x, l * y, l * z), v / Math.sqrt(l), 1e-14);
      }),
      { numRuns: 200 },
    );
  });

  it('R_C(x, y) = R_F(x, y, y) and R_D(x, y, z) = R_J(x, y, z, z)', () => {
    fc.assert(
      fc.property(pos, pos, pos, (x, y, z) => {
        near(carlsonRC(x, y), carlsonRF(x, y, y), 1e-14);
        near(carlsonRD(x, y, z), carlsonRJ(x, y, z, z), 1e-14);
      }),
      { numRuns: 200 },
    );
  });

  it("R_C has its elementary closed forms (arccos for x < y, arccosh for x > y; principal value for y < 0)", () => {
    near(carlsonRC(1, 2), Math.acos(Math.sqrt(0.5)) / Math.sqrt(1), 1e-15);
    near(carlsonRC(4, 1), Math.acosh(2) / Math.sqrt(3), 1e-15);
    // Principal value for y < 0: √(x/(x − y)) R_C(x − y, −y).
    near(carlsonRC(1, -3), Math.sqrt(1 / 4) * (Math.acosh(Math.sqrt(4 / 3)) / Math.sqrt(1)), 1e-15);
  });

  it("Legendre's relation E K' + E' K − K K' = π/2 (DLMF 19.7.1 — number from memory)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1 - 1e-6, noNaN: true }), (m) => {
        const k = ellipticK(m);
        const e = ellipticE(m);
        const kp = ellipticK(1 - m);
        const ep = ellipticE(1 - m);
        // Terms up to K K' ≈ 50 at the ends of the range: 1e-14 of that.
        expect(Math.abs(e * kp + ep * k - k * kp - Math.PI / 2)).toBeLessThanOrEqual(1e-14 * Math.max(1, k * kp));
      }),
      { numRuns: 200 },
    );
  });

  it('incomplete integrals reach the complete ones at π/2 and are quasi-periodic', () => {
    for (const m of [0, 0.3, 0.9, -2]) {
      near(ellipticF(Math.PI / 2, m), ellipticK(m), 1e-15);
      near(ellipticEIncomplete(Math.PI / 2, m), ellipticE(m), 1e-15);
      near(ellipticF(0.4 + 2 * Math.PI, m), ellipticF(0.4, m) + 4 * ellipticK(m), 1e-14);
      near(ellipticF(-0.7, m), -ellipticF(0.7, m), 1e-15);
    }
    expect(ellipticF(0, 0.5)).toBe(0);
    near(ellipticF(0.3, 0), 0.3, 1e-15);
    near(ellipticK(0), Math.PI / 2, 1e-15);
    near(ellipticE(0), Math.PI / 2, 1e-15);
  });

  it('K grows like ln(4/√(1 − m)) at the logarithmic end (DLMF 19.12.1 — number from memory)', () => {
    const m = 1 - 1e-14;
    const k1 = Math.sqrt(1 - m);
    // K = ln(4/k') + O(k'² ln k'), k' = 1e-7: the neglected term is ~1e-13.
    expect(Math.abs(ellipticK(m) - Math.log(4 / k1))).toBeLessThan(1e-12);
  });
});

describe('domain contract', () => {
  it('is NaN outside the domain and +∞ where the integral diverges', () => {
    expect(carlsonRF(-1, 1, 1)).toBeNaN();
    expect(carlsonRF(1, Number.NaN, 1)).toBeNaN();
    expect(carlsonRF(1, Number.POSITIVE_INFINITY, 1)).toBeNaN();
    expect(carlsonRF(0, 0, 1)).toBe(Number.POSITIVE_INFINITY);
    expect(carlsonRJ(1, 1, 1, 0)).toBeNaN();
    expect(carlsonRJ(1, 1, 1, -1)).toBeNaN();
    expect(carlsonRJ(0, 0, 1, 1)).toBe(Number.POSITIVE_INFINITY);
    expect(carlsonRD(1, 1, 0)).toBeNaN();
    expect(carlsonRD(0, 0, 1)).toBe(Number.POSITIVE_INFINITY);
    expect(carlsonRC(1, 0)).toBeNaN();
    expect(carlsonRC(-1, 1)).toBeNaN();
    expect(ellipticK(1)).toBe(Number.POSITIVE_INFINITY);
    expect(ellipticK(1.5)).toBeNaN();
    expect(ellipticE(1)).toBe(1);
    expect(ellipticF(1.2, 2)).toBeNaN(); // 1 − m sin²φ < 0
    expect(ellipticF(4, 1)).toBeNaN(); // beyond π/2 with m = 1
    expect(ellipticF(Number.NaN, 0.5)).toBeNaN();
  });
});
