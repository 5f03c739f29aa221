/**
 * Stationary observers around one body and the rates of their clocks.
 *
 * Geometric units G = c = M = 1 (lengths in GM/c², times in GM/c³, angular velocities in c³/(GM)).
 * A stationary observer at (r, θ) moves along the Killing field ∂_t + Ω ∂_φ with constant angular
 * velocity Ω (as seen from far away): u = u^t (∂_t + Ω ∂_φ), and its clock runs at
 *   dτ/dt = 1/u^t = √N,   N = −(g_tt + 2Ω g_tφ + Ω² g_φφ)
 * relative to far-away time t (Bardeen, Press & Teukolsky 1972, ApJ 178, 347, §II; Wald 1984, General
 * Relativity, §6.3). With x = μ/Σ (μ = 2r − Q², Σ = r² + a² cos²θ) the Boyer–Lindquist components are
 * g_tt = −1 + x, g_tφ = −a sin²θ x, g_φφ = (r² + a²) sin²θ + a² sin⁴θ x, so
 *   y ≡ 1 − N = x (1 − Ω a sin²θ)² + Ω² (r² + a²) sin²θ,
 * a sum of two non-negative terms wherever μ ≥ 0: every term is computed directly and the offset
 * 1 − rate = y/(1 + √(1 − y)) keeps full relative precision however small it is (the 1 cm height
 * difference at the Earth's surface is 1.1e−18). Expanding y term by term (x − 2Ω a sin²θ x + Ω² g_φφ)
 * gives the same value; the tests check both forms against the mpmath fixture.
 *
 * Kinds: static (Ω = 0), ZAMO (Ω = ω = a μ/A, the frame-dragging rate), circular equatorial geodesic
 * orbits (Ω = ±√(r − Q²)/(r² ± a √(r − Q²)), the root of ∂_r g_tt + 2Ω ∂_r g_tφ + Ω² ∂_r g_φφ = 0),
 * rotating with a given Ω (a clock on a spinning planet), and distant (at rest at infinity, rate 1).
 *
 * The log-rate splits exactly into three parts, each evaluated with log1p:
 *   ln(dτ/dt) = ln √(−g_tt)  +  ln(1 + Ω g_tφ/g_tt)  +  ln(1/γ_s),
 * gravitational (the static clock), frame-dragging (zero when a = 0 or Ω = 0), and motion relative to
 * the local static observer, γ_s = u^t (−g_tt − Ω g_tφ)/√(−g_tt), with
 *   v_s² = Ω² Δ sin²θ/(−g_tt − Ω g_tφ)²    (from g_tφ² − g_tt g_φφ = Δ sin²θ).
 * For a = 0 this is the familiar gravitational + velocity split; for a ≠ 0 the middle term is needed
 * (a ZAMO moves relative to the static observers, yet its clock runs faster than theirs).
 */
import { horizons, pointFunctions, type KerrNewman, type PointFunctions } from './spacetime.js';

export type ObserverKind = 'static' | 'zamo' | 'circular' | 'rotating' | 'distant';
export type OrbitDirection = 'prograde' | 'retrograde';

/** What the caller asks for; r and θ are Boyer–Lindquist (units of M, radians). */
export type ObserverSpec =
  | { kind: 'static'; r: number; theta: number }
  | { kind: 'zamo'; r: number; theta: number }
  /** Equatorial; θ, if given, must be π/2 (within 1e−12 in cos θ). */
  | { kind: 'circular'; r: number; direction: OrbitDirection; theta?: number }
  /** Ω in radians per unit t (c³/(GM)), positive in the sense of the body's spin. */
  | { kind: 'rotating'; r: number; theta: number; angularVelocity: number }
  | { kind: 'distant' };

/** The three parts of ln(dτ/dt); null where no static observer exists to split against. */
export interface RateSplit {
  /** ln √(−g_tt) = ½ log1p(−μ/Σ): the static clock at this point. */
  gravitational: number;
  /** ln(1 + Ω g_tφ/g_tt) = log1p(Ω a sin²θ μ/(Σ − μ)): the motion's coupling to frame dragging. */
  frameDragging: number;
  /** ln(1/γ_s) = ½ log1p(−v_s²): time dilation of the motion relative to the static observer. */
  motion: number;
}

export interface Observer {
  exists: true;
  kind: ObserverKind;
  /** Boyer–Lindquist r (Infinity for the distant observer). */
  r: number;
  theta: number;
  /** Ω = dφ/dt. */
  angularVelocity: number;
  /** dτ/dt. */
  rate: number;
  /** 1 − dτ/dt, without cancellation. */
  offset: number;
  /** ln(dτ/dt) = ½ log1p(−y). */
  logRate: number;
  /** Contravariant four-velocity (u^t, u^φ); u^r = u^θ = 0. */
  fourVelocity: { t: number; phi: number };
  /** Conserved energy per unit mass E = −u_t. */
  energy: number;
  /** Conserved angular momentum per unit mass L = u_φ (units of M). */
  angularMomentum: number;
  /** Velocity relative to the local ZAMO in units of c, signed (+ along +φ); null where no ZAMO. */
  velocityRelativeToZamo: number | null;
  /** Velocity relative to the local static observer, signed; null where no static observer exists. */
  velocityRelativeToStatic: number | null;
  /** Lorentz factor relative to the static observer, γ_s = u^t(−g_tt − Ω g_tφ)/√(−g_tt); null likewise. */
  lorentzFactorStatic: number | null;
  /** The exact three-part split of ln(dτ/dt); null where no static observer exists. */
  split: RateSplit | null;
}

export type ObserverAbsenceReason =
  | 'invalidInput'
  | 'insideHorizon'
  | 'onHorizon'
  | 'ergoregion'
  | 'noZamo'
  | 'notEquatorial'
  | 'noCircularOrbit'
  | 'insidePhotonOrbit'
  | 'fasterThanLight';

export interface ObserverAbsent {
  exists: false;
  kind: ObserverKind;
  reason: ObserverAbsenceReason;
  message: string;
}

export type ObserverResult = Observer | ObserverAbsent;

export const OBSERVER_REASONS: Record<ObserverAbsenceReason, string> = {
  invalidInput: 'r must be a finite positive Boyer–Lindquist radius, θ in [0, π] and Ω finite',
  insideHorizon:
    'the point is inside the outer horizon: no clock there can be compared with far-away clocks (no light from it escapes; between the horizons no observer can even stay at fixed r)',
  onHorizon: 'the point is on the outer horizon: only light can stay there',
  ergoregion:
    'the point is on or inside the ergosurface: space is dragged around so fast that no observer can stay at fixed r, θ, φ',
  noZamo: 'no zero-angular-momentum observer exists here (g_φφ ≤ 0 or its lapse is not real)',
  notEquatorial: 'circular geodesic orbits are computed in the equatorial plane only (θ = π/2)',
  noCircularOrbit:
    'no circular geodesic orbit exists here: gravity does not hold a body on a circle at this radius (r ≤ Q², or the orbit equation has no physical root)',
  insidePhotonOrbit:
    'no timelike circular orbit exists here: at or inside the photon orbit an orbit would need the speed of light or more',
  fasterThanLight: 'at this angular velocity the observer would move at or faster than light (dτ/dt would not be real)',
};

/** Why no static observer or ZAMO can be at a point, whatever it is used for (see stationaryAbsence). */
export type StationaryAbsence = 'onHorizon' | 'betweenHorizons' | 'ergoregion' | 'noZamo';

export const STATIONARY_REASONS: Record<StationaryAbsence, string> = {
  onHorizon: 'the point is on a horizon: only light can stay there',
  betweenHorizons:
    'the point lies between the outer and the inner horizon, where r is a time coordinate: no observer can stay at fixed r',
  ergoregion: OBSERVER_REASONS.ergoregion,
  noZamo: OBSERVER_REASONS.noZamo,
};

/**
 * Where a static observer (u ∝ ∂_t) or a ZAMO (u ∝ ∂_t + ω ∂_φ) exists as a local frame: where Δ > 0,
 * i.e. outside the outer horizon or inside the inner one (between them r is a time coordinate, and on
 * them only light stays at fixed r); there the static observer needs g_tt < 0 (Σ > μ: outside the
 * ergosurface, or inside its inner sheet) and the ZAMO g_φφ > 0 (A > 0; not in the region of closed
 * timelike curves very close to the centre of a spinning, charged mass). Null where the observer exists. The
 * horizon test uses the roots themselves, so its sign is exact next to them (Δ = (r − r₊)(r − r₋));
 * a point whose computed Δ still rounds to ≤ 0 counts as on the horizon.
 * Whether a clock there can be compared with far-away clocks is a separate question
 * (stationaryObserver refuses every point on or inside the outer horizon for that reason).
 */
export function stationaryAbsence(
  s: KerrNewman,
  kind: 'static' | 'zamo',
  r: number,
  p: Pick<PointFunctions, 'sigma' | 'mu' | 'delta' | 'bigA'>,
): StationaryAbsence | null {
  const h = horizons(s);
  if (h && (r === h.outer || r === h.inner)) return 'onHorizon';
  if (h && r < h.outer && r > h.inner) return 'betweenHorizons';
  // Within rounding of a root Δ itself may come out ≤ 0: there the frames are not computable.
  if (!(p.delta > 0)) return 'onHorizon';
  if (kind === 'static') return p.sigma > p.mu ? null : 'ergoregion';
  return p.bigA > 0 ? null : 'noZamo';
}

function absent(kind: ObserverKind, reason: ObserverAbsenceReason): ObserverAbsent {
  return { exists: false, kind, reason, message: OBSERVER_REASONS[reason] };
}

/** cos θ within this of zero counts as the equator (cos of the double nearest π/2 is 6.1e−17). */
const EQUATOR_COS = 1e-12;

/**
 * Angular velocity Ω of a circular equatorial geodesic orbit in Kerr–Newman,
 *   Ω = ±√(r − Q²)/(r² ± a √(r − Q²))   (upper sign prograde; M = 1),
 * the root of ∂_r g_tt + 2Ω ∂_r g_tφ + Ω² ∂_r g_φφ = 0 (Bardeen, Press & Teukolsky 1972, ApJ 178,
 * 347, §II, for Q = 0: Ω = ±M^{1/2}/(r^{3/2} ± a M^{1/2}); with charge 2Mr → 2Mr − Q², checked with sympy
 * in test/fixtures/python/proper_time.py). NaN where
 * r ≤ Q² (no attraction to balance) or the denominator is not positive.
 */
export function circularOrbitAngularVelocity(s: KerrNewman, r: number, direction: OrbitDirection): number {
  const k = r - s.q * s.q;
  if (!(k > 0)) return Number.NaN;
  const sq = Math.sqrt(k);
  const sign = direction === 'prograde' ? 1 : -1;
  const den = r * r + sign * s.a * sq;
  if (!(den > 0)) return Number.NaN;
  return (sign * sq) / den;
}

/**
 * The observer described by `spec`, or the typed reason it does not exist (see the module comment for
 * the formulas). Every kind is refused on or inside the outer horizon; static inside the ergosurface;
 * ZAMO where g_φφ ≤ 0; circular off the equator, where r ≤ Q² or at/inside the photon orbit (N ≤ 0);
 * rotating where N ≤ 0 (it would move at c or faster).
 */
export function stationaryObserver(s: KerrNewman, spec: ObserverSpec): ObserverResult {
  if (spec.kind === 'distant') return distantObserver();
  const { r, kind } = spec;
  const theta = spec.kind === 'circular' ? (spec.theta ?? Math.PI / 2) : spec.theta;
  if (!(Number.isFinite(r) && r > 0 && Number.isFinite(theta) && theta >= 0 && theta <= Math.PI)) {
    return absent(kind, 'invalidInput');
  }
  const h = horizons(s);
  if (h && r < h.outer) return absent(kind, 'insideHorizon');
  if (h && r === h.outer) return absent(kind, 'onHorizon');
  const p = pointFunctions(s, r, theta);
  let omega: number;
  switch (spec.kind) {
    case 'static':
    case 'zamo': {
      const reason = stationaryAbsence(s, spec.kind, r, p);
      // Outside the outer horizon (checked above) only 'ergoregion' or 'noZamo' can come back.
      if (reason) return absent(kind, reason === 'ergoregion' || reason === 'noZamo' ? reason : 'insideHorizon');
      omega = spec.kind === 'static' ? 0 : (s.a * p.mu) / p.bigA;
      break;
    }
    case 'circular':
      if (Math.abs(Math.cos(theta)) > EQUATOR_COS) return absent(kind, 'notEquatorial');
      omega = circularOrbitAngularVelocity(s, r, spec.direction);
      if (Number.isNaN(omega)) return absent(kind, 'noCircularOrbit');
      break;
    case 'rotating':
      if (!Number.isFinite(spec.angularVelocity)) return absent(kind, 'invalidInput');
      omega = spec.angularVelocity;
      break;
  }
  const x = p.mu / p.sigma;
  const asin2 = s.a * p.sin2;
  const drag = 1 - omega * asin2;
  let y = x * drag * drag + omega * omega * p.rho2 * p.sin2;
  let n = 1 - y;
  if (spec.kind === 'circular' && y > 0.5) {
    // Near the photon orbit N → 0 and 1 − y cancels; the orbit has the product form
    // N = r² (r² − 3r + 2Q² ± 2a√(r − Q²))/(r² ± a√(r − Q²))², whose zero is the photon orbit and
    // whose factor r(r − 3) is exact near r = 3 (sympy-checked in the fixture script).
    const sign = spec.direction === 'prograde' ? 1 : -1;
    const sq = Math.sqrt(r - s.q * s.q);
    const den = r * r + sign * s.a * sq;
    n = (r * r * (r * (r - 3) + 2 * s.q * s.q + 2 * sign * s.a * sq)) / (den * den);
    y = 1 - n;
  }
  if (!(n > 0)) {
    const reason: ObserverAbsenceReason =
      kind === 'circular' ? 'insidePhotonOrbit' : kind === 'zamo' ? 'noZamo' : kind === 'static' ? 'ergoregion' : 'fasterThanLight';
    return absent(kind, reason);
  }
  const rate = Math.sqrt(n);
  const ut = 1 / rate;
  const minusGtt = 1 - x;
  const gtphi = -asin2 * x;
  const gphph = p.rho2 * p.sin2 + asin2 * asin2 * x;
  // −g_tt − Ω g_tφ, the combination in E and γ_s.
  const eFactor = minusGtt + omega * asin2 * x;

  let vZamo: number | null = null;
  if (p.delta > 0 && p.bigA > 0) {
    if (kind === 'zamo') vZamo = 0;
    else {
      // v = (Ω − ω) √g_φφ / α = (Ω − ω) sinθ A/(Σ √Δ)  (Bardeen, Press & Teukolsky 1972, §III).
      const w = (s.a * p.mu) / p.bigA;
      vZamo = ((omega - w) * Math.sqrt(p.sin2) * p.bigA) / (p.sigma * Math.sqrt(p.delta));
    }
  }

  let vStatic: number | null = null;
  let gammaS: number | null = null;
  let split: RateSplit | null = null;
  if (minusGtt > 0 && p.delta >= 0) {
    const v = (omega * Math.sqrt(p.sin2 * p.delta)) / eFactor;
    vStatic = v;
    gammaS = (ut * eFactor) / Math.sqrt(minusGtt);
    split = {
      gravitational: 0.5 * Math.log1p(-x),
      frameDragging: Math.log1p((omega * asin2 * x) / minusGtt),
      motion: 0.5 * Math.log1p(-v * v),
    };
  }
  return {
    exists: true,
    kind,
    r,
    theta,
    angularVelocity: omega,
    rate,
    offset: y / (1 + rate),
    logRate: y < 0.5 ? 0.5 * Math.log1p(-y) : 0.5 * Math.log(n),
    fourVelocity: { t: ut, phi: omega * ut },
    energy: ut * eFactor,
    // A ZAMO has L = 0 by definition (the formula would leave rounding noise of g_tφ + ω g_φφ).
    angularMomentum: kind === 'zamo' ? 0 : ut * (gtphi + omega * gphph),
    velocityRelativeToZamo: vZamo,
    velocityRelativeToStatic: vStatic,
    lorentzFactorStatic: gammaS,
    split,
  };
}

/** The observer at rest far away: the reference clock of t (rate 1, all parts 0). */
export function distantObserver(): Observer {
  return {
    exists: true,
    kind: 'distant',
    r: Number.POSITIVE_INFINITY,
    theta: Math.PI / 2,
    angularVelocity: 0,
    rate: 1,
    offset: 0,
    logRate: 0,
    fourVelocity: { t: 1, phi: 0 },
    energy: 1,
    angularMomentum: 0,
    velocityRelativeToZamo: 0,
    velocityRelativeToStatic: 0,
    lorentzFactorStatic: 1,
    split: { gravitational: 0, frameDragging: 0, motion: 0 },
  };
}

/**
 * ½ ln[(1 − x_B)/(1 − x_A)] with x = μ/Σ, the gravitational part of ln(rate_B/rate_A), computed as
 * ½ log1p((x_A − x_B)/(1 − x_A)) with the difference formed structurally:
 *   μ_A Σ_B − μ_B Σ_A = (r_B − r_A)[2 r_A r_B − 2k_A − Q²(r_A + r_B)] + (k_B − k_A)(2 r_A − Q²),
 * k = a² cos²θ, k_B − k_A = a² sin(θ_A + θ_B) sin(θ_A − θ_B), so x_A − x_B = (μ_AΣ_B − μ_BΣ_A)/(Σ_AΣ_B)
 * keeps full relative precision when the two points are close (two clocks 1 cm apart in height at the
 * Earth's surface: 1.1e−18 out of x ≈ 1.4e−9). `dr` = r_B − r_A is taken as given, so a caller that
 * knows the height difference exactly can pass it instead of the difference of two rounded radii.
 * A distant point (r = ∞) has x = 0.
 */
export function gravitationalLogRatio(
  s: KerrNewman,
  rA: number,
  thetaA: number,
  rB: number,
  thetaB: number,
  dr: number = rB - rA,
): number {
  const q2 = s.q * s.q;
  const a2 = s.a * s.a;
  if (rA === Number.POSITIVE_INFINITY && rB === Number.POSITIVE_INFINITY) return 0;
  if (rB === Number.POSITIVE_INFINITY) {
    const pA = pointFunctions(s, rA, thetaA);
    return -0.5 * Math.log1p(-pA.mu / pA.sigma);
  }
  if (rA === Number.POSITIVE_INFINITY) {
    const pB = pointFunctions(s, rB, thetaB);
    return 0.5 * Math.log1p(-pB.mu / pB.sigma);
  }
  const pA = pointFunctions(s, rA, thetaA);
  const pB = pointFunctions(s, rB, thetaB);
  const kA = a2 * pA.cos2;
  const dk = thetaA === thetaB ? 0 : a2 * Math.sin(thetaA + thetaB) * Math.sin(thetaA - thetaB);
  const num = dr * (2 * rA * rB - 2 * kA - q2 * (rA + rB)) + dk * (2 * rA - q2);
  const dx = num / (pA.sigma * pB.sigma); // x_A − x_B
  const oneMinusXA = 1 - pA.mu / pA.sigma;
  return 0.5 * Math.log1p(dx / oneMinusXA);
}

/** A comparison of the clocks of two observers of the same body. */
export interface ClockComparison {
  /** rate_B / rate_A: seconds ticked by B per second ticked by A. */
  ratio: number;
  /** rate_B / rate_A − 1, as expm1 of the log-ratio (full relative precision for tiny offsets). */
  fractionalOffset: number;
  /** ln(rate_B / rate_A). */
  logRatio: number;
  /** Differences B − A of the three parts of ln(rate); null unless both observers have a split. */
  parts: RateSplit | null;
}

/**
 * Compares the clock of observer B with that of observer A at the same body: rate_B/rate_A, its
 * offset from 1 and the split of the log-ratio into gravitational, frame-dragging and motion parts
 * (B − A). The gravitational part uses {@link gravitationalLogRatio} (structural difference), so
 * nearby clocks keep full relative precision; the other parts are each small and exact to a few ulp.
 * Where either split is missing (an observer inside the ergosurface), the log-ratio is the difference
 * of the two log-rates.
 */
export function compareClocks(s: KerrNewman, a: Observer, b: Observer, dr?: number): ClockComparison {
  let logRatio: number;
  let parts: RateSplit | null = null;
  if (a.split && b.split) {
    parts = {
      gravitational: gravitationalLogRatio(s, a.r, a.theta, b.r, b.theta, dr ?? b.r - a.r),
      frameDragging: b.split.frameDragging - a.split.frameDragging,
      motion: b.split.motion - a.split.motion,
    };
    logRatio = parts.gravitational + parts.frameDragging + parts.motion;
  } else {
    logRatio = b.logRate - a.logRate;
  }
  return { ratio: Math.exp(logRatio), fractionalOffset: Math.expm1(logRatio), logRatio, parts };
}

/** A light signal between two static (or distant) observers. */
export interface SignalFrequency {
  /** ν_received / ν_emitted = rate_A / rate_B (A the emitter). */
  ratio: number;
  /** ratio − 1 (positive: blueshift), via expm1. */
  shift: number;
  /** Redshift z = ν_emitted/ν_received − 1 = rate_B/rate_A − 1. */
  redshift: number;
}

/**
 * Frequency received by static (or distant) observer B per frequency emitted by static observer A:
 * ν_B/ν_A = √(−g_tt(A))/√(−g_tt(B)) = rate_A/rate_B, since k_t is conserved along the light ray and
 * ν = −k_t/√(−g_tt) for a static observer (Wald 1984, General Relativity, §6.3). Holds for any light
 * path. Null when either observer is not static or distant.
 */
export function signalFrequencyRatio(s: KerrNewman, emitter: Observer, receiver: Observer, dr?: number): SignalFrequency | null {
  const staticLike = (o: Observer) => o.kind === 'static' || o.kind === 'distant';
  if (!staticLike(emitter) || !staticLike(receiver)) return null;
  const c = compareClocks(s, emitter, receiver, dr);
  return { ratio: Math.exp(-c.logRatio), shift: Math.expm1(-c.logRatio), redshift: c.fractionalOffset };
}
