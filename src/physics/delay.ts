/**
 * Shapiro delay: the extra coordinate time a light signal takes between two points at radii r₁ and r₂
 * when it passes a Schwarzschild mass with closest approach r₀, compared with a straight line in flat
 * space. Geometric units G = c = M = 1: radii in GM/c², times in GM/c³ (multiply by GM/c³ for
 * seconds; 4.925 µs for the Sun). Times are Schwarzschild coordinate time t, the time kept by a
 * clock at rest far away; an observer's own clock at r₁ runs slow by √(1 − 2/r₁) (≈ 1e−8 at the
 * Earth's orbit for the Sun's field alone), which is not applied here (common practice).
 *
 * Exact: along a null geodesic with impact parameter b (b² = r₀²/f₀, f = 1 − 2/r),
 *   dt/dr = 1/(f √(1 − f b²/r²))  (Weinberg 1972, Gravitation and Cosmology, §8.7 — from memory),
 * so from r₀ out to r the signal takes t(r) = ∫_{r₀}^{r} dt/dr dr, and the one-way delay is
 *   Δt = [t(r₁) − √(r₁² − r₀²)] + [t(r₂) − √(r₂² − r₀²)],
 * the round trip (out and back along the same path, r₁ → r₂ → r₁) twice that. Each bracket is
 * integrated as one integral of the difference of the two integrands, written without cancellation
 * (derived by hand, verified with sympy in test/fixtures/python/light.py):
 *   1 − f b²/r² = (r − r₀) g/(f₀ r²),  g = (r + r₀) − 2(r² + r r₀ + r₀²)/(r r₀),
 *   dt/dr − r/√(r² − r₀²) = r N / (√(r − r₀) (√f₀ √(r + r₀) + f √g) f √g √(r + r₀)),
 *   N = f₀(r + r₀) − f² g = [4r³(r₀ − 2) + 6r²r₀(r₀ − 2) + 8r² − 12 r r₀² + 8 r r₀ + 8 r₀²]/(r³ r₀),
 * in the variable x = ln(r/r₀) (dr = r dx; the integrand is then smooth apart from 1/√x at x = 0,
 * whose distance the tanh-sinh rule of ./quadrature.ts supplies exactly, and it tends to 2 at large
 * r, so ranges of any length cost the same; a further substitution handles r₀ near 3, see
 * excessTime). Relative precision ≈ 1e−14 in weak fields; near the photon sphere r₀ → 3 the delay
 * grows like ln(1/(r₀ − 3)) and, like the deflection, is ill-conditioned (see ./deflection.ts): the
 * error estimate then includes the rounding floor ≈ 1e−16 r₀ b/(r₀ − 3).
 *
 * Weak field, to first order in M:
 *   Shapiro (1964, Phys. Rev. Lett. 13, 789): Δt = 2 ln[(r₁ + √(r₁² − r₀²))(r₂ + √(r₂² − r₀²))/r₀²],
 *   with the further first-order terms of the exact integral (Weinberg 1972, eq. 8.7.4 — from memory):
 *   + √((r₁ − r₀)/(r₁ + r₀)) + √((r₂ − r₀)/(r₂ + r₀)).
 * The second form differs from the exact delay by O(M²/r₀) (about 19/r₀ for r₁, r₂ ≫ r₀; checked in
 * the tests). A published check (Reasenberg et al. 1979, ApJ 234, L219): the round trip Earth–Mars at
 * superior conjunction with the ray grazing the Sun is ≈ 250 µs.
 */
import { schwarzschildClosestApproach } from './deflection-schwarzschild.js';
import type { RayInput } from './deflection.js';
import { tanhSinh } from './quadrature.js';

export interface ShapiroRequest {
  /** Radii of the two ends (BL r, units of M), each ≥ r₀. */
  r1: number;
  r2: number;
  ray: RayInput;
  /** Radius of the body's surface, if it has one (the ray must pass outside it). */
  surfaceRadius?: number;
}

export interface ShapiroOptions {
  /** Relative tolerance of the quadrature (default 1e−12; between 1e−15 and 1e−3). */
  relativeTolerance?: number;
}

export type ShapiroRefusalReason =
  | 'invalidInput'
  | 'captured'
  | 'insidePhotonSphere'
  | 'endBelowClosestApproach'
  | 'insideBody'
  | 'notConverged';

export const SHAPIRO_REASONS: Record<ShapiroRefusalReason, string> = {
  invalidInput:
    'the radii, the impact parameter or closest approach and the surface radius must be finite and > 0, the tolerance in [1e−15, 1e−3]',
  captured: 'the impact parameter is at or below 3√3 GM/c²: the signal is captured by the black hole and never arrives',
  insidePhotonSphere: 'the closest approach is at or inside the photon sphere r = 3GM/c²: no signal from far away turns back there',
  endBelowClosestApproach: 'an end of the path lies closer to the mass than the closest approach of the ray',
  insideBody: 'the ray passes below the surface of the body',
  notConverged: 'the quadrature did not reach the requested tolerance',
};

export interface ShapiroDelay {
  ok: true;
  closestApproach: number;
  impactParameter: number;
  /** Straight-line flat-space travel time √(r₁² − r₀²) + √(r₂² − r₀²). */
  flatTravelTime: number;
  /** Exact one-way delay (coordinate time) and the round trip (twice it). */
  oneWay: number;
  roundTrip: number;
  /** The logarithmic first-order formula (Shapiro 1964), one way. */
  weakFieldOneWay: number;
  /** The first-order formula with Weinberg's further terms, one way. */
  weakFieldCorrectedOneWay: number;
  /** Quadrature error estimate of the one-way delay (conservative). */
  errorEstimate: number;
  evaluations: number;
}

export interface ShapiroRefused {
  ok: false;
  reason: ShapiroRefusalReason;
  message: string;
}

export type ShapiroResult = ShapiroDelay | ShapiroRefused;

function refuse(reason: ShapiroRefusalReason): ShapiroRefused {
  return { ok: false, reason, message: SHAPIRO_REASONS[reason] };
}

/**
 * ∫_{r₀}^{r} [dt/dr − r/√(r² − r₀²)] dr by tanh-sinh quadrature in x = ln(r/r₀) (module comment),
 * r ≥ r₀ > 3. Near the photon sphere g(r₀) = 2(r₀ − 3) → 0 and the integrand behaves like
 * 1/√(x (g₀ + r₀x)) (g′(r₀) = 1): the substitution x = κ sinh²v with κ = 2(r₀ − 3)/r₀ makes that
 * model constant (as for the deflection), so the integral over v is smooth for every r₀. The rounding
 * noise of g near r₀, ≈ 1e−16 (2r₀ + 6)/g₀ relative, sets a floor to the tolerance.
 */
function excessTime(r0: number, r: number, rtol: number): { value: number; errorEstimate: number; evaluations: number; converged: boolean } {
  if (r === r0) return { value: 0, errorEstimate: 0, evaluations: 0, converged: true };
  const f0 = 1 - 2 / r0;
  const sf0 = Math.sqrt(f0);
  const r02 = r0 * r0;
  const g0 = 2 * (r0 - 3);
  const kappa = g0 / r0;
  const rootKappa2 = 2 * Math.sqrt(kappa);
  const integrand = (_v: number, v: number): number => {
    const sh = Math.sinh(v); // v from its distance to the lower end 0, i.e. itself
    const x = kappa * sh * sh;
    const rr = r0 * Math.exp(x);
    const em = x === 0 ? 1 : Math.expm1(x) / x; // (r − r₀)/(r₀ x), full precision near x = 0
    const f = 1 - 2 / rr;
    const sum = rr + r0;
    const g = sum - (2 * (rr * rr + rr * r0 + r02)) / (rr * r0);
    const n = (4 * rr * rr * rr * (r0 - 2) + 6 * rr * rr * r0 * (r0 - 2) + 8 * rr * rr - 12 * rr * r02 + 8 * rr * r0 + 8 * r02) / (rr * rr * rr * r0);
    const sg = Math.sqrt(g);
    const ss = Math.sqrt(sum);
    // r² N dx/(√(r − r₀) …) with dx/√x = 2√κ cosh v dv.
    return ((rr * rr * n) / (Math.sqrt(r0 * em) * (sf0 * ss + f * sg) * f * sg * ss)) * rootKappa2 * Math.sqrt(1 + sh * sh);
  };
  const noise = (Number.EPSILON * (2 * r0 + 6)) / g0;
  const b = r0 / sf0;
  const nearPhotonSphere = noise > rtol / 64;
  const absoluteTolerance = nearPhotonSphere ? 64 * noise * b : 0;
  const upper = Math.asinh(Math.sqrt(Math.log(r / r0) / kappa));
  const q = tanhSinh(integrand, 0, upper, { relativeTolerance: rtol, absoluteTolerance });
  return { value: q.value, errorEstimate: nearPhotonSphere ? Math.max(q.errorEstimate, noise * b) : q.errorEstimate, evaluations: q.evaluations, converged: q.converged };
}

/**
 * One-way and round-trip Shapiro delay in Schwarzschild between radii r₁ and r₂ for the ray with
 * closest approach r₀ (or impact parameter b, converted exactly: r₀ the largest root of
 * r³ − b²r + 2b² = 0), with the two first-order formulas beside the exact value (module comment).
 * Refused with a typed reason when no such signal exists: b ≤ 3√3 or r₀ ≤ 3 (captured or inside the
 * photon sphere), an end below r₀, a ray below the body's surface, or invalid numbers.
 */
export function shapiroDelay(req: ShapiroRequest, options: ShapiroOptions = {}): ShapiroResult {
  const { r1, r2, surfaceRadius } = req;
  const rtol = options.relativeTolerance ?? 1e-12;
  const byRadius = 'closestApproach' in req.ray;
  const given = 'closestApproach' in req.ray ? req.ray.closestApproach : req.ray.impactParameter;
  if (
    !(Number.isFinite(r1) && r1 > 0 && Number.isFinite(r2) && r2 > 0 && Number.isFinite(given) && given > 0) ||
    (surfaceRadius !== undefined && !(Number.isFinite(surfaceRadius) && surfaceRadius > 0)) ||
    !(rtol >= 1e-15 && rtol <= 1e-3)
  ) {
    return refuse('invalidInput');
  }
  let r0: number;
  let b: number;
  if (byRadius) {
    r0 = given;
    if (!(r0 > 3)) return refuse('insidePhotonSphere');
    b = (r0 * r0) / Math.sqrt(r0 * (r0 - 2));
  } else {
    b = given;
    if (!(b > Math.sqrt(27))) return refuse('captured');
    r0 = schwarzschildClosestApproach(b).r0;
    if (!(r0 > 3)) return refuse('captured');
  }
  if (surfaceRadius !== undefined && r0 < surfaceRadius) return refuse('insideBody');
  if (r1 < r0 || r2 < r0) return refuse('endBelowClosestApproach');
  const e1 = excessTime(r0, r1, rtol);
  const e2 = excessTime(r0, r2, rtol);
  if (!(e1.converged && e2.converged)) return refuse('notConverged');
  const s1 = Math.sqrt((r1 - r0) * (r1 + r0));
  const s2 = Math.sqrt((r2 - r0) * (r2 + r0));
  const shapiro = 2 * (Math.log((r1 + s1) / r0) + Math.log((r2 + s2) / r0));
  const oneWay = e1.value + e2.value;
  return {
    ok: true,
    closestApproach: r0,
    impactParameter: b,
    flatTravelTime: s1 + s2,
    oneWay,
    roundTrip: 2 * oneWay,
    weakFieldOneWay: shapiro,
    weakFieldCorrectedOneWay: shapiro + Math.sqrt((r1 - r0) / (r1 + r0)) + Math.sqrt((r2 - r0) / (r2 + r0)),
    errorEstimate: e1.errorEstimate + e2.errorEstimate,
    evaluations: e1.evaluations + e2.evaluations,
  };
}
