/** GET /v1/local for the Earth preset at 400 km altitude (a body with a surface), each request computed. */
import type { BenchCase } from '../processes.js';

const localEarth: BenchCase = {
  name: 'GET /v1/local (earth, 400 km) (computed)',
  target: 'serviceComputed',
  method: 'GET',
  path: '/v1/local?body=earth&altitude=400%20km',
};
export default localEarth;
