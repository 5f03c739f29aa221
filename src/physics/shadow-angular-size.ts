/**
 * The angular size of a black hole's shadow for an observer at a finite distance, in geometric units
 * G = c = M = 1 (distances in units of M, angles in radians): the exact angular radius seen by a static
 * observer outside a non-spinning hole (Synge 1966), and the small-angle size of a length on the
 * far-away curve of ./shadow.ts. Refusals come from the shadow's catalogue (SHADOW_REASONS).
 */
import { equatorialPhotonOrbit } from './deflection.js';
import { hole } from './photon-region.js';
import { refuse, type ShadowRefused } from './shadow.js';
import type { KerrNewman } from './spacetime.js';

/**
 * Angular radius of the shadow seen by a static observer at radius r outside a non-spinning hole:
 * Synge's formula sin α = (3√3/r)√(1 − 2/r) for Schwarzschild (Synge 1966, MNRAS 131, 463), and the
 * same construction with f = 1 − 2/r + Q²/r² for Reissner–Nordström, sin α = b_c √f / r (common
 * practice). Evaluated as α = atan2(b_c√(r² − 2r + Q²), (r − r_ph)√(r² + 2r_ph r + 3r_ph² − b_c²)),
 * using r⁴ − b_c²(r² − 2r + Q²) = (r − r_ph)²(r² + 2r_ph r + 3r_ph² − b_c²), so that α stays accurate
 * next to the photon sphere (where α → 90°) and far away (α ≈ b_c/r). Radians. Refused for a ≠ 0,
 * naked singularities and observers inside the photon sphere (r < r_ph).
 */
export function staticObserverShadowRadius(s: KerrNewman, r: number): { ok: true; angularRadius: number } | ShadowRefused {
  if (!(Number.isFinite(s.a) && s.a >= 0 && Number.isFinite(s.q) && Number.isFinite(r) && r > 0)) return refuse('invalidInput');
  if (s.a !== 0) return refuse('spinNotSupported');
  const q2 = s.q * s.q;
  if (q2 > 1) return refuse('nakedSingularity');
  const rph = (3 + Math.sqrt(9 - 8 * q2)) / 2;
  if (r < rph) return refuse('insidePhotonSphere');
  const bc2 = (rph * rph * rph * rph) / (rph * rph - 2 * rph + q2);
  const sinPart = Math.sqrt(bc2 * (r * r - 2 * r + q2));
  const cosPart = (r - rph) * Math.sqrt(r * r + 2 * rph * r + 3 * rph * rph - bc2);
  return { ok: true, angularRadius: Math.atan2(sinPart, cosPart) };
}

/**
 * Angle subtended at a distant observer (distance D, units of M) by a length on the shadow given in
 * units of M: θ = length/D radians (small-angle, flat space between hole and observer; the neglected
 * terms are O(M/D) relative, as Synge's exact formula shows for Schwarzschild: sin α = b_c(1 − 1/D + …)/D).
 * For M87*: GM/(c²D) ≈ 3.8 µas, so the Schwarzschild diameter 6√3 M is ≈ 39.7 µas. Refused when D is
 * inside the outermost photon orbit (the retrograde equatorial one; r_ph when a = 0).
 */
export function distantAngularSize(s: KerrNewman, length: number, distance: number): { ok: true; angle: number } | ShadowRefused {
  if (
    !(Number.isFinite(s.a) && s.a >= 0 && Number.isFinite(s.q) && Number.isFinite(length) && length >= 0 && Number.isFinite(distance) && distance > 0)
  ) {
    return refuse('invalidInput');
  }
  const h = hole(s, Math.PI / 2);
  if (!h) return refuse('nakedSingularity');
  const outer = equatorialPhotonOrbit(s, 'retrograde')?.radius ?? h.rRN;
  if (distance <= outer) return refuse('insidePhotonSphere');
  return { ok: true, angle: length / distance };
}
