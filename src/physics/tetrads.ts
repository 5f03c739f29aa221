/**
 * Orthonormal frames (tetrads) of the observers that can launch a geodesic, in ingoing Kerr coordinates
 * (v, r, θ, φ̃) of Kerr–Newman (see ./geodesic-equations.ts for the metric), and the initial momentum
 * of a particle or photon launched in a direction and with a speed measured in such a frame.
 *
 * Geometric units G = c = M = 1; signature (−,+,+,+). Observers (four-velocity u):
 * - static: u ∝ ∂_v (= ∂_t), at rest relative to the distant stars.
 * - zamo: zero angular momentum, u_μ = −α ∂_μ t with t the Boyer–Lindquist time, dt = dv − (r² + a²)/Δ dr
 *   (Bardeen, Press & Teukolsky 1972, ApJ 178, 347).
 *   Both exist where Δ > 0 (outside the outer horizon and inside the inner one), the static observer
 *   where g_vv = g_tt < 0 (Σ > μ), the ZAMO where A > 0: observers.ts, stationaryAbsence.
 * - river: the free-faller from rest at infinity (E = 1, L = 0, K = 0), u_μ = (−1, √(r²+a²)/(√(r²+a²)+√μ), 0, 0)
 *   in (v, r, θ, φ̃) — the Boyer–Lindquist u_r = −√((r² + a²)μ)/Δ carried over by p_r → p_r + (E(r² + a²) − aL)/Δ;
 *   exists wherever μ = 2r − Q² ≥ 0, on and inside the horizons too.
 * Spatial frame (common practice: Gram–Schmidt in the observer's rest space): e_r̂ is the direction in
 * which r grows fastest (∇r projected orthogonally to u), e_θ̂ = ∂_θ/√Σ (towards the south, increasing θ),
 * e_φ̂ the remaining unit vector with a positive φ̃ component (the sense of the hole's rotation).
 * For static observers and ZAMOs these are the usual Boyer–Lindquist frames (e_r̂ ∝ ∂_r of Boyer–Lindquist).
 *
 * A launch direction is given by ψ, the angle from the outward radial direction (0 outward, 90° tangential,
 * 180° straight in) and χ, the angle around the radial direction from e_φ̂ towards the north (−e_θ̂):
 *   n = cos ψ e_r̂ + sin ψ (cos χ e_φ̂ − sin χ e_θ̂).
 * A massive particle launched with speed w < 1 (units of c) has p = γ(u + w n), γ = 1/√(1 − w²) (per unit
 * rest mass, so λ is proper time); a photon has p = u + n: its energy measured by the observer is 1, which
 * fixes the scale of its affine parameter (λ advances like the observer's clock at the launch).
 */
import { STATIONARY_REASONS, stationaryAbsence, type StationaryAbsence } from './observers.js';
import { pointFunctions, type KerrNewman } from './spacetime.js';

export type LaunchObserver = 'static' | 'zamo' | 'river';

export type TetradAbsenceReason = StationaryAbsence | 'noRiver' | 'onAxis' | 'singular';

export const TETRAD_REASONS: Record<TetradAbsenceReason, string> = {
  ...STATIONARY_REASONS,
  noRiver: 'no observer falling from rest at infinity reaches a point where 2r < Q² (very close to the centre of a charged mass)',
  onAxis: 'on the rotation axis (sin θ = 0) the azimuthal direction is undefined: start off the axis',
  singular: 'the point is at or too close to the singularity (Σ = 0)',
};

/** Covariant metric g_{μν} in (v, r, θ, φ̃), as a 4×4 row-major array. */
export function ingoingMetric(s: KerrNewman, r: number, th: number): Float64Array {
  const a = s.a;
  const { sin2, sigma, mu, bigA } = pointFunctions(s, r, th);
  const g = new Float64Array(16);
  g[0] = -(1 - mu / sigma);
  g[1] = g[4] = 1;
  g[3] = g[12] = (-a * sin2 * mu) / sigma;
  g[7] = g[13] = -a * sin2;
  g[10] = sigma;
  g[15] = (bigA * sin2) / sigma;
  return g;
}

/** Contravariant metric g^{μν} in (v, r, θ, φ̃) (see ./geodesic-equations.ts). */
export function ingoingInverseMetric(s: KerrNewman, r: number, th: number): Float64Array {
  const a = s.a;
  const { sin2, sigma, rho2, delta } = pointFunctions(s, r, th);
  const h = new Float64Array(16);
  h[0] = (a * a * sin2) / sigma;
  h[1] = h[4] = rho2 / sigma;
  h[3] = h[12] = a / sigma;
  h[5] = delta / sigma;
  h[7] = h[13] = a / sigma;
  h[10] = 1 / sigma;
  h[15] = 1 / (sigma * sin2);
  return h;
}

function mul(m: Float64Array, x: ArrayLike<number>): number[] {
  const out = [0, 0, 0, 0];
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) out[i]! += m[i * 4 + j]! * x[j]!;
  return out;
}

function dot(g: Float64Array, x: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) s += g[i * 4 + j]! * x[i]! * y[j]!;
  return s;
}

/** An observer's orthonormal frame at a point: e[0] = u, then e_r̂, e_θ̂, e_φ̂ (contravariant components). */
export interface Tetrad {
  e: [number[], number[], number[], number[]];
  /** The metric there (covariant), for lowering. */
  g: Float64Array;
}

export type TetradResult = { ok: true; tetrad: Tetrad } | { ok: false; reason: TetradAbsenceReason };

/** The tetrad of `observer` at (r, θ); see the module comment for the frames and where they exist. */
export function observerTetrad(s: KerrNewman, observer: LaunchObserver, r: number, th: number): TetradResult {
  const sn = Math.sin(th);
  if (!(Math.abs(sn) > 1e-9)) return { ok: false, reason: 'onAxis' };
  const p = pointFunctions(s, r, th);
  const { sigma, rho2, mu } = p;
  if (!(sigma > 1e-12)) return { ok: false, reason: 'singular' };
  const g = ingoingMetric(s, r, th);
  const ginv = ingoingInverseMetric(s, r, th);
  let u: number[];
  if (observer !== 'river') {
    const absence = stationaryAbsence(s, observer, r, p);
    if (absence) return { ok: false, reason: absence };
  }
  if (observer === 'static') {
    // g_vv = −(1 − μ/Σ) may still round to 0 when Σ exceeds μ by an ulp.
    if (!(g[0]! < 0)) return { ok: false, reason: 'ergoregion' };
    u = [1 / Math.sqrt(-g[0]!), 0, 0, 0];
  } else if (observer === 'zamo') {
    const alpha = Math.sqrt((sigma * p.delta) / p.bigA);
    u = mul(ginv, [-alpha, (alpha * rho2) / p.delta, 0, 0]);
  } else {
    if (mu < 0) return { ok: false, reason: 'noRiver' };
    const rho = Math.sqrt(rho2);
    u = mul(ginv, [-1, rho / (rho + Math.sqrt(mu)), 0, 0]);
  }
  // Normalise u exactly (removes rounding of the closed forms).
  const nu = Math.sqrt(-dot(g, u, u));
  u = u.map((x) => x / nu);
  const orth = (x: number[], basis: number[][], signs: number[]): number[] => {
    let y = x.slice();
    basis.forEach((b, k) => {
      const c = dot(g, y, b) * signs[k]!;
      y = y.map((yi, i) => yi - c * b[i]!);
    });
    const n = Math.sqrt(dot(g, y, y));
    return y.map((yi) => yi / n);
  };
  // ∇r = g^{μr}; projected orthogonally to u (u·u = −1, hence the sign −1 in the projection).
  const gradR = [ginv[4]!, ginv[5]!, ginv[6]!, ginv[7]!];
  const er = orth(gradR, [u], [-1]);
  const eth = orth([0, 0, 1, 0], [u, er], [-1, 1]);
  const ephi = orth([0, 0, 0, 1], [u, er, eth], [-1, 1, 1]);
  if (ephi[3]! < 0) for (let i = 0; i < 4; i++) ephi[i] = -ephi[i]!;
  return { ok: true, tetrad: { e: [u, er, eth, ephi], g } };
}

/** Covariant momentum (p_v, p_r, p_θ, p_φ̃) of a launch; see the module comment. */
export function launchMomentum(t: Tetrad, kind: 'timelike' | 'null', speed: number, psi: number, chi: number): number[] {
  const [u, er, eth, ephi] = t.e;
  const n = [0, 1, 2, 3].map(
    (i) => Math.cos(psi) * er[i]! + Math.sin(psi) * (Math.cos(chi) * ephi[i]! - Math.sin(chi) * eth[i]!),
  );
  let p: number[];
  if (kind === 'null') p = u.map((ui, i) => ui + n[i]!);
  else {
    const gamma = 1 / Math.sqrt(1 - speed * speed);
    p = u.map((ui, i) => gamma * (ui + speed * n[i]!));
  }
  return mul(t.g, p);
}
