/**
 * The typed-array sweep kernels against the single-point functions: every value bit-for-bit
 * (Object.is) and every reason text equal to evaluateLocal's, over random grids that reach inside the
 * horizons, the ergoregion, the region 2r < Q² and the closed-timelike-curve region of charged,
 * spinning holes; the domain codes against normalizeBody/normalizePoint's refusals.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateLocal, LOCAL_QUANTITIES, REASONS } from '../../src/physics/local.js';
import { horizonProperties } from '../../src/physics/horizon.js';
import { BODY_QUANTITIES, sweepBody } from '../../src/physics/sweep-body.js';
import {
  bodyDomainCode,
  DOMAIN_REASONS,
  MAX_REASONS,
  REASON,
  ReasonTable,
  sweepDomain,
  sweepLocal,
  type SweepGrid,
} from '../../src/physics/sweep.js';

const finite = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

/** A random grid of n points: per-point arrays or broadcast scalars for each parameter. */
const gridArb = fc
  .record({
    n: fc.integer({ min: 1, max: 40 }),
    aScalar: fc.option(finite(0, 1.2), { nil: undefined }),
    qScalar: fc.option(finite(-1.1, 1.1), { nil: undefined }),
    thetaScalar: fc.option(fc.constantFrom(0, Math.PI / 2, Math.PI, 1), { nil: undefined }),
    surface: fc.option(finite(1.5, 20), { nil: undefined }),
    seed: fc.integer(),
  })
  .chain((g) =>
    fc.record({
      g: fc.constant(g),
      a: fc.array(fc.oneof(finite(0, 1.05), fc.constantFrom(0, 0.5, 1)), { minLength: g.n, maxLength: g.n }),
      q: fc.array(fc.oneof(finite(-1.05, 1.05), fc.constantFrom(0, 0.3, 1)), { minLength: g.n, maxLength: g.n }),
      r: fc.array(fc.oneof(finite(1e-3, 50), fc.constantFrom(1, 2, 0.5, 1e-300)), { minLength: g.n, maxLength: g.n }),
      theta: fc.array(fc.oneof(finite(-0.2, 3.3), fc.constantFrom(0, Math.PI / 2, Math.PI)), { minLength: g.n, maxLength: g.n }),
    }),
  )
  .map(({ g, a, q, r, theta }) => {
    const grid: SweepGrid = {
      n: g.n,
      a: g.aScalar ?? Float64Array.from(a),
      q: g.qScalar ?? Float64Array.from(q),
      r: Float64Array.from(r),
      theta: g.thetaScalar ?? Float64Array.from(theta),
      surface: g.surface ?? Number.NaN,
    };
    return grid;
  });

const at = (p: number | Float64Array, i: number) => (typeof p === 'number' ? p : p[i]!);

describe('sweepLocal', () => {
  it('equals evaluateLocal bit for bit, with the same reason, at every admissible point', () => {
    fc.assert(
      fc.property(gridArb, fc.constantFrom(...LOCAL_QUANTITIES), finite(1e-3, 1e3), (grid, name, factor) => {
        const domain = new Uint8Array(grid.n);
        sweepDomain(grid, domain);
        const out = new Float64Array(grid.n);
        const codes = new Uint8Array(grid.n);
        sweepLocal(name, grid, domain, factor, out, codes);
        const texts = new ReasonTable().texts;
        for (let i = 0; i < grid.n; i++) {
          if (domain[i] !== 0) {
            expect(Number.isNaN(out[i]!)).toBe(true);
            expect(codes[i]).toBe(domain[i]);
            continue;
          }
          const R = at(grid.surface, i);
          const single = evaluateLocal({ a: at(grid.a, i), q: at(grid.q, i) }, at(grid.r, i), at(grid.theta, i), R === R ? R : undefined);
          const geo = single.values[name];
          const si = geo * factor;
          if (Number.isFinite(geo) && Number.isFinite(si)) {
            expect(Object.is(out[i], si), `${name} at ${i}: ${out[i]} vs ${si}`).toBe(true);
            expect(codes[i]).toBe(0);
          } else {
            expect(Number.isNaN(out[i]!)).toBe(true);
            expect(texts[codes[i]!]).toBe(single.reasons[name]);
          }
        }
      }),
      { numRuns: 400 },
    );
  });

  it('gives the flow speed c on the horizon and the reasons inside it (Schwarzschild)', () => {
    const grid: SweepGrid = { n: 3, a: 0, q: 0, r: Float64Array.of(1, 2, 8), theta: Math.PI / 2, surface: Number.NaN };
    const domain = new Uint8Array(3);
    const out = new Float64Array(3);
    const codes = new Uint8Array(3);
    sweepLocal('flowSpeed', grid, domain, 1, out, codes);
    // v = √(2/r): √2 inside, exactly 1 on the horizon r = 2, 1/2 at r = 8.
    expect([...out]).toEqual([Math.SQRT2, 1, 0.5]);
    sweepLocal('staticClockRate', grid, domain, 1, out, codes);
    expect(codes[0]).toBe(REASON.insideHorizon);
    expect(codes[1]).toBe(REASON.onHorizon);
    expect(out[2]).toBe(Math.sqrt(0.75));
  });

  it('marks a finite value whose SI product overflows with the SI reason', () => {
    // v = √2 at r = 1 (inside the horizon, where the flow speed still exists); √2 × 1.5e308 overflows.
    const grid: SweepGrid = { n: 1, a: 0, q: 0, r: 1, theta: 1, surface: Number.NaN };
    const out = new Float64Array(1);
    const codes = new Uint8Array(1);
    sweepLocal('flowSpeed', grid, new Uint8Array(1), 1.5e308, out, codes);
    expect(Number.isNaN(out[0]!)).toBe(true);
    expect(codes[0]).toBe(REASON.siNotFinite);
  });
});

describe('sweepDomain', () => {
  it('refuses what a single request refuses: naked singularity, radius inside the horizon or ergosurface, θ outside [0, π], below the surface', () => {
    expect(bodyDomainCode(0.9, 0.5, Number.NaN)).toBe(REASON.nakedSingularity);
    expect(bodyDomainCode(0.9, 0.5, 5)).toBe(0); // a body with a surface may be over-spun
    expect(bodyDomainCode(0, 0, 2)).toBe(REASON.radiusInsideHorizon);
    expect(bodyDomainCode(0.9, 0, 1.9)).toBe(REASON.radiusInsideErgosurface);
    expect(bodyDomainCode(1, 0, Number.NaN)).toBe(0); // extremal Kerr is a black hole
    const grid: SweepGrid = {
      n: 4,
      a: 0,
      q: 0,
      r: Float64Array.of(3, 4, 5, 6),
      theta: Float64Array.of(-0.1, 1, 1, Math.PI),
      surface: 4.5,
    };
    const codes = new Uint8Array(4);
    expect(sweepDomain(grid, codes)).toBe(2);
    expect([...codes]).toEqual([REASON.thetaOutOfRange, REASON.belowSurface, 0, 0]);
    expect(new ReasonTable().texts[REASON.belowSurface]).toBe(DOMAIN_REASONS.belowSurface);
    // Body-only quantities check the body alone.
    expect(sweepDomain(grid, codes, false)).toBe(4);
  });
});

describe('ReasonTable', () => {
  it('starts with the local reasons and falls back when full', () => {
    const t = new ReasonTable();
    expect(t.texts[REASON.ergoregion]).toBe(REASONS.ergoregion);
    expect(t.intern(REASONS.noFlow, '')).toBe(REASON.noFlow);
    const first = t.intern('a new reason', REASONS.notFinite);
    expect(t.intern('a new reason', REASONS.notFinite)).toBe(first);
    for (let i = 0; t.texts.length < MAX_REASONS; i++) t.intern(`filler ${i}`, REASONS.notFinite);
    expect(t.intern('one too many', REASONS.escapeInside)).toBe(REASON.escapeInside);
  });
});

describe('sweepBody', () => {
  it('evaluates each body once and equals horizonProperties bit for bit', () => {
    const a = Float64Array.of(0, 0.5, 0.5, 0.99, 1.2);
    const out = new Float64Array(5);
    const codes = new Uint8Array(5);
    const table = new ReasonTable();
    sweepBody('surfaceGravity', 5, a, 0, Number.NaN, 2, out, codes, table, (r) => String(r));
    for (let i = 0; i < 4; i++) expect(Object.is(out[i], horizonProperties({ a: a[i]!, q: 0 })!.surfaceGravity * 2)).toBe(true);
    expect(codes[4]).toBe(REASON.nakedSingularity);
    expect(BODY_QUANTITIES).toContain('iscoPrograde');
  });
});
