/**
 * GET /v1/orbits/circular for the hole of local-get.ts (10 solar masses, a/M = 0.9) at r = 8 GM/c²,
 * prograde (the default), outside the ISCO. Target: within the same ratio as /v1/local.
 */
import type { BenchCase } from '../processes.js';
import localGetComputed from './local-get-computed.js';

const orbitsCircular: BenchCase = {
  name: 'GET /v1/orbits/circular (Kerr, 8 rg) (computed)',
  target: 'serviceComputed',
  method: 'GET',
  path: '/v1/orbits/circular?mass=10%20Msun&spin=0.9&r=8%20rg',
  // 0.9, not 1: the allowance for run-to-run noise between two rows measured one after the other.
  goal: { relativeTo: localGetComputed, atLeast: 0.9, statement: 'within the same ratio as /v1/local' },
};
export default orbitsCircular;
