/**
 * Context rival for POST: a bare fastify POST route that parses the same JSON body as local-post.ts
 * and returns a precomputed copy of its /v1/local response (same bytes both ways, no computation).
 */
import type { BenchCase } from '../processes.js';
import localPost from './local-post.js';

const barePayloadPost: BenchCase = {
  name: 'bare fastify POST, same payload',
  target: 'barePayloadPost',
  method: 'POST',
  path: localPost.path,
  ...(localPost.headers ? { headers: localPost.headers } : {}),
  ...(localPost.body !== undefined ? { body: localPost.body } : {}),
  sameBytesAs: localPost,
};
export default barePayloadPost;
