/**
 * A 1e6-point sweep of flowSpeed around a Kerr hole (a/M = 0.9, 10 M☉): θ from 1° to 179° (1000
 * values, linear) × r from 1 rg to 100 rg (1000 values, log), r fastest. The numpy rival
 * (bench/rivals/numpy_sweep.py) evaluates the same closed form on the same grid; the HTTP rows send
 * the same request as columnar JSON.
 */
import type { SweepCase } from '../sweep.js';

const sweepFlow1e6: SweepCase = {
  name: 'flowSpeed, Kerr a=0.9, θ 1°–179° × r 1–100 rg, 1000 × 1000',
  request: {
    body: { mass: '10 Msun', spin: 0.9 },
    quantities: ['flowSpeed'],
    axes: [
      { variable: 'theta', from: '1 deg', to: '179 deg', count: 1000, spacing: 'linear' },
      { variable: 'r', from: '1 rg', to: '100 rg', count: 1000, spacing: 'log' },
    ],
  },
  rival: { spin: 0.9, thetaDeg: [1, 179, 1000], rRg: [1, 100, 1000] },
};
export default sweepFlow1e6;
