/**
 * In-process: deflection of the Schwarzschild ray whose closest approach is r₀ = 4 (b = 4√2), by
 * Darwin's closed form. The scipy rival integrates the same deflection (bench/rivals/scipy_deflection.py).
 */
import type { DeflectionCase } from '../light.js';

const r0 = 4;

const deflectionSchwarzschildR4: DeflectionCase = {
  kind: 'deflection',
  name: 'deflection, Schwarzschild, r₀=4',
  spacetime: { a: 0, q: 0 },
  request: { ray: { closestApproach: r0 } },
  method: 'darwin',
  // The service's default quadrature tolerance, for a rival that has no closed form.
  rival: { r0, epsrel: 1e-12 },
};
export default deflectionSchwarzschildR4;
