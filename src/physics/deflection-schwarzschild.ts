/**
 * Deflection of light by a Schwarzschild mass in closed form and series, and the weak-field values for
 * equatorial rays of the Kerr–Newman family, in geometric units G = c = M = 1 (lengths in GM/c², angles
 * in radians). ./deflection.ts uses these as its Schwarzschild fast path and for its weak-field values.
 *
 * A Schwarzschild ray with impact parameter b turns at the largest root r₀ of r³ − b²r + 2b² = 0
 * (b = r₀/√(1 − 2/r₀), Darwin 1959); rays with b < 3√3 are captured. Methods:
 *  - closest approach: the trigonometric solution of the cubic (see {@link schwarzschildClosestApproach});
 *  - Darwin's exact elliptic-integral form (Darwin 1959, Proc. R. Soc. A 249, 180), written in Carlson's
 *    R_F (see {@link darwinDeflection});
 *  - for b ≥ 500 the weak-field series to eighth order (see {@link schwarzschildSeriesDeflection}), which
 *    keeps full relative precision where 2φ − π cancels (coefficients: Keeton & Petters 2005, Phys.
 *    Rev. D 72, 104006 — from memory; all eight checked in test/fixtures/python/light.py);
 *  - weak-field first and second order for spin and charge (see {@link weakFieldDeflection}; Einstein
 *    1916, Epstein & Shapiro 1980, Edery & Godin 2006, Eiroa, Romero & Torres 2002 — from memory).
 */
import { carlsonRF } from './elliptic.js';
import type { OrbitDirection } from './observers.js';
import type { KerrNewman } from './spacetime.js';

const SQRT27 = Math.sqrt(27);
/** 3√3 − SQRT27 (mpmath, 40 digits): b − 3√3 is formed as (b − SQRT27) − SQRT27_LO, exact near b_c. */
const SQRT27_LO = -1.4303668319585554e-16;

/** Sign ± of the direction: +1 prograde, −1 retrograde (also used by ./deflection.ts). */
export function sense(direction: OrbitDirection): 1 | -1 {
  return direction === 'retrograde' ? -1 : 1;
}

/**
 * Schwarzschild closest approach from the impact parameter, b > 3√3: the largest root of
 * r³ − b²r + 2b² = 0, r₀ = (2b/√3) cos((π − ψ)/3) with ψ = arccos(3√3/b) = 2 arcsin√((b − 3√3)/(2b))
 * (the trigonometric solution of the cubic; the arcsin form keeps ψ accurate near b_c, and b − 3√3 is
 * formed against 3√3 in two parts so that it is exact for b next to it). Also returns
 * r₀ − 3 = ((b − 3√3)/√3) cos(ψ/3) − 6 sin²(ψ/6) + b sin(ψ/3), free of cancellation at the photon
 * sphere. NaN for b < 3√3.
 */
export function schwarzschildClosestApproach(b: number): { r0: number; r0MinusThree: number } {
  const excess = b - SQRT27 - SQRT27_LO;
  if (!(excess >= 0)) return { r0: Number.NaN, r0MinusThree: Number.NaN };
  const psi = 2 * Math.asin(Math.sqrt(excess / (2 * b)));
  const c = Math.cos(psi / 3);
  const sn = Math.sin(psi / 3);
  const s6 = Math.sin(psi / 6);
  const r0MinusThree = (excess / Math.sqrt(3)) * c - 6 * s6 * s6 + b * sn;
  return { r0: (b / Math.sqrt(3)) * c + b * sn, r0MinusThree };
}

/**
 * Darwin's exact Schwarzschild deflection for closest approach r₀ > 3 (Darwin 1959, Proc. R. Soc. A
 * 249, 180; the Legendre form as usually quoted, checked against quadrature in the fixture script):
 * α = −π + 4√(r₀/P)[K(k) − F(ψ₀, k)], P = √((r₀ − 2)(r₀ + 6)), k² = (P − r₀ + 6)/(2P),
 * sin²ψ₀ = (P − r₀ + 2)/(P − r₀ + 6). Evaluated in Carlson's form: with the roots u₁ < 0 < u₀ = 1/r₀ ≤ u₃
 * of 2u³ − u² + 1/b², φ/2 = ∫₀^{u₀} du/√(2(u₀ − u)(u₃ − u)(u − u₁)) = √2 R_F(A, B, C) (DLMF 19.29.4 with
 * one limit at a root — number from memory), which simplifies to
 *   A = (r₀ − 2 + P) S/(16 r₀),  B = 8(r₀ − 2)(r₀ − 3)/(r₀ (P + r₀ − 2) S),  C = (r₀ − 3)/r₀,
 *   S = P + 6 − r₀ = 16(r₀ − 3)/(P + r₀ − 6),
 * so α = 2√2 R_F(A, B, C) − π. Every factor is free of cancellation given r₀ − 3 (pass it when known
 * more precisely than r₀ − 3 rounds, e.g. from {@link schwarzschildClosestApproach}); near r₀ = 3, B
 * and C vanish and R_F grows like a logarithm, which the duplication algorithm follows to full
 * precision. In weak fields 2√2 R_F → π and the subtraction leaves an absolute error of a few 1e−16
 * (relative ≈ 1e−16 b); use the series there. NaN for r₀ ≤ 3 (+∞ at r₀ = 3).
 */
export function darwinDeflection(r0: number, r0MinusThree: number = r0 - 3): number {
  if (!(r0 >= 3 && r0MinusThree >= 0)) return Number.NaN;
  if (r0MinusThree === 0) return Number.POSITIVE_INFINITY;
  const p = Math.sqrt((r0 - 2) * (r0 + 6));
  const sArg = r0 <= 6 ? p + (6 - r0) : (16 * r0MinusThree) / (p + (r0 - 6));
  const A = ((r0 - 2 + p) * sArg) / (16 * r0);
  const B = (8 * (r0 - 2) * r0MinusThree) / (r0 * (p + r0 - 2) * sArg);
  const C = r0MinusThree / r0;
  return 2 * Math.SQRT2 * carlsonRF(A, B, C) - Math.PI;
}

/**
 * Coefficients c_n of the Schwarzschild weak-field series α = Σ c_n (M/b)^n, n = 1..8: 4, 15π/4, 128/3,
 * 3465π/64, 3584/5, 255255π/256, 98304/7, 334639305π/16384. The first four as given by Keeton &
 * Petters 2005 (Phys. Rev. D 72, 104006 — from memory); all eight were identified (rational, times π
 * for even n) from a fit to Darwin's exact form at 80 digits, which test/fixtures/python/light.py
 * repeats and checks.
 */
const SERIES = [
  4,
  (15 * Math.PI) / 4,
  128 / 3,
  (3465 * Math.PI) / 64,
  3584 / 5,
  (255255 * Math.PI) / 256,
  98304 / 7,
  (334639305 * Math.PI) / 16384,
] as const;

/**
 * The Schwarzschild weak-field series to eighth order in M/b (coefficients above). The series
 * converges for b > 3√3 (its radius is b_c); truncated after (M/b)⁸ its relative error is below
 * 2e−17 for b ≥ 500, where it replaces Darwin's form (whose 2φ − π cancels).
 */
export function schwarzschildSeriesDeflection(b: number): number {
  const x = 1 / b;
  let acc = 0;
  for (let i = SERIES.length - 1; i >= 0; i--) acc = (acc + (SERIES[i] as number)) * x;
  return acc;
}

/**
 * Weak-field deflection of an equatorial ray with impact parameter b: first order 4M/b (Einstein 1916,
 * Ann. Phys. 49, 769 — from memory), and second order 4M/b + (15π/4 M² − 3π Q²/4 ∓ 4aM)/b², the spin term with the
 * upper sign for prograde rays (Schwarzschild 15π/4: Epstein & Shapiro 1980, Phys. Rev. D 22, 2947;
 * spin: Edery & Godin 2006, Gen. Relativ. Gravit. 38, 1715; charge: Eiroa, Romero & Torres 2002,
 * Phys. Rev. D 66, 024010 — all from memory; the tests check that the exact deflection minus this
 * value is O(1/b³)). Radians; b > 0.
 */
export function weakFieldDeflection(
  s: KerrNewman,
  b: number,
  direction: OrbitDirection,
): { firstOrder: number; secondOrder: number } {
  const first = 4 / b;
  const k2 = (15 * Math.PI) / 4 - (3 * Math.PI * s.q * s.q) / 4 - 4 * sense(direction) * s.a;
  return { firstOrder: first, secondOrder: first + k2 / (b * b) };
}

