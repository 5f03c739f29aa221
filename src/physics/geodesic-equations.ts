/**
 * Geodesics of Kerr–Newman in ingoing Kerr coordinates (v, r, θ, φ̃), which are regular across both
 * horizons: the equations of motion as a Hamiltonian system, the conserved quantities, and the rate
 * of river (Doran) time along the path. Boyer–Lindquist t and φ and Kerr–Schild x, y, z are formed
 * from v and φ̃ with the chart relations of coordinate-integrals.ts and coordinates.ts (t̄ = v − r).
 *
 * Geometric units G = c = M = 1. Ingoing Kerr coordinates (Misner, Thorne & Wheeler 1973, Box 33.2;
 * Poisson 2004, A Relativist's Toolkit, §5.3.6, with 2Mr → μ = 2r − Q² for the charge):
 *   dv = dt + (r² + a²)/Δ dr,  dφ̃ = dφ + a/Δ dr,
 *   ds² = −(1 − μ/Σ) dv² + 2 dv dr − 2a sin²θ dr dφ̃ − 2a sin²θ (μ/Σ) dv dφ̃ + Σ dθ² + (A sin²θ/Σ) dφ̃².
 * Its inverse, regular wherever Σ > 0 and sinθ ≠ 0 (Δ appears only in the numerator):
 *   Σ g^{vv} = a² sin²θ, Σ g^{vr} = r² + a², Σ g^{vφ̃} = a, Σ g^{rr} = Δ, Σ g^{rφ̃} = a, Σ g^{θθ} = 1,
 *   Σ g^{φ̃φ̃} = 1/sin²θ.
 * Both were derived from the Boyer–Lindquist form and are checked with sympy in
 * test/fixtures/python/geodesic.py.
 *
 * Hamiltonian H = ½ g^{μν} p_μ p_ν (Carter 1968, Phys. Rev. 174, 1559; MTW 1973 §33.5) with p_v = −E
 * and p_φ̃ = L conserved, so that
 *   2Σ H = N ≡ Δ p_r² − 2 P p_r + p_θ² + W,   P = E(r² + a²) − aL,   W = (L − aE sin²θ)²/sin²θ,
 * and H = −κ/2 with κ = 1 for a massive particle (λ its proper time) and κ = 0 for light (λ an affine
 * parameter). Hamilton's equations, integrated in λ for y = (r, θ, p_r, p_θ, v, φ̃, T):
 *   dr/dλ = (Δ p_r − P)/Σ,            dθ/dλ = p_θ/Σ,
 *   dp_r/dλ = −(Δ' p_r² − 4 E r p_r)/(2Σ) + N r/Σ²,        Δ' = 2r − 2,
 *   dp_θ/dλ = −∂_θW/(2Σ) − N a² sinθ cosθ/Σ²,  ∂_θW = −2L² cosθ/sin³θ + 2a²E² sinθ cosθ,
 *   dv/dλ = ((r² + a²) p_r − a² E sin²θ + aL)/Σ,       dφ̃/dλ = (a p_r − aE + L/sin²θ)/Σ,
 *   dT/dλ = dv/dλ − √(r² + a²)/(√(r² + a²) + √μ) · dr/dλ   (river time; see riverFactor).
 * N is evaluated from the state rather than replaced by −κΣ, so the system is exactly Hamiltonian and
 * H is a check on the integration. The Carter constant
 *   K = p_θ² + cos²θ (a²(κ − E²) + L²/sin²θ)
 * is conserved too (Carter 1968); E and L are constants of the system by construction.
 */
import type { KerrNewman } from './spacetime.js';

/** The constants of motion that enter the equations: energy E = −p_v, axial angular momentum L = p_φ̃, κ. */
export interface MotionConstants {
  E: number;
  L: number;
  /** 1 for a massive particle (λ = proper time), 0 for light (λ an affine parameter). */
  kappa: 0 | 1;
}

/** Indices of the state vector. */
export const R = 0;
export const TH = 1;
export const PR = 2;
export const PTH = 3;
export const V = 4;
export const PHI = 5;
export const RIVER = 6;
export const STATE_SIZE = 7;

/**
 * √(r² + a²)/(√(r² + a²) + √μ): the factor relating river time to v, dT = dv − factor · dr. It follows
 * from dT = dt + √((r² + a²)μ)/Δ dr (Doran 2000, Phys. Rev. D 61, 067503, with 2Mr → μ) and
 * dv = dt + (r² + a²)/Δ dr, using Δ = (r² + a²) − μ = (√(r² + a²) − √μ)(√(r² + a²) + √μ): smooth
 * through both horizons. NaN where μ = 2r − Q² < 0 (no river time there).
 */
export function riverFactor(s: KerrNewman, r: number): number {
  const mu = 2 * r - s.q * s.q;
  if (mu < 0) return Number.NaN;
  const rho = Math.sqrt(r * r + s.a * s.a);
  return rho / (rho + Math.sqrt(mu));
}

/** The right-hand side of the geodesic equations (see the module comment), written into d. */
export function geodesicRhs(s: KerrNewman, c: MotionConstants, y: Float64Array, d: Float64Array): void {
  const r = y[R]!;
  const th = y[TH]!;
  const pr = y[PR]!;
  const pth = y[PTH]!;
  const a = s.a;
  const a2 = a * a;
  const { E, L } = c;
  const sn = Math.sin(th);
  const cs = Math.cos(th);
  const sin2 = sn * sn;
  const rho2 = r * r + a2;
  const mu = 2 * r - s.q * s.q;
  const delta = rho2 - mu;
  const sigma = r * r + a2 * cs * cs;
  const P = E * rho2 - a * L;
  const w0 = L - a * E * sin2;
  const W = (w0 * w0) / sin2;
  const N = delta * pr * pr - 2 * P * pr + pth * pth + W;
  const inv = 1 / sigma;
  const drdl = (delta * pr - P) * inv;
  d[R] = drdl;
  d[TH] = pth * inv;
  d[PR] = (-((2 * r - 2) * pr * pr - 4 * E * r * pr) * 0.5 + N * r * inv) * inv;
  const dW = (-2 * L * L * cs) / (sin2 * sn) + 2 * a2 * E * E * sn * cs;
  d[PTH] = (-0.5 * dW - N * a2 * sn * cs * inv) * inv;
  const dv = (rho2 * pr - a2 * E * sin2 + a * L) * inv;
  d[V] = dv;
  d[PHI] = (a * pr - a * E + L / sin2) * inv;
  const rho = Math.sqrt(rho2);
  d[RIVER] = dv - (rho / (rho + Math.sqrt(Math.max(mu, 0)))) * drdl;
}

/** 2H = N/Σ at the state: −κ on the mass shell. */
export function twiceHamiltonian(s: KerrNewman, c: MotionConstants, r: number, th: number, pr: number, pth: number): number {
  const a = s.a;
  const sin2 = Math.sin(th) ** 2;
  const rho2 = r * r + a * a;
  const delta = rho2 - (2 * r - s.q * s.q);
  const sigma = r * r + a * a * (1 - sin2);
  const P = c.E * rho2 - a * c.L;
  const w0 = c.L - a * c.E * sin2;
  return (delta * pr * pr - 2 * P * pr + pth * pth + (w0 * w0) / sin2) / sigma;
}

/** The Carter constant K = p_θ² + cos²θ (a²(κ − E²) + L²/sin²θ) (Carter 1968). */
export function carterConstant(s: KerrNewman, c: MotionConstants, th: number, pth: number): number {
  const sn = Math.sin(th);
  const cs = Math.cos(th);
  return pth * pth + cs * cs * (s.a * s.a * (c.kappa - c.E * c.E) + (c.L * c.L) / (sn * sn));
}

/** dr/dλ = (Δ p_r − P)/Σ at a state. */
export function radialVelocity(s: KerrNewman, c: MotionConstants, r: number, th: number, pr: number): number {
  const a2 = s.a * s.a;
  const rho2 = r * r + a2;
  const delta = rho2 - (2 * r - s.q * s.q);
  const cs = Math.cos(th);
  return (delta * pr - (c.E * rho2 - s.a * c.L)) / (r * r + a2 * cs * cs);
}
