/**
 * The Kerr–Newman family of stationary black-hole (and vacuum-exterior) spacetimes in one core.
 *
 * Geometric units G = c = M = 1 throughout: lengths in GM/c^2, times in GM/c^3. Signature (-,+,+,+),
 * Boyer–Lindquist coordinates (t, r, θ, φ). A spacetime is given by its spin a = J/(Mc) and charge
 * Q (geometrized, Q sqrt(G/(4π ε0))/c^2), both in units of M. Schwarzschild (a = Q = 0),
 * Reissner–Nordström (a = 0) and Kerr (Q = 0) are special cases of the same expressions; there are no
 * separate code paths, and the tests hold the general expressions against each family's closed form.
 *
 * Auxiliary functions (Misner, Thorne & Wheeler 1973, eq. 33.2; Newman et al. 1965):
 *   Σ = r² + a² cos²θ,  Δ = r² − 2r + a² + Q²,  A = (r² + a²)² − a² Δ sin²θ,  μ = 2r − Q².
 * μ plays the role of 2Mr in the Kerr expressions: every formula below is the Kerr one with 2Mr → μ.
 *
 * The "river" (flow) picture: the observers that fall from rest at infinity with zero angular momentum
 * and zero Carter constant (E = 1, L = 0, K = 0) have four-velocity u_μ = (−1, −√((r²+a²)μ)/Δ, 0, 0).
 * Their proper time T is a global time coordinate (u = −∇T), and together with the angle Φ carried along
 * with them gives the horizon-penetrating Gullstrand–Painlevé form (a = 0; Painlevé 1921, Gullstrand 1922)
 * and its rotating generalisation (Doran 2000, Phys. Rev. D 61, 067503), here with charge:
 *   dT = dt + √((r²+a²)μ)/Δ dr,   dΦ = dφ + a √(μ/(r²+a²))/Δ dr,
 *   ds² = −dT² + Σ/(r²+a²) (dr + β (dT − a sin²θ dΦ))² + Σ dθ² + (r²+a²) sin²θ dΦ²,  β = √((r²+a²)μ)/Σ.
 * Measured by the local zero-angular-momentum observer (ZAMO), these free-fallers move inward at the
 * flow speed v = √((r²+a²) μ / A), which is √(2M/r) (the Newtonian escape speed) for Schwarzschild and
 * exactly c on the outer horizon (where Δ = 0 makes A = (r²+a²)² and r²+a² = μ). The ZAMO lapse obeys
 * α² = ΣΔ/A = 1 − v², since A − ΣΔ = (r²+a²)μ; the ZAMO clock rate is the flow's inverse Lorentz factor.
 */

/** A member of the Kerr–Newman family, in units of its mass M. */
export interface KerrNewman {
  /** Spin a/M = cJ/(GM²), ≥ 0 (the orbit direction says prograde or retrograde). */
  readonly a: number;
  /** Charge Q/M (geometrized), any sign; only Q² enters the metric. */
  readonly q: number;
}

/** Boyer–Lindquist metric components (covariant); the others vanish. */
export interface BoyerLindquistMetric {
  tt: number;
  tphi: number;
  rr: number;
  thth: number;
  phph: number;
}

/** River (Doran / Gullstrand–Painlevé) metric components (covariant) in (T, r, θ, Φ); the others vanish. */
export interface RiverMetric {
  TT: number;
  Tr: number;
  TPhi: number;
  rr: number;
  rPhi: number;
  thth: number;
  PhiPhi: number;
}

/** Where a point lies relative to the surfaces of the spacetime (and of a body, if it has one). */
export type Region =
  | 'outside'
  | 'ergoregion'
  | 'outerHorizon'
  | 'betweenHorizons'
  | 'innerHorizon'
  | 'insideInnerHorizon'
  | 'singularity'
  | 'belowSurface';

/** The auxiliary functions at (r, θ); computed once per point and shared by every quantity. */
export interface PointFunctions {
  r: number;
  sin2: number;
  cos2: number;
  sigma: number;
  delta: number;
  bigA: number;
  /** μ = 2r − Q². */
  mu: number;
  /** r² + a². */
  rho2: number;
  /** sinθ cosθ (carries the sign of the hemisphere). */
  sincos: number;
}

export const schwarzschild: KerrNewman = { a: 0, q: 0 };

/** Whether (a, Q) describe a black hole (a² + Q² ≤ 1) rather than a naked singularity. */
export function hasHorizon(s: KerrNewman): boolean {
  return s.a * s.a + s.q * s.q <= 1;
}

/** Σ, Δ, A, μ at (r, θ). */
export function pointFunctions(s: KerrNewman, r: number, theta: number): PointFunctions {
  const sn = Math.sin(theta);
  const cs = Math.cos(theta);
  const sin2 = sn * sn;
  const cos2 = cs * cs;
  const a2 = s.a * s.a;
  const q2 = s.q * s.q;
  const rho2 = r * r + a2;
  const sigma = r * r + a2 * cos2;
  const mu = 2 * r - q2;
  // Δ = r² + a² − μ; written so that it is exact at the horizon for representable inputs.
  const delta = rho2 - mu;
  // A = (r² + a²)² − a²Δ sin²θ, written as (r² + a²)Σ + a²μ sin²θ (the same, with Δ = r² + a² − μ):
  // a sum of non-negative terms wherever μ ≥ 0, so no cancellation next to the ring, where the first
  // form loses every digit.
  const bigA = rho2 * sigma + a2 * mu * sin2;
  return { r, sin2, cos2, sigma, delta, bigA, mu, rho2, sincos: sn * cs };
}

/**
 * Outer and inner horizons r± = M ± √(M² − a² − Q²) (Δ = 0). Null for a naked singularity.
 * The inner root is evaluated as (a² + Q²)/r+ to avoid cancellation at small spin and charge.
 */
export function horizons(s: KerrNewman): { outer: number; inner: number } | null {
  const k = s.a * s.a + s.q * s.q;
  if (k > 1) return null;
  const root = Math.sqrt(1 - k);
  const outer = 1 + root;
  return { outer, inner: k / outer };
}

/**
 * Outer ergosurface r_E(θ) = M + √(M² − Q² − a² cos²θ), the outer root of g_tt = 0: the static limit,
 * inside which no observer can stay at fixed (r, θ, φ). Null when g_tt has no real root at this θ
 * (possible only with a² + Q² > 1). At the poles it meets the outer horizon.
 */
export function ergosurfaceRadius(s: KerrNewman, theta: number): number | null {
  const c = Math.cos(theta);
  const k = 1 - s.q * s.q - s.a * s.a * c * c;
  if (k < 0) return null;
  return 1 + Math.sqrt(k);
}

/** Boyer–Lindquist metric components (MTW 1973 eq. 33.2 with 2Mr → 2Mr − Q²). */
export function boyerLindquistMetric(s: KerrNewman, p: PointFunctions): BoyerLindquistMetric {
  const f = p.mu / p.sigma;
  return {
    tt: -(1 - f),
    tphi: -s.a * p.sin2 * f,
    rr: p.sigma / p.delta,
    thth: p.sigma,
    phph: (p.bigA * p.sin2) / p.sigma,
  };
}

/**
 * River-form metric components (see the module comment), regular across both horizons. Null where
 * μ = 2r − Q² < 0: there no observer falls from rest at infinity and the coordinates do not exist.
 */
export function riverMetric(s: KerrNewman, p: PointFunctions): RiverMetric | null {
  if (p.mu < 0) return null;
  const f = p.mu / p.sigma;
  const flowRate = Math.sqrt(p.mu / p.rho2); // Σβ/(r²+a²)
  const asin2 = s.a * p.sin2;
  return {
    TT: -(1 - f),
    Tr: flowRate,
    TPhi: -asin2 * f,
    rr: p.sigma / p.rho2,
    rPhi: -asin2 * flowRate,
    thth: p.sigma,
    PhiPhi: p.rho2 * p.sin2 + asin2 * asin2 * f,
  };
}

/**
 * (r² + a²) μ / A: the square of the flow speed in units of c² where μ ≥ 0, and in every case
 * 1 − α² with α the ZAMO lapse. Not a number where A ≤ 0 (very close to the centre of a spinning,
 * charged mass, where g_φφ < 0 and no ZAMO exists).
 */
function oneMinusLapseSquared(p: PointFunctions): number {
  if (!(p.bigA > 0)) return Number.NaN;
  return (p.rho2 * p.mu) / p.bigA;
}

/**
 * Square of the flow speed, v² = (r² + a²) μ / A, in units of c². Not a number where μ < 0 (no
 * observer falls from rest at infinity to there) or A ≤ 0.
 */
export function flowSpeedSquared(p: PointFunctions): number {
  if (p.mu < 0) return Number.NaN;
  return oneMinusLapseSquared(p);
}

/** Flow speed in units of c (see the module comment); > 1 between the horizons; NaN where undefined. */
export function flowSpeed(p: PointFunctions): number {
  return Math.sqrt(flowSpeedSquared(p));
}

/**
 * 1 − α, with α = √(ΣΔ/A) = √(1 − v²) the lapse: the clock rate dτ/dt of the ZAMO, evaluated as
 * v²/(1 + √(1 − v²)) so the offset keeps full relative precision in weak fields. Where 2r < Q² the
 * flow does not exist but the ZAMO does, and v² < 0 there (the offset is negative). NaN where no ZAMO
 * exists: on and between the horizons (v² ≥ 1), or where A ≤ 0.
 */
export function zamoClockOffset(p: PointFunctions): number {
  const v2 = oneMinusLapseSquared(p);
  if (!(v2 < 1)) return Number.NaN;
  return v2 / (1 + Math.sqrt(1 - v2));
}

/** Lapse α = dτ/dt of the ZAMO; NaN where it does not exist. */
export function zamoClockRate(p: PointFunctions): number {
  const v2 = oneMinusLapseSquared(p);
  if (!(v2 < 1)) return Number.NaN;
  return Math.sqrt(1 - v2);
}

/** Angular velocity of the ZAMOs, ω = −g_tφ/g_φφ = a μ / A (rad per unit t); NaN where A ≤ 0. */
export function frameDragRate(s: KerrNewman, p: PointFunctions): number {
  if (!(p.bigA > 0)) return Number.NaN;
  return (s.a * p.mu) / p.bigA;
}

/** x = μ/Σ = 1 + g_tt: the static observer's clock rate is √(1 − x). */
function staticPotential(p: PointFunctions): number {
  return p.mu / p.sigma;
}

/**
 * 1 − dτ/dt of a static observer (fixed r, θ, φ), as x/(1 + √(1 − x)) with x = μ/Σ, keeping full
 * relative precision for weak fields (Earth's equatorial surface: 6.95e-10; 1 m of height: 1.09e-16).
 * NaN where no static observer exists (x ≥ 1: on or inside the ergosurface).
 */
export function staticClockOffset(p: PointFunctions): number {
  const x = staticPotential(p);
  if (!(x < 1)) return Number.NaN;
  return x / (1 + Math.sqrt(1 - x));
}

/** dτ/dt = √(−g_tt) of a static observer; NaN where none exists. */
export function staticClockRate(p: PointFunctions): number {
  const x = staticPotential(p);
  if (!(x < 1)) return Number.NaN;
  return Math.sqrt(1 - x);
}

/**
 * Gravitational redshift z of light from a static emitter received by a static observer at infinity:
 * 1 + z = 1/√(−g_tt), evaluated as offset/rate. NaN where no static emitter exists.
 */
export function redshiftToInfinity(p: PointFunctions): number {
  return staticClockOffset(p) / staticClockRate(p);
}

/**
 * Proper acceleration of a static (hovering) observer, the gradient of ln V with V = √(−g_tt), as for
 * any observer moving along a Killing vector (Wald 1984, General Relativity, §6.3). Covariant components a_r, a_θ and the magnitude
 * |a| = √(g^rr a_r² + g^θθ a_θ²). Units 1/M. Positive a_r points outward (a hovering observer must
 * push away from the mass). NaN where no static observer exists, or where Δ ≤ 0.
 */
export function hoverAcceleration(
  s: KerrNewman,
  p: PointFunctions,
): { magnitude: number; r: number; theta: number } {
  const x = staticPotential(p);
  if (!(x < 1) || !(p.delta > 0)) return { magnitude: Number.NaN, r: Number.NaN, theta: Number.NaN };
  const sigma2 = p.sigma * p.sigma;
  const dxdr = (2 * p.sigma - 2 * p.r * p.mu) / sigma2;
  // ∂θ Σ = −2a² sinθ cosθ, so ∂θ x = 2a² μ sinθ cosθ / Σ².
  const dxdth = (2 * s.a * s.a * p.mu * p.sincos) / sigma2;
  const oneMinusX = 1 - x;
  const ar = (-0.5 * dxdr) / oneMinusX;
  const ath = (-0.5 * dxdth) / oneMinusX;
  const magnitude = Math.sqrt((p.delta / p.sigma) * ar * ar + (ath * ath) / p.sigma);
  return { magnitude, r: ar, theta: ath };
}

/** Region of a point, given the spacetime and, for a body with a surface, its radius (BL r). */
export function region(s: KerrNewman, r: number, theta: number, surfaceRadius?: number): Region {
  if (surfaceRadius !== undefined && r < surfaceRadius) return 'belowSurface';
  // Σ = 0: the central point (a = 0) or the ring r = 0, θ = π/2 (a ≠ 0).
  if (r === 0 && (s.a === 0 || Math.cos(theta) === 0 || Math.abs(Math.cos(theta)) < 1e-16)) return 'singularity';
  const h = horizons(s);
  if (h) {
    if (r < h.inner) return 'insideInnerHorizon';
    if (r === h.inner && h.inner > 0 && h.inner < h.outer) return 'innerHorizon';
    if (r < h.outer) return 'betweenHorizons';
    if (r === h.outer) return 'outerHorizon';
  }
  if (ergoregionContains(s, r, theta)) return 'ergoregion';
  return 'outside';
}

/** g_tt ≥ 0 (r² − 2r + Q² + a² cos²θ ≤ 0): on or inside the ergosurface, no static observers. */
function ergoregionContains(s: KerrNewman, r: number, theta: number): boolean {
  const c = Math.cos(theta);
  return r * r - 2 * r + s.q * s.q + s.a * s.a * c * c <= 0;
}
