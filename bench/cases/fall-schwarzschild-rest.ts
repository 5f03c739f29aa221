/** In-process: freeFall in Schwarzschild from rest at r₁ = 10 down to r₂ = 1 (the cycloid, closed form). */
import type { FallCase } from '../fall.js';

const fallSchwarzschildRest: FallCase = {
  name: 'Schwarzschild, rest at 10 → 1',
  spacetime: { a: 0, q: 0 },
  request: { r1: 10, r2: 1, theta: Math.PI / 2, start: { kind: 'rest' } },
  options: { relativeTolerance: 1e-12 },
  method: 'closedForm',
};
export default fallSchwarzschildRest;
