/**
 * Geodesics against test/fixtures/geodesic.json (scipy solve_ivp DOP853 at rtol 1e−12 on Hamilton's
 * equations differentiated by sympy, initial momenta solved in mpmath; the periastron advance of
 * Schwarzschild orbits in closed form, checked there by two quadratures), and the conserved quantities.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { geodesic, type Geodesic } from '../../src/physics/geodesic.js';

interface OrbitCase {
  name: string;
  particle: 'timelike' | 'null';
  a: number;
  q: number;
  E: number;
  L: number;
  carter: number;
  r: number;
  theta: number;
  phi: number;
  radialSign: 1 | -1;
  polarSign: 1 | -1;
  maxLength: number;
  samples: number;
  stopAtHorizon?: boolean;
  reference: {
    lambda: number[];
    r: number[];
    theta: number[];
    phi: number[];
    v: number[];
    river: number[];
    horizon?: { lambda: number; v: number; river: number };
  };
}

const fixture = JSON.parse(readFileSync(new URL('../fixtures/geodesic.json', import.meta.url), 'utf8')) as {
  orbits: OrbitCase[];
  periastron: { p: number; e: number; E: number; L: number; rPeriapsis: number; rApoapsis: number; phiPerRadialPeriod: number }[];
};

function run(c: OrbitCase, rtol: number): Geodesic {
  const g = geodesic(
    { a: c.a, q: c.q },
    {
      particle: c.particle,
      start: { kind: 'constants', r: c.r, theta: c.theta, phi: c.phi, E: c.E, L: c.L, carter: c.carter, radialSign: c.radialSign, polarSign: c.polarSign },
      maxLength: c.maxLength,
      samples: c.samples,
      // The reference is sampled at multiples of maxLength/(samples − 1), also for the plunge.
      sampleOver: 'maxLength',
      rtol,
      maxSteps: 1_000_000,
      ...(c.stopAtHorizon ? { stopAt: 'outerHorizon' as const } : {}),
    },
  );
  if (!g.ok) throw new Error(`${c.name}: ${g.message}`);
  return g;
}

describe('geodesics against scipy solve_ivp (DOP853, rtol 1e−12)', () => {
  for (const c of fixture.orbits) {
    it(`${c.name}: positions and clocks agree at every sample`, () => {
      const g = run(c, 1e-12);
      const ref = c.reference;
      const n = ref.lambda.length;
      expect(g.samples.count).toBeGreaterThanOrEqual(n);
      let worst = 0;
      for (let k = 0; k < n; k++) {
        expect(g.samples.lambda[k]).toBeCloseTo(ref.lambda[k]!, 9);
        // Agreement 1e−8 (the target over ~10 orbits), relative to max(1, |x|): two integrators at
        // rtol 1e−12 accumulate global errors of ~1e−10 over these lengths.
        for (const [ours, theirs] of [
          [g.samples.r[k]!, ref.r[k]!],
          [g.samples.theta[k]!, ref.theta[k]!],
          [g.samples.phi[k]!, ref.phi[k]!],
          [g.samples.v[k]!, ref.v[k]!],
          [g.samples.river[k]!, ref.river[k]!],
        ] as const) {
          worst = Math.max(worst, Math.abs(ours - theirs) / Math.max(1, Math.abs(theirs)));
        }
      }
      expect(worst).toBeLessThan(1e-8);
      if (ref.horizon) {
        expect(g.termination).toBe('outerHorizon');
        const ev = g.events.find((e) => e.kind === 'outerHorizon')!;
        // Event location on the dense output: both to ~1e−12.
        expect(Math.abs(ev.lambda - ref.horizon.lambda)).toBeLessThan(1e-9);
        expect(Math.abs(ev.v - ref.horizon.v)).toBeLessThan(1e-9);
        expect(Math.abs(ev.river - ref.horizon.river)).toBeLessThan(1e-9);
      }
    });
  }

  it('the Carter constant and the mass shell drift below 1e−10 relative over ~10 orbits at rtol 1e−12', () => {
    for (const c of fixture.orbits.slice(0, 2)) {
      // At the default rtol 1e−10 the drift is ~1e−9 over these ~20 windings: the global error of the path.
      for (const rtol of [1e-12]) {
        const g = run(c, rtol);
        // E = −p_v and L = p_φ̃ are constants of the equations (not integrated): no drift by construction.
        expect(g.constants.E).toBe(c.E);
        expect(g.constants.L).toBe(c.L);
        const dK = Math.abs(g.end.carter - g.start.carter) / Math.abs(g.start.carter);
        const dH = Math.abs(g.end.twiceH - g.start.twiceH);
        expect(Math.abs(g.start.carter - c.carter) / c.carter).toBeLessThan(1e-14);
        expect(dK, `${c.name} rtol ${rtol}`).toBeLessThan(1e-10);
        expect(dH, `${c.name} rtol ${rtol}`).toBeLessThan(1e-10);
      }
    }
  });
});

describe('periastron advance of bound Schwarzschild orbits (closed form, elliptic integral)', () => {
  for (const p of fixture.periastron) {
    it(`p = ${p.p}, e = ${p.e}: Δφ per radial period`, () => {
      const g = geodesic(
        { a: 0, q: 0 },
        {
          particle: 'timelike',
          start: { kind: 'constants', r: p.rPeriapsis, theta: Math.PI / 2, phi: 0, E: p.E, L: p.L, carter: 0, radialSign: 1, polarSign: 1 },
          // Long enough for three radial periods (the Newtonian period 2π a^{3/2} times a margin).
          maxLength: 3.5 * 2 * Math.PI * ((p.rPeriapsis + p.rApoapsis) / 2) ** 1.5,
          samples: 2,
          rtol: 1e-12,
        },
      );
      if (!g.ok) throw new Error(g.message);
      const peri = g.events.filter((e) => e.kind === 'radialTurningPoint' && Math.abs(e.r - p.rPeriapsis) < 1e-3);
      const apo = g.events.filter((e) => e.kind === 'radialTurningPoint' && Math.abs(e.r - p.rApoapsis) < 1e-3);
      expect(peri.length).toBeGreaterThanOrEqual(2);
      expect(apo.length).toBeGreaterThanOrEqual(2);
      // Between consecutive periapses and consecutive apoapses (not from the start: a start placed exactly
      // on a turning point is off it by rounding, which shifts the phase by ~√ε ≈ 1e−7 once, not per orbit).
      // 1e−10 relative: the dense-output location of dr/dλ = 0 (a simple zero) plus the global error at rtol 1e−12.
      for (const list of [peri, apo]) {
        for (let k = 1; k < list.length; k++) {
          expect(Math.abs(list[k]!.phi - list[k - 1]!.phi - p.phiPerRadialPeriod) / p.phiPerRadialPeriod).toBeLessThan(1e-10);
        }
      }
    });
  }
});
