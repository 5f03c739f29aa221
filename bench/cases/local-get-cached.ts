/**
 * GET /v1/local for the Kerr case, served by the service with its default result cache: after the
 * first request every answer is a cache hit (the repeat path: key, lookup, send).
 */
import type { BenchCase } from '../processes.js';
import localGet from './local-get.js';

const localGetCached: BenchCase = { ...localGet, name: 'GET /v1/local (Kerr, 6 rg) (cached)', target: 'serviceCached', goal: undefined };
export default localGetCached;
