/**
 * Circular equatorial geodesic orbits around one Kerr–Newman body: the full description of a circular
 * orbit at a given radius (frequencies, period, E, L, stability, epicyclic frequencies and the
 * precessions they imply). The characteristic radii (photon orbit, marginally bound orbit, ISCO) are
 * in characteristic-orbits.ts, found by root finding on the residuals below in orbit-roots.ts.
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
