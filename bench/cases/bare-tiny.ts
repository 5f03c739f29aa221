/** The headline rival: a bare fastify JSON route returning {"hello":"world"}. */
import type { BenchCase } from '../processes.js';

const bareTiny: BenchCase = { name: 'bare fastify, tiny JSON', target: 'bareTiny', method: 'GET', path: '/' };
export default bareTiny;
