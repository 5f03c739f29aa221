/**
 * In-process: deflection of a retrograde equatorial ray with closest approach r₀ = 10 past a
 * Kerr–Newman hole with a/M = 0.9, Q/M = 0.3, by quadrature (default relative tolerance 1e−12).
 */
import type { DeflectionCase } from '../light.js';

const deflectionKerrNewmanRetrograde: DeflectionCase = {
  kind: 'deflection',
  name: 'deflection, Kerr–Newman a=0.9 q=0.3, retrograde, r₀=10',
  spacetime: { a: 0.9, q: 0.3 },
  request: { ray: { closestApproach: 10 }, direction: 'retrograde' },
  method: 'quadrature',
};
export default deflectionKerrNewmanRetrograde;
