/**
 * In-process: the shadow of a Kerr hole with a/M = 0.9 seen from 17° off its spin axis, 512 points on
 * the curve. The numpy rival computes the same 512 points (bench/rivals/numpy_shadow.py).
 */
import type { ShadowCase } from '../light.js';

const spin = 0.9;
const inclination = (17 * Math.PI) / 180;
const points = 512;

const shadowKerr17deg: ShadowCase = {
  kind: 'shadow',
  name: 'shadow, Kerr a=0.9, i=17°',
  spacetime: { a: spin, q: 0 },
  inclination,
  points,
  rival: { spin, inclination, points },
};
export default shadowKerr17deg;
