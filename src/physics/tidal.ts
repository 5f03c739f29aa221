/**
 * Tides: the tidal tensor (electric part of the Riemann tensor) seen by an observer, its principal
 * stretches and squeezes, and the tidal disruption of a star.
 *
 * Geometric units G = c = M = 1: the tidal tensor in 1/M² (multiply by (c³/GM)² for s⁻²).
 * E_ij = R_{i0j0} = R_abcd e_i^a u^b e_j^c u^d in the observer's orthonormal frame (u, e_i), so that
 * two free particles a small distance ξ apart accelerate apart at δa_i = −E_ij ξ^j (geodesic
 * deviation; Misner, Thorne & Wheeler 1973, §1.6 and ch. 31 — from memory). An eigenvalue λ < 0 stretches along
 * its direction, λ > 0 squeezes. In vacuum tr E = 0; with charge tr E = R_ab u^a u^b.
 *
 * Observers and their spatial triads (radial outward, polar towards increasing θ, azimuthal along
 * the spin), each given by its components in the principal frame of curvature.ts:
 * - static: u ∝ ∂t. Relative to Carter's e0 it moves along e3 at β = −a sinθ/√Δ, so
 *   u = γ(e0 + β e3), e_φ = γ(β e0 + e3), e_r = e1, e_θ = e2, with γ = √(Δ/(Σ − μ)).
 * - ZAMO: u ∝ ∂t + ω∂φ, β = −a sinθ √Δ/(r² + a²), γ = (r² + a²)/√A (Bardeen, Press & Teukolsky 1972,
 *   ApJ 178, 347, §III).
 *   Both exist where Δ > 0 — outside the outer horizon and inside the inner one — the static observer
 *   where Σ > μ, the ZAMO where A > 0 (observers.ts, stationaryAbsence): their tides are local and need
 *   no comparison with far-away clocks.
 * - river: the zero-angular-momentum free-faller from rest at infinity (E = 1, L = 0, Carter's
 *   K = 0), whose covariant velocity is u = (−1, −√((r²+a²)μ)/Δ, 0, 0) (spacetime.ts). Its component
 *   along e3 is u·e3 = −a sinθ/√Σ; its part in the e0–e1 plane, of norm √((r² + a²)/Σ), defines the
 *   principal frame's T (and X ⟂ T in that plane, with a positive dr component), so
 *   u = (√((r²+a²)/Σ), 0, 0, −a sinθ/√Σ) in (T, X, e2, e3) — regular through both horizons, wherever
 *   μ = 2r − Q² ≥ 0. Its azimuthal axis is ∂φ/|∂φ| (orthogonal to u because L = 0),
 *   e_φ = (−a sinθ √(r²+a²), −a sinθ √μ, 0, r² + a²)/√A, and e_r the unit vector orthogonal to u, e_θ
 *   and e_φ with a positive dr component,
 *   e_r = (−a² sin²θ √μ/√Σ, √((r²+a²)Σ), 0, a sinθ √(μ(r²+a²)/Σ))/√A.
 *   Outside the horizon it is the ZAMO's frame boosted inward along e_r by the flow speed.
 *
 * Method: each of these observers is a boost along e3 of a frame in the principal plane, followed
 * (river) by a rotation of its radial and azimuthal axes; E then follows in closed form from Ψ2 and
 * Φ11 (tidalTensorClosedForm), keeping full precision even where the boost is extreme (next to the
 * ring singularity). The explicit tetrads and the contraction of the frame Riemann tensor
 * (tidalTensor) are the independent route the tests compare it with, and serve other observers.
 * The principal directions come from the Jacobi eigen-solver of mathjs (eigs) on E scaled to unit
 * size; the tests hold E v = λ v and the orthonormality of the directions to 1e−12.
 */
import { eigs } from 'mathjs';
import { contract, weylPsi2, type Complex, type Tensor4 } from './curvature.js';
import { stationaryAbsence, type StationaryAbsence } from './observers.js';
import { pointFunctions, type KerrNewman } from './spacetime.js';

export type TidalObserverKind = 'static' | 'zamo' | 'river';

/** An observer's orthonormal tetrad, contravariant components in the principal frame (T, X, e2, e3). */
export interface Tetrad {
  u: number[];
  radial: number[];
  polar: number[];
  azimuthal: number[];
}

export type TetradAbsence = StationaryAbsence | 'noFlow';

export type TetradResult = { exists: true; tetrad: Tetrad } | { exists: false; reason: TetradAbsence };

/** The point functions the frames need (Σ, Δ, A, μ, r² + a², sin θ). */
interface FrameGeometry {
  sn: number;
  rho2: number;
  sigma: number;
  mu: number;
  delta: number;
  bigA: number;
}

function geometry(s: KerrNewman, r: number, theta: number): FrameGeometry {
  const p = pointFunctions(s, r, theta);
  return { sn: Math.sin(theta), rho2: p.rho2, sigma: p.sigma, mu: p.mu, delta: p.delta, bigA: p.bigA };
}

/** Why the observer `kind` cannot exist here, or null if it can. */
function absence(s: KerrNewman, kind: TidalObserverKind, r: number, g: FrameGeometry): TetradAbsence | null {
  if (kind === 'river') return g.mu < 0 ? 'noFlow' : null;
  return stationaryAbsence(s, kind, r, g);
}

/**
 * The observer relative to the principal frame: a boost along e3 with velocity β (given as γ², γ²β²
 * and γ²β, each formed directly so that none is a difference of large numbers), then a rotation by α
 * in the plane of X and the boosted e3 that carries (X, e3') to the observer's (radial, azimuthal)
 * axes; α = 0 for the static observer and the ZAMO. For the river observer cos α = √((r²+a²)Σ/A),
 * sin α = a sinθ √μ/√A (the components of e_r along X and e3').
 */
export interface FrameBoost {
  g2: number;
  g2b2: number;
  g2b: number;
  cos: number;
  sin: number;
}

/** The boost and rotation of observer `kind` at (r, θ) (module comment), or why it does not exist. */
export function observerBoost(
  s: KerrNewman,
  kind: TidalObserverKind,
  r: number,
  theta: number,
): { exists: true; boost: FrameBoost } | { exists: false; reason: TetradAbsence } {
  const g = geometry(s, r, theta);
  const reason = absence(s, kind, r, g);
  if (reason) return { exists: false, reason };
  const as = s.a * g.sn;
  if (kind === 'static') {
    const sm = g.sigma - g.mu;
    return { exists: true, boost: { g2: g.delta / sm, g2b2: (as * as) / sm, g2b: (-as * Math.sqrt(g.delta)) / sm, cos: 1, sin: 0 } };
  }
  if (kind === 'zamo') {
    const A = g.bigA;
    return {
      exists: true,
      boost: { g2: (g.rho2 * g.rho2) / A, g2b2: (as * as * g.delta) / A, g2b: (-g.rho2 * as * Math.sqrt(g.delta)) / A, cos: 1, sin: 0 },
    };
  }
  const sA = Math.sqrt(g.bigA);
  return {
    exists: true,
    boost: {
      g2: g.rho2 / g.sigma,
      g2b2: (as * as) / g.sigma,
      g2b: (-Math.sqrt(g.rho2) * as) / g.sigma,
      cos: Math.sqrt(g.rho2 * g.sigma) / sA,
      sin: (as * Math.sqrt(g.mu)) / sA,
    },
  };
}

/**
 * The tidal tensor over (radial, polar, azimuthal) in closed form. With E − iB = Ψ2 diag(2, −1, −1)
 * in the principal frame, a boost along e3 acts on E − iB as a rotation about e3 by an imaginary
 * angle (cos → γ, sin → iγβ), so the boosted observer sees, over (X, e2, e3'),
 *   E'11 = (2γ² + γ²β²) Re Ψ2 + γ²Φ,  E'22 = −(γ² + 2γ²β²) Re Ψ2 + γ²β²Φ,  E'33 = −Re Ψ2,
 *   E'12 = 3γ²β Im Ψ2,  E'13 = E'23 = 0,
 * where Φ = Q²/Σ² and the Φ terms are the Maxwell part ½(δ_ij R_uu − R_ij). The rotation by α then
 * gives E = R_α E' R_αᵀ in the (radial, azimuthal) plane. Every term is a product (no differences of
 * boosted quantities), so the result keeps its precision however large γ is (next to the ring, or the
 * static observer near the ergosurface); the tests hold it against the direct contraction of the
 * frame Riemann tensor and against the sympy fixture.
 */
export function tidalTensorClosedForm(psi2: Complex, phi: number, b: FrameBoost): number[][] {
  const e11 = (2 * b.g2 + b.g2b2) * psi2.re + b.g2 * phi;
  const e22 = -(b.g2 + 2 * b.g2b2) * psi2.re + b.g2b2 * phi;
  const e33 = -psi2.re;
  const e12 = 3 * b.g2b * psi2.im;
  const c = b.cos;
  const s = b.sin;
  const rp = c * s * (e33 - e11);
  return [
    [c * c * e11 + s * s * e33, c * e12, rp],
    [c * e12, e22, -s * e12],
    [rp, -s * e12, s * s * e11 + c * c * e33],
  ];
}

/** Tetrad of the observer `kind` at Boyer–Lindquist (r, θ) (see the module comment). */
export function observerTetrad(s: KerrNewman, kind: TidalObserverKind, r: number, theta: number): TetradResult {
  const g = geometry(s, r, theta);
  const reason = absence(s, kind, r, g);
  if (reason) return { exists: false, reason };
  const { sn, rho2, sigma, mu, delta, bigA } = g;
  const a = s.a;
  const polar = [0, 0, 1, 0];
  if (kind === 'river') {
    const sA = Math.sqrt(bigA);
    const sSig = Math.sqrt(sigma);
    const sMu = Math.sqrt(mu);
    const sRho = Math.sqrt(rho2);
    return {
      exists: true,
      tetrad: {
        u: [sRho / sSig, 0, 0, (-a * sn) / sSig],
        radial: [(-a * a * sn * sn * sMu) / (sSig * sA), (sRho * sSig) / sA, 0, (a * sn * sMu * sRho) / (sSig * sA)],
        polar,
        azimuthal: [(-a * sn * sRho) / sA, (-a * sn * sMu) / sA, 0, rho2 / sA],
      },
    };
  }
  let gamma: number;
  let gammaBeta: number;
  if (kind === 'static') {
    const sm = sigma - mu; // −g_tt Σ
    gamma = Math.sqrt(delta / sm);
    gammaBeta = (-a * sn) / Math.sqrt(sm);
  } else {
    const sA = Math.sqrt(bigA);
    gamma = rho2 / sA;
    gammaBeta = (-a * sn * Math.sqrt(delta)) / sA;
  }
  return {
    exists: true,
    tetrad: { u: [gamma, 0, 0, gammaBeta], radial: [0, 1, 0, 0], polar, azimuthal: [gammaBeta, 0, 0, gamma] },
  };
}

/** E_ij = R(e_i, u, e_j, u) over the triad (radial, polar, azimuthal); symmetric 3×3, units 1/M². */
export function tidalTensor(riemann: Tensor4, t: Tetrad): number[][] {
  const e = [t.radial, t.polar, t.azimuthal];
  const out = [0, 1, 2].map(() => [0, 0, 0]);
  for (let i = 0; i < 3; i++) {
    for (let j = i; j < 3; j++) {
      const v = contract(riemann, e[i]!, t.u, e[j]!);
      out[i]![j] = v;
      out[j]![i] = v;
    }
  }
  return out;
}

/** A principal axis of the tidal tensor. */
export interface PrincipalTide {
  /** Eigenvalue λ (units 1/M²): relative acceleration −λ per unit separation along `direction`. */
  value: number;
  /** Unit vector (radial, polar, azimuthal) in the observer's frame; sign fixed so its largest component is positive. */
  direction: [number, number, number];
}

/**
 * Eigenvalues and unit eigenvectors of a symmetric 3×3, ascending (most stretching first). The matrix
 * is scaled by its largest entry before mathjs's Jacobi iteration (which stops at an absolute
 * off-diagonal size of 1e−12/3), so tiny and huge tides are resolved alike. Null for a non-finite matrix.
 */
export function principalTides(E: number[][]): PrincipalTide[] | null {
  let scale = 0;
  for (const row of E) for (const v of row) {
    if (!Number.isFinite(v)) return null;
    scale = Math.max(scale, Math.abs(v));
  }
  if (scale === 0) {
    return [0, 1, 2].map((i) => ({ value: 0, direction: [i === 0 ? 1 : 0, i === 1 ? 1 : 0, i === 2 ? 1 : 0] }));
  }
  const m = E.map((row) => row.map((v) => v / scale));
  const res = eigs(m, { eigenvectors: true });
  const out = (res.eigenvectors ?? []).map(({ value, vector }) => {
    const v = (Array.isArray(vector) ? vector : (vector as unknown as { toArray(): number[] }).toArray()) as number[];
    const norm = Math.hypot(v[0]!, v[1]!, v[2]!);
    let big = 0;
    for (let i = 1; i < 3; i++) if (Math.abs(v[i]!) > Math.abs(v[big]!)) big = i;
    const sign = v[big]! < 0 ? -1 : 1;
    const direction = [0, 1, 2].map((i) => (sign * v[i]!) / norm + 0) as [number, number, number];
    return { value: (value as number) * scale, direction };
  });
  out.sort((p, q) => p.value - q.value);
  return out;
}

/** The tidal tensor of one observer at a point, with its principal axes; null with a reason where none exists. */
export type ObserverTides =
  | { kind: TidalObserverKind; exists: true; tensor: number[][]; principal: PrincipalTide[] | null }
  | { kind: TidalObserverKind; exists: false; reason: TetradAbsence };

/** Tides seen by each observer kind at Boyer–Lindquist (r, θ), by the closed form. */
export function tidesAt(s: KerrNewman, r: number, theta: number, kinds: readonly TidalObserverKind[]): ObserverTides[] {
  const cs = Math.cos(theta);
  const psi2 = weylPsi2(s.a, s.q, r, cs);
  const sigma = r * r + s.a * s.a * cs * cs;
  const phi = (s.q * s.q) / sigma / sigma;
  return kinds.map((kind) => {
    const b = observerBoost(s, kind, r, theta);
    if (!b.exists) return { kind, exists: false, reason: b.reason };
    const tensor = tidalTensorClosedForm(psi2, phi, b.boost);
    return { kind, exists: true, tensor, principal: principalTides(tensor) };
  });
}

/**
 * Tidal disruption radius r_t = R⋆(M/m⋆)^{1/3} in units of M, given the star's radius R⋆ (units of M)
 * and its mass as a fraction m⋆/M of the hole's: where the hole's Newtonian tidal acceleration across
 * the star, ~GM R⋆/r³, matches the star's surface gravity Gm⋆/R⋆² (Hills 1975, Nature 254, 295; Rees
 * 1988, Nature 333, 523). An order-of-magnitude estimate: the prefactor depends on the star's structure
 * and spin and on the orbit (factors of order unity).
 */
export function disruptionRadius(starRadius: number, starMassRatio: number): number {
  return starRadius * Math.cbrt(1 / starMassRatio);
}

/**
 * Hills mass: the hole mass at which r_t equals the outer horizon r+ = k GM/c² (k = r+/M of the
 * given spin and charge, 2 for Schwarzschild). From R⋆(M/m⋆)^{1/3} = k G M/c²:
 *   M_H = (R⋆ c²/(k G))^{3/2} m⋆^{−1/2},  i.e.  M_H/m⋆ = (k C⋆)^{−3/2}  with C⋆ = G m⋆/(R⋆ c²),
 * the star's compactness. Above it a star of this kind is swallowed whole. Same estimate as above; for
 * a spinning hole the true limit also depends on the orbit's inclination, which this does not model.
 */
export function hillsMassRatio(starCompactness: number, horizonInM: number): number {
  return Math.pow(horizonInM * starCompactness, -1.5);
}
