/** POST /v1/local with the same body and point as local-get.ts, as a JSON body (service as deployed, like local-get.ts). */
import type { BenchCase } from '../processes.js';

const localPost: BenchCase = {
  name: 'POST /v1/local (Kerr, 6 rg)',
  target: 'service',
  method: 'POST',
  path: '/v1/local',
  headers: { 'content-type': 'application/json' },
  body: JSON.stringify({ body: { mass: '10 Msun', spin: 0.9 }, point: { r: '6 rg' } }),
};
export default localPost;
