/**
 * Weak-field (post-Newtonian) precessions around one body: the periapsis advance of an eccentric
 * orbit, the geodetic (de Sitter) and Lense–Thirring (frame-dragging) precessions of a gyroscope, and
 * the Lense–Thirring drift of an orbit's node. Meant for bodies with a surface (the Sun, the Earth),
 * where orbits are far out (r ≫ M) and only the leading relativistic terms matter; the strong-field
 * counterparts for circular orbits are the epicyclic precessions of ./orbits.ts, and the tests hold
 * these formulas to those in the overlap (circular orbits at large r).
 *
 * Geometric units G = c = M = 1: lengths (r, semi-major axis A) in GM/c², times in GM/c³, rates in
 * rad per unit t (multiply by c³/(GM) for rad/s), angles per orbit in rad. The body's spin enters as
 * a = J/(Mc) in units of M, i.e. J = a M² in these units (J/M² = cJ/(GM²) in SI), and its charge as
 * Q in units of M. Inclination i is the angle between the orbit normal and the spin axis (0: equatorial
 * prograde; π/2: polar; π: equatorial retrograde).
 *
 * The body's quadrupole (J₂) is not included: for the Earth it dominates the classical node and
 * periapsis motion and shifts the geodetic rate by a few parts per thousand.
 */
import type { KerrNewman } from './spacetime.js';

/** Per-orbit changes of the orbital elements, rad, and the rate of the in-plane advance. */
export interface PeriapsisAdvance {
  /** Advance of the periapsis direction within the orbit plane per orbit (sum of the three parts). */
  perOrbit: number;
  /** Schwarzschild part 6π/p, p = A(1 − e²) the semi-latus rectum (units of M). */
  schwarzschild: number;
  /** Charge part −πQ²/p (leading order). */
  charge: number;
  /** Frame-dragging part −8π a cos i / p^{3/2} (argument of periapsis plus cos i × node). */
  frameDragging: number;
  /** Change of the argument of periapsis (measured from the node): 6π/p − πQ²/p − 12π a cos i/p^{3/2}. */
  argumentOfPeriapsis: number;
  /** Lense–Thirring change of the longitude of the node, 4π a/p^{3/2} (in the sense of the spin). */
  node: number;
  /** The period used, in units of GM/c³ (the caller's, or Kepler's 2π A^{3/2}). */
  period: number;
  /** perOrbit / period: the secular advance rate, rad per unit t. */
  rate: number;
}

/**
 * Periapsis advance of a bound eccentric orbit with semi-major axis A (units of M) and eccentricity e
 * around a body of spin a and charge Q, to leading post-Newtonian order in each effect:
 *   Schwarzschild: Δϖ = 6π/(A(1 − e²))  (Einstein 1915, Sitzungsber. Preuss. Akad. Wiss., 831; in SI
 *     6πGM/(c² A(1 − e²))),
 *   charge: −πQ²/p, derived here from the Reissner–Nordström orbit equation
 *     u'' + u(1 + Q²/L²) = M/L² + 3Mu² − 2Q²u³ (u = 1/r), whose linear term gives the advance
 *     2π(3M/p − Q²/(2Mp)); no published source is cited for it,
 *   Lense–Thirring: dω/dt = −6J cos i/(A³(1 − e²)^{3/2}) and dΩ/dt = 2J/(A³(1 − e²)^{3/2}) (Lense &
 *     Thirring 1918, Phys. Z. 19, 156; in this form e.g. Ciufolini 1986, Phys. Rev. Lett. 56, 278 —
 *     from memory), over one Keplerian period 2πA^{3/2}: Δω = −12π a cos i/p^{3/2}, ΔΩ = 4π a/p^{3/2}.
 * The in-plane advance is Δω + cos i ΔΩ. In the circular equatorial limit the charge and spin terms
 * equal the weak-field limit of the epicyclic periastron advance of ./orbits.ts (sympy-checked in
 * test/fixtures/python/orbits.py), which is the independent check of the two derived terms.
 * `period` (units of GM/c³, e.g. the observed sidereal period) gives the rate; Kepler's if omitted.
 * Domain: A > 0, 0 ≤ e < 1, p ≫ 1 (weak field); null otherwise (not finite, e outside [0, 1)).
 */
export function periapsisAdvance(
  s: KerrNewman,
  semiMajorAxis: number,
  eccentricity: number,
  options: { inclination?: number; period?: number } = {},
): PeriapsisAdvance | null {
  const inclination = options.inclination ?? 0;
  if (
    !(Number.isFinite(semiMajorAxis) && semiMajorAxis > 0) ||
    !(Number.isFinite(eccentricity) && eccentricity >= 0 && eccentricity < 1) ||
    !Number.isFinite(inclination) ||
    !Number.isFinite(s.a) ||
    !Number.isFinite(s.q)
  ) {
    return null;
  }
  const period = options.period ?? 2 * Math.PI * semiMajorAxis * Math.sqrt(semiMajorAxis);
  if (!(Number.isFinite(period) && period > 0)) return null;
  const p = semiMajorAxis * (1 - eccentricity) * (1 + eccentricity);
  const p32 = p * Math.sqrt(p);
  const cosI = Math.cos(inclination);
  const schwarzschild = (6 * Math.PI) / p;
  const charge = (-Math.PI * s.q * s.q) / p;
  const node = (4 * Math.PI * s.a) / p32;
  const argumentLT = (-12 * Math.PI * s.a * cosI) / p32;
  const frameDragging = argumentLT + cosI * node;
  const perOrbit = schwarzschild + charge + frameDragging;
  return {
    perOrbit,
    schwarzschild,
    charge,
    frameDragging,
    argumentOfPeriapsis: schwarzschild + charge + argumentLT,
    node,
    period,
    rate: perOrbit / period,
  };
}

/**
 * Weak-field geodetic (de Sitter) precession rate of a gyroscope on a circular orbit of radius r,
 * (3/2) r^{−5/2} rad per unit t — in SI (3/2)(GM)^{3/2}/(c² r^{5/2}) rad/s — about the orbit normal,
 * in the sense of the orbital motion, for any orientation of the orbit (polar or equatorial; de Sitter
 * 1916, MNRAS 77, 155; Schiff 1960, Phys. Rev. Lett. 4, 215). Domain r > 0; NaN otherwise.
 */
export function geodeticPrecessionRate(r: number): number {
  if (!(r > 0)) return Number.NaN;
  return 1.5 / (r * r * Math.sqrt(r));
}

/**
 * Exact geodetic precession rate for a circular geodesic in Schwarzschild, Ω(1 − √(1 − 3/r)) with
 * Ω = r^{−3/2}, rad per unit t: parallel transport along the orbit turns the spin relative to the
 * radial direction at Ω√(1 − 3/r), so relative to the distant stars it advances by 2π(1 − √(1 − 3/r))
 * per orbit (e.g. Hartle 2003, Gravity, §14.4 — section from memory; the transport equation is
 * checked with sympy in test/fixtures/python/orbits.py). Evaluated as Ω(3/r)/(1 + √(1 − 3/r)),
 * without cancellation; tends to (3/2) r^{−5/2}. Domain r > 3 (outside the photon orbit); NaN otherwise.
 */
export function geodeticPrecessionRateSchwarzschild(r: number): number {
  if (!(r > 3)) return Number.NaN;
  const x = 3 / r;
  return (x / (1 + Math.sqrt(1 - x))) / (r * Math.sqrt(r));
}

/** The orbit-averaged Lense–Thirring precession of a gyroscope as a vector, rad per unit t. */
export interface GyroscopeFrameDragging {
  /** Component along the body's spin axis Ĵ: a/(2r³). */
  alongSpin: number;
  /** Component along the orbit normal n̂: −(3/2) a cos i / r³. */
  alongOrbitNormal: number;
  /** |⟨Ω⟩| = (|a|/(2r³)) √(1 + 3 cos² i). */
  magnitude: number;
}

/**
 * Lense–Thirring (frame-dragging) precession of a gyroscope on a circular orbit of radius r, averaged
 * over the orbit. Schiff's rate Ω = (G/(c²r³))[3(J·r̂)r̂ − J] (Schiff 1960, Phys. Rev. Lett. 4, 215)
 * averaged with ⟨r̂r̂⟩ = (1 − n̂n̂)/2 gives ⟨Ω⟩ = (1/r³)[J/2 − (3/2)(J·n̂) n̂], J = a (units of M²):
 * along Ĵ a/(2r³), along n̂ −(3/2) a cos i/r³; magnitude (a/(2r³))√(1 + 3cos²i). Polar orbit (i = π/2):
 * a/(2r³) along the spin axis — in SI GJ/(2c²r³), the Gravity Probe B case; equatorial: a/r³
 * against the spin. Domain r > 0, a, i finite; NaN components otherwise.
 */
export function lenseThirringGyroscopePrecession(a: number, r: number, inclination: number): GyroscopeFrameDragging {
  if (!(r > 0) || !Number.isFinite(a) || !Number.isFinite(inclination)) {
    return { alongSpin: Number.NaN, alongOrbitNormal: Number.NaN, magnitude: Number.NaN };
  }
  const r3 = r * r * r;
  const c = Math.cos(inclination);
  const alongSpin = a / (2 * r3);
  return {
    alongSpin,
    alongOrbitNormal: (-1.5 * a * c) / r3,
    magnitude: Math.abs(alongSpin) * Math.sqrt(1 + 3 * c * c),
  };
}

/**
 * Lense–Thirring rate of the longitude of the ascending node, 2a/(A³(1 − e²)^{3/2}) rad per unit t —
 * in SI 2GJ/(c² A³(1 − e²)^{3/2}) — in the sense of the spin, for any inclination (Lense & Thirring
 * 1918, Phys. Z. 19, 156; the effect measured with the LAGEOS satellites, Ciufolini & Pavlis 2004,
 * Nature 431, 958 — from memory). Domain A > 0, 0 ≤ e < 1; NaN otherwise.
 */
export function lenseThirringNodalRate(a: number, semiMajorAxis: number, eccentricity: number): number {
  if (!(semiMajorAxis > 0) || !(eccentricity >= 0 && eccentricity < 1)) return Number.NaN;
  const w = (1 - eccentricity) * (1 + eccentricity);
  const a3 = semiMajorAxis * semiMajorAxis * semiMajorAxis;
  return (2 * a) / (a3 * w * Math.sqrt(w));
}
