/**
 * In-process: freeFall in the equatorial plane of a Kerr hole with a/M = 0.9, released from rest
 * (relative to the ZAMO) at r₁ = 10 down to r₂ = 1, between the horizons (quadrature).
 */
import type { FallCase } from '../fall.js';

const fallKerrEquator: FallCase = {
  name: 'Kerr a=0.9 equator, rest at 10 → 1',
  spacetime: { a: 0.9, q: 0 },
  request: { r1: 10, r2: 1, theta: Math.PI / 2, start: { kind: 'rest' } },
  options: { relativeTolerance: 1e-12 },
  method: 'quadrature',
};
export default fallKerrEquator;
