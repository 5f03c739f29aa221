/**
 * The quantity catalogue: every quantity the service returns, under the one name used as its key in
 * responses, in GET /v1/quantities and (later) in sweeps, with its SI unit, how its geometric value
 * (G = c = M = 1) converts to SI, and what it means.
 */
import { C, C2, HBAR, K_B, POTENTIAL_TO_VOLT } from './units/constants.js';

/** How a geometric value converts to SI, given the body's scales. */
export type Scale =
  | 'none'
  | 'speed'
  | 'length'
  | 'time'
  | 'acceleration'
  | 'angularVelocity'
  | 'area'
  | 'mass'
  | 'temperature'
  | 'potential'
  | 'frequency'
  | 'specificAngularMomentum'
  | 'curvatureSquared'
  | 'tidal';

export interface BodyScales {
  /** GM/c², m. */
  rg: number;
  /** GM/c³, s. */
  tg: number;
  /** M, kg. */
  massKg: number;
}

export interface QuantityInfo {
  name: string;
  unit: string;
  scale: Scale;
  /** The unit of the geometric value, or null for dimensionless quantities (no geometric value sent). */
  geometricUnit: string | null;
  description: string;
  endpoint: string;
  /** Depends only on the body and the point (or the body alone), so it can be swept. */
  sweepable: boolean;
}

const GEOMETRIC_UNIT: Record<Scale, string | null> = {
  none: null,
  speed: 'c',
  length: 'GM/c^2',
  time: 'GM/c^3',
  acceleration: 'c^4/(GM)',
  angularVelocity: 'c^3/(GM)',
  area: '(GM/c^2)^2',
  mass: 'M',
  temperature: 'hbar c^3/(G M k_B)',
  potential: 'c^2/sqrt(4 pi epsilon_0 G)',
  frequency: 'c^3/(GM)',
  specificAngularMomentum: 'GM/c',
  curvatureSquared: '(GM/c^2)^-4',
  tidal: '(c^3/(GM))^2',
};

/** Multiplies a geometric value into SI for the body. */
export function siFactor(scale: Scale, b: BodyScales): number {
  switch (scale) {
    case 'none':
      return 1;
    case 'speed':
      return C;
    case 'length':
      return b.rg;
    case 'time':
      return b.tg;
    case 'acceleration':
      return C2 / b.rg;
    case 'angularVelocity':
      return 1 / b.tg;
    case 'area':
      return b.rg * b.rg;
    case 'mass':
      return b.massKg;
    case 'temperature':
      // T = ħ κ_SI / (2π c k_B) with κ_SI = κ c²/rg; the geometric value is already κ/2π.
      return (HBAR * C) / (K_B * b.rg);
    case 'potential':
      return POTENTIAL_TO_VOLT;
    case 'frequency':
      return 1 / b.tg;
    case 'specificAngularMomentum':
      return b.rg * C;
    case 'curvatureSquared':
      // 1/rg⁴, formed as a square of squares (no intermediate overflow for rg in the documented range).
      return 1 / (b.rg * b.rg) / (b.rg * b.rg);
    case 'tidal':
      return 1 / (b.tg * b.tg);
  }
}

function q(
  name: string,
  unit: string,
  scale: Scale,
  endpoint: string,
  description: string,
  sweepable = true,
): QuantityInfo {
  return { name, unit, scale, geometricUnit: GEOMETRIC_UNIT[scale], description, endpoint, sweepable };
}

const CLOCKS = '/v1/clocks';
const ORBITS = '/v1/orbits/circular';
const TIDAL = '/v1/tidal';
const PROPER_TIME = '/v1/proper-time';

const LOCAL = '/v1/local';
const SPACETIME = '/v1/spacetime';

export const CATALOGUE: readonly QuantityInfo[] = [
  q('flowSpeed', 'm/s', 'speed', LOCAL,
    'Speed of the inward flow of space: the speed, measured by the local ZAMO, of observers falling from rest at infinity with zero angular momentum. Equals the Newtonian escape speed sqrt(2GM/r) for a non-rotating uncharged body, reaches c on the outer horizon, exceeds it between the horizons and falls below c again inside the inner horizon of a spinning or charged hole.'),
  q('escapeSpeed', 'm/s', 'speed', LOCAL,
    'ZAMO-measured speed of a zero-angular-momentum launch that just reaches infinity; equal to flowSpeed outside the horizon, null at and inside it.'),
  q('staticClockRate', '1', 'none', LOCAL,
    'dτ/dt of a clock held at fixed r, θ, φ relative to a far-away clock: sqrt(-g_tt). Null inside the ergosurface and the horizon.'),
  q('staticClockOffset', '1', 'none', LOCAL,
    '1 - staticClockRate, computed without cancellation (full double precision down to 1e-300).'),
  q('zamoClockRate', '1', 'none', LOCAL,
    'dτ/dt of the zero-angular-momentum observer (the lapse α = sqrt(ΣΔ/A) = sqrt(1 - v_flow²/c²)).'),
  q('zamoClockOffset', '1', 'none', LOCAL, '1 - zamoClockRate, computed without cancellation.'),
  q('redshiftToInfinity', '1', 'none', LOCAL,
    'Redshift z of light sent by a static emitter here and received far away: 1 + z = 1/staticClockRate.'),
  q('hoverAcceleration', 'm/s^2', 'acceleration', LOCAL,
    'Proper acceleration a static (hovering) observer needs to stay at fixed r, θ, φ, as its own accelerometer reads it.'),
  q('frameDragRate', 'rad/s', 'angularVelocity', LOCAL,
    'Angular velocity dφ/dt of the ZAMO (frame dragging), ω = -g_tφ/g_φφ.'),
  q('kretschmannScalar', 'm^-4', 'curvatureSquared', LOCAL,
    'Kretschmann scalar R_abcd R^abcd, the square of the Riemann tensor: 48G²M²/(c⁴r⁶) for a non-rotating uncharged body; negative in places near a spinning hole. Null where it underflows double precision (r ≳ 1e51 GM/c²).'),
  q('ricciSquared', 'm^-4', 'curvatureSquared', LOCAL,
    'R_ab R^ab, the square of the Ricci tensor: 4Q⁴/Σ⁴ in geometric units, from the electromagnetic field of a charged body; 0 without charge. (The Ricci scalar R itself is 0 for a Maxwell field, so it is not listed.)'),
  q('schwarzschildRadius', 'm', 'length', SPACETIME, '2GM/c², the horizon radius of a non-rotating uncharged body of this mass.'),
  q('outerHorizon', 'm', 'length', SPACETIME, 'Boyer–Lindquist radius of the outer (event) horizon, r+ = M + sqrt(M² - a² - Q²).'),
  q('innerHorizon', 'm', 'length', SPACETIME, 'Boyer–Lindquist radius of the inner (Cauchy) horizon, r- = M - sqrt(M² - a² - Q²).'),
  q('ergosurfaceEquator', 'm', 'length', SPACETIME, 'Boyer–Lindquist radius of the outer ergosurface (static limit) in the equatorial plane.'),
  q('ergosurfacePole', 'm', 'length', SPACETIME, 'Boyer–Lindquist radius of the outer ergosurface on the spin axis (it meets the horizon there).'),
  q('surfaceGravity', 'm/s^2', 'acceleration', SPACETIME, 'Surface gravity κ of the outer horizon.'),
  q('hawkingTemperature', 'K', 'temperature', SPACETIME, 'Hawking temperature ħκ/(2π c k_B) of the outer horizon.'),
  q('horizonArea', 'm^2', 'area', SPACETIME, 'Area 4π(r+² + a²) of the outer horizon.'),
  q('horizonAngularVelocity', 'rad/s', 'angularVelocity', SPACETIME, 'Angular velocity Ω_H = a/(r+² + a²) of the outer horizon.'),
  q('horizonElectricPotential', 'V', 'potential', SPACETIME, 'Electric potential Φ_H = Q r+/(r+² + a²) of the outer horizon (co-rotating).'),
  q('irreducibleMass', 'kg', 'mass', SPACETIME, 'Irreducible mass sqrt(A_H/16π) (Christodoulou–Ruffini): the mass that no classical process can extract.'),
  q('compactness', '1', 'none', SPACETIME, 'r_s/R = 2GM/(Rc²) for a body with a surface of equatorial radius R.'),
  q('surfaceEscapeSpeed', 'm/s', 'speed', SPACETIME, 'escapeSpeed at the equatorial surface of a body with a surface.'),
  q('surfaceClockOffset', '1', 'none', SPACETIME, 'staticClockOffset at the equatorial surface of a body with a surface (no rotation of the clock).'),
  q('surfaceHoverAcceleration', 'm/s^2', 'acceleration', SPACETIME, 'hoverAcceleration at the equatorial surface of a body with a surface (no centrifugal part).'),
  // Characteristic equatorial orbits of a black hole (Bardeen, Press & Teukolsky 1972 for Kerr).
  ...(['Prograde', 'Retrograde'] as const).flatMap((d) => [
    q(`photonOrbit${d}`, 'm', 'length', SPACETIME, `Boyer–Lindquist radius of the ${d.toLowerCase()} circular photon orbit.`),
    q(`marginallyBoundOrbit${d}`, 'm', 'length', SPACETIME, `Radius of the ${d.toLowerCase()} marginally bound circular orbit (specific energy 1).`),
    q(`isco${d}`, 'm', 'length', SPACETIME, `Radius of the ${d.toLowerCase()} innermost stable circular orbit.`),
    q(`iscoEnergy${d}`, '1', 'none', SPACETIME, `Specific energy E (units of c²) of the ${d.toLowerCase()} ISCO.`),
    q(`iscoAngularMomentum${d}`, 'm^2/s', 'specificAngularMomentum', SPACETIME, `Specific angular momentum of the ${d.toLowerCase()} ISCO (signed along the spin).`),
    q(`iscoEfficiency${d}`, '1', 'none', SPACETIME, `Radiative efficiency 1 − E of a thin disc ending at the ${d.toLowerCase()} ISCO.`),
  ]),
  // A circular equatorial orbit at r.
  q('orbitalAngularVelocity', 'rad/s', 'angularVelocity', ORBITS, 'Ω = dφ/dt of the circular orbit, signed (negative for retrograde).', false),
  q('orbitalFrequency', 'Hz', 'frequency', ORBITS, '|Ω|/2π: revolutions per second of far-away time.', false),
  q('coordinatePeriod', 's', 'time', ORBITS, '2π/|Ω|: far-away time per revolution.', false),
  q('properPeriod', 's', 'time', ORBITS, 'Time per revolution on the orbiting clock.', false),
  q('orbitalSpeed', 'm/s', 'speed', ORBITS, 'Speed of the orbiting body measured by the local ZAMO.', false),
  q('orbitClockRate', '1', 'none', ORBITS, 'dτ/dt of the orbiting clock.', false),
  q('specificEnergy', '1', 'none', ORBITS, 'Energy per unit rest energy, E = −u_t.', false),
  q('bindingEnergy', '1', 'none', ORBITS, '1 − E, without cancellation: the fraction of rest energy released in reaching this orbit from rest at infinity.', false),
  q('specificAngularMomentum', 'm^2/s', 'specificAngularMomentum', ORBITS, 'Angular momentum per unit mass, u_φ, signed along the spin.', false),
  q('radialEpicyclicFrequency', 'Hz', 'frequency', ORBITS, 'κ_r/2π: frequency of small radial oscillations about the orbit.', false),
  q('verticalEpicyclicFrequency', 'Hz', 'frequency', ORBITS, 'κ_θ/2π: frequency of small vertical oscillations.', false),
  q('periastronPrecessionFrequency', 'Hz', 'frequency', ORBITS, '(|Ω| − κ_r)/2π: precession of a slightly eccentric orbit.', false),
  q('nodalPrecessionFrequency', 'Hz', 'frequency', ORBITS, '(|Ω| − κ_θ)/2π: precession of a slightly tilted orbit (Lense–Thirring in weak fields).', false),
  // Light (each depends on a ray or a view as well as the body).
  q('deflection', 'rad', 'none', '/v1/light/deflection', 'Exact total bending angle of a light ray (also in arcseconds).', false),
  q('weakFieldFirstOrder', 'rad', 'none', '/v1/light/deflection', 'Weak-field deflection 4GM/(c²b).', false),
  q('weakFieldSecondOrder', 'rad', 'none', '/v1/light/deflection', 'Weak-field deflection to second order in GM/(c²b).', false),
  q('criticalImpactParameter', 'm', 'length', '/v1/light/deflection', 'Impact parameter below which a ray is captured.', false),
  q('oneWay', 's', 'none', '/v1/light/delay', 'Exact Shapiro delay of a signal, one way (coordinate time).', false),
  q('roundTrip', 's', 'none', '/v1/light/delay', 'Exact Shapiro delay, there and back.', false),
  q('weakFieldOneWay', 's', 'none', '/v1/light/delay', 'Shapiro\'s logarithmic weak-field delay, one way.', false),
  q('weakFieldRoundTrip', 's', 'none', '/v1/light/delay', 'Shapiro\'s logarithmic weak-field delay, there and back.', false),
  q('horizontalDiameter', 'm', 'length', '/v1/shadow', 'Width of the black hole\'s critical curve along the projected equator.', false),
  q('verticalDiameter', 'm', 'length', '/v1/shadow', 'Height of the critical curve.', false),
  q('meanRadius', 'm', 'length', '/v1/shadow', 'Mean radius of the critical curve about its centre.', false),
  q('centreDisplacement', 'm', 'length', '/v1/shadow', 'Offset of the curve\'s centre from the line of sight to the hole.', false),
  q('circularityDeviation', '1', 'none', '/v1/shadow', 'ΔC: rms deviation of the curve\'s radius from its mean, over the mean.', false),
  q('diameterAsymmetry', '1', 'none', '/v1/shadow', '(horizontal − vertical diameter) / vertical diameter.', false),
  q('angularDiameter', 'rad', 'none', '/v1/shadow', 'Angular diameter of the shadow seen from a distance (also in µas).', false),
  // Observer quantities: they depend on an observer as well as the point, so they are not swept.
  q('clockRate', '1', 'none', CLOCKS, 'dτ/dt of an observer (static, ZAMO, circular orbit, rotating, distant) against far-away time.', false),
  q('clockOffset', '1', 'none', CLOCKS, '1 - clockRate, computed without cancellation.', false),
  q('speedRelativeToZamo', 'm/s', 'speed', CLOCKS, 'Speed of an observer measured by the local ZAMO (signed, + along the spin).', false),
  q('speedRelativeToStatic', 'm/s', 'speed', CLOCKS, 'Speed of an observer measured by the local static observer.', false),
  q('rateRatio', '1', 'none', CLOCKS, 'rate_B / rate_A: seconds of clock B per second of clock A.', false),
  q('fractionalOffset', '1', 'none', CLOCKS, 'rate_B / rate_A - 1, computed without cancellation.', false),
  q('gainPerDay', 's', 'none', CLOCKS, 'Time clock B gains on clock A per day of A (also in µs and ns).', false),
  q('gainPerYear', 's', 'none', CLOCKS, 'Time clock B gains on clock A per Julian year of A.', false),
  // Tides (they depend on an observer, and the disruption on a star, as well as the point).
  q('tidalEigenvalue', 's^-2', 'tidal', TIDAL, 'Eigenvalue of the tidal tensor E_ij = R_i0j0 in an observer\'s frame (static, ZAMO, river): negative stretches, positive squeezes; 2GM/r³ stretch along the radius for a non-rotating body.', false),
  q('differentialAcceleration', 'm/s^2', 'acceleration', TIDAL, 'Relative acceleration of the two ends of an object of given length along a principal tidal direction (positive apart).', false),
  q('disruptionRadius', 'm', 'length', TIDAL, 'Tidal disruption radius of a star, R⋆(M/m⋆)^{1/3}: an order-of-magnitude estimate.', false),
  q('hillsMass', 'kg', 'mass', TIDAL, 'Hole mass above which a star of given mass and radius is swallowed whole: the disruption radius equals the outer horizon (estimate).', false),
  q('properTime', 's', 'time', PROPER_TIME, 'Time elapsed on the clock of a stationary, orbiting or free-falling observer.', false),
  q('farAwayTime', 's', 'time', PROPER_TIME, 'Boyer–Lindquist time t elapsed: the time of a clock at rest far away.', false),
  q('riverTime', 's', 'time', PROPER_TIME, 'Gullstrand–Painlevé / Doran time T elapsed: the proper time of observers falling from rest at infinity.', false),
  q('lag', 's', 'time', PROPER_TIME, 'farAwayTime - properTime of a stationary clock, computed without cancellation.', false),
];

export const CATALOGUE_BY_NAME: ReadonlyMap<string, QuantityInfo> = new Map(CATALOGUE.map((c) => [c.name, c]));

export function quantityInfo(name: string): QuantityInfo {
  const info = CATALOGUE_BY_NAME.get(name);
  if (!info) throw new Error(`quantity "${name}" is not in the catalogue`);
  return info;
}
