/**
 * The DOP853 integrator on problems with known solutions: the harmonic oscillator (sin, cos), the
 * Kepler two-body orbit (closed orbit of eccentricity e: exact period, conserved energy), its dense
 * output between steps, and its order (error ∝ h⁸ on fixed steps).
 */
import { describe, expect, it } from 'vitest';
import { Dop853, type OdeSystem } from '../../src/physics/dop853.js';

const oscillator: OdeSystem = {
  n: 2,
  rhs(_t, y, d) {
    d[0] = y[1]!;
    d[1] = -y[0]!;
  },
};

/** Kepler problem, GM = 1: y = (x, y, vx, vy). */
const kepler: OdeSystem = {
  n: 4,
  rhs(_t, y, d) {
    const r2 = y[0]! * y[0]! + y[1]! * y[1]!;
    const r3 = r2 * Math.sqrt(r2);
    d[0] = y[2]!;
    d[1] = y[3]!;
    d[2] = -y[0]! / r3;
    d[3] = -y[1]! / r3;
  },
};

function integrate(sys: OdeSystem, y0: number[], tEnd: number, rtol: number): Dop853 {
  const ode = new Dop853(sys, 0, y0, { rtol, atol: rtol * 1e-3 });
  while (ode.t < tEnd) {
    const status = ode.step(tEnd - ode.t);
    expect(status).toBe('accepted');
  }
  return ode;
}

describe('DOP853', () => {
  it('integrates the harmonic oscillator over 100 periods to its tolerance', () => {
    const tEnd = 200 * Math.PI;
    const ode = integrate(oscillator, [0, 1], tEnd, 1e-12);
    expect(ode.t).toBe(tEnd);
    // Global error grows about linearly with the number of steps: 1e−12 per step-unit × 100 periods
    // stays below 1e−9.
    expect(Math.abs(ode.y[0]! - Math.sin(tEnd))).toBeLessThan(1e-9);
    expect(Math.abs(ode.y[1]! - Math.cos(tEnd))).toBeLessThan(1e-9);
  });

  it('dense output matches the exact solution inside every step (7th order interpolant)', () => {
    const ode = new Dop853(oscillator, 0, [0, 1], { rtol: 1e-11 });
    const out = new Float64Array(2);
    let worst = 0;
    for (let s = 0; s < 40; s++) {
      expect(ode.step()).toBe('accepted');
      for (const x of [0.1, 0.37, 0.5, 0.81]) {
        const t = ode.tOld + x * (ode.t - ode.tOld);
        ode.interpolate(t, out);
        worst = Math.max(worst, Math.abs(out[0]! - Math.sin(t)), Math.abs(out[1]! - Math.cos(t)));
      }
    }
    // Interpolation error is of the same order as the step error (Hairer et al. 1993, §II.6).
    expect(worst).toBeLessThan(1e-9);
    // And it reproduces the step's end points exactly up to rounding.
    ode.interpolate(ode.t, out);
    expect(Math.abs(out[0]! - ode.y[0]!)).toBeLessThan(1e-15);
  });

  it('closes a Kepler orbit of eccentricity 0.6 after 10 periods and keeps its energy', () => {
    const e = 0.6;
    // Periapsis at r = 1 − e on the x axis, speed √((1 + e)/(1 − e)); semi-major axis 1, period 2π.
    const y0 = [1 - e, 0, 0, Math.sqrt((1 + e) / (1 - e))];
    const tEnd = 20 * Math.PI;
    const ode = integrate(kepler, y0, tEnd, 1e-13);
    const [x, y, vx, vy] = ode.y as unknown as number[];
    expect(Math.abs(x! - y0[0]!)).toBeLessThan(1e-8);
    expect(Math.abs(y!)).toBeLessThan(1e-8);
    const energy = 0.5 * (vx! * vx! + vy! * vy!) - 1 / Math.hypot(x!, y!);
    // Exact energy −1/(2a) = −0.5.
    expect(Math.abs(energy + 0.5)).toBeLessThan(1e-10);
  });

  it('converges at order 8 on fixed steps', () => {
    // Steps forced by maxStep with a loose tolerance so the controller never shrinks them.
    const errAt = (h: number) => {
      const ode = new Dop853(oscillator, 0, [0, 1], { rtol: 1, atol: 1, firstStep: h, maxStep: h });
      while (ode.t < 4 - 1e-12) ode.step(4 - ode.t);
      return Math.abs(ode.y[0]! - Math.sin(4));
    };
    const ratio = errAt(0.4) / errAt(0.2);
    // 2⁸ = 256 for an 8th-order method; the pre-asymptotic range leaves a margin.
    expect(ratio).toBeGreaterThan(150);
    expect(ratio).toBeLessThan(600);
  });

  it('refuses to crawl: a solution that blows up stops with a status', () => {
    // y' = y², y(0) = 1: y = 1/(1 − t) blows up at t = 1.
    const sys: OdeSystem = { n: 1, rhs: (_t, y, d) => void (d[0] = y[0]! * y[0]!) };
    const ode = new Dop853(sys, 0, [1], { rtol: 1e-10 });
    let status = 'accepted';
    for (let i = 0; i < 100_000 && status === 'accepted'; i++) status = ode.step();
    expect(status === 'stepTooSmall' || status === 'notFinite').toBe(true);
    // It stops at the pole rather than hanging; a relative error control cannot see the pole itself,
    // so the geodesic driver guards its singularities (Σ → 0) by events, not by this status.
    expect(Math.abs(ode.t - 1)).toBeLessThan(1e-6);
    expect(ode.accepted).toBeLessThan(100_000);
  });
});
