/**
 * Horizon properties against two published identities that tie them together, over random black
 * holes: the Smarr formula and the Christodoulou–Ruffini mass formula.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { horizonProperties } from '../../src/physics/horizon.js';

const blackHole = fc
  .tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: Math.PI / 2, noNaN: true }))
  .map(([k, phi]) => ({ a: k * Math.cos(phi), q: k * Math.sin(phi) }));

describe('horizon properties', () => {
  it('Smarr (1973, Phys. Rev. Lett. 30:71): M = κA/4π + 2Ω_H J + Φ_H Q, with M = 1, J = a', () => {
    fc.assert(
      fc.property(blackHole, (s) => {
        const h = horizonProperties(s)!;
        const m = (h.surfaceGravity * h.horizonArea) / (4 * Math.PI) + 2 * h.horizonAngularVelocity * s.a + h.horizonElectricPotential * s.q;
        // 1e-14: a sum of three positive terms of closed forms, each a few roundings.
        expect(Math.abs(m - 1)).toBeLessThan(1e-14);
      }),
    );
  });

  it('Christodoulou & Ruffini (1971, Phys. Rev. D 4:3552): M² = (M_irr + Q²/4M_irr)² + J²/4M_irr²', () => {
    fc.assert(
      fc.property(blackHole, (s) => {
        const mi = horizonProperties(s)!.irreducibleMass;
        const m2 = (mi + (s.q * s.q) / (4 * mi)) ** 2 + (s.a * s.a) / (4 * mi * mi);
        expect(Math.abs(m2 - 1)).toBeLessThan(1e-14);
      }),
    );
  });

  it('Schwarzschild: κ = 1/4M, A = 16πM², M_irr = M; extremal holes are cold (κ = 0)', () => {
    const h = horizonProperties({ a: 0, q: 0 })!;
    expect(h.surfaceGravity).toBe(0.25);
    expect(h.horizonArea).toBeCloseTo(16 * Math.PI, 13);
    expect(h.irreducibleMass).toBe(1);
    expect(horizonProperties({ a: 1, q: 0 })!.surfaceGravity).toBe(0);
    expect(horizonProperties({ a: 0.6, q: 0.8 })!.hawkingTemperature).toBe(0);
    expect(horizonProperties({ a: 0.8, q: 0.8 })).toBeNull();
  });
});
