/**
 * Deflection of light by one mass of the Kerr–Newman family: rays in the equatorial plane (any ray
 * when a = 0), in geometric units G = c = M = 1 (lengths in GM/c², angles in radians).
 *
 * A null geodesic in the equatorial plane has energy E and angular momentum L; its impact parameter
 * is b = |L|/E, and it is prograde when it circulates with the hole's rotation (L a > 0). With the
 * signed λ = L/E (λ = b prograde, −b retrograde), the radial potential and the orbit equation are
 * (Carter 1968, Phys. Rev. 174, 1559; Chandrasekhar 1983, The Mathematical Theory of Black Holes, ch. 7;
 * with 2Mr → μ = 2r − Q² for the charge, Newman et al. 1965, J. Math. Phys. 6, 918; both forms derived
 * by hand and verified with sympy in test/fixtures/python/light.py):
 *   R(r) = (r² + a² − aλ)² − Δ(λ − a)² = r⁴ + (a² − λ²) r² + (λ − a)² μ,
 *   dφ/dr = ± [λ r² − (λ − a) μ] / (Δ √R),   Δ = r² − 2r + a² + Q².
 * The closest approach r₀ is the largest root of R. Solving R(r₀) = 0 for λ, in cancellation-free form:
 *   prograde  b = (r₀⁴ + a² r₀² + a² μ₀) / (r₀² √Δ₀ + a μ₀),
 *   retrograde b = (r₀² √Δ₀ + a μ₀) / (r₀² − μ₀)
 * (both r₀/√(1 − 2/r₀) for Schwarzschild, Darwin 1959). db/dr₀ has the sign of
 * g(r₀) = r₀² − 3r₀ + 2Q² ± 2a√(r₀ − Q²) (upper sign prograde), whose largest root is the circular photon
 * orbit r_ph; its b is the critical impact parameter b_c (3√3 for Schwarzschild; 2 and 7 for extreme
 * Kerr, Bardeen, Press & Teukolsky 1972, ApJ 178, 347, eq. 2.18). Rays with b < b_c are captured; a
 * closest approach r₀ ≤ r_ph belongs to no scattered ray.
 *
 * The deflection is α = 2 ∫_{r₀}^∞ |dφ/dr| dr − π. Methods:
 *  - Schwarzschild (./deflection-schwarzschild.ts): Darwin's exact elliptic-integral form (Darwin 1959,
 *    Proc. R. Soc. A 249, 180), written in Carlson's R_F (see {@link darwinDeflection}); for b ≥ 500 the
 *    weak-field series to eighth order (see {@link schwarzschildSeriesDeflection}), which keeps full
 *    relative precision where 2φ − π cancels.
 *  - Reissner–Nordström and Kerr–Newman: tanh-sinh quadrature (./quadrature.ts) in u = 1/r of the
 *    difference between the orbit integrand and the straight line's 1/√(u₀² − u²) (which integrates to
 *    π/2), with the numerator of the difference in a closed form free of the large cancelling terms
 *    (derived by hand, verified with sympy in the fixture script). The 1/√(u₀ − u) factor at the
 *    turning point takes its distance from the quadrature rule with full precision. The result keeps
 *    its relative precision from the strong field to b ≈ 1e12 and beyond.
 *
 * Near the capture limit the deflection diverges logarithmically, α ≈ −ln(b/b_c − 1) + const
 * (Schwarzschild; Bozza 2002, Phys. Rev. D 66, 103001 — from memory), and it is ill-conditioned: a
 * relative change δ of r₀ changes α by about δ r₀/(r₀ − r_ph) radians, so with r₀ given as a double
 * the answer is good to ≈ 1e−16 r₀/(r₀ − r_ph) absolute at best. The Darwin form reaches that limit
 * (given r₀, or b: both r₀ − 3 and b − 3√3 are formed exactly); the quadrature stays within ~100 times
 * it (its potential has the same cancellation at u₀, and its tolerance is floored there, see
 * errorEstimate); from b the root r₀ adds ≈ 1e−16 b/(b − b_c). At r₀ − r_ph = 1e−10 the floor is
 * ≈ 3e−6 rad on α ≈ 47; below r₀ − r_ph ≈ 1e−14 the quadrature may refuse ('notConverged').
 */
import {
  darwinDeflection,
  schwarzschildClosestApproach,
  schwarzschildSeriesDeflection,
  sense,
  weakFieldDeflection,
} from './deflection-schwarzschild.js';
import type { OrbitDirection } from './observers.js';
import { tanhSinh } from './quadrature.js';
import type { KerrNewman } from './spacetime.js';

/** How a ray is specified: by its impact parameter b = |L|/E, or by its closest approach r₀ (BL r). */
export type RayInput = { impactParameter: number } | { closestApproach: number };

export type DeflectionRefusalReason =
  | 'invalidInput'
  | 'nakedSingularity'
  | 'insidePhotonOrbit'
  | 'insideBody'
  | 'unsupportedRegion'
  | 'notConverged';

export type DeflectionNullReason = 'captured' | 'critical' | 'hitsSurface';

export const LIGHT_REASONS: Record<DeflectionRefusalReason | DeflectionNullReason, string> = {
  invalidInput:
    'spin must be finite and ≥ 0, charge finite, the impact parameter or closest approach finite and > 0, the surface radius finite and > 0',
  nakedSingularity: 'spin² + charge² > 1 describes a naked singularity; give the radius of the body’s surface',
  insidePhotonOrbit:
    'the closest approach is at or inside the circular photon orbit for this direction: no ray that comes in from infinity turns back there',
  insideBody: 'the closest approach lies below the surface of the body',
  unsupportedRegion:
    'for a body with spin² + charge² > 1 only closest approaches outside r = Q² + (3 − 2Q²)/6 (where the photon-orbit condition is convex) are supported',
  notConverged: 'the quadrature did not reach the requested tolerance',
  captured: 'the impact parameter is below the critical one: the ray spirals into the black hole and is not deflected back out',
  critical: 'the ray has exactly the critical impact parameter: it winds onto the circular photon orbit and its deflection is infinite',
  hitsSurface:
    'the ray reaches the surface of the body before its closest approach (for a ray that grazes the surface, give closestApproach = the radius instead of an impact parameter)',
};

export interface DeflectionRequest {
  ray: RayInput;
  /** Prograde: circulating with the hole's rotation. Ignored when a = 0; default prograde. */
  direction?: OrbitDirection;
  /** Radius (BL r, units of M) of the body's surface, for bodies that have one. */
  surfaceRadius?: number;
}

export interface DeflectionOptions {
  /** 'auto': Darwin/series for Schwarzschild, quadrature otherwise; 'quadrature': always quadrature. */
  method?: 'auto' | 'quadrature';
  /** Relative tolerance of the quadrature (default 1e−12; between 1e−15 and 1e−3). */
  relativeTolerance?: number;
}

export interface Deflection {
  ok: true;
  direction: OrbitDirection;
  impactParameter: number;
  /** r₀, or null when the ray never turns (captured, hits the surface, critical). */
  closestApproach: number | null;
  /** α in radians (total bending of the ray, > 0 towards the mass), or null with `reason`. */
  deflection: number | null;
  reason?: DeflectionNullReason;
  /** Equatorial circular photon orbit radius for this direction, and its b_c (null: none exists). */
  photonOrbitRadius: number | null;
  criticalImpactParameter: number | null;
  /** Weak-field values of α: 4/b, and 4/b + (15π/4 − 3πQ²/4 ∓ 4a)/b² (see weakFieldDeflection). */
  weakFieldFirstOrder: number;
  weakFieldSecondOrder: number;
  method: 'darwin' | 'series' | 'quadrature' | 'none';
  /**
   * Error estimate of α (radians): the quadrature's (conservative), raised near the photon orbit to the
   * rounding floor there and, for rays given by b, to the effect of the root r₀(b); 0 for the closed
   * forms (rounding only).
   */
  errorEstimate: number;
  evaluations: number;
}

export interface DeflectionRefused {
  ok: false;
  reason: DeflectionRefusalReason;
  message: string;
}

export type DeflectionResult = Deflection | DeflectionRefused;

export interface PhotonOrbit {
  /** Radius (BL r) of the equatorial circular photon orbit. */
  radius: number;
  /** Its impact parameter b_c: rays with b < b_c are captured. */
  criticalImpactParameter: number;
}

/** The quartic h(x) = x⁴ + p x² + c₁ x + c₀ of {@link outermostPhotonOrbit}, and its derivatives. */
function quartic(x: number, p: number, c1: number, c0: number): number {
  return ((x * x + p) * x + c1) * x + c0;
}
function quarticSlope(x: number, p: number, c1: number): number {
  return (4 * x * x + 2 * p) * x + c1;
}

/**
 * Largest root r_ph of g(r) = r² − 3r + 2Q² ± 2a√(r − Q²) (upper sign prograde), and the lower end of
 * the region where the search is reliable (`validFrom`). Closed forms: Reissner–Nordström (a = 0)
 * r_ph = (3 + √(9 − 8Q²))/2; Kerr (Q = 0, a ≤ 1) r_ph = 2[1 + cos(⅔ arccos(∓a))] (Bardeen, Press &
 * Teukolsky 1972 eq. 2.18), with arccos(a) = 2 arcsin√((1 − a)/2) for accuracy near a = 1. Otherwise, in
 * x = √(r − Q²), g is the quartic h = x⁴ + (2Q² − 3)x² ± 2ax + Q⁴ − Q², convex for
 * x ≥ x_c = √max(0, (3 − 2Q²)/6): its minimum over [x_c, ∞) comes from Newton's method on h′ (convex and
 * increasing there), and if that minimum is ≤ 0 the largest root from Newton's method on h started
 * above every root (monotone convergence on a convex function). For black holes the root lies in the
 * convex part (h ≤ 0 on the horizon). An extreme hole (a² + Q² = 1) has a double root on the horizon
 * r₊ = 1 for prograde light; it is the outermost root for large spin (extreme Kerr: r_ph = 1), while for
 * small spin a simple root lies further out (extreme Reissner–Nordström: r_ph = 2); the double root,
 * approached only linearly, is set exactly. For overspun bodies a root below x_c is not searched for.
 */
function outermostPhotonOrbit(s: KerrNewman, sgn: 1 | -1): { radius: number; validFrom: number } {
  const q2 = s.q * s.q;
  const p = 2 * q2 - 3;
  const xc = Math.sqrt(Math.max(0, -p / 6));
  const validFrom = q2 + xc * xc;
  const k = s.a * s.a + q2;
  if (s.a === 0) {
    const disc = 9 - 8 * q2;
    return { radius: disc >= 0 ? (3 + Math.sqrt(disc)) / 2 : Number.NaN, validFrom };
  }
  if (s.q === 0 && s.a <= 1) {
    if (s.a === 1 && sgn > 0) return { radius: 1, validFrom }; // cos(2π/3) rounds to 1 + 4e−16
    const theta = 2 * Math.asin(Math.sqrt((1 - s.a) / 2)); // arccos(a)
    const angle = sgn > 0 ? (2 * (Math.PI - theta)) / 3 : (2 * theta) / 3;
    return { radius: 2 * (1 + Math.cos(angle)), validFrom };
  }
  const c1 = 2 * sgn * s.a;
  const c0 = q2 * (q2 - 1);
  const upper = 1 + Math.max(Math.abs(p), Math.abs(c1), Math.abs(c0));
  if (k > 1) {
    // Overspun: is there a root in the convex region at all? (A black hole always has one.)
    let xm = xc;
    if (quarticSlope(xc, p, c1) < 0) {
      xm = upper;
      for (let i = 0; i < 200; i++) {
        const step = quarticSlope(xm, p, c1) / (12 * xm * xm + 2 * p);
        xm -= step;
        if (!(step > 4 * Number.EPSILON * xm)) break;
      }
    }
    if (quartic(xm, p, c1, c0) > 0) return { radius: Number.NaN, validFrom };
  }
  let x = upper;
  for (let i = 0; i < 400; i++) {
    const hx = quartic(x, p, c1, c0);
    if (hx <= 0) break;
    const step = hx / quarticSlope(x, p, c1);
    if (!(step > 0)) break;
    x -= step;
    if (step <= 2 * Number.EPSILON * x) break;
  }
  const radius = x * x + q2;
  // Extreme hole, prograde: when the outermost root is the double root on the horizon, Newton's
  // method approaches it only linearly (to ≈ 1e−8); it is exactly r = 1 there.
  if (k === 1 && sgn > 0 && radius - 1 < 1e-6) return { radius: 1, validFrom };
  return { radius, validFrom };
}

/** The photon orbit with its b_c, clamped to the outer horizon; null where none was found. */
function photonOrbitOf(s: KerrNewman, sgn: 1 | -1, radius: number): PhotonOrbit | null {
  if (!Number.isFinite(radius)) return null;
  const k = s.a * s.a + s.q * s.q;
  const r = k <= 1 ? Math.max(radius, 1 + Math.sqrt(1 - k)) : radius;
  return { radius: r, criticalImpactParameter: impactAndSlope(s, r, sgn, false).b };
}

/**
 * The equatorial circular photon orbit for one direction and its critical impact parameter b_c
 * (the largest root of r² − 3r + 2Q² ± 2a√(r − Q²) = 0, upper sign prograde: the zero of the
 * circular-orbit energy denominator; closed forms for Reissner–Nordström and Kerr as in
 * {@link outermostPhotonOrbit}). Null where none exists outside the convex region (only for some
 * overspun bodies). Computed here for light; the orbits module may hold its own.
 */
export function equatorialPhotonOrbit(s: KerrNewman, direction: OrbitDirection): PhotonOrbit | null {
  const sgn = sense(direction);
  return photonOrbitOf(s, sgn, outermostPhotonOrbit(s, sgn).radius);
}

/**
 * Impact parameter b = |L|/E of the equatorial ray whose closest approach is r₀ (the cancellation-free
 * forms of the module comment; b = r₀/√(1 − 2/r₀) for Schwarzschild, r₀/√(1 − 2/r₀ + Q²/r₀²) for
 * Reissner–Nordström). Meaningful for r₀ at or outside the photon orbit; NaN where Δ₀ < 0.
 */
export function impactParameter(s: KerrNewman, r0: number, direction: OrbitDirection): number {
  return impactAndSlope(s, r0, sense(direction), false).b;
}

/** b(r₀) and, if asked, db/dr₀. */
function impactAndSlope(s: KerrNewman, r: number, sgn: 1 | -1, slope: boolean): { b: number; db: number } {
  const a = s.a;
  const a2 = a * a;
  const mu = 2 * r - s.q * s.q;
  const delta = r * r + a2 - mu;
  const sd = Math.sqrt(delta);
  const dn = r * r * sd + a * mu; // r²√Δ + aμ
  const dnPrime = slope ? 2 * r * sd + (r * r * (r - 1)) / sd + 2 * a : 0;
  if (sgn > 0 || a === 0) {
    const n = r * r * (r * r + a2) + a2 * mu;
    const b = n / dn;
    if (!slope) return { b, db: 0 };
    const nPrime = 4 * r * r * r + 2 * a2 * r + 2 * a2;
    return { b, db: (nPrime * dn - n * dnPrime) / (dn * dn) };
  }
  const d0 = r * r - mu;
  const b = dn / d0;
  if (!slope) return { b, db: 0 };
  return { b, db: (dnPrime * d0 - dn * (2 * r - 2)) / (d0 * d0) };
}

/** Below this b the Schwarzschild fast path uses Darwin's form, above it the series. */
const SERIES_FROM_B = 500;

/**
 * α by quadrature (see the module comment) for a ray with turning point r₀ and impact parameter b,
 * consistent with each other. With u = 1/r, u₀ = 1/r₀, β = b ∓ a, m = 2 − Q²u:
 *   n = b − β u m,  D = 1 − u m + a²u²  (= Δ/r²),
 *   P = 1 + (a² − b²)u² + β²u³m = (u₀ − u) G,  G = (b² − a²)(u + u₀) − β² W,
 *   W = 2(u² + u u₀ + u₀²) − Q²(u + u₀)(u² + u₀²),
 *   α/2 = ∫₀^{u₀} [n/(D√P) − 1/√(u₀² − u²)] du
 *       = ∫₀^{u₀} H / ((n√(u₀+u) + D√G) D √G √(u₀+u) √(u₀−u)) du,
 *   H = n²(u₀ + u) − D²G = (u + u₀)[a² ± 2β a u m − 2(b² − a²)a²u² ∓ 2aβu²m² + (b² − a²)a²u³(2m − a²u)] + D²β²W
 * (upper signs prograde). H has no cancelling large terms; where n ≤ 0 (a guard: it does not happen
 * for rays outside the photon orbit in the cases tested) the difference is formed directly.
 *
 * Near the photon orbit G(u₀) = G₀ → 0 and the integrand behaves like 1/√(x (G₀ + G₁x)), x = u₀ − u:
 * a 1/√x singularity that turns into 1/x over the scale κ = G₀/|G₁|. The substitution x = κ sinh²v
 * makes that model integrand constant (∫dx/√(x(G₀ + G₁x)) = (2/√G₁) asinh√(G₁x/G₀)), so the integral
 * over v ∈ [0, asinh√(u₀/κ)] is smooth for every r₀ (its length grows only like ½ ln(1/G₀)); in weak
 * fields the same substitution is x ≈ κv², which removes the square-root singularity.
 */
function quadratureDeflection(
  s: KerrNewman,
  r0: number,
  b: number,
  sgn: 1 | -1,
  rtol: number,
): { value: number; errorEstimate: number; evaluations: number; converged: boolean } {
  const a2 = s.a * s.a;
  const q2 = s.q * s.q;
  const as = sgn * s.a;
  const beta = b - as;
  const beta2 = beta * beta;
  const bb = (b - s.a) * (b + s.a);
  const u0 = 1 / r0;
  const u02 = u0 * u0;
  const g0 = 2 * bb * u0 - beta2 * (6 * u02 - 4 * q2 * u02 * u0);
  const g1 = Math.abs(beta2 * 6 * u0 * (1 - q2 * u0) - bb);
  let kappa = g0 / g1;
  if (!(kappa > 0 && kappa < Number.POSITIVE_INFINITY)) kappa = u0;
  const rootKappa2 = 2 * Math.sqrt(kappa);
  const f = (_v: number, v: number): number => {
    const sh = Math.sinh(v); // v from its distance to the lower end 0, i.e. itself
    const x = kappa * sh * sh; // u₀ − u
    const u = u0 - x;
    const jac = rootKappa2 * Math.sqrt(1 + sh * sh); // dx/√x = 2√κ cosh v dv
    const m = 2 - q2 * u;
    const um = u * m;
    const n = b - beta * um;
    const d = 1 - um + a2 * u * u;
    const sum = u + u0;
    const u2 = u * u;
    const w = 2 * (u2 + u * u0 + u02) - q2 * sum * (u2 + u02);
    const g = bb * sum - beta2 * w;
    const sg = Math.sqrt(g);
    const ss = Math.sqrt(sum);
    if (!(n > 0)) return (n / (d * sg) - 1 / ss) * jac;
    const h =
      sum * (a2 + 2 * um * beta * as - 2 * bb * a2 * u2 - 2 * as * beta * u2 * m * m + bb * a2 * u2 * u * (2 * m - a2 * u)) +
      d * d * beta2 * w;
    return (h / ((n * ss + d * sg) * d * sg * ss)) * jac;
  };
  // Rounding noise of G near u₀ relative to G₀ (its cancellation as r₀ → r_ph, with b itself good to a
  // few ulp): the integrand cannot be known better than that, so the quadrature is not asked to
  // resolve α below it.
  const noise = (16 * Number.EPSILON * (2 * Math.abs(bb) * u0 + 6 * beta2 * u02)) / g0;
  const nearOrbit = noise > rtol / 64;
  const absoluteTolerance = nearOrbit ? 64 * noise : 0;
  const r = tanhSinh(f, 0, Math.asinh(Math.sqrt(u0 / kappa)), { relativeTolerance: rtol, absoluteTolerance });
  const errorEstimate = 2 * (nearOrbit ? Math.max(r.errorEstimate, noise) : r.errorEstimate);
  return { value: 2 * r.value, errorEstimate, evaluations: r.evaluations, converged: r.converged };
}

/**
 * Closest approach r₀ > lo of the ray with impact parameter b ≥ b(lo): the root of b(r₀) = b by
 * Newton's method inside a shrinking bracket (bisection when a step leaves it). b(r₀) is increasing
 * and convex beyond the photon orbit, so the steps from the right converge monotonically; near b_c
 * they halve the distance to the photon orbit until quadratic convergence sets in.
 */
function solveClosestApproach(s: KerrNewman, b: number, sgn: 1 | -1, lowest: number): number {
  let lo = lowest;
  let hi = Math.max(b + 2, 2 * lo);
  for (let i = 0; i < 64 && impactAndSlope(s, hi, sgn, false).b < b; i++) hi *= 2;
  let r = hi;
  for (let i = 0; i < 300; i++) {
    const { b: value, db } = impactAndSlope(s, r, sgn, true);
    const f = value - b;
    if (f === 0) return r;
    if (f > 0) hi = r;
    else lo = r;
    let next = r - f / db;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - r) <= 2 * Number.EPSILON * r || hi - lo <= 2 * Number.EPSILON * hi) return next;
    r = next;
  }
  return r;
}

function refuse(reason: DeflectionRefusalReason): DeflectionRefused {
  return { ok: false, reason, message: LIGHT_REASONS[reason] };
}

function result(
  s: KerrNewman,
  direction: OrbitDirection,
  orbit: PhotonOrbit | null,
  b: number,
  r0: number | null,
  alpha: number | null,
  reason: DeflectionNullReason | undefined,
  method: Deflection['method'],
  errorEstimate: number,
  evaluations: number,
): Deflection {
  const w = weakFieldDeflection(s, b, direction);
  const out: Deflection = {
    ok: true,
    direction,
    impactParameter: b,
    closestApproach: r0,
    deflection: alpha,
    photonOrbitRadius: orbit ? orbit.radius : null,
    criticalImpactParameter: orbit ? orbit.criticalImpactParameter : null,
    weakFieldFirstOrder: w.firstOrder,
    weakFieldSecondOrder: w.secondOrder,
    method,
    errorEstimate,
    evaluations,
  };
  if (reason !== undefined) out.reason = reason;
  return out;
}

/**
 * Deflection angle of an equatorial ray (any ray when a = 0) given its impact parameter or closest
 * approach, with the weak-field first- and second-order values beside it and the photon orbit of its
 * direction. Exact methods as in the module comment. A ray that never turns (b below b_c, or one that
 * reaches a body's surface) gives deflection null with its reason; inputs that describe no ray — r₀
 * inside the photon orbit or below the surface, non-finite or non-positive values, a naked
 * singularity without a surface — are refused with a typed reason (for the API's 422). r₀ exactly on
 * the photon orbit, or b exactly b_c, gives null with reason 'critical'.
 */
export function deflection(s: KerrNewman, req: DeflectionRequest, options: DeflectionOptions = {}): DeflectionResult {
  const direction: OrbitDirection = req.direction ?? 'prograde';
  const sgn = sense(direction);
  const rtol = options.relativeTolerance ?? 1e-12;
  const byRadius = 'closestApproach' in req.ray;
  const given = 'closestApproach' in req.ray ? req.ray.closestApproach : req.ray.impactParameter;
  const surface = req.surfaceRadius;
  if (
    !(Number.isFinite(s.a) && s.a >= 0 && Number.isFinite(s.q) && Number.isFinite(given) && given > 0) ||
    (surface !== undefined && !(Number.isFinite(surface) && surface > 0)) ||
    !(rtol >= 1e-15 && rtol <= 1e-3)
  ) {
    return refuse('invalidInput');
  }
  if (s.a * s.a + s.q * s.q > 1 && surface === undefined) return refuse('nakedSingularity');
  const search = outermostPhotonOrbit(s, sgn);
  const orbit = photonOrbitOf(s, sgn, search.radius);
  // Lowest admissible r₀: the photon orbit, else (overspun bodies) the edge of the convex region.
  const floor = orbit ? orbit.radius : search.validFrom;
  const schwarzschild = s.a === 0 && s.q === 0;

  let r0: number;
  let r0MinusThree = Number.NaN;
  let b: number;
  if (byRadius) {
    r0 = given;
    if (surface !== undefined && r0 < surface) return refuse('insideBody');
    if (orbit && r0 < orbit.radius) return refuse('insidePhotonOrbit');
    if (!orbit && r0 <= floor) return refuse('unsupportedRegion');
    b = impactAndSlope(s, r0, sgn, false).b;
    if (orbit && r0 === orbit.radius) return result(s, direction, orbit, b, null, null, 'critical', 'none', 0, 0);
    if (schwarzschild) r0MinusThree = r0 - 3; // exact for r₀ in [1.5, 6] (Sterbenz)
  } else {
    b = given;
    if (surface !== undefined && surface > floor && b < impactAndSlope(s, surface, sgn, false).b) {
      return result(s, direction, orbit, b, null, null, 'hitsSurface', 'none', 0, 0);
    }
    if (orbit && b <= orbit.criticalImpactParameter) {
      // Below b_c the ray would plunge; a body with a surface (inside its own photon orbit) stops it there.
      const why = b === orbit.criticalImpactParameter ? 'critical' : surface !== undefined ? 'hitsSurface' : 'captured';
      return result(s, direction, orbit, b, null, null, why, 'none', 0, 0);
    }
    if (schwarzschild) {
      const c = schwarzschildClosestApproach(b);
      r0 = c.r0;
      r0MinusThree = c.r0MinusThree;
    } else {
      if (!orbit && b <= impactAndSlope(s, floor, sgn, false).b) return refuse('unsupportedRegion');
      r0 = solveClosestApproach(s, b, sgn, floor);
    }
  }
  if (schwarzschild && (options.method ?? 'auto') === 'auto') {
    if (b >= SERIES_FROM_B) return result(s, direction, orbit, b, r0, schwarzschildSeriesDeflection(b), undefined, 'series', 0, 0);
    return result(s, direction, orbit, b, r0, darwinDeflection(r0, r0MinusThree), undefined, 'darwin', 0, 0);
  }
  // The quadrature's factorisation needs (r₀, b) consistent to rounding: b(r₀) from the root.
  let dr0 = 0;
  let bRay = b;
  if (!byRadius) {
    const at = impactAndSlope(s, r0, sgn, true);
    bRay = at.b;
    dr0 = (8 * Number.EPSILON * b) / Math.abs(at.db); // the root is good to ≈ 8 ulp of b over db/dr₀
  }
  const q = quadratureDeflection(s, r0, bRay, sgn, rtol);
  if (!q.converged) return refuse('notConverged');
  // |dα/dr₀| ≲ 2α/(r₀ − r_ph): near the photon orbit α ≈ −2 ln(r₀ − r_ph) + const (Bozza 2002), so
  // |dα/dr₀| ≈ 2/(r₀ − r_ph) < 2α/(r₀ − r_ph) once α > 1; in weak fields α ≈ 4/r₀ and |dα/dr₀| ≈ α/r₀.
  const rootError = (2 * dr0 * q.value) / (r0 - floor);
  return result(s, direction, orbit, b, r0, q.value, undefined, 'quadrature', q.errorEstimate + rootError, q.evaluations);
}
