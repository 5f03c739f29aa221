/**
 * Elliptic integrals in Carlson's symmetric forms, and the Legendre forms built from them.
 *
 * R_F(x, y, z) = ½ ∫₀^∞ dt / √((t + x)(t + y)(t + z)),
 * R_J(x, y, z, p) = (3/2) ∫₀^∞ dt / ((t + p) √((t + x)(t + y)(t + z))),
 * R_D(x, y, z) = R_J(x, y, z, z),  R_C(x, y) = R_F(x, y, y)
 * (Carlson 1995, "Numerical computation of real or complex elliptic integrals", Numer. Algorithms 10,
 * 13–26, §2; DLMF §19.16).
 *
 * Method: Carlson's duplication theorem (1995, §2, Algorithms 1–4). Each step replaces every argument
 * v by (v + λ)/4 with λ = √x√y + √x√z + √y√z, which leaves the integral unchanged (up to an explicit
 * sum for R_D and R_J) and draws the arguments together by a factor 4 per step; once they agree to
 * the tolerance the integral is evaluated from the fifth-order Taylor expansion about their mean. The
 * stopping rule 4^{−m} Q < |A_m| with Q = (3r)^{−1/6} max|A₀ − v| (R_F), (r/4)^{−1/6} max|A₀ − v|
 * (R_D, R_J) and (3r)^{−1/8}|A₀ − x| (R_C) bounds the relative truncation error by r (Carlson 1995,
 * Algorithms 1–4 and the error bounds stated with them); here r = 2⁻⁵³, so the results carry
 * rounding error only (a few ulp; the tests hold them to 1e−14 against mpmath). Cost: about
 * log₄(spread of the arguments / r^{1/6}) steps, e.g. 10 for arguments within a factor 100 of each
 * other and ≈ 30 when one argument is 1e−16 of the others (the logarithmic limit R_F(x, y, 0⁺)).
 *
 * Domains (real arguments only): x, y, z ≥ 0 with at most one of them 0, p > 0; R_C also accepts
 * y < 0 (Cauchy principal value). Outside the domain the result is NaN;
 * where the integral diverges (two arguments 0) it is +∞. No allocation.
 */

const R = 2 ** -53;
const RF_Q = (3 * R) ** (-1 / 6);
const RD_Q = (R / 4) ** (-1 / 6);
const RC_Q = (3 * R) ** (-1 / 8);

function nonNegativeFinite(v: number): boolean {
  return v >= 0 && v < Number.POSITIVE_INFINITY;
}

/**
 * Carlson's R_F(x, y, z), symmetric in its arguments (Carlson 1995 Algorithm 1). Domain x, y, z ≥ 0,
 * finite, at most one zero (two zeros: +∞); NaN otherwise. Homogeneous of degree −½.
 */
export function carlsonRF(x: number, y: number, z: number): number {
  if (!(nonNegativeFinite(x) && nonNegativeFinite(y) && nonNegativeFinite(z))) return Number.NaN;
  if ((x === 0 ? 1 : 0) + (y === 0 ? 1 : 0) + (z === 0 ? 1 : 0) >= 2) return Number.POSITIVE_INFINITY;
  const a0 = (x + y + z) / 3;
  const q = RF_Q * Math.max(Math.abs(a0 - x), Math.abs(a0 - y), Math.abs(a0 - z));
  let xm = x;
  let ym = y;
  let zm = z;
  let am = a0;
  let f = 1; // 4^{−m}
  while (f * q >= Math.abs(am)) {
    const sx = Math.sqrt(xm);
    const sy = Math.sqrt(ym);
    const sz = Math.sqrt(zm);
    const lam = sx * sy + sx * sz + sy * sz;
    am = (am + lam) / 4;
    xm = (xm + lam) / 4;
    ym = (ym + lam) / 4;
    zm = (zm + lam) / 4;
    f /= 4;
  }
  const X = ((a0 - x) * f) / am;
  const Y = ((a0 - y) * f) / am;
  const Z = -(X + Y);
  const e2 = X * Y - Z * Z;
  const e3 = X * Y * Z;
  return (1 - e2 / 10 + e3 / 14 + (e2 * e2) / 24 - (3 * e2 * e3) / 44) / Math.sqrt(am);
}

/**
 * Carlson's R_C(x, y) = R_F(x, y, y) (Carlson 1995 Algorithm 2): x ≥ 0, y ≠ 0; for y < 0 the Cauchy
 * principal value √(x/(x − y)) R_C(x − y, −y) (DLMF 19.2.20 — number from memory). Elementary: arccos(√(x/y))/√(y − x)
 * for x < y, arccosh(√(x/y))/√(x − y) for x > y > 0; the duplication avoids their cancellation at x ≈ y.
 */
export function carlsonRC(x: number, y: number): number {
  if (!(nonNegativeFinite(x) && Number.isFinite(y)) || y === 0) return Number.NaN;
  if (y < 0) return Math.sqrt(x / (x - y)) * carlsonRC(x - y, -y);
  const a0 = (x + 2 * y) / 3;
  const q = RC_Q * Math.abs(a0 - x);
  let xm = x;
  let ym = y;
  let am = a0;
  let f = 1;
  while (f * q >= Math.abs(am)) {
    const lam = 2 * Math.sqrt(xm) * Math.sqrt(ym) + ym;
    am = (am + lam) / 4;
    xm = (xm + lam) / 4;
    ym = (ym + lam) / 4;
    f /= 4;
  }
  const s = ((y - a0) * f) / am;
  const poly = 1 + s * s * (3 / 10 + s * (1 / 7 + s * (3 / 8 + s * (9 / 22 + s * (159 / 208 + s * (9 / 8))))));
  return poly / Math.sqrt(am);
}

/**
 * R_C(1, 1 + e) = arctan(√e)/√e (e > 0), artanh(√−e)/√−e (−1 < e < 0), 1 at e = 0. Near e = −1
 * (p much smaller than x, y, z) artanh is ill-conditioned in its argument; there it is evaluated as
 * [ln(1 + t) − ½ ln(1 + e)]/t, t = √−e, with 1 + e given separately without cancellation.
 */
function rcOneOnePlus(e: number, onePlusE: number): number {
  if (e === 0) return 1;
  if (e > 0) {
    const t = Math.sqrt(e);
    return Math.atan(t) / t;
  }
  const t = Math.sqrt(-e);
  if (t < 0.5) return Math.atanh(t) / t;
  return (Math.log1p(t) - 0.5 * Math.log(onePlusE)) / t;
}

/**
 * Carlson's R_D(x, y, z) = R_J(x, y, z, z), symmetric in x and y (Carlson 1995 Algorithm 4). Domain
 * x, y ≥ 0 (not both 0), z > 0, finite; NaN otherwise (+∞ when x = y = 0). Homogeneous of degree −3/2.
 */
export function carlsonRD(x: number, y: number, z: number): number {
  if (!(nonNegativeFinite(x) && nonNegativeFinite(y) && nonNegativeFinite(z)) || z === 0) return Number.NaN;
  if (x === 0 && y === 0) return Number.POSITIVE_INFINITY;
  const a0 = (x + y + 3 * z) / 5;
  const q = RD_Q * Math.max(Math.abs(a0 - x), Math.abs(a0 - y), Math.abs(a0 - z));
  let xm = x;
  let ym = y;
  let zm = z;
  let am = a0;
  let f = 1;
  let sum = 0;
  while (f * q >= Math.abs(am)) {
    const sx = Math.sqrt(xm);
    const sy = Math.sqrt(ym);
    const sz = Math.sqrt(zm);
    const lam = sx * sy + sx * sz + sy * sz;
    sum += f / (sz * (zm + lam));
    am = (am + lam) / 4;
    xm = (xm + lam) / 4;
    ym = (ym + lam) / 4;
    zm = (zm + lam) / 4;
    f /= 4;
  }
  const X = ((a0 - x) * f) / am;
  const Y = ((a0 - y) * f) / am;
  const Z = -(X + Y) / 3;
  const xy = X * Y;
  const z2 = Z * Z;
  const e2 = xy - 6 * z2;
  const e3 = (3 * xy - 8 * z2) * Z;
  const e4 = 3 * (xy - z2) * z2;
  const e5 = xy * z2 * Z;
  const poly = 1 - (3 * e2) / 14 + e3 / 6 + (9 * e2 * e2) / 88 - (3 * e4) / 22 - (9 * e2 * e3) / 52 + (3 * e5) / 26;
  return (f * poly) / (am * Math.sqrt(am)) + 3 * sum;
}

/**
 * Carlson's R_J(x, y, z, p), symmetric in x, y, z (Carlson 1995 Algorithm 3, with the R_C terms of
 * the sum in the form R_C(1, 1 + e_m), e_m = 4^{−3m} δ / d_m², δ = (p − x)(p − y)(p − z),
 * d_m = (√p + √x)(√p + √y)(√p + √z) at step m; 1 + e_m = 2√p_m (p_m + λ_m)/d_m keeps the term
 * accurate when p ≪ x, y, z). Domain x, y, z ≥ 0 (at most one 0), p > 0, finite;
 * NaN otherwise (the principal value for p < 0 is not provided). Homogeneous of degree −3/2.
 */
export function carlsonRJ(x: number, y: number, z: number, p: number): number {
  if (!(nonNegativeFinite(x) && nonNegativeFinite(y) && nonNegativeFinite(z) && nonNegativeFinite(p)) || p === 0) {
    return Number.NaN;
  }
  if ((x === 0 ? 1 : 0) + (y === 0 ? 1 : 0) + (z === 0 ? 1 : 0) >= 2) return Number.POSITIVE_INFINITY;
  const a0 = (x + y + z + 2 * p) / 5;
  const delta = (p - x) * (p - y) * (p - z);
  const q = RD_Q * Math.max(Math.abs(a0 - x), Math.abs(a0 - y), Math.abs(a0 - z), Math.abs(a0 - p));
  let xm = x;
  let ym = y;
  let zm = z;
  let pm = p;
  let am = a0;
  let f = 1;
  let sum = 0;
  while (f * q >= Math.abs(am)) {
    const sx = Math.sqrt(xm);
    const sy = Math.sqrt(ym);
    const sz = Math.sqrt(zm);
    const sp = Math.sqrt(pm);
    const lam = sx * sy + sx * sz + sy * sz;
    const d = (sp + sx) * (sp + sy) * (sp + sz);
    // e = δ 4^{−3m}/d² = (√p − √x)(√p − √y)(√p − √z)/d at this step (each difference shrinks by 4 per
    // step), hence 1 + e = 2√p (p + λ)/d exactly: the odd terms cancel in d + (√p − √x)(√p − √y)(√p − √z).
    const e = (delta * f * f * f) / (d * d);
    sum += (f * rcOneOnePlus(e, (2 * sp * (pm + lam)) / d)) / d;
    am = (am + lam) / 4;
    xm = (xm + lam) / 4;
    ym = (ym + lam) / 4;
    zm = (zm + lam) / 4;
    pm = (pm + lam) / 4;
    f /= 4;
  }
  const X = ((a0 - x) * f) / am;
  const Y = ((a0 - y) * f) / am;
  const Z = ((a0 - z) * f) / am;
  const P = -(X + Y + Z) / 2;
  const p2 = P * P;
  const xyz = X * Y * Z;
  const e2 = X * Y + X * Z + Y * Z - 3 * p2;
  const e3 = xyz + 2 * e2 * P + 4 * p2 * P;
  const e4 = (2 * xyz + e2 * P + 3 * p2 * P) * P;
  const e5 = xyz * p2;
  const poly = 1 - (3 * e2) / 14 + e3 / 6 + (9 * e2 * e2) / 88 - (3 * e4) / 22 - (9 * e2 * e3) / 52 + (3 * e5) / 26;
  return (f * poly) / (am * Math.sqrt(am)) + 6 * sum;
}

/**
 * Complete elliptic integral of the first kind K(m) = ∫₀^{π/2} dθ/√(1 − m sin²θ) = R_F(0, 1 − m, 1)
 * (DLMF 19.25.1), parameter m = k² < 1 (any negative m); +∞ at m = 1; NaN for m > 1.
 */
export function ellipticK(m: number): number {
  if (!(m <= 1)) return Number.NaN;
  return carlsonRF(0, 1 - m, 1);
}

/**
 * Complete elliptic integral of the second kind E(m) = ∫₀^{π/2} √(1 − m sin²θ) dθ
 * = R_F(0, 1 − m, 1) − (m/3) R_D(0, 1 − m, 1) (DLMF 19.25.1), m ≤ 1 (E(1) = 1); NaN for m > 1.
 */
export function ellipticE(m: number): number {
  if (!(m <= 1)) return Number.NaN;
  if (m === 1) return 1;
  return carlsonRF(0, 1 - m, 1) - (m / 3) * carlsonRD(0, 1 - m, 1);
}

/**
 * Reduces φ to φ' ∈ [−π/2, π/2] with φ = jπ + φ'; the Legendre integrals are quasi-periodic:
 * F(jπ + φ', m) = 2jK(m) + F(φ', m) (DLMF 19.2.10 — number from memory), and likewise for E.
 */
function reduce(phi: number): { j: number; rest: number } {
  const j = Math.round(phi / Math.PI);
  return { j, rest: phi - j * Math.PI };
}

/**
 * Incomplete elliptic integral of the first kind F(φ, m) = ∫₀^φ dθ/√(1 − m sin²θ)
 * = sinφ R_F(cos²φ, 1 − m sin²φ, 1) for |φ| ≤ π/2 (DLMF 19.25.5), extended by quasi-periodicity.
 * Parameter m = k² (mpmath's ellipf(φ, m) convention). Domain: m sin²φ ≤ 1 (m ≤ 1 when |φ| passes π/2);
 * NaN outside it or for non-finite input.
 */
export function ellipticF(phi: number, m: number): number {
  if (!(Number.isFinite(phi) && Number.isFinite(m))) return Number.NaN;
  const { j, rest } = reduce(phi);
  if (j !== 0 && !(m < 1)) return Number.NaN;
  const sn = Math.sin(rest);
  const cn = Math.cos(rest);
  const d = 1 - m * sn * sn;
  if (d < 0) return Number.NaN;
  const part = rest === 0 ? 0 : sn * carlsonRF(cn * cn, d, 1);
  return j === 0 ? part : 2 * j * ellipticK(m) + part;
}

/**
 * Incomplete elliptic integral of the second kind E(φ, m) = ∫₀^φ √(1 − m sin²θ) dθ
 * = sinφ R_F(c², Δ², 1) − (m/3) sin³φ R_D(c², Δ², 1), c = cosφ, Δ² = 1 − m sin²φ, |φ| ≤ π/2
 * (DLMF 19.25.9 — number from memory), extended by quasi-periodicity. Domain as for {@link ellipticF}.
 */
export function ellipticEIncomplete(phi: number, m: number): number {
  if (!(Number.isFinite(phi) && Number.isFinite(m))) return Number.NaN;
  const { j, rest } = reduce(phi);
  if (j !== 0 && !(m <= 1)) return Number.NaN;
  const sn = Math.sin(rest);
  const cn = Math.cos(rest);
  const d = 1 - m * sn * sn;
  if (d < 0) return Number.NaN;
  let part = 0;
  if (rest !== 0) {
    const c2 = cn * cn;
    part = sn * carlsonRF(c2, d, 1);
    if (m !== 0) part -= (m / 3) * sn * sn * sn * carlsonRD(c2, d, 1);
  }
  return j === 0 ? part : 2 * j * ellipticE(m) + part;
}
