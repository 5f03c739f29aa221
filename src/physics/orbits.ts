/**
 * Circular equatorial geodesic orbits around one Kerr–Newman body: the characteristic radii (photon
 * orbit, marginally bound orbit, innermost stable circular orbit) and the full description of a
 * circular orbit at a given radius (frequencies, period, E, L, stability, epicyclic frequencies and
 * the precessions they imply).
 *
 * Geometric units G = c = M = 1: radii in GM/c², times in GM/c³, angular frequencies in c³/(GM),
 * E per unit rest-mass energy, L in units of M (per unit rest mass). Boyer–Lindquist r, equator θ = π/2.
 * The direction s = +1 (prograde, +φ, with the spin) or −1 (retrograde); only s·a and Q² enter.
 *
 * Closed forms for equatorial circular orbits in Kerr–Newman, with σ = √(r − Q²), μ = 2r − Q²,
 * Δ = r² − 2r + a² + Q², D = r² − 3r + 2Q² + 2saσ, d = r² + saσ (Bardeen, Press & Teukolsky 1972,
 * ApJ 178, 347, eqs. 2.12–2.16 for Q = 0, equation numbers from memory; the charged forms, e.g.
 * Dadhich & Kale 1977, J. Math. Phys. 18, 1727 — citation from memory — are verified with sympy in
 * test/fixtures/python/orbits.py, which checks that they solve U = ∂_r U = 0 for the geodesic
 * potential U built from the metric):
 *   Ω = sσ/d,   u^t = d/(r√D),   E = (r² − 2r + Q² + saσ)/(r√D),   L = s(σ(r² + a²) − saμ)/(r√D),
 *   1 − E = B/(r√D (r√D + n)),  n = r² − 2r + Q² + saσ = rE√D,  B = r²D − n² = r³ − 4r² + 4Q²r − Q⁴
 *   − a²σ² + 2saσμ,
 *   dE/dr = I/(2r²D^{3/2}),  dL/dr = (d/(sσ)) dE/dr,
 *   I = r³ − 6r² − 3a²r + 9Q²r − 4Q²(Q² − a²) + 8saσ³.
 * Hence the photon orbit is the outermost zero of D (E, L diverge; D = Δ − (σ − sa)², so D ≤ 0 on the
 * horizon), the marginally bound orbit the zero of B (E = 1), and the ISCO the zero of I (dE/dr = 0).
 * For Q = 0 these reduce to BPT's r² − 3r + 2sa√r = 0, E = 1 and r² − 6r + 8sa√r − 3a² = 0.
 *
 * Epicyclic frequencies (per unit t) from the second derivatives of the geodesic potential
 * U(r, θ) = g_rr(u^r)² + g_θθ(u^θ)² = −1 − g^tt E² + 2g^tφ EL − g^φφ L² at the circular orbit,
 *   κ_r² = −∂_r²U/(2 g_rr (u^t)²),  κ_θ² = −∂_θ²U/(2 g_θθ (u^t)²)
 * (the method of Okazaki, Kato & Fukue 1987, PASJ 39, 457; Kato, Fukue & Mineshige 2008, Black-Hole
 * Accretion Disks, ch. 3 — chapter from memory), which sympy reduces (in the fixture script) to
 *   κ_r² = Ω²(1 − X_r),  X_r = [(6 − Q²)r² − 9Q²r + 4Q⁴ + a²(3r − 4Q²) − 8saσ³]/(r²σ²)  = 1 − I/(r²σ²),
 *   κ_θ² = Ω²(1 − X_θ),  X_θ = [2saσμ − a²(3r − 2Q²)]/(r²σ²).
 * For Q = 0 these are the published Kerr forms κ_r² = Ω²(1 − 6/r + 8sa r^{−3/2} − 3a²/r²),
 * κ_θ² = Ω²(1 − 4sa r^{−3/2} + 3a²/r²) (Okazaki, Kato & Fukue 1987; equation numbers not quoted).
 * The precessions |Ω| − κ = |Ω| X/(1 + √(1 − X)) are formed from X directly, without cancellation, so
 * they keep full relative precision in weak fields (X ≈ 6/r).
 */
import type { OrbitDirection } from './observers.js';
import { horizons, type KerrNewman } from './spacetime.js';

export type { OrbitDirection } from './observers.js';

// ---------------------------------------------------------------------------------------------
// Circular orbit at a given radius
// ---------------------------------------------------------------------------------------------

/** A circular equatorial geodesic orbit (units of M; frequencies per unit far-away time t). */
export interface CircularOrbit {
  exists: true;
  r: number;
  direction: OrbitDirection;
  /** Ω = dφ/dt, signed (negative for retrograde). */
  angularVelocity: number;
  /** 2π/|Ω|, in far-away time t. */
  coordinatePeriod: number;
  /** 2π/(|Ω| u^t), the orbiting clock's time per revolution. */
  properPeriod: number;
  /** dτ/dt = 1/u^t = r√D/d. */
  clockRate: number;
  /** Specific energy E = −u_t. */
  energy: number;
  /** 1 − E, without cancellation (positive: bound). */
  bindingEnergy: number;
  /** Specific angular momentum L = u_φ (units of M), signed along +φ. */
  angularMomentum: number;
  /** Speed relative to the local ZAMO, in units of c (≥ 0); null where no ZAMO exists (Δ ≤ 0 or A ≤ 0). */
  zamoSpeed: number | null;
  /** Lorentz factor relative to the local ZAMO; null likewise. */
  zamoLorentzFactor: number | null;
  /** κ_r² (may be negative: the orbit is radially unstable). */
  radialEpicyclicFrequencySquared: number;
  /** κ_r = √κ_r² (angular frequency per unit t); null where κ_r² < 0. */
  radialEpicyclicFrequency: number | null;
  /** κ_θ² (may be negative only for some naked-singularity orbits). */
  verticalEpicyclicFrequencySquared: number;
  /** κ_θ; null where κ_θ² < 0. */
  verticalEpicyclicFrequency: number | null;
  /** |Ω| − κ_r: periastron precession rate, positive along the orbital motion; null where κ_r is. */
  periastronPrecession: number | null;
  /** |Ω| − κ_θ: nodal precession rate, positive along the orbital motion; null where κ_θ is. */
  nodalPrecession: number | null;
  /** 2π(|Ω| − κ_r)/κ_r: periastron advance per radial period, rad; null where κ_r ≤ 0. */
  periastronAdvancePerOrbit: number | null;
  /** 2π(|Ω| − κ_θ)/κ_θ: nodal advance per vertical period, rad; null where κ_θ ≤ 0. */
  nodalAdvancePerOrbit: number | null;
  /** κ_r² > 0 (outside the ISCO). */
  radiallyStable: boolean;
  /** κ_θ² > 0. */
  verticallyStable: boolean;
  /** Both. */
  stable: boolean;
  /** E < 1: the orbiting body cannot reach infinity without an energy kick. */
  bound: boolean;
}

export type CircularOrbitAbsenceReason =
  | 'invalidInput'
  | 'outOfRange'
  | 'insideHorizon'
  | 'onHorizon'
  | 'noCircularOrbit'
  | 'insidePhotonOrbit';

export interface CircularOrbitAbsent {
  exists: false;
  r: number;
  direction: OrbitDirection;
  reason: CircularOrbitAbsenceReason;
  message: string;
}

export type CircularOrbitResult = CircularOrbit | CircularOrbitAbsent;

export const CIRCULAR_ORBIT_REASONS: Record<CircularOrbitAbsenceReason, string> = {
  invalidInput: 'r must be a finite positive Boyer–Lindquist radius, and spin and charge finite',
  outOfRange:
    'the radius or spin is too large for a double-precision evaluation of this orbit (a product such as r⁴ overflows); r and a up to about 1e70 M are supported',
  insideHorizon: 'the radius is inside the outer horizon: nothing can stay at fixed r there',
  onHorizon: 'the radius is on the outer horizon: only light can stay there',
  noCircularOrbit:
    'no circular geodesic orbit exists here: gravity does not hold a body on a circle at this radius (r ≤ Q², where the charge repels, or r² + s·a·√(r − Q²) ≤ 0)',
  insidePhotonOrbit:
    'no timelike circular orbit exists here: at or inside the photon orbit an orbit would need the speed of light or more',
};

function absentOrbit(r: number, direction: OrbitDirection, reason: CircularOrbitAbsenceReason): CircularOrbitAbsent {
  return { exists: false, r, direction, reason, message: CIRCULAR_ORBIT_REASONS[reason] };
}

const TWO_PI = 2 * Math.PI;

/** |Ω| − κ = |Ω| X/(1 + √(1 − X)) with κ² = Ω²(1 − X); NaN where X > 1. */
function precessionFrom(absOmega: number, x: number): number {
  return (absOmega * x) / (1 + Math.sqrt(1 - x));
}

/**
 * The circular equatorial geodesic orbit at Boyer–Lindquist radius r in the given direction, or the
 * typed reason none exists (see the module comment for every formula). Domain: any finite (a, Q),
 * black hole or not; refused inside or on the outer horizon (if there is one), where r ≤ Q², where
 * r² + saσ ≤ 0, and at or inside the photon orbit (D ≤ 0). Stability is decided by the sign of κ_r²
 * (equivalently r above or below the ISCO), so it also holds for bodies whose ISCO is not computed.
 * References: Bardeen, Press & Teukolsky 1972, ApJ 178, 347 (Ω, E, L, ZAMO speed, eqs. 2.12–2.16 and
 * 3.10 for Q = 0; equation numbers from memory); Okazaki, Kato & Fukue 1987, PASJ 39, 457 (epicyclic
 * frequencies); the charged forms derived and checked with sympy in test/fixtures/python/orbits.py.
 */
export function circularOrbit(s: KerrNewman, r: number, direction: OrbitDirection): CircularOrbitResult {
  if (!(Number.isFinite(r) && r > 0 && Number.isFinite(s.a) && Number.isFinite(s.q))) {
    return absentOrbit(r, direction, 'invalidInput');
  }
  const h = horizons(s);
  if (h && r < h.outer) return absentOrbit(r, direction, 'insideHorizon');
  if (h && r === h.outer) return absentOrbit(r, direction, 'onHorizon');
  const sign = direction === 'prograde' ? 1 : -1;
  const a2 = s.a * s.a;
  const q2 = s.q * s.q;
  const sa = sign * s.a;
  const x = r - q2; // σ²
  if (!(x > 0)) return absentOrbit(r, direction, 'noCircularOrbit');
  const sigma = Math.sqrt(x);
  const den = r * r + sa * sigma;
  if (!(den > 0)) return absentOrbit(r, direction, 'noCircularOrbit');
  const dd = r * (r - 3) + 2 * q2 + 2 * sa * sigma;
  if (!(dd > 0)) return absentOrbit(r, direction, 'insidePhotonOrbit');

  const mu = 2 * r - q2;
  const rRootD = r * Math.sqrt(dd);
  const omega = (sign * sigma) / den;
  const absOmega = sigma / den;
  const n = r * (r - 2) + q2 + sa * sigma; // r√D · E
  const energy = n / rRootD;
  const bNum = r * (r * (r - 4) + 4 * q2) - q2 * q2 - a2 * x + 2 * sa * sigma * mu;
  // 1 − E two ways, each with its own condition number: B/(r√D(r√D + n)) with B = r²D − n² has
  // relative error ~ε (sum of |terms of B|)/|B| (good in weak fields, where 1 − E ≈ 1/(2r) and a direct
  // subtraction would lose log₁₀ r digits); 1 − E directly has ~ε E/|1 − E| (good near the photon
  // orbit, where B ≈ −n² is a small difference of large terms). Take the better conditioned.
  const bTerms = r * r * (r + 4) + 4 * q2 * r + q2 * q2 + a2 * x + 2 * Math.abs(sa) * sigma * mu;
  const direct = 1 - energy;
  const bindingEnergy =
    n > 0 && bTerms * Math.abs(direct) < energy * Math.abs(bNum) ? bNum / (rRootD * (rRootD + n)) : direct;
  const lNum = sigma * (r * r + a2) - sa * mu;
  const angularMomentum = (sign * lNum) / rRootD;

  // Δ = (r − 1)² − (1 − a)(1 + a) + Q²: near the horizon of a nearly extremal hole Δ ≪ r² + a², and
  // this form keeps its absolute error at a few ε of the small terms rather than of r² + a².
  const rm1 = r - 1;
  const delta = rm1 * rm1 - (1 - s.a) * (1 + s.a) + q2;
  const bigA = r * r * (r * r + a2) + a2 * mu;
  let zamoSpeed: number | null = null;
  let zamoLorentzFactor: number | null = null;
  if (delta > 0 && bigA > 0) {
    zamoSpeed = Math.abs(lNum) / (Math.sqrt(delta) * den);
    zamoLorentzFactor = den * Math.sqrt(delta / (dd * bigA));
  }

  const r2x = r * r * x;
  const xr = ((6 - q2) * r * r - 9 * q2 * r + 4 * q2 * q2 + a2 * (3 * r - 4 * q2) - 8 * sa * sigma * x) / r2x;
  const xth = (2 * sa * sigma * mu - a2 * (3 * r - 2 * q2)) / r2x;
  const om2 = absOmega * absOmega;
  const kr2 = om2 * (1 - xr);
  const kth2 = om2 * (1 - xth);
  const kr = kr2 >= 0 ? Math.sqrt(kr2) : null;
  const kth = kth2 >= 0 ? Math.sqrt(kth2) : null;
  const periastron = kr === null ? null : precessionFrom(absOmega, xr);
  const nodal = kth === null ? null : precessionFrom(absOmega, xth);
  // Every value is finite for r, |a| ≲ 1e70; beyond, products such as r²(r² + a²) overflow.
  if (!Number.isFinite(energy + angularMomentum + bindingEnergy + kr2 + kth2 + bigA + omega) || !(absOmega > 0)) {
    return absentOrbit(r, direction, 'outOfRange');
  }
  return {
    exists: true,
    r,
    direction,
    angularVelocity: omega,
    coordinatePeriod: (TWO_PI * den) / sigma,
    properPeriod: (TWO_PI * rRootD) / sigma,
    clockRate: rRootD / den,
    energy,
    bindingEnergy,
    angularMomentum,
    zamoSpeed,
    zamoLorentzFactor,
    radialEpicyclicFrequencySquared: kr2,
    radialEpicyclicFrequency: kr,
    verticalEpicyclicFrequencySquared: kth2,
    verticalEpicyclicFrequency: kth,
    periastronPrecession: periastron,
    nodalPrecession: nodal,
    periastronAdvancePerOrbit: periastron !== null && kr !== null && kr > 0 ? (TWO_PI * periastron) / kr : null,
    nodalAdvancePerOrbit: nodal !== null && kth !== null && kth > 0 ? (TWO_PI * nodal) / kth : null,
    radiallyStable: kr2 > 0,
    verticallyStable: kth2 > 0,
    stable: kr2 > 0 && kth2 > 0,
    bound: bindingEnergy > 0,
  };
}

// ---------------------------------------------------------------------------------------------
// Characteristic radii
// ---------------------------------------------------------------------------------------------

export type CharacteristicOrbitKind = 'photonOrbit' | 'marginallyBoundOrbit' | 'isco';

/**
 * How a radius was found: the Bardeen–Press–Teukolsky closed forms (Q = 0), bracketed root finding
 * (Q ≠ 0, or on request), or the degenerate extremal limit where the orbit sits at the lower end of its
 * search interval (the outer horizon, or the photon orbit) in Boyer–Lindquist r.
 */
export type CharacteristicOrbitMethod = 'closedForm' | 'rootFinding' | 'lowerLimit';

export interface CharacteristicOrbit {
  exists: true;
  kind: CharacteristicOrbitKind;
  direction: OrbitDirection;
  /** Boyer–Lindquist radius, units of M. */
  r: number;
  method: CharacteristicOrbitMethod;
  /** Ω = dφ/dt of the circular orbit (photon or timelike) at r, signed. */
  angularVelocity: number;
  /** Specific energy E; null at the photon orbit (it diverges) and where D = 0 in an extremal limit. */
  energy: number | null;
  /** Specific angular momentum L, signed; null likewise. */
  angularMomentum: number | null;
  /** 1 − E without cancellation; at the ISCO the radiative efficiency of a thin disc. Null likewise. */
  bindingEnergy: number | null;
}

export type CharacteristicOrbitAbsenceReason = 'invalidInput' | 'noHorizon';

export interface CharacteristicOrbitAbsent {
  exists: false;
  kind: CharacteristicOrbitKind;
  direction: OrbitDirection;
  reason: CharacteristicOrbitAbsenceReason;
  message: string;
}

export type CharacteristicOrbitResult = CharacteristicOrbit | CharacteristicOrbitAbsent;

export const CHARACTERISTIC_ORBIT_REASONS: Record<CharacteristicOrbitAbsenceReason, string> = {
  invalidInput: 'spin and charge must be finite numbers',
  noHorizon:
    'characteristic orbits are computed for black holes (spin² + charge² ≤ 1); without a horizon the family has further branches of circular orbits reaching down to the singularity, which are not covered',
};

/**
 * Photon orbit of Kerr, r_ph = 2[1 + cos((2/3) arccos(−sa))] (Bardeen, Press & Teukolsky 1972, ApJ 178,
 * 347, eq. 2.18), s = +1 prograde. Domain |a| ≤ 1; units of M.
 */
export function kerrPhotonOrbit(a: number, direction: OrbitDirection): number {
  const sa = direction === 'prograde' ? a : -a;
  return 2 * (1 + Math.cos((2 / 3) * Math.acos(-sa)));
}

/** Marginally bound orbit of Kerr, r_mb = 2 − sa + 2√(1 − sa) (BPT 1972, eq. 2.19). |a| ≤ 1. */
export function kerrMarginallyBoundOrbit(a: number, direction: OrbitDirection): number {
  const sa = direction === 'prograde' ? a : -a;
  return 2 - sa + 2 * Math.sqrt(1 - sa);
}

/**
 * ISCO of Kerr (BPT 1972, eq. 2.21): Z₁ = 1 + (1 − a²)^{1/3}[(1 + a)^{1/3} + (1 − a)^{1/3}],
 * Z₂ = √(3a² + Z₁²), r_ms = 3 + Z₂ ∓ √((3 − Z₁)(3 + Z₁ + 2Z₂)), upper sign prograde (sa ≥ 0).
 * |a| ≤ 1; units of M. 3 − Z₁ → 0 as a → 0 and would cancel (2e−14 relative error in r at a = 0.004);
 * with u = (1 + a)^{1/3}, v = (1 − a)^{1/3} (so u³ + v³ = 2, Z₁ = 1 + uv(u + v)) it is formed as
 * 3 − Z₁ = (u − v)²(u + v), u − v = 2a/(u² + uv + v²), exact algebra with no cancellation.
 */
export function kerrIsco(a: number, direction: OrbitDirection): number {
  const sa = direction === 'prograde' ? a : -a;
  const u = Math.cbrt(1 + a);
  const v = Math.cbrt(1 - a);
  const z1 = 1 + u * v * (u + v);
  const uMinusV = (2 * a) / (u * u + u * v + v * v);
  const threeMinusZ1 = uMinusV * uMinusV * (u + v);
  const z2 = Math.sqrt(3 * a * a + z1 * z1);
  const root = Math.sqrt(threeMinusZ1 * (3 + z1 + 2 * z2));
  return 3 + z2 + (sa >= 0 ? -root : root);
}

/**
 * The residuals D (photon orbit), I (ISCO) and B (marginally bound) as polynomials in σ = √(r − Q²)
 * (expand r = σ² + Q² in the module-comment forms):
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
  method: CharacteristicOrbitMethod;
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

/**
 * Ω, E, L and 1 − E of the circular orbit at a characteristic radius. E and L use the general closed
 * forms where D > 0; at the Kerr ISCO (Q = 0) they use BPT's E = √(1 − 2/(3r)),
 * L = s(2/(3√3))(1 + 2√(3r − 2)) (BPT 1972, eqs. 2.22–2.23, from memory; checked against the general
 * forms in the tests), finite also at a = 1 prograde where D = 0; the marginally bound orbit has E = 1.
 */
function orbitAt(
  s: KerrNewman,
  kind: CharacteristicOrbitKind,
  direction: OrbitDirection,
  r: number,
  method: CharacteristicOrbitMethod,
): CharacteristicOrbit {
  const sign = direction === 'prograde' ? 1 : -1;
  const q2 = s.q * s.q;
  const sigma = Math.sqrt(r - q2);
  const angularVelocity = (sign * sigma) / (r * r + sign * s.a * sigma);
  const base = { exists: true as const, kind, direction, r, method, angularVelocity };
  if (kind === 'photonOrbit') return { ...base, energy: null, angularMomentum: null, bindingEnergy: null };
  if (kind === 'isco' && method === 'closedForm') {
    const x = 2 / (3 * r);
    const root = Math.sqrt(1 - x);
    const angularMomentum = (sign * 2 * (1 + 2 * Math.sqrt(3 * r - 2))) / (3 * Math.sqrt(3));
    return { ...base, energy: root, angularMomentum, bindingEnergy: x / (1 + root) };
  }
  const o = circularOrbit(s, r, direction);
  if (kind === 'marginallyBoundOrbit') {
    return { ...base, energy: 1, angularMomentum: o.exists ? o.angularMomentum : null, bindingEnergy: 0 };
  }
  if (!o.exists) return { ...base, energy: null, angularMomentum: null, bindingEnergy: null };
  return { ...base, energy: o.energy, angularMomentum: o.angularMomentum, bindingEnergy: o.bindingEnergy };
}

/**
 * One characteristic equatorial orbit (photon orbit, marginally bound orbit or ISCO) of a black hole,
 * with Ω, E, L and 1 − E there. Q = 0 takes the Bardeen–Press–Teukolsky closed forms
 * ({@link kerrPhotonOrbit}, {@link kerrMarginallyBoundOrbit}, {@link kerrIsco}); Q ≠ 0, or
 * `{ method: 'rootFinding' }`, uses {@link characteristicRadiiByRootFinding} (the tests hold the two
 * paths together to 1e-12). Absent with a reason for non-finite input or a² + Q² > 1 (no horizon).
 * At the ISCO 1 − E is the radiative efficiency of a thin accretion disc (Novikov & Thorne 1973, in
 * Black Holes, Les Houches; Thorne 1974, ApJ 191, 507).
 */
export function characteristicOrbit(
  s: KerrNewman,
  kind: CharacteristicOrbitKind,
  direction: OrbitDirection,
  options: { method?: 'auto' | 'rootFinding' } = {},
): CharacteristicOrbitResult {
  return characteristicOrbitWith(s, kind, direction, options.method === 'rootFinding', null);
}

function characteristicOrbitWith(
  s: KerrNewman,
  kind: CharacteristicOrbitKind,
  direction: OrbitDirection,
  forceRootFinding: boolean,
  known: CharacteristicRadii | null,
): CharacteristicOrbitResult {
  if (!Number.isFinite(s.a) || !Number.isFinite(s.q)) {
    return { exists: false, kind, direction, reason: 'invalidInput', message: CHARACTERISTIC_ORBIT_REASONS.invalidInput };
  }
  if (!horizons(s)) {
    return { exists: false, kind, direction, reason: 'noHorizon', message: CHARACTERISTIC_ORBIT_REASONS.noHorizon };
  }
  if (s.q === 0 && !forceRootFinding) {
    const r =
      kind === 'photonOrbit'
        ? kerrPhotonOrbit(s.a, direction)
        : kind === 'isco'
          ? kerrIsco(s.a, direction)
          : kerrMarginallyBoundOrbit(s.a, direction);
    return orbitAt(s, kind, direction, r, 'closedForm');
  }
  const radii = known ?? (characteristicRadiiByRootFinding(s, direction) as CharacteristicRadii);
  const found = radii[kind];
  return orbitAt(s, kind, direction, found.r, found.method);
}

/** Keys as in the quantity catalogue: `iscoPrograde`, `photonOrbitRetrograde`, …. */
export type CharacteristicOrbitKey = `${CharacteristicOrbitKind}${'Prograde' | 'Retrograde'}`;

/** All six characteristic orbits (three kinds × two directions), keyed as in the quantity catalogue. */
export function characteristicOrbits(s: KerrNewman): Record<CharacteristicOrbitKey, CharacteristicOrbitResult> {
  const out = {} as Record<CharacteristicOrbitKey, CharacteristicOrbitResult>;
  const charged = s.q !== 0 && Number.isFinite(s.a) && Number.isFinite(s.q) && horizons(s) !== null;
  for (const direction of ['prograde', 'retrograde'] as const) {
    // One root-finding pass serves all three kinds of a direction.
    const radii = charged ? characteristicRadiiByRootFinding(s, direction) : null;
    const suffix = direction === 'prograde' ? 'Prograde' : 'Retrograde';
    for (const kind of ['photonOrbit', 'marginallyBoundOrbit', 'isco'] as const) {
      out[`${kind}${suffix}`] = characteristicOrbitWith(s, kind, direction, false, radii);
    }
  }
  return out;
}
