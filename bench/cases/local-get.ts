/** GET /v1/local for a spinning black hole: 10 solar masses, a/M = 0.9, at r = 6 GM/c². */
import type { BenchCase } from '../processes.js';

const localGet: BenchCase = {
  name: 'GET /v1/local (Kerr, 6 rg)',
  target: 'service',
  method: 'GET',
  path: '/v1/local?mass=10%20Msun&spin=0.9&r=6%20rg',
};
export default localGet;
