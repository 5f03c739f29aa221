/**
 * The curvature of the Kerr–Newman spacetime in its principal (Carter) frame, and its invariants.
 *
 * Geometric units G = c = M = 1; curvature components in 1/M², the quadratic invariants in 1/M⁴.
 * Signature (−,+,+,+); Riemann convention R^a_bcd = ∂_c Γ^a_db − ∂_d Γ^a_cb + Γ^a_ce Γ^e_db − Γ^a_de Γ^e_cb
 * (that of Misner, Thorne & Wheeler 1973, ch. 11), so that relative acceleration is δa^i = −R^i_0j0 ξ^j.
 *
 * Method. Kerr–Newman is of Petrov type D (Kinnersley 1969, J. Math. Phys. 10, 1195). In Carter's
 * orthonormal frame (Carter 1968, Phys. Rev. 174, 1559; MTW 1973 §33.2, here with charge)
 *   e0 = (r² + a²)/√(ΣΔ) (∂t + a/(r² + a²) ∂φ),  e1 = √(Δ/Σ) ∂r,  e2 = ∂θ/√Σ,
 *   e3 = (∂φ + a sin²θ ∂t)/(√Σ sinθ),
 * e0 ∧ e1 holds both principal null directions, and the only Weyl scalar is
 *   Ψ2 = −M/r̄³ + Q²/(r̄³ r̄*),   r̄ = r − i a cosθ
 * (Newman–Penrose form, as in Chandrasekhar 1983, The Mathematical Theory of Black Holes, ch. 11 —
 * from memory; signs verified here against the sympy fixture). The
 * electric and magnetic parts of the Weyl tensor seen by e0 are then diagonal,
 *   E = Re Ψ2 · diag(2, −1, −1),   B = −Im Ψ2 · diag(2, −1, −1)   (axes e1, e2, e3),
 * and the Maxwell field is radial with |E + iB| = |Q|/Σ, so the Ricci tensor (R_ab = 8π T_ab, trace
 * free) is R_ab = (Q²/Σ²) diag(1, −1, 1, 1) — the Newman–Penrose Φ11 = Q²/(2Σ²). Both pieces are
 * unchanged by a boost in the e0–e1 plane, so the same components hold in any orthonormal frame
 * (T, X, e2, e3) with T, X spanning that plane and T ∧ X = e0 ∧ e1; that plane stays timelike inside
 * the horizons, where this is how the frame of a free-faller is built (see tidal.ts). The sign of B is
 * that of E − iB = Ψ2 diag(2, −1, −1) for the orientation (e1, e2, e3), ε₁₂₃ = +1, with the component
 * convention below; it is checked against a Riemann tensor built
 * from the metric by sympy (test/fixtures/python/curvature.py), off-diagonal tidal components included.
 *
 * Invariants (C·C = 8(E·E − B·B) = 48 Re Ψ2²; Stephani et al. 2003, Exact Solutions of Einstein's Field
 * Equations, ch. 4 — from memory):
 *   Kretschmann  K = R_abcd R^abcd = 48 Re(Ψ2²) + 8 Q⁴/Σ⁴,     Ricci square R_ab R^ab = 4 Q⁴/Σ⁴,
 * and the Ricci scalar R vanishes identically (a Maxwell field is traceless). For Schwarzschild
 * K = 48 M²/r⁶; the Kerr–Newman polynomial form is Henry (2000, ApJ 535, 350 — from memory); the tests
 * hold this form against both and against the sympy fixture.
 */

/** Ψ2 as a complex number, units 1/M². */
export interface Complex {
  re: number;
  im: number;
}

/**
 * The Weyl scalar Ψ2 = (Q² w̄ − M) w³ with w = 1/r̄ = (r + i a cosθ)/Σ, at Boyer–Lindquist (r, cosθ).
 * Written through w so that no power above Σ is formed (no overflow for r up to 1e150). Domain: Σ > 0
 * (everywhere but the ring r = 0, θ = π/2, or the point r = 0 when a = 0); not finite there.
 */
export function weylPsi2(a: number, q: number, r: number, cosTheta: number): Complex {
  const y = a * cosTheta;
  const sigma = r * r + y * y;
  const wr = r / sigma;
  const wi = y / sigma;
  const q2 = q * q;
  // Q² w̄ − M
  const fr = q2 * wr - 1;
  const fi = -q2 * wi;
  // w³
  const w2r = wr * wr - wi * wi;
  const w2i = 2 * wr * wi;
  const w3r = w2r * wr - w2i * wi;
  const w3i = w2r * wi + w2i * wr;
  return { re: fr * w3r - fi * w3i, im: fr * w3i + fi * w3r };
}

/** Smallest positive normal double, 2^−1022: below it a value has lost relative precision. */
export const SMALLEST_NORMAL = 2.2250738585072014e-308;

/**
 * Kretschmann scalar K = R_abcd R^abcd = 48 Re(Ψ2²) + 8 Q⁴/Σ⁴ (module comment), units 1/M⁴, at
 * Boyer–Lindquist (r, cos θ). It takes both signs in Kerr (negative near the axis at small r). NaN
 * where its size (48|Ψ2|² + 8Q⁴/Σ⁴) lies below the normal range of doubles (r ≳ 1e51 M: the value
 * would be subnormal or zero); +Infinity where it overflows (at and next to the singularity).
 */
export function kretschmannScalar(a: number, q: number, r: number, cosTheta: number): number {
  const p = weylPsi2(a, q, r, cosTheta);
  const y = a * cosTheta;
  const inv = 1 / (r * r + y * y);
  const phi = q * q * inv * inv; // Q²/Σ² = 2Φ11
  const size = 48 * (p.re * p.re + p.im * p.im) + 8 * phi * phi;
  if (size < SMALLEST_NORMAL) return Number.NaN;
  if (!(size < Number.POSITIVE_INFINITY)) return Number.POSITIVE_INFINITY;
  return 48 * (p.re * p.re - p.im * p.im) + 8 * phi * phi;
}

/**
 * R_ab R^ab = 4 Q⁴/Σ⁴ (units 1/M⁴): the square of the Ricci tensor sourced by the Maxwell field (the
 * Ricci scalar itself is 0). Exactly 0 without charge; NaN where a nonzero value lies below the
 * normal range of doubles; +Infinity where it overflows (at and next to the singularity).
 */
export function ricciSquared(a: number, q: number, r: number, cosTheta: number): number {
  if (q === 0) return 0;
  const y = a * cosTheta;
  const inv = 1 / (r * r + y * y);
  const phi = q * q * inv * inv;
  const v = 4 * phi * phi;
  return v < SMALLEST_NORMAL ? Number.NaN : v;
}

/** A 4-index tensor in an orthonormal frame, flat, index (a, b, c, d) at 64a + 16b + 4c + d. */
export type Tensor4 = Float64Array;

const ETA = [-1, 1, 1, 1] as const;
const idx = (a: number, b: number, c: number, d: number): number => 64 * a + 16 * b + 4 * c + d;

/** Sets R_abcd = v with all the symmetries of a curvature tensor (antisymmetric pairs, pair exchange). */
function put(t: Tensor4, a: number, b: number, c: number, d: number, v: number): void {
  t[idx(a, b, c, d)] = v;
  t[idx(b, a, c, d)] = -v;
  t[idx(a, b, d, c)] = -v;
  t[idx(b, a, d, c)] = v;
  t[idx(c, d, a, b)] = v;
  t[idx(d, c, a, b)] = -v;
  t[idx(c, d, b, a)] = -v;
  t[idx(d, c, b, a)] = v;
}

/** Levi-Civita symbol on spatial indices 1..3 (ε₁₂₃ = 1). */
function eps(i: number, j: number, k: number): number {
  return ((i - j) * (j - k) * (k - i)) / 2;
}

/**
 * The Riemann tensor R_abcd (all indices down) in the principal frame (T, X, e2, e3) at a point, from
 * Ψ2 and Q²/Σ² (module comment), units 1/M². The Weyl part from its electric and magnetic parts with
 * respect to T (the standard decomposition, e.g. Stephani et al. 2003, ch. 3 — from memory):
 *   C_0i0j = E_ij,  C_0ijk = ε_jkl B_li,  C_ijkl = −ε_ijm ε_kln E_mn,
 * plus R_abcd ⊃ ½(η_ac R_bd − η_ad R_bc − η_bc R_ad + η_bd R_ac) for the trace-free Ricci part.
 */
export function principalRiemann(psi2: Complex, ricciScale: number): Tensor4 {
  const t = new Float64Array(256);
  const shape = [0, 2, -1, -1];
  const E = (i: number, j: number) => (i === j ? psi2.re * shape[i]! : 0);
  const B = (i: number, j: number) => (i === j ? -psi2.im * shape[i]! : 0);
  for (let i = 1; i <= 3; i++) {
    for (let j = 1; j <= 3; j++) {
      put(t, 0, i, 0, j, E(i, j));
      for (let k = 1; k <= 3; k++) {
        let v = 0;
        for (let l = 1; l <= 3; l++) v += eps(j, k, l) * B(l, i);
        if (j < k) put(t, 0, i, j, k, v);
      }
    }
  }
  for (let i = 1; i <= 3; i++) {
    for (let j = i + 1; j <= 3; j++) {
      for (let k = 1; k <= 3; k++) {
        for (let l = k + 1; l <= 3; l++) {
          let v = 0;
          for (let m = 1; m <= 3; m++) for (let n = 1; n <= 3; n++) v -= eps(i, j, m) * eps(k, l, n) * E(m, n);
          put(t, i, j, k, l, v);
        }
      }
    }
  }
  const ric = [ricciScale, -ricciScale, ricciScale, ricciScale];
  const g = (a: number, b: number) => (a === b ? ETA[a]! : 0);
  const R = (a: number, b: number) => (a === b ? ric[a]! : 0);
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      for (let c = 0; c < 4; c++) {
        for (let d = 0; d < 4; d++) {
          const k = idx(a, b, c, d);
          t[k] = t[k]! + 0.5 * (g(a, c) * R(b, d) - g(a, d) * R(b, c) - g(b, c) * R(a, d) + g(b, d) * R(a, c));
        }
      }
    }
  }
  return t;
}

/** The Riemann tensor in the principal frame at Boyer–Lindquist (r, θ) of spacetime (a, Q). */
export function riemannAt(a: number, q: number, r: number, theta: number): Tensor4 {
  const cs = Math.cos(theta);
  const y = a * cs;
  const sigma = r * r + y * y;
  return principalRiemann(weylPsi2(a, q, r, cs), (q * q) / (sigma * sigma));
}

/** R(x, u, y, u) for frame vectors given by their components in the same orthonormal frame. */
export function contract(t: Tensor4, x: readonly number[], u: readonly number[], y: readonly number[]): number {
  let s = 0;
  for (let a = 0; a < 4; a++) {
    const xa = x[a]!;
    if (xa === 0) continue;
    for (let b = 0; b < 4; b++) {
      const ub = u[b]!;
      if (ub === 0) continue;
      for (let c = 0; c < 4; c++) {
        const yc = y[c]!;
        if (yc === 0) continue;
        for (let d = 0; d < 4; d++) {
          const ud = u[d]!;
          if (ud !== 0) s += t[idx(a, b, c, d)]! * xa * ub * yc * ud;
        }
      }
    }
  }
  return s;
}

/** R_abcd R^abcd by direct contraction in the orthonormal frame (a check of the closed form). */
export function fullContraction(t: Tensor4): number {
  let s = 0;
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      for (let c = 0; c < 4; c++) {
        for (let d = 0; d < 4; d++) {
          const v = t[idx(a, b, c, d)]!;
          s += v * v * ETA[a]! * ETA[b]! * ETA[c]! * ETA[d]!;
        }
      }
    }
  }
  return s;
}

/** Ricci tensor R_bd = η^ac R_abcd from the frame Riemann tensor (a check of the construction). */
export function ricciOf(t: Tensor4): number[][] {
  const out = [0, 1, 2, 3].map(() => [0, 0, 0, 0]);
  for (let b = 0; b < 4; b++) {
    for (let d = 0; d < 4; d++) {
      let s = 0;
      for (let a = 0; a < 4; a++) s += ETA[a]! * t[idx(a, b, a, d)]!;
      out[b]![d] = s;
    }
  }
  return out;
}

export { idx as riemannIndex };
