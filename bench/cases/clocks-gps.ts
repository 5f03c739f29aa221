/**
 * POST /v1/clocks for the GPS comparison: a clock at rest on the rotating Earth's equator at sea level
 * (A) against one on a circular orbit of radius 26 561.75 km (B, the GPS semi-major axis).
 * Each request computed (cache off), like the /v1/local row it is read against. Target: a clock comparison costs no more than /v1/local.
 */
import type { BenchCase } from '../processes.js';
import localGetComputed from './local-get-computed.js';

const clocksGps: BenchCase = {
  name: 'POST /v1/clocks (GPS vs ground) (computed)',
  target: 'serviceComputed',
  method: 'POST',
  path: '/v1/clocks',
  headers: { 'content-type': 'application/json' },
  body: JSON.stringify({
    body: 'earth',
    a: { kind: 'rotating', point: { altitude: 0 } },
    b: { kind: 'circular', point: { r: '26561.75 km' } },
  }),
  // 0.9, not 1: the allowance for run-to-run noise between two rows measured one after the other.
  goal: { relativeTo: localGetComputed, atLeast: 0.9, statement: 'a clock comparison costs no more than /v1/local' },
};
export default clocksGps;
