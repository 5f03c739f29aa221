/**
 * The characteristic circular equatorial orbits of a black hole: the photon orbit, the marginally
 * bound orbit and the innermost stable circular orbit (ISCO), prograde and retrograde, with Ω, E, L and
 * 1 − E there. Q = 0 takes the Bardeen–Press–Teukolsky closed forms; Q ≠ 0 the root finding of
 * orbit-roots.ts on the residuals of orbits.ts. Geometric units G = c = M = 1.
 */
import type { OrbitDirection } from './observers.js';
import { characteristicRadiiByRootFinding, type CharacteristicRadii } from './orbit-roots.js';
import { circularOrbit } from './orbits.js';
import { horizons, type KerrNewman } from './spacetime.js';

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
