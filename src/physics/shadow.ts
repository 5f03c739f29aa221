/**
 * The shadow (critical curve) of a Kerr–Newman black hole seen from far away, and its averages, in
 * geometric units G = c = M = 1 (lengths on the sky in units of M; multiply by GM/(c²D) for radians at
 * distance D). Its angular size for an observer at a finite distance is in ./shadow-angular-size.ts.
 *
 * The curve is the image of the spherical photon orbits of ./photon-region.ts (ξ = L/E, η = Q_Carter/E²
 * there; Bardeen 1973, in Black Holes, Les Houches, eds. DeWitt & DeWitt, Gordon and Breach,
 * pp. 215–239 — pages from memory). A distant observer at inclination i (angle between the line of sight
 * and the spin axis) sees the orbit of radius r at the celestial coordinates (Bardeen 1973)
 *   α = −ξ/sin i,  β = ±√(η + a² cos²i − ξ² cot²i),
 * where the square root is real; α is measured perpendicular to the projected spin axis (the side
 * where prograde photons appear has α < 0), β along it.
 *
 * Numerics. Orbits are addressed by their offset z from the polar orbit (Hole in ./photon-region.ts).
 * The endpoints of the visible range (β = 0) and the polar orbit (ξ = 0) come from Newton's method
 * inside brackets; the curve is sampled at t_k = 2πk/N with δ = δ_lo + (δ_hi − δ_lo) sin²(t/2) and
 * β = sign(sin t)·√β², a parametrisation in which the closed curve is analytic and periodic in t,
 * so the midpoint rule for its averages converges exponentially (doubling until converged).
 */
import { bracketedRoot, hole, orbitConstants, photonRegion, polarOrbit, visibility, type Hole } from './photon-region.js';
import type { KerrNewman } from './spacetime.js';

export type ShadowRefusalReason =
  | 'invalidInput'
  | 'inclinationOutOfRange'
  | 'invalidPointCount'
  | 'nakedSingularity'
  | 'insidePhotonSphere'
  | 'spinNotSupported';

export const SHADOW_REASONS: Record<ShadowRefusalReason, string> = {
  invalidInput: 'spin must be finite and ≥ 0, charge finite, and every length finite and > 0',
  inclinationOutOfRange: 'the inclination must lie in [0, π] (0 and π: looking along the spin axis)',
  invalidPointCount: 'the number of points on the curve must be an integer from 8 to 4096',
  nakedSingularity: 'spin² + charge² > 1 describes a naked singularity, which casts no black-hole shadow',
  insidePhotonSphere:
    'the observer is inside the photon sphere (or the photon region of a spinning hole): the shadow then covers more than half the sky and the formula does not apply',
  spinNotSupported:
    'the exact angular size at a finite distance is available for non-spinning holes only; use the distant-observer size for a spinning hole',
};

export interface ShadowRefused {
  ok: false;
  reason: ShadowRefusalReason;
  message: string;
}

export interface Shadow {
  ok: true;
  inclination: number;
  /** Celestial coordinates of the N points (units of M), clockwise from the leftmost point (β = 0). */
  alpha: Float64Array;
  beta: Float64Array;
  /** Radius of the spherical photon orbit seen at each point. */
  orbitRadius: Float64Array;
  /** Width of the curve along α: α_max − α_min. */
  horizontalDiameter: number;
  /** Height of the curve along β: 2 β_max. */
  verticalDiameter: number;
  /** α of the midpoint of the horizontal extent, (α_max + α_min)/2 (the centre displacement). */
  centreDisplacement: number;
  /** R̄ = (1/2π)∮R dϑ, R and ϑ the distance and polar angle from the point (centreDisplacement, 0). */
  meanRadius: number;
  /** ΔC = √((1/2π)∮(R − R̄)² dϑ)/R̄, the rms deviation from a circle relative to R̄. */
  circularityDeviation: number;
  /** (D_h − D_v)/D_v, horizontal against vertical diameter. */
  diameterAsymmetry: number;
  /** Equatorial prograde and retrograde circular photon orbits: the photon region r range. */
  photonRegion: { prograde: number; retrograde: number };
  /** The r range of the spherical orbits visible at this inclination. */
  visibleRange: { inner: number; outer: number };
  /** 'circle': a = 0 or face-on (sin i < 1e−8); 'curve' otherwise. */
  shape: 'circle' | 'curve';
}

export type ShadowResult = Shadow | ShadowRefused;

/** The refusal with its message from SHADOW_REASONS (also used by ./shadow-angular-size.ts). */
export function refuse(reason: ShadowRefusalReason): ShadowRefused {
  return { ok: false, reason, message: SHADOW_REASONS[reason] };
}

/** Scratch output of {@link orbitConstants} for the curve: ξ, η, dξ/dr, dη/dr. */
const OUT = new Float64Array(4);

/** Celestial coordinates α and β² of the orbit at z (see Hole), into the given pair (also fills OUT). */
function skyPoint(h: Hole, z: number, out: { alpha: number; beta2: number }): void {
  orbitConstants(h, z, OUT);
  const xi = OUT[0] as number;
  out.alpha = -xi / h.sinI;
  out.beta2 = (OUT[1] as number) + h.a2 * h.cos2 - xi * xi * h.cot2;
}

/** Running sums of the averages over the curve (see curveAverages). */
interface Averages {
  mean: number;
  rms: number;
  angle: number;
}

/**
 * R̄ and ΔC by the midpoint rule in t on (0, π) with K nodes (the lower half mirrors the upper), with
 * dϑ/dt = (x y′ − y x′)/R², x = α − α_c, y = β; sums are taken about a provisional radius R̃ to keep
 * (R − R̄)² free of cancellation. `segment` adds the straight edge of an extreme hole in closed form:
 * along x = x₀, |y| ≤ Y, ∫R dϑ = 2p asinh(Y/p), ∫dϑ = 2 atan(Y/p), ∫R² dϑ = 2pY (p = |x₀|).
 */
function curveAverages(
  h: Hole,
  lo: number,
  hi: number,
  centre: number,
  guess: number,
  k: number,
  segment: number,
  segmentX: number,
): Averages {
  const w = hi - lo;
  const pt = { alpha: 0, beta2: 0 };
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  for (let j = 0; j < k; j++) {
    const t = (Math.PI * (j + 0.5)) / k;
    const sh = Math.sin(t / 2);
    const z = lo + w * sh * sh;
    const dd = 0.5 * w * Math.sin(t);
    skyPoint(h, z, pt);
    const y = Math.sqrt(Math.max(pt.beta2, 0));
    const x = pt.alpha - centre;
    const dx = (-(OUT[2] as number) / h.sinI) * dd;
    const db2 = (OUT[3] as number) - 2 * (OUT[0] as number) * (OUT[2] as number) * h.cot2;
    const dy = y > 0 ? (db2 * dd) / (2 * y) : 0;
    const r2 = x * x + y * y;
    const omega = -(x * dy - y * dx) / r2; // −dϑ/dt > 0: the curve runs clockwise
    const dev = Math.sqrt(r2) - guess;
    s0 += omega;
    s1 += dev * omega;
    s2 += dev * dev * omega;
  }
  s0 /= k;
  s1 /= k;
  s2 /= k;
  if (segment > 0) {
    const p = Math.abs(segmentX);
    const ang = (2 * Math.atan(segment / p)) / (2 * Math.PI);
    const rInt = (2 * p * Math.asinh(segment / p)) / (2 * Math.PI);
    const r2Int = (2 * p * segment) / (2 * Math.PI);
    s0 += ang;
    s1 += rInt - guess * ang;
    s2 += r2Int - 2 * guess * rInt + guess * guess * ang;
  }
  const mean = guess * s0 + s1;
  const shift = mean - guess;
  const variance = s2 - 2 * shift * s1 + shift * shift * s0;
  return { mean, rms: Math.sqrt(Math.max(variance, 0)), angle: s0 };
}

/** Golden-section search for the largest β² on [lo, hi] (β² is unimodal along the convex curve). */
function maxBeta2(h: Hole, lo: number, hi: number): number {
  const pt = { alpha: 0, beta2: 0 };
  const g = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  skyPoint(h, x1, pt);
  let f1 = pt.beta2;
  skyPoint(h, x2, pt);
  let f2 = pt.beta2;
  for (let i = 0; i < 100 && b - a > 1e-9 * (hi - lo); i++) {
    if (f1 < f2) {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      skyPoint(h, x2, pt);
      f2 = pt.beta2;
    } else {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      skyPoint(h, x1, pt);
      f1 = pt.beta2;
    }
  }
  skyPoint(h, lo, pt);
  const atLo = pt.beta2;
  return Math.max(f1, f2, atLo);
}

/** The circle of radius ρ sampled like the general curve: α = c − ρ cos t, β = ρ sin t. */
function circle(inclination: number, n: number, rho: number, r: number, region: { prograde: number; retrograde: number }): Shadow {
  const alpha = new Float64Array(n);
  const beta = new Float64Array(n);
  const orbitRadius = new Float64Array(n).fill(r);
  for (let k = 0; k < n; k++) {
    const t = (2 * Math.PI * k) / n;
    alpha[k] = -rho * Math.cos(t);
    beta[k] = 2 * k === n ? 0 : rho * Math.sin(t);
  }
  return {
    ok: true,
    inclination,
    alpha,
    beta,
    orbitRadius,
    horizontalDiameter: 2 * rho,
    verticalDiameter: 2 * rho,
    centreDisplacement: 0,
    meanRadius: rho,
    circularityDeviation: 0,
    diameterAsymmetry: 0,
    photonRegion: region,
    visibleRange: { inner: r, outer: r },
    shape: 'circle',
  };
}

/** Below this sin i the observer is treated as on the axis (face-on circle; error ≲ 1e−8 M). */
const FACE_ON_SIN = 1e-8;
/**
 * Spins below this are treated as zero: the curve changes at O(a) (its centre moves by ≈ 2a sin i),
 * i.e. below the double-precision rounding of its size, while a² and the photon-region width
 * underflow or lose all their digits in the general construction (seen from a ≲ 1e−100).
 */
const NEGLIGIBLE_SPIN = 1e-20;

/**
 * The shadow of a Kerr–Newman black hole seen from far away at inclination i ∈ [0, π], sampled at
 * N points (8 ≤ N ≤ 4096), with its diameters, centre displacement, mean radius, circularity
 * deviation ΔC (the rms of R − R̄ over the polar angle about the horizontal midpoint, relative to R̄:
 * the measure of the Event Horizon Telescope, 2019, ApJL 875, L6 — from memory) and diameter
 * asymmetry. Closed cases: a = 0, a circle of radius b_c = r_ph²/√(r_ph² − 2r_ph + Q²) (3√3 for
 * Schwarzschild; also for a < 1e−20, whose effect is below double precision); i = 0 or π (sin i < 1e−8),
 * a circle of radius √(η + a²) at the polar orbit.
 * i and π − i give the same curve. Units of M; the curve runs clockwise from its leftmost point.
 * Accuracy: points and diameters to ≈ 1e−14 relative, mean radius and ΔC to ≈ 1e−12 (≈ 1e−8 for an
 * exactly extreme hole seen from the side, whose straight edge breaks the analytic parametrisation).
 */
export function shadow(s: KerrNewman, inclination: number, points: number): ShadowResult {
  if (!(Number.isFinite(s.a) && s.a >= 0 && Number.isFinite(s.q) && Number.isFinite(inclination))) return refuse('invalidInput');
  if (!(inclination >= 0 && inclination <= Math.PI)) return refuse('inclinationOutOfRange');
  if (!(Number.isInteger(points) && points >= 8 && points <= 4096)) return refuse('invalidPointCount');
  const h = hole(s.a < NEGLIGIBLE_SPIN ? { a: 0, q: s.q } : s, inclination);
  if (!h) return refuse('nakedSingularity');
  if (h.a === 0) {
    const r = h.rRN;
    const bc = (r * r) / Math.sqrt(r * r - 2 * r + h.q2);
    return circle(inclination, points, bc, r, { prograde: r, retrograde: r });
  }
  const region = photonRegion(s, h);
  h.nearExtreme = h.rRN + region.pro - 1 < 0.25;
  const photon = { prograde: h.rRN + region.pro, retrograde: h.rRN + region.retro };
  const polar = polarOrbit(h, region.pro, region.retro);
  const rp = h.rRN + polar;
  h.polarResidual = rp * polar * (polar + h.c) + h.a2 * (rp + 1);
  h.base = polar;
  h.factored = true;
  const rBase = h.rRN + polar;
  if (h.sinI < FACE_ON_SIN) {
    orbitConstants(h, 0, OUT);
    return circle(inclination, points, Math.sqrt((OUT[1] as number) + h.a2), rBase, photon);
  }
  // Visible range (as z = δ − δ_p): where sin²i β² ≥ 0, on either side of the polar orbit (z = 0).
  const zPro = region.pro - polar;
  const zRetro = region.retro - polar;
  const f = (z: number) => visibility(h, z);
  let lo = zPro;
  let hi = zRetro;
  if (h.cos2 > 1e-30) {
    if (f(lo).s < 0) lo = bracketedRoot(f, zPro, 0, 0.5 * zPro);
    if (f(hi).s < 0) hi = bracketedRoot(f, 0, zRetro, 0.5 * zRetro);
  }
  const pt = { alpha: 0, beta2: 0 };
  skyPoint(h, lo, pt);
  const alphaLo = pt.alpha;
  // An extreme hole's straight edge: β² > 0 at the inner end of the photon region itself.
  const segment = lo === zPro && h.eps === 0 && pt.beta2 > 0 ? Math.sqrt(pt.beta2) : 0;
  skyPoint(h, hi, pt);
  const alphaHi = pt.alpha;
  const centre = 0.5 * (alphaLo + alphaHi);
  const horizontal = alphaHi - alphaLo;
  const vertical = 2 * Math.sqrt(Math.max(maxBeta2(h, lo, hi), 0));

  const n = points;
  const alpha = new Float64Array(n);
  const beta = new Float64Array(n);
  const orbitRadius = new Float64Array(n);
  const w = hi - lo;
  for (let k = 0; k < n; k++) {
    const t = (2 * Math.PI * k) / n;
    const sh = Math.sin(t / 2);
    const z = lo + w * sh * sh;
    skyPoint(h, z, pt);
    const side = k === 0 || 2 * k === n ? 0 : 2 * k < n ? 1 : -1;
    alpha[k] = pt.alpha;
    beta[k] = side * Math.sqrt(Math.max(pt.beta2, 0));
    orbitRadius[k] = rBase + z;
  }

  let guess = 0.25 * (horizontal + vertical);
  // Doubling K until two levels agree to 1e−12 of R̄. The rule converges exponentially (64 nodes
  // usually suffice to 1e−13), while rounding near the ends of the curve, where β is small, grows
  // slowly with K; so a tighter test would only add noise. An exactly extreme hole converges like 1/K².
  let avg = curveAverages(h, lo, hi, centre, guess, 64, segment, alphaLo - centre);
  for (let k = 128; k <= 4096; k *= 2) {
    guess = avg.mean;
    const next = curveAverages(h, lo, hi, centre, guess, k, segment, alphaLo - centre);
    const done = Math.abs(next.mean - avg.mean) <= 1e-12 * next.mean && Math.abs(next.rms - avg.rms) <= 1e-12 * next.mean;
    avg = next;
    if (done) break;
  }
  return {
    ok: true,
    inclination,
    alpha,
    beta,
    orbitRadius,
    horizontalDiameter: horizontal,
    verticalDiameter: vertical,
    centreDisplacement: centre,
    meanRadius: avg.mean,
    circularityDeviation: avg.rms / avg.mean,
    diameterAsymmetry: (horizontal - vertical) / vertical,
    photonRegion: photon,
    visibleRange: { inner: rBase + lo, outer: rBase + hi },
    shape: 'curve',
  };
}
