/**
 * Context rival for GET: a bare fastify route returning a precomputed copy of the /v1/local response
 * that local-get.ts asks for, at the same path and query string (same bytes, no computation).
 */
import type { BenchCase } from '../processes.js';
import localGet from './local-get.js';

const barePayload: BenchCase = {
  name: 'bare fastify, same payload',
  target: 'barePayload',
  method: 'GET',
  path: localGet.path,
  sameBytesAs: localGet,
};
export default barePayload;
