/**
 * A small sweep (flow speed, clock rate and hover acceleration over 20 radii × 10 spins) repeated
 * against the service as deployed (default result cache): the cached-sweep row of the HTTP table, read
 * against the bare fastify route.
 */
import type { BenchCase } from '../processes.js';

const sweepSmallCached: BenchCase = {
  name: 'POST /v1/sweep, 200 points (cached)',
  target: 'service',
  method: 'POST',
  path: '/v1/sweep',
  headers: { 'content-type': 'application/json' },
  body: JSON.stringify({
    body: { mass: '10 Msun' },
    point: { r: '10 rg' },
    quantities: ['flowSpeed', 'staticClockRate', 'hoverAcceleration'],
    axes: [
      { variable: 'r', from: '1 rg', to: '100 rg', count: 20, spacing: 'log' },
      { variable: 'spin', from: 0, to: 0.99, count: 10 },
    ],
  }),
};
export default sweepSmallCached;
