/**
 * Characteristic radii of circular equatorial orbits by root finding, for any black hole: the residuals
 * D (photon orbit), I (ISCO) and B (marginally bound orbit) of orbits.ts, as polynomials in
 * σ = √(r − Q²) evaluated in double-double arithmetic, and a scan plus Brent's method for the outermost
 * zero of each. Geometric units G = c = M = 1; Boyer–Lindquist r, equator.
 */
import type { OrbitDirection } from './observers.js';
import { horizons, type KerrNewman } from './spacetime.js';

/**
 * The residuals D (photon orbit), I (ISCO) and B (marginally bound) as polynomials in σ = √(r − Q²)
 * (expand r = σ² + Q² in the forms of the module comment of orbits.ts):
 *   D = σ⁴ + (2Q² − 3)σ² + 2saσ + Q⁴ − Q²,
 *   I = σ⁶ + (3Q² − 6)σ⁴ + 8saσ³ + (3Q⁴ − 3Q² − 3a²)σ² + Q⁶ − Q⁴ + a²Q²,
 *   B = σ⁶ + (3Q² − 4)σ⁴ + 4saσ³ + (3Q⁴ − 4Q² − a²)σ² + 2saQ²σ + Q⁶ − Q⁴.
 * As a → 1 prograde the three orbits merge at r = 1 and I has a near-triple zero (at a = 1 Kerr,
 * I = σ²(σ − 1)³(σ + 3)), so an ordinary double-precision evaluation, whose rounding noise is
 * ~1e−16 of the terms, would move the root by up to (noise / slope) — 1e−12 at a = 1 − 1e−5 and
 * worse closer to 1. The coefficients are therefore formed and the polynomials evaluated by Horner's
 * rule in double-double arithmetic (Dekker 1971, "A floating-point technique for extending the
 * available precision", Numer. Math. 18, 224: split two-product; Knuth, The Art of Computer
 * Programming vol. 2, §4.2.2: two-sum), which makes the computed residual good to ~1e−32 of its terms
 * and the root good to a few ulp for every black hole (tested against the closed forms up to
 * a = 1 − 2⁻⁵²). Coefficients live in module-level arrays (hi, lo
 * pairs, highest power first), filled once per solve: the evaluation allocates nothing.
 */
const PHOTON_COEFFS = new Float64Array(10);
const ISCO_COEFFS = new Float64Array(14);
const BOUND_COEFFS = new Float64Array(14);

/** Dekker's splitting constant 2^27 + 1. */
const SPLITTER = 134217729;
/** Scratch results of the double-double helpers (hi, lo): no allocation. */
let ddHi = 0;
let ddLo = 0;

/** (ah + al)(bh + bl) → (ddHi, ddLo), to ~2^−104 relative (Dekker 1971, mul2). */
function ddMul(ah: number, al: number, bh: number, bl: number): void {
  const p = ah * bh;
  let t = SPLITTER * ah;
  const ahh = t - (t - ah);
  const ahl = ah - ahh;
  t = SPLITTER * bh;
  const bhh = t - (t - bh);
  const bhl = bh - bhh;
  const e = ahh * bhh - p + ahh * bhl + ahl * bhh + ahl * bhl;
  const lo = e + (ah * bl + al * bh);
  ddHi = p + lo;
  ddLo = lo - (ddHi - p);
}

/** (ah + al) + (bh + bl) → (ddHi, ddLo) (Knuth's two-sum on the high parts). */
function ddAdd(ah: number, al: number, bh: number, bl: number): void {
  const s = ah + bh;
  const v = s - ah;
  const e = ah - (s - v) + (bh - v) + al + bl;
  ddHi = s + e;
  ddLo = e - (ddHi - s);
}

/** Stores (ddHi, ddLo) times the small integer `scale` (in double-double) at slot k. */
function store(c: Float64Array, k: number, scale: number): void {
  ddMul(ddHi, ddLo, scale, 0);
  c[2 * k] = ddHi;
  c[2 * k + 1] = ddLo;
}

/** Fills the three coefficient arrays for (sa, a, q). */
function setCoefficients(sa: number, a: number, q: number): void {
  ddMul(q, 0, q, 0);
  const q2h = ddHi;
  const q2l = ddLo;
  ddMul(a, 0, a, 0);
  const a2h = ddHi;
  const a2l = ddLo;
  ddMul(q2h, q2l, q2h, q2l);
  const q4h = ddHi;
  const q4l = ddLo;
  ddMul(q4h, q4l, q2h, q2l);
  const q6h = ddHi;
  const q6l = ddLo;
  ddMul(a2h, a2l, q2h, q2l);
  const a2q2h = ddHi;
  const a2q2l = ddLo;

  // D: σ⁴ + (2Q² − 3)σ² + 2saσ + (Q⁴ − Q²)
  const d = PHOTON_COEFFS;
  d.fill(0);
  d[0] = 1;
  ddAdd(2 * q2h, 2 * q2l, -3, 0);
  store(d, 2, 1);
  d[6] = 2 * sa;
  ddAdd(q4h, q4l, -q2h, -q2l);
  store(d, 4, 1);

  // I: σ⁶ + (3Q² − 6)σ⁴ + 8saσ³ + (3Q⁴ − 3Q² − 3a²)σ² + (Q⁶ − Q⁴ + a²Q²)
  const i = ISCO_COEFFS;
  i.fill(0);
  i[0] = 1;
  ddAdd(q2h, q2l, -2, 0);
  store(i, 2, 3);
  i[6] = 8 * sa;
  ddAdd(q4h, q4l, -q2h, -q2l);
  ddAdd(ddHi, ddLo, -a2h, -a2l);
  store(i, 4, 3);
  ddAdd(q6h, q6l, -q4h, -q4l);
  ddAdd(ddHi, ddLo, a2q2h, a2q2l);
  store(i, 6, 1);

  // B: σ⁶ + (3Q² − 4)σ⁴ + 4saσ³ + (3Q⁴ − 4Q² − a²)σ² + 2saQ²σ + (Q⁶ − Q⁴)
  const b = BOUND_COEFFS;
  b.fill(0);
  b[0] = 1;
  ddMul(q2h, q2l, 3, 0);
  ddAdd(ddHi, ddLo, -4, 0);
  store(b, 2, 1);
  b[6] = 4 * sa;
  ddMul(q4h, q4l, 3, 0);
  ddAdd(ddHi, ddLo, -4 * q2h, -4 * q2l);
  ddAdd(ddHi, ddLo, -a2h, -a2l);
  store(b, 4, 1);
  ddMul(q2h, q2l, 2 * sa, 0);
  store(b, 5, 1);
  ddAdd(q6h, q6l, -q4h, -q4l);
  store(b, 6, 1);
}

/** Σ c_k σ^k by Horner's rule in double-double (σ a double); returns the value rounded to a double. */
function polyValue(c: Float64Array, sigma: number): number {
  let h = c[0] as number;
  let l = c[1] as number;
  for (let k = 2; k < c.length; k += 2) {
    ddMul(h, l, sigma, 0);
    ddAdd(ddHi, ddLo, c[k] as number, c[k + 1] as number);
    h = ddHi;
    l = ddLo;
  }
  return h + l;
}

/** Upper ends of the σ search intervals: r_ph ≤ 4, r_isco ≤ 9 for every black hole (a² + Q² ≤ 1). */
const PHOTON_SIGMA_MAX = 2.5;
const ISCO_SIGMA_MAX = 3.5;
/** Cells of the downward scan that isolates the outermost sign change. */
export const SCAN_CELLS = 32;
/**
 * Brent iterations allowed per root. From a scan cell of width ≤ 0.11 in σ, bisection alone reaches
 * the 2ε|σ| stopping width in ≤ 53 halvings; Brent's method falls back to bisection whenever
 * interpolation fails to shrink the bracket fast enough, so 100 bounds it with room to spare (the tests
 * record the most seen). A solve therefore costs at most SCAN_CELLS + MAX_ROOT_ITERATIONS + 1
 * residual evaluations.
 */
export const MAX_ROOT_ITERATIONS = 100;
const EPS = Number.EPSILON;

/** Result of one bracketed solve: the root in σ, whether it touched the lower end, and the cost. */
interface Zero {
  sigma: number;
  touched: boolean;
  /** Residual evaluations used (scan plus Brent). */
  evaluations: number;
}

/** Brent iterations of the last call of brent(); read once by outermostZero. */
let brentIterations = 0;

/**
 * Brent's method (Brent 1973, Algorithms for Minimization without Derivatives, ch. 4; in the form of
 * the zeroin routine of Forsythe, Malcolm & Moler 1977, Computer Methods for Mathematical Computations,
 * §7.2): inverse quadratic interpolation and secant steps, safeguarded by bisection, on a bracket
 * [lo, hi] with f(lo), f(hi) of opposite signs. Stops when the bracket is within 2ε|σ| (a few ulp) or
 * f = 0, or after MAX_ROOT_ITERATIONS. No allocation.
 */
function brent(poly: Float64Array, lo: number, hi: number, flo: number, fhi: number): number {
  let a = lo;
  let b = hi;
  let fa = flo;
  let fb = fhi;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let it = 1; it <= MAX_ROOT_ITERATIONS; it++) {
    brentIterations = it;
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * EPS * Math.abs(b);
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) < tol || Math.abs(fa) <= Math.abs(fb)) {
      d = m;
      e = m;
    } else {
      let p: number;
      let q: number;
      const t = fb / fa;
      if (a === c) {
        p = 2 * m * t;
        q = 1 - t;
      } else {
        const u = fa / fc;
        const v = fb / fc;
        p = t * (2 * m * u * (u - v) - (b - a) * (v - 1));
        q = (u - 1) * (v - 1) * (t - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < 3 * m * q - Math.abs(tol * q) && p < Math.abs(0.5 * e * q)) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = polyValue(poly, b);
  }
  return b;
}

/**
 * The outermost zero of the polynomial c in [lo, hi], where the residual is positive at hi: a scan of
 * SCAN_CELLS equal cells downward from hi finds the first cell whose lower end is ≤ 0, and Brent's
 * method refines it. `flo` is the value at lo (passed in: at the horizon D = −(σ₊ − sa)² exactly).
 * If no cell changes sign the zero touches the lower end (a double root in the extremal limit):
 * returns lo with `touched` set.
 */
function outermostZero(c: Float64Array, lo: number, hi: number, flo: number): Zero {
  if (!(hi > lo)) return { sigma: lo, touched: true, evaluations: 0 };
  let xu = hi;
  let fu = polyValue(c, hi);
  for (let k = 1; k <= SCAN_CELLS; k++) {
    const x = k === SCAN_CELLS ? lo : hi - ((hi - lo) * k) / SCAN_CELLS;
    const f = k === SCAN_CELLS ? flo : polyValue(c, x);
    if (f === 0) return { sigma: x, touched: k === SCAN_CELLS, evaluations: k + 1 };
    if (f < 0) {
      const sigma = brent(c, x, xu, f, fu);
      return { sigma, touched: false, evaluations: k + 1 + brentIterations };
    }
    xu = x;
    fu = f;
  }
  return { sigma: lo, touched: true, evaluations: SCAN_CELLS + 1 };
}

/** The three characteristic orbits of one direction, with how each was found. */
export interface CharacteristicRadius {
  r: number;
  /** 'rootFinding', or 'lowerLimit' where a double zero sits at the lower end (extremal limits). */
  method: 'rootFinding' | 'lowerLimit';
  /** Residual evaluations spent (≤ SCAN_CELLS + MAX_ROOT_ITERATIONS + 1). */
  evaluations: number;
}

export interface CharacteristicRadii {
  photonOrbit: CharacteristicRadius;
  marginallyBoundOrbit: CharacteristicRadius;
  isco: CharacteristicRadius;
}

/**
 * Characteristic radii by root finding on σ = √(r − Q²), for any black hole (a² + Q² ≤ 1); null
 * otherwise. The photon orbit is the outermost zero of D above the outer horizon σ₊ (where
 * D = −(σ₊ − sa)² ≤ 0 exactly), the ISCO the outermost zero of I above the photon orbit, and the
 * marginally bound orbit the zero of B between them. Existence: for a black hole D ≤ 0 at the horizon
 * and D > 0 at σ = 2.5; E decreases from +∞ at the photon orbit to its minimum at the ISCO (I < 0
 * below it, I > 0 above, I > 0 at σ = 3.5) and rises to 1 at infinity, so E_isco < 1 and E = 1 is
 * crossed once between the two: all three orbits exist in both directions for every black hole,
 * charged or not, and each is unique (checked over a grid with mpmath polynomial roots in the
 * fixture script). Extremal degenerate cases (a double zero at the lower end, e.g. every orbit at
 * r = 1 for a = 1 prograde) return the lower end with method 'lowerLimit'.
 */
export function characteristicRadiiByRootFinding(s: KerrNewman, direction: OrbitDirection): CharacteristicRadii | null {
  const h = horizons(s);
  if (!h || !Number.isFinite(s.a) || !Number.isFinite(s.q)) return null;
  const sa = (direction === 'prograde' ? 1 : -1) * s.a;
  const q2 = s.q * s.q;
  setCoefficients(sa, s.a, s.q);
  const sigmaH = Math.sqrt(Math.max(0, h.outer - q2));
  const gap = sigmaH - sa;
  const ph = outermostZero(PHOTON_COEFFS, sigmaH, PHOTON_SIGMA_MAX, -gap * gap);
  const isco = outermostZero(ISCO_COEFFS, ph.sigma, ISCO_SIGMA_MAX, polyValue(ISCO_COEFFS, ph.sigma));
  const mb = outermostZero(BOUND_COEFFS, ph.sigma, isco.sigma, polyValue(BOUND_COEFFS, ph.sigma));
  const toR = (z: Zero, lower: number): CharacteristicRadius => ({
    r: z.touched ? lower : z.sigma * z.sigma + q2,
    method: z.touched ? 'lowerLimit' : 'rootFinding',
    evaluations: z.evaluations,
  });
  const photonOrbit = toR(ph, h.outer);
  return {
    photonOrbit,
    isco: toR(isco, photonOrbit.r),
    marginallyBoundOrbit: toR(mb, photonOrbit.r),
  };
}
