/**
 * Spherical photon orbits and the photon region of a Kerr–Newman black hole, in geometric units
 * G = c = M = 1: the constants of motion ξ = L/E and η = Q_Carter/E² of each orbit with their
 * r-derivatives, the equatorial circular photon orbits that bound the region, the polar orbit (ξ = 0),
 * and the bracketed Newton root finder; ./shadow.ts builds the shadow from them.
 *
 * Spherical photon orbits (Bardeen 1973, in Black Holes, Les Houches, eds. DeWitt & DeWitt, Gordon and
 * Breach, pp. 215–239 — pages from memory;
 * with charge, 2Mr → 2r − Q²; derived by hand from R(r) = R′(r) = 0 for the radial potential
 * R = (r² + a² − aξ)² − Δ(η + (ξ − a)²) and verified with sympy in test/fixtures/python/light.py):
 *   ξ = L/E = −[r X + a²(r + 1)]/(a(r − 1)),  η = Q_Carter/E² = r²[4a²(r − Q²) − X²]/(a²(r − 1)²),
 *   X = r² − 3r + 2Q².
 * They exist for r between the equatorial prograde and retrograde circular photon orbits, the roots of
 * X = ∓2a√(r − Q²) (where η = 0).
 *
 * Numerics. Every r is written r = r_RN + δ with r_RN = (3 + c)/2, c = √(9 − 8Q²), the photon sphere of
 * the non-spinning hole of the same charge, so that X = δ(δ + c) is exact even when the photon region
 * is only O(a) wide (a → 0, where ξ and η are ratios of O(a) quantities). Near extreme spin the region
 * reaches r = 1, where both forms are 0/0; there the equivalent forms (ε = 1 − a² − Q², s = r − 1)
 *   ξ = [2ε/s − (s² + a² + 2Q² − 3)]/a,  η = (r²/a²)[3 − 4Q² + 2s − s² − 4ε(s + 1 − Q²)/s²]
 * are used instead (exact at ε = 0, where the extreme hole's shadow has a straight vertical edge).
 * The polar orbit (ξ = 0) comes from Newton's method inside a bracket (bracketedRoot, also used by
 * ./shadow.ts for the ends of the visible range).
 */
import { equatorialPhotonOrbit } from './deflection.js';
import type { KerrNewman } from './spacetime.js';

/** Constants of one hole and inclination. */
export interface Hole {
  a: number;
  a2: number;
  q2: number;
  /** ε = 1 − a² − Q² ≥ 0. */
  eps: number;
  rRN: number;
  c: number;
  /** Use the near-extreme forms where r − 1 < 0.25 (the photon region reaches there). */
  nearExtreme: boolean;
  /**
   * Orbits are addressed by z = δ − base. Once the polar orbit δ_p (ξ = 0) is known, base = δ_p and
   * `factored` is set, so that z = δ − δ_p is exact however small (see orbitConstants); n(δ_p) is the
   * root's residual.
   */
  base: number;
  factored: boolean;
  polarResidual: number;
  sinI: number;
  cos2: number;
  sin2: number;
  cot2: number;
}

/** Scratch output of {@link orbitConstants} for visibility and sphericalPhotonOrbit: ξ, η, dξ/dr, dη/dr. */
const OUT = new Float64Array(4);

/**
 * ξ, η and their r-derivatives at δ = base + z (r = r_RN + δ), into out[0..3] (module comment for the
 * two forms).
 */
export function orbitConstants(h: Hole, z: number, out: Float64Array): void {
  const delta = h.base + z;
  const r = h.rRN + delta;
  const s = h.rRN - 1 + h.base + z;
  if (h.nearExtreme && s < 0.25) {
    const e = h.eps;
    // At ε = 0 the ε terms vanish identically (also at r = 1 itself, where they would be 0/0).
    const e1 = e === 0 ? 0 : (2 * e) / s;
    const e2 = e === 0 ? 0 : e1 / s;
    out[0] = (e1 - (s * s + h.a2 + 2 * h.q2 - 3)) / h.a;
    out[2] = (-2 * s - e2) / h.a;
    const w = 3 - 4 * h.q2 + 2 * s - s * s - 2 * e2 * (s + 1 - h.q2);
    const wp = 2 - 2 * s + (2 * e2 * (s + 2 * (1 - h.q2))) / s;
    out[1] = (r * r * w) / h.a2;
    out[3] = (2 * r * w + r * r * wp) / h.a2;
    return;
  }
  const x = delta * (delta + h.c);
  const xp = 2 * delta + h.c;
  // n = r X + a²(r + 1) = δ³ + (r_RN + c)δ² + (r_RN c + a²)δ + a²(r_RN + 1) vanishes at the polar orbit,
  // where its terms cancel; written as (δ − δ_p) ñ(δ) + n(δ_p) with ñ the divided difference and
  // δ − δ_p = z exact, it keeps full relative precision there (at small inclinations the visible orbits
  // all lie within O(sin i) of the polar one, and ξ ∝ sin i must be exact to that order).
  let n: number;
  if (h.factored) {
    const dp = h.base;
    const nTilde = delta * delta + delta * dp + dp * dp + (h.rRN + h.c) * (delta + dp) + h.rRN * h.c + h.a2;
    n = z * nTilde + h.polarResidual;
  } else {
    n = r * x + h.a2 * (r + 1);
  }
  const np = x + r * xp + h.a2;
  out[0] = -n / (h.a * s);
  out[2] = -(np * s - n) / (h.a * s * s);
  const y = 4 * h.a2 * (r - h.q2) - x * x;
  const yp = 4 * h.a2 - 2 * x * xp;
  out[1] = (r * r * y) / (h.a2 * s * s);
  out[3] = ((2 * r * y + r * r * yp) * s - 2 * r * r * y) / (h.a2 * s * s * s);
}

/** sin²i · β² = sin²i (η + a² cos²i) − ξ² cos²i at z, and its derivative (after orbitConstants). */
export function visibility(h: Hole, z: number): { s: number; ds: number } {
  orbitConstants(h, z, OUT);
  const xi = OUT[0] as number;
  const eta = OUT[1] as number;
  return {
    s: h.sin2 * (eta + h.a2 * h.cos2) - xi * xi * h.cos2,
    ds: h.sin2 * (OUT[3] as number) - 2 * xi * (OUT[2] as number) * h.cos2,
  };
}

/**
 * A root of f in [lo, hi] (f(lo) and f(hi) of opposite signs or zero) by Newton's method from
 * `start`, falling back to bisection whenever a step leaves the bracket; to a few ulp of the root
 * (at most 200 steps: enough for bisection to reach any double).
 */
export function bracketedRoot(f: (x: number) => { s: number; ds: number }, lo: number, hi: number, start: number): number {
  const flo = f(lo).s;
  if (flo === 0) return lo;
  const rising = flo < 0;
  let x = Math.min(Math.max(start, lo), hi);
  for (let i = 0; i < 200; i++) {
    const { s, ds } = f(x);
    if (s === 0) return x;
    if (s < 0 === rising) lo = x;
    else hi = x;
    let next = x - s / ds;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    // Relative tests only: roots as offsets (z, δ) can be far below 1 and still need full precision
    // (at small spin and inclination the visible range is ~1e−14 wide).
    if (Math.abs(next - x) <= 2 * Number.EPSILON * Math.abs(x) || hi - lo <= 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi))) {
      return next;
    }
    x = next;
  }
  return x;
}

/**
 * Equatorial circular photon orbits as offsets δ from r_RN: the outermost roots of
 * δ(δ + c) ± 2a√(r − Q²) = 0 (upper sign prograde), taken from ./deflection.ts and refined here by
 * Newton's method in δ, which restores full relative precision of δ when the region is O(a) wide.
 * The double root of an extreme hole on its horizon (r = 1) is kept exactly.
 */
export function photonRegion(s: KerrNewman, h: Hole): { pro: number; retro: number } {
  const pro = equatorialPhotonOrbit(s, 'prograde');
  const retro = equatorialPhotonOrbit(s, 'retrograde');
  return {
    pro: pro ? refineOrbit(h, 1, pro.radius) : Number.NaN,
    retro: retro ? refineOrbit(h, -1, retro.radius) : Number.NaN,
  };
}

function refineOrbit(h: Hole, sgn: 1 | -1, radius: number): number {
  let d = radius - h.rRN;
  if (radius === 1) return d;
  for (let i = 0; i < 8; i++) {
    const root = Math.sqrt(h.rRN + d - h.q2);
    const step = (d * (d + h.c) + 2 * sgn * h.a * root) / (2 * d + h.c + (sgn * h.a) / root);
    if (!Number.isFinite(step)) break;
    d -= step;
    if (Math.abs(step) <= 2 * Number.EPSILON * Math.abs(d)) break;
  }
  return d;
}

/**
 * Offset δ of the polar orbit (ξ = 0), between the equatorial orbits. In s = r − 1 the numerator of ξ
 * is n = s³ + p s − 2ε, p = a² + 2Q² − 3 < 0 (n = r X + a²(r + 1) rearranged; ε = 1 − a² − Q²), whose
 * largest root s_p = 2√(−p/3) cos(⅓ arccos((−3ε/p)√(−3/p))) (the trigonometric solution of the cubic)
 * is the polar orbit; 1 + √(3 − a² − 2Q²) for an extreme hole. Near extreme spin another root lies
 * next to r = 1 (exactly at it when ε = 0), so the bracket starts at s_p/2, where n < 0. The start is
 * refined by Newton's method on n in δ, whose terms scale with a² and so give δ_p to full relative
 * precision even when the photon region is O(a) wide.
 */
export function polarOrbit(h: Hole, pro: number, retro: number): number {
  const p = h.a2 + 2 * h.q2 - 3;
  const arg = Math.min(1, ((-3 * h.eps) / p) * Math.sqrt(-3 / p));
  const sp = 2 * Math.sqrt(-p / 3) * Math.cos(Math.acos(arg) / 3);
  const start = 1 + sp - h.rRN;
  if (h.eps === 0) return start;
  const f = (d: number) => {
    const r = h.rRN + d;
    const x = d * (d + h.c);
    return { s: r * x + h.a2 * (r + 1), ds: x + r * (2 * d + h.c) + h.a2 };
  };
  const lo = Math.max(pro, 1 + sp / 2 - h.rRN);
  return bracketedRoot(f, lo, retro, start);
}

/**
 * ξ = L/E and η = Q/E² of the spherical photon orbit of radius r (module comment): defined for a > 0
 * and r in the photon region of a black hole (NaN at r = 1 unless the hole is extreme). Exposed for
 * tests and plots; the shadow uses the same code.
 */
export function sphericalPhotonOrbit(s: KerrNewman, r: number): { xi: number; eta: number } {
  const h = hole(s, Math.PI / 2);
  if (!h || !(s.a > 0)) return { xi: Number.NaN, eta: Number.NaN };
  h.nearExtreme = true; // the near-extreme forms wherever r − 1 < 0.25
  orbitConstants(h, r - h.rRN, OUT);
  return { xi: OUT[0] as number, eta: OUT[1] as number };
}

/** Constants of the hole s at the given inclination (base 0, not yet factored); null for a naked singularity. */
export function hole(s: KerrNewman, inclination: number): Hole | null {
  const a2 = s.a * s.a;
  const q2 = s.q * s.q;
  const eps = 1 - (a2 + q2); // as the core forms it (spacetime.ts horizons), so extreme holes agree
  if (!(eps >= 0)) return null;
  const c = Math.sqrt(9 - 8 * q2);
  const sinI = Math.sin(inclination);
  const cosI = Math.cos(inclination);
  const h: Hole = {
    a: s.a,
    a2,
    q2,
    eps,
    rRN: (3 + c) / 2,
    c,
    nearExtreme: false,
    base: 0,
    factored: false,
    polarResidual: 0,
    sinI,
    cos2: cosI * cosI,
    sin2: sinI * sinI,
    cot2: (cosI * cosI) / (sinI * sinI),
  };
  return h;
}
