/**
 * GET /v1/local of local-get.ts against the service with its result cache switched off
 * (CACHE_MAX_BYTES=0): every request is validated, keyed, computed and serialised. The clock and orbit
 * rows, which are computed too, are read against this one.
 */
import type { BenchCase } from '../processes.js';
import localGet from './local-get.js';

const localGetComputed: BenchCase = { ...localGet, name: `${localGet.name} (computed)`, target: 'serviceComputed' };
export default localGetComputed;
