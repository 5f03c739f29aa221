/**
 * In-process: freeFall in a Reissner–Nordström hole with Q/M = 0.5, from rest at infinity (E = 1),
 * passing r₁ = 10, down to r₂ = 0.5, between the horizons (quadrature). The scipy rival integrates the
 * same proper time, τ = ∫ dr/√(1 − f(r)) over [0.5, 10].
 */
import type { FallCase } from '../fall.js';

const q = 0.5;
const r1 = 10;
const r2 = 0.5;
const relativeTolerance = 1e-12;

const fallRnInfinity: FallCase = {
  name: 'Reissner–Nordström q=0.5, rest at ∞, 10 → 0.5',
  spacetime: { a: 0, q },
  request: { r1, r2, theta: Math.PI / 2, start: { kind: 'restAtInfinity' } },
  options: { relativeTolerance },
  method: 'quadrature',
  rival: { q, energy: 1, rMin: r2, rMax: r1, epsrel: relativeTolerance },
};
export default fallRnInfinity;
