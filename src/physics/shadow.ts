/**
 * The shadow (critical curve) of a Kerr–Newman black hole, and its angular size, in geometric units
 * G = c = M = 1 (lengths on the sky in units of M; multiply by GM/(c²D) for radians at distance D).
 *
 * Spherical photon orbits (Bardeen 1973, in Black Holes, Les Houches, eds. DeWitt & DeWitt, Gordon and
 * Breach, pp. 215–239 — pages from memory;
 * with charge, 2Mr → 2r − Q²; derived by hand from R(r) = R′(r) = 0 for the radial potential
 * R = (r² + a² − aξ)² − Δ(η + (ξ − a)²) and verified with sympy in test/fixtures/python/light.py):
 *   ξ = L/E = −[r X + a²(r + 1)]/(a(r − 1)),  η = Q_Carter/E² = r²[4a²(r − Q²) − X²]/(a²(r − 1)²),
 *   X = r² − 3r + 2Q².
 * They exist for r between the equatorial prograde and retrograde circular photon orbits, the roots of
 * X = ∓2a√(r − Q²) (where η = 0). A distant observer at inclination i (angle between the line of sight
 * and the spin axis) sees the orbit of radius r at the celestial coordinates (Bardeen 1973)
 *   α = −ξ/sin i,  β = ±√(η + a² cos²i − ξ² cot²i),
 * where the square root is real; α is measured perpendicular to the projected spin axis (the side
 * where prograde photons appear has α < 0), β along it.
 *
 * Numerics. Every r is written r = r_RN + δ with r_RN = (3 + c)/2, c = √(9 − 8Q²), the photon sphere of
 * the non-spinning hole of the same charge, so that X = δ(δ + c) is exact even when the photon region
 * is only O(a) wide (a → 0, where ξ and η are ratios of O(a) quantities). Near extreme spin the region
 * reaches r = 1, where both forms are 0/0; there the equivalent forms (ε = 1 − a² − Q², s = r − 1)
 *   ξ = [2ε/s − (s² + a² + 2Q² − 3)]/a,  η = (r²/a²)[3 − 4Q² + 2s − s² − 4ε(s + 1 − Q²)/s²]
 * are used instead (exact at ε = 0, where the extreme hole's shadow has a straight vertical edge).
 * The endpoints of the visible range (β = 0) and the polar orbit (ξ = 0) come from Newton's method
 * inside brackets; the curve is sampled at t_k = 2πk/N with δ = δ_lo + (δ_hi − δ_lo) sin²(t/2) and
 * β = sign(sin t)·√β², a parametrisation in which the closed curve is analytic and periodic in t,
 * so the midpoint rule for its averages converges exponentially (doubling until converged).
 */
import { equatorialPhotonOrbit } from './deflection.js';
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

function refuse(reason: ShadowRefusalReason): ShadowRefused {
  return { ok: false, reason, message: SHADOW_REASONS[reason] };
}

/** Constants of one hole and inclination. */
interface Hole {
  a: number;
  a2: number;
  q2: number;
  /** ε = 1 − a² − Q² ≥ 0. */
  eps: number;
  rRN: number;
  c: number;
  /** Use the near-extreme forms where r − 1 < 0.25 (the photon region reaches there). */
  nearExtreme: boolean;
  /**
   * Orbits are addressed by z = δ − base. Once the polar orbit δ_p (ξ = 0) is known, base = δ_p and
   * `factored` is set, so that z = δ − δ_p is exact however small (see orbitConstants); n(δ_p) is the
   * root's residual.
   */
  base: number;
  factored: boolean;
  polarResidual: number;
  sinI: number;
  cos2: number;
  sin2: number;
  cot2: number;
}

/** Scratch output of {@link orbitConstants}: ξ, η, dξ/dr, dη/dr. */
const OUT = new Float64Array(4);

/** ξ, η and their r-derivatives at δ = base + z (r = r_RN + δ), into OUT (module comment for the two forms). */
function orbitConstants(h: Hole, z: number): void {
  const delta = h.base + z;
  const r = h.rRN + delta;
  const s = h.rRN - 1 + h.base + z;
  if (h.nearExtreme && s < 0.25) {
    const e = h.eps;
    // At ε = 0 the ε terms vanish identically (also at r = 1 itself, where they would be 0/0).
    const e1 = e === 0 ? 0 : (2 * e) / s;
    const e2 = e === 0 ? 0 : e1 / s;
    OUT[0] = (e1 - (s * s + h.a2 + 2 * h.q2 - 3)) / h.a;
    OUT[2] = (-2 * s - e2) / h.a;
    const w = 3 - 4 * h.q2 + 2 * s - s * s - 2 * e2 * (s + 1 - h.q2);
    const wp = 2 - 2 * s + (2 * e2 * (s + 2 * (1 - h.q2))) / s;
    OUT[1] = (r * r * w) / h.a2;
    OUT[3] = (2 * r * w + r * r * wp) / h.a2;
    return;
  }
  const x = delta * (delta + h.c);
  const xp = 2 * delta + h.c;
  // n = r X + a²(r + 1) = δ³ + (r_RN + c)δ² + (r_RN c + a²)δ + a²(r_RN + 1) vanishes at the polar orbit,
  // where its terms cancel; written as (δ − δ_p) ñ(δ) + n(δ_p) with ñ the divided difference and
  // δ − δ_p = z exact, it keeps full relative precision there (at small inclinations the visible orbits
  // all lie within O(sin i) of the polar one, and ξ ∝ sin i must be exact to that order).
  let n: number;
  if (h.factored) {
    const dp = h.base;
    const nTilde = delta * delta + delta * dp + dp * dp + (h.rRN + h.c) * (delta + dp) + h.rRN * h.c + h.a2;
    n = z * nTilde + h.polarResidual;
  } else {
    n = r * x + h.a2 * (r + 1);
  }
  const np = x + r * xp + h.a2;
  OUT[0] = -n / (h.a * s);
  OUT[2] = -(np * s - n) / (h.a * s * s);
  const y = 4 * h.a2 * (r - h.q2) - x * x;
  const yp = 4 * h.a2 - 2 * x * xp;
  OUT[1] = (r * r * y) / (h.a2 * s * s);
  OUT[3] = ((2 * r * y + r * r * yp) * s - 2 * r * r * y) / (h.a2 * s * s * s);
}

/** sin²i · β² = sin²i (η + a² cos²i) − ξ² cos²i at z, and its derivative (after orbitConstants). */
function visibility(h: Hole, z: number): { s: number; ds: number } {
  orbitConstants(h, z);
  const xi = OUT[0] as number;
  const eta = OUT[1] as number;
  return {
    s: h.sin2 * (eta + h.a2 * h.cos2) - xi * xi * h.cos2,
    ds: h.sin2 * (OUT[3] as number) - 2 * xi * (OUT[2] as number) * h.cos2,
  };
}

/**
 * A root of f in [lo, hi] (f(lo) and f(hi) of opposite signs or zero) by Newton's method from
 * `start`, falling back to bisection whenever a step leaves the bracket; to a few ulp of the root
 * (at most 200 steps: enough for bisection to reach any double).
 */
function bracketedRoot(f: (x: number) => { s: number; ds: number }, lo: number, hi: number, start: number): number {
  const flo = f(lo).s;
  if (flo === 0) return lo;
  const rising = flo < 0;
  let x = Math.min(Math.max(start, lo), hi);
  for (let i = 0; i < 200; i++) {
    const { s, ds } = f(x);
    if (s === 0) return x;
    if (s < 0 === rising) lo = x;
    else hi = x;
    let next = x - s / ds;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    // Relative tests only: roots as offsets (z, δ) can be far below 1 and still need full precision
    // (at small spin and inclination the visible range is ~1e−14 wide).
    if (Math.abs(next - x) <= 2 * Number.EPSILON * Math.abs(x) || hi - lo <= 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi))) {
      return next;
    }
    x = next;
  }
  return x;
}

/**
 * Equatorial circular photon orbits as offsets δ from r_RN: the outermost roots of
 * δ(δ + c) ± 2a√(r − Q²) = 0 (upper sign prograde), taken from ./deflection.ts and refined here by
 * Newton's method in δ, which restores full relative precision of δ when the region is O(a) wide.
 * The double root of an extreme hole on its horizon (r = 1) is kept exactly.
 */
function photonRegion(s: KerrNewman, h: Hole): { pro: number; retro: number } {
  const pro = equatorialPhotonOrbit(s, 'prograde');
  const retro = equatorialPhotonOrbit(s, 'retrograde');
  return {
    pro: pro ? refineOrbit(h, 1, pro.radius) : Number.NaN,
    retro: retro ? refineOrbit(h, -1, retro.radius) : Number.NaN,
  };
}

function refineOrbit(h: Hole, sgn: 1 | -1, radius: number): number {
  let d = radius - h.rRN;
  if (radius === 1) return d;
  for (let i = 0; i < 8; i++) {
    const root = Math.sqrt(h.rRN + d - h.q2);
    const step = (d * (d + h.c) + 2 * sgn * h.a * root) / (2 * d + h.c + (sgn * h.a) / root);
    if (!Number.isFinite(step)) break;
    d -= step;
    if (Math.abs(step) <= 2 * Number.EPSILON * Math.abs(d)) break;
  }
  return d;
}

/**
 * Offset δ of the polar orbit (ξ = 0), between the equatorial orbits. In s = r − 1 the numerator of ξ
 * is n = s³ + p s − 2ε, p = a² + 2Q² − 3 < 0 (n = r X + a²(r + 1) rearranged; ε = 1 − a² − Q²), whose
 * largest root s_p = 2√(−p/3) cos(⅓ arccos((−3ε/p)√(−3/p))) (the trigonometric solution of the cubic)
 * is the polar orbit; 1 + √(3 − a² − 2Q²) for an extreme hole. Near extreme spin another root lies
 * next to r = 1 (exactly at it when ε = 0), so the bracket starts at s_p/2, where n < 0. The start is
 * refined by Newton's method on n in δ, whose terms scale with a² and so give δ_p to full relative
 * precision even when the photon region is O(a) wide.
 */
function polarOrbit(h: Hole, pro: number, retro: number): number {
  const p = h.a2 + 2 * h.q2 - 3;
  const arg = Math.min(1, ((-3 * h.eps) / p) * Math.sqrt(-3 / p));
  const sp = 2 * Math.sqrt(-p / 3) * Math.cos(Math.acos(arg) / 3);
  const start = 1 + sp - h.rRN;
  if (h.eps === 0) return start;
  const f = (d: number) => {
    const r = h.rRN + d;
    const x = d * (d + h.c);
    return { s: r * x + h.a2 * (r + 1), ds: x + r * (2 * d + h.c) + h.a2 };
  };
  const lo = Math.max(pro, 1 + sp / 2 - h.rRN);
  return bracketedRoot(f, lo, retro, start);
}

/** Celestial coordinates α and β² of the orbit at z (see Hole), into the given pair (also fills OUT). */
function skyPoint(h: Hole, z: number, out: { alpha: number; beta2: number }): void {
  orbitConstants(h, z);
  const xi = OUT[0] as number;
  out.alpha = -xi / h.sinI;
  out.beta2 = (OUT[1] as number) + h.a2 * h.cos2 - xi * xi * h.cot2;
}

/**
 * ξ = L/E and η = Q/E² of the spherical photon orbit of radius r (module comment): defined for a > 0
 * and r in the photon region of a black hole (NaN at r = 1 unless the hole is extreme). Exposed for
 * tests and plots; the shadow uses the same code.
 */
export function sphericalPhotonOrbit(s: KerrNewman, r: number): { xi: number; eta: number } {
  const h = hole(s, Math.PI / 2);
  if (!h || !(s.a > 0)) return { xi: Number.NaN, eta: Number.NaN };
  h.nearExtreme = true; // the near-extreme forms wherever r − 1 < 0.25
  orbitConstants(h, r - h.rRN);
  return { xi: OUT[0] as number, eta: OUT[1] as number };
}

function hole(s: KerrNewman, inclination: number): Hole | null {
  const a2 = s.a * s.a;
  const q2 = s.q * s.q;
  const eps = 1 - (a2 + q2); // as the core forms it (spacetime.ts horizons), so extreme holes agree
  if (!(eps >= 0)) return null;
  const c = Math.sqrt(9 - 8 * q2);
  const sinI = Math.sin(inclination);
  const cosI = Math.cos(inclination);
  const h: Hole = {
    a: s.a,
    a2,
    q2,
    eps,
    rRN: (3 + c) / 2,
    c,
    nearExtreme: false,
    base: 0,
    factored: false,
    polarResidual: 0,
    sinI,
    cos2: cosI * cosI,
    sin2: sinI * sinI,
    cot2: (cosI * cosI) / (sinI * sinI),
  };
  return h;
}

/** Running sums of the averages over the curve (see shadowAverages). */
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
    orbitConstants(h, 0);
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
