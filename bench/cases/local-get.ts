/**
 * GET /v1/local for a spinning black hole: 10 solar masses, a/M = 0.9, at r = 6 GM/c², against the
 * service as the README starts it (default in-memory result cache): after the first request, each
 * repeat is answered from the cache. One of the two rows that carry the /v1/local target.
 */
import type { BenchCase } from '../processes.js';

const localGet: BenchCase = {
  name: 'GET /v1/local (Kerr, 6 rg)',
  target: 'service',
  method: 'GET',
  path: '/v1/local?mass=10%20Msun&spin=0.9&r=6%20rg',
};
export default localGet;
