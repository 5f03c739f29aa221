/**
 * In-process: the orbit of ./geodesic-kerr-inclined.ts sampled at 10 000 points (the request limit): the
 * cost of the dense output, and the memory of the samples (eleven Float64Arrays of samples + 1 entries).
 */
import type { GeodesicBenchCase } from '../geodesic.js';
import base from './geodesic-kerr-inclined.js';

const geodesicKerrInclined10k: GeodesicBenchCase = {
  ...base,
  name: 'the same orbit, 10 000 samples',
  request: { ...base.request, samples: 10_000 },
  rival: false,
};
export default geodesicKerrInclined10k;
