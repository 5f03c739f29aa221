/** POST /v1/local of local-post.ts against the service with its result cache switched off (each request computed). */
import type { BenchCase } from '../processes.js';
import localPost from './local-post.js';

const localPostComputed: BenchCase = { ...localPost, name: `${localPost.name} (computed)`, target: 'serviceComputed' };
export default localPostComputed;
