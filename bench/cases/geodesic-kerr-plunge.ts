/**
 * In-process: a probe launched by the ZAMO at r = 10 around a Kerr hole with a/M = 0.9, at 0.3 c and 150°
 * from the outward radial direction: it crosses the outer horizon and is followed to the inner horizon.
 */
import type { GeodesicBenchCase } from '../geodesic.js';

const geodesicKerrPlunge: GeodesicBenchCase = {
  name: 'Kerr a=0.9 plunge through the horizon, rtol 1e-10',
  spacetime: { a: 0.9, q: 0 },
  request: {
    particle: 'timelike',
    start: { kind: 'observer', observer: 'zamo', r: 10, theta: Math.PI / 2, phi: 0, speed: 0.3, psi: (150 * Math.PI) / 180, chi: 0 },
    maxLength: 100,
    samples: 101,
    rtol: 1e-10,
    stopAt: 'outerHorizon',
  },
  rival: true,
};
export default geodesicKerrPlunge;
