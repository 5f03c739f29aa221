/**
 * In-process: a bound, inclined, eccentric orbit around a Kerr hole with a/M = 0.9 (E = 0.97, L = 3,
 * Carter constant 4, from r = 12 on the equator), followed for λ = 7000 GM/c³: about ten radial periods
 * (r between 7.0 and 25.7) and twenty windings, at rtol 1e−10 — the 10-orbit speed case. The
 * same orbit is a fixture of test/fixtures/python/geodesic.py at rtol 1e−12.
 */
import type { GeodesicBenchCase } from '../geodesic.js';

const geodesicKerrInclined: GeodesicBenchCase = {
  name: 'Kerr a=0.9 inclined bound orbit, ~10 orbits, rtol 1e-10',
  spacetime: { a: 0.9, q: 0 },
  request: {
    particle: 'timelike',
    start: { kind: 'constants', r: 12, theta: Math.PI / 2, phi: 0, E: 0.97, L: 3, carter: 4, radialSign: 1, polarSign: 1 },
    maxLength: 7000,
    samples: 41,
    rtol: 1e-10,
  },
  rival: true,
};
export default geodesicKerrInclined;
