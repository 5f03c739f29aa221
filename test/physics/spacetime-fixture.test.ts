/**
 * The Kerr–Newman core against reference values from test/fixtures/python/spacetime.py: sympy builds
 * the metric, transforms it to river coordinates symbolically and differentiates it; mpmath evaluates
 * at 40 digits on a grid of (a, Q, r, θ) covering every region, overspun bodies and weak fields.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  boyerLindquistMetric,
  ergosurfaceRadius,
  flowSpeed,
  frameDragRate,
  horizons,
  hoverAcceleration,
  pointFunctions,
  riverMetric,
  staticClockOffset,
  staticClockRate,
  zamoClockOffset,
  zamoClockRate,
} from '../../src/physics/spacetime.js';

type N = number | null;
interface Case {
  a: number;
  q: number;
  r: number;
  theta: number;
  outerHorizon: N;
  innerHorizon: N;
  ergosurface: N;
  bl: Record<string, N>;
  river: Record<string, N> | null;
  lapse: N;
  frameDragRate: N;
  staticClockRate: N;
  staticClockOffset: N;
  flowSpeed: N;
  zamoClockOffset: N;
  hoverAcceleration: N;
  hoverAccelerationR: N;
  hoverAccelerationTheta: N;
}

const fixture = JSON.parse(readFileSync(new URL('../fixtures/spacetime.json', import.meta.url), 'utf8')) as {
  dps: number;
  cases: Case[];
};

// 1e-12 relative: closed-form expressions in double precision, a few roundings each; the reference is
// exact to 40 digits for the same double inputs. `floor` is the absolute scale below which a value
// counts as zero (components that vanish analytically come out as ~1e-17 through cos(π/2) ≠ 0).
const REL = 1e-12;
function close(what: string, actual: number, expected: N, floor = 1e-300, extra = 0): void {
  if (expected === null) {
    expect(Number.isFinite(actual), `${what}: expected no value, got ${actual}`).toBe(false);
    return;
  }
  expect(Number.isFinite(actual), `${what}: expected ${expected}, got ${actual}`).toBe(true);
  const tol = REL * Math.max(Math.abs(expected), floor) + extra;
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tol);
}
const orNaN = (x: number | null) => (x === null ? Number.NaN : x);

describe('Kerr–Newman core against the mpmath/sympy fixture', () => {
  it('has a real grid to test', () => {
    expect(fixture.dps).toBeGreaterThanOrEqual(30);
    expect(fixture.cases.length).toBeGreaterThan(500);
  });

  for (const c of fixture.cases) {
    const name = `a=${c.a} q=${c.q} r=${c.r} θ=${c.theta}`;
    it(name, () => {
      const s = { a: c.a, q: c.q };
      const p = pointFunctions(s, c.r, c.theta);
      // On a horizon, Δ of the rounded radius is ~1e-16 and quantities with Δ in a denominator or
      // under a square root are ill-conditioned: they are compared only away from the horizons.
      const onHorizon = c.r === c.outerHorizon || c.r === c.innerHorizon;
      const h = horizons(s);
      close('outerHorizon', orNaN(h?.outer ?? null), c.outerHorizon);
      close('innerHorizon', orNaN(h?.inner ?? null), c.innerHorizon);
      close('ergosurface', orNaN(ergosurfaceRadius(s, c.theta)), c.ergosurface);

      // μ = 2r − Q² and Δ = r² + a² − μ are differences: near their zeros the absolute error of a
      // few ulp of the larger terms is what double precision can promise (the `extra` tolerances).
      const ulp = 4e-16 * Math.max(p.rho2, 2 * c.r);
      const sigma = p.sigma;
      const metricExtra = (ulp / sigma) * (1 + s.a);
      const bl = boyerLindquistMetric(s, p);
      const scale = Math.max(1, Math.abs(c.bl.phph ?? 0), Math.abs(c.bl.thth ?? 0));
      for (const k of ['tt', 'tphi', 'thth', 'phph'] as const) close(`bl.${k}`, bl[k], c.bl[k] ?? null, 1e-16 * scale, metricExtra);
      if (!onHorizon && c.bl.rr !== null) close('bl.rr', bl.rr, c.bl.rr ?? null);

      const river = riverMetric(s, p);
      if (c.river === null) {
        expect(river).toBeNull();
      } else {
        expect(river).not.toBeNull();
        for (const k of ['TT', 'Tr', 'TPhi', 'rr', 'rPhi', 'thth', 'PhiPhi'] as const) {
          close(`river.${k}`, river![k], c.river[k] ?? null, 1e-16 * scale, metricExtra);
        }
      }

      if (p.bigA > 0) {
        close('frameDragRate', frameDragRate(s, p), c.frameDragRate, 1e-300, (Math.abs(s.a) * ulp) / Math.abs(p.bigA));
      } else {
        // Where A ≤ 0 (g_φφ < 0, deep inside a spinning charged hole) the core declines to define ω.
        expect(frameDragRate(s, p)).toBeNaN();
      }
      if (onHorizon && s.a === 0) {
        // Non-rotating: the horizon is also the static limit; whether the rounded radius lies just
        // inside or outside is decided by the last bit, so only "≈ 0 or absent" can be asserted.
        const rate = staticClockRate(p);
        expect(Number.isNaN(rate) || rate < 1e-7).toBe(true);
      } else {
        close('staticClockRate', staticClockRate(p), c.staticClockRate, 1e-300, ulp / sigma / Math.abs(c.staticClockRate ?? 1));
        close('staticClockOffset', staticClockOffset(p), c.staticClockOffset, 1e-300, ulp / sigma);
      }
      if (p.mu >= 0 && p.bigA > 0) {
        close('flowSpeed', flowSpeed(p), c.flowSpeed, 1e-300, (p.rho2 * ulp) / Math.abs(p.bigA) / Math.abs(c.flowSpeed ?? 1));
      } else {
        // No flow where 2r < Q² (DESIGN.md), even where μ/A > 0 because A < 0 as well.
        expect(flowSpeed(p)).toBeNaN();
      }
      if (!onHorizon) {
        const dv2 = (p.rho2 * ulp) / Math.abs(p.bigA);
        close('zamoClockRate', zamoClockRate(p), c.lapse, 1e-300, dv2 / Math.abs(c.lapse ?? 1));
        // The fixture derives the ZAMO offset from the flow speed, which does not exist where 2r < Q²;
        // the ZAMO does exist there (lapse > 1), and its offset is 1 − lapse.
        const offset = c.zamoClockOffset ?? (c.lapse === null ? null : 1 - c.lapse);
        close('zamoClockOffset', zamoClockOffset(p), offset, 1e-300, dv2 + (c.zamoClockOffset === null ? 1e-15 : 0));
      }
      const hover = hoverAcceleration(s, p);
      if (!onHorizon) {
        const rel = 1 + ulp / Math.abs(p.delta) + ulp / Math.abs(sigma - p.mu);
        close('hoverAcceleration', hover.magnitude, c.hoverAcceleration, 1e-300, 1e-15 * rel * Math.abs(c.hoverAcceleration ?? 0));
        close('hoverAccelerationR', hover.r, c.hoverAccelerationR, 1e-300, 1e-15 * rel * Math.abs(c.hoverAccelerationR ?? 0));
        // a_θ vanishes analytically at θ = π/2; compare it on the scale of the whole vector.
        close('hoverAccelerationTheta', hover.theta, c.hoverAccelerationTheta, 1e-12 * Math.abs(c.hoverAcceleration ?? 0) * Math.sqrt(sigma));
      }
    });
  }
});
