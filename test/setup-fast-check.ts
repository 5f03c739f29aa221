/**
 * fast-check's seed for the whole suite. By default a fixed seed, so that `npm test` (and CI) explores
 * the same cases on every run and a failure is reproducible from the commit alone. FC_SEED=random
 * draws a fresh seed per property (fast-check prints it on failure) to explore further; FC_SEED=<integer>
 * replays a reported one. Failures found by random runs become fixed regression cases or fixes.
 */
import fc from 'fast-check';

const FIXED_SEED = 20_261_202;
const given = process.env.FC_SEED;

if (given !== 'random') {
  const seed = given === undefined || given === '' ? FIXED_SEED : Number(given);
  if (!Number.isSafeInteger(seed)) throw new Error(`FC_SEED must be an integer or "random", got "${given}"`);
  fc.configureGlobal({ seed });
}
