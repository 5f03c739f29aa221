/**
 * The radial functions that relate the time and azimuth coordinates of the three charts of a
 * Kerr–Newman spacetime: Boyer–Lindquist (t, r, θ, φ), ingoing Kerr–Schild (t̄, r, θ, φ̄) and river
 * (Doran; Gullstrand–Painlevé when a = 0) (T, r, θ, Φ). All three share r and θ. Geometric units
 * G = c = M = 1; lengths in M, times in M.
 *
 * Defining relations (Kerr 1963; Kerr & Schild 1965 for t̄, φ̄ — the ingoing Kerr coordinates with
 * t̄ = v − r; Doran 2000, Phys. Rev. D 61, 067503 for T, Φ, here with charge, as in spacetime.ts):
 *   dt̄ = dt + μ/Δ dr,                 dφ̄ = dφ + a/Δ dr,
 *   dT = dt + √(μ(r²+a²))/Δ dr,        dΦ = dφ + a√μ/(√(r²+a²) Δ) dr,
 * with μ = 2r − Q², Δ = r² − 2r + a² + Q² = (r² + a²) − μ. The committed sympy script
 * test/fixtures/python/transform.py checks that these carry the Boyer–Lindquist metric into the
 * Kerr–Schild form η + f k k and the river form of spacetime.ts.
 *
 * The river functions are taken relative to Kerr–Schild, where they are regular across both horizons:
 * since μ = r² + a² exactly where Δ = 0,
 *   d(T − t̄)/dr = (√(μρ²) − μ)/Δ = √μ/(ρ + √μ),   d(Φ − φ̄)/dr = a(√μ/ρ − 1)/Δ = −a/(ρ(ρ + √μ)),
 * with ρ = √(r² + a²): no pole, no cancellation (derivation checked by sympy in transform.py).
 *
 * Additive constants (a choice; every chart is defined only up to them), fixed at spatial infinity:
 *   φ̄ − φ → 0,   Φ − φ → 0,   t̄ − t − 2 ln r → 0,   T − t − 2√(2r) → 0   as r → ∞
 * (t̄ − t and T − t themselves diverge like 2M ln(r/M) and 2√(2Mr), so no constant makes them vanish;
 * this one makes the Schwarzschild river time the textbook Gullstrand–Painlevé time
 * T = t + 2√(2r) + 2 ln|(√r − √2)/(√r + √2)| and t̄ = t + 2 ln|r − 2|, and every expression continuous
 * in a and Q through extremality).
 *
 * Closed forms (derived and checked in transform.py): with x = r − 1 and δ² = 1 − a² − Q²,
 *   ∫ dr/Δ = J(x) = (1/2δ) ln|(x − δ)/(x + δ)|  (δ² > 0),   −1/x  (δ = 0),   −atan2(b, x)/b  (b² = −δ² > 0),
 *   t̄ − t = ln|Δ| + (2 − Q²) J(x),   φ̄ − φ = a J(x).
 * J is evaluated through atanh/atan so that it stays accurate as δ → 0 (near-extremal holes).
 * For T − t̄ the variable u = √μ (r = (u² + Q²)/2, dr = u du) makes the a = 0 integrand rational,
 *   H(u) = ∫ u²/(r + u) du = 2u + [p² ln(u + p) − s² ln(u + s)]/k + 2 ln 2,  k = √(1 − Q²), p = 1 − k, s = 1 + k,
 *        = 2u − 2(2 − Q²) K(1 + u) − 2 ln(r + u),  K(y) = atanh(k/y)/k, 1/y or atan(κ/y)/κ (κ² = Q² − 1),
 * and with spin the difference from it is integrable out to infinity:
 *   T − t̄ = H(u) + a² ∫_u^∞ s² ds / ((ρ + r)(ρ + s)(r + s)),   Φ − φ̄ = a ∫_u^∞ s ds / (ρ(ρ + s)),
 * where r and ρ are functions of s. With spin these are elliptic integrals; they are evaluated by
 * tanh-sinh quadrature (quadrature.ts) after s = u + c w/(1 − w), w ∈ [0, 1).
 *
 * Domains: the Boyer–Lindquist functions are infinite on the horizons (Δ = 0) — t and φ are singular
 * there; the river functions need μ ≥ 0 (r ≥ Q²/2): inside that radius no observer falls from rest at
 * infinity and the river chart does not exist.
 */
import { tanhSinhVector } from './quadrature.js';
import type { KerrNewman } from './spacetime.js';

/**
 * δ² = 1 − a² − Q²: positive with two horizons, zero when extremal, negative without a horizon.
 * Written as 1 − (a² + Q²), the same rounding as hasHorizon in spacetime.ts, so that every body the
 * rest of the service treats as a black hole has δ² ≥ 0 here.
 */
function deltaSquared(s: KerrNewman): number {
  return 1 - (s.a * s.a + s.q * s.q);
}

/**
 * Δ = r² − 2r + a² + Q², written as (x − δ)(x + δ) with x = r − 1 when there are horizons, so that it
 * keeps its relative precision next to them.
 */
export function deltaFunction(s: KerrNewman, r: number): number {
  const d2 = deltaSquared(s);
  const x = r - 1;
  if (d2 > 0) {
    const d = Math.sqrt(d2);
    return (x - d) * (x + d);
  }
  return x * x - d2;
}

/**
 * J(r) = ∫ dr/Δ with J → 0 as r → ∞ (see the module comment); ±Infinity or NaN on a horizon.
 */
export function inverseDeltaIntegral(s: KerrNewman, r: number): number {
  const d2 = deltaSquared(s);
  const x = r - 1;
  if (d2 > 0) {
    const d = Math.sqrt(d2);
    const ax = Math.abs(x);
    if (ax > d) return -Math.atanh(d / x) / d;
    if (ax < d) return -Math.atanh(x / d) / d;
    return Number.NaN; // on a horizon
  }
  if (d2 === 0) return x === 0 ? Number.NaN : -1 / x;
  const b = Math.sqrt(-d2);
  return -Math.atan2(b, x) / b;
}

/** t̄ − t at r (Kerr–Schild minus Boyer–Lindquist time); NaN on a horizon. */
export function kerrSchildTimeShift(s: KerrNewman, r: number): number {
  const j = inverseDeltaIntegral(s, r);
  if (!Number.isFinite(j)) return Number.NaN;
  return Math.log(Math.abs(deltaFunction(s, r))) + (2 - s.q * s.q) * j;
}

/** φ̄ − φ at r; NaN on a horizon (0 for a = 0 everywhere else). */
export function kerrSchildAzimuthShift(s: KerrNewman, r: number): number {
  if (s.a === 0) return 0;
  const j = inverseDeltaIntegral(s, r);
  return Number.isFinite(j) ? s.a * j : Number.NaN;
}

/** d(t̄ − t)/dr = μ/Δ and d(φ̄ − φ)/dr = a/Δ; infinite on a horizon. */
export function kerrSchildShiftRates(s: KerrNewman, r: number): { time: number; azimuth: number } {
  const delta = deltaFunction(s, r);
  return { time: (2 * r - s.q * s.q) / delta, azimuth: s.a / delta };
}

/**
 * H(u) = ∫ u²/(r + u) du, normalised so that H − 2√(2r) + 2 ln r → 0: the river time T − t̄ of the
 * non-spinning member with the same charge, at u = √μ, r = (u² + Q²)/2 (see the module comment).
 */
function riverTimeNonSpinning(q2: number, r: number, u: number): number {
  const k2 = 1 - q2;
  if (k2 > 0.25) {
    // p = 1 − k = Q²/(1 + k) without cancellation; p ≥ 0, s = 1 + k ≥ 1.5.
    const k = Math.sqrt(k2);
    const p = q2 / (1 + k);
    const sp = 1 + k;
    const pTerm = p === 0 ? 0 : p * p * Math.log(u + p);
    return 2 * u + (pTerm - sp * sp * Math.log(u + sp)) / k + 2 * Math.LN2;
  }
  // Here Q² ≥ 0.75, so r ≥ 0.375 and y = 1 + u ≥ 1: no end-point singularity, and K(y) stays accurate
  // as k → 0 (extremal charge) and through k² < 0 (a body with |Q| > 1).
  const y = 1 + u;
  let kFun: number;
  if (k2 > 0) {
    const k = Math.sqrt(k2);
    kFun = Math.atanh(k / y) / k;
  } else if (k2 === 0) {
    kFun = 1 / y;
  } else {
    const kappa = Math.sqrt(-k2);
    kFun = Math.atan(kappa / y) / kappa;
  }
  return 2 * u - 2 * (2 - q2) * kFun - 2 * Math.log(r + u);
}

/** Relative tolerance of the spin integrals (the quadrature's own estimate is conservative). */
const SPIN_TOLERANCE = 1e-14;

export interface RiverShift {
  /** T − t̄. */
  time: number;
  /** Φ − φ̄. */
  azimuth: number;
  /** False when the quadrature of the spin terms missed its tolerance (values then NaN). */
  converged: boolean;
}

/**
 * T − t̄ and Φ − φ̄ at r (river minus Kerr–Schild time and azimuth), regular across the horizons.
 * NaN where μ = 2r − Q² < 0 (no river chart). With spin, the two integrals to infinity are evaluated
 * together by tanh-sinh quadrature at relative tolerance 1e-14.
 */
export function riverShift(s: KerrNewman, r: number): RiverShift {
  const q2 = s.q * s.q;
  const mu = 2 * r - q2;
  if (!(mu >= 0)) return { time: Number.NaN, azimuth: Number.NaN, converged: true };
  const u = Math.sqrt(mu);
  const base = riverTimeNonSpinning(q2, r, u);
  if (s.a === 0) return { time: base, azimuth: 0, converged: true };
  const a = s.a;
  const a2 = a * a;
  // s = u + c w/(1 − w): c sets where the map spreads its nodes (the integrands change on the scale
  // of u, of 1, and of √a where r ~ a).
  const c = Math.max(u, 1, Math.sqrt(a));
  const tails = tanhSinhVector(
    (_w, w, oneMinusW, out) => {
      const sv = u + (c * w) / oneMinusW;
      const jac = c / (oneMinusW * oneMinusW);
      const rs = (sv * sv + q2) / 2;
      const rho = Math.hypot(rs, a);
      out[0] = (sv / (rho + rs)) * (sv / (rho + sv)) * (jac / (rs + sv));
      out[1] = (sv / rho) * (jac / (rho + sv));
    },
    0,
    1,
    2,
    { relativeTolerance: SPIN_TOLERANCE, absoluteTolerance: 1e-300, maxLevel: 12 },
  );
  if (!tails.converged) return { time: Number.NaN, azimuth: Number.NaN, converged: false };
  return { time: base + a2 * (tails.values[0] as number), azimuth: a * (tails.values[1] as number), converged: true };
}

/** d(T − t̄)/dr = √μ/(ρ + √μ) and d(Φ − φ̄)/dr = −a/(ρ(ρ + √μ)); NaN where μ < 0. */
export function riverShiftRates(s: KerrNewman, r: number): { time: number; azimuth: number } {
  const mu = 2 * r - s.q * s.q;
  if (!(mu >= 0)) return { time: Number.NaN, azimuth: Number.NaN };
  const u = Math.sqrt(mu);
  const rho = Math.hypot(r, s.a);
  return { time: u / (rho + u), azimuth: -s.a / (rho * (rho + u)) };
}
