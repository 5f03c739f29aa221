/**
 * Sweeps of the body-only quantities (horizons, ergosurface, horizon thermodynamics, characteristic
 * orbits, values at a body's surface) over arrays of bodies (a, Q, surface radius R), geometric units.
 *
 * These depend on the body alone, so a sweep evaluates them once per distinct body (the caller passes
 * one entry per value of the axes that change the body, and consecutive equal bodies are evaluated
 * once) by calling the same scalar functions as /v1/spacetime: the values are bit-for-bit those of the
 * single request. The mass only scales the SI value (the caller's factor).
 */
import { horizonProperties, type HorizonProperties } from './horizon.js';
import { evaluateLocal } from './local.js';
import { characteristicOrbits } from './characteristic-orbits.js';
import { ergosurfaceRadius, type KerrNewman } from './spacetime.js';
import { bodyDomainCode, REASON, ReasonTable, SI_NOT_FINITE, type SweepParam } from './sweep.js';

/** The body-only quantities a sweep can evaluate (the sweepable /v1/spacetime quantities). */
export const BODY_QUANTITIES = [
  'schwarzschildRadius',
  'outerHorizon',
  'innerHorizon',
  'ergosurfaceEquator',
  'ergosurfacePole',
  'surfaceGravity',
  'hawkingTemperature',
  'horizonArea',
  'horizonAngularVelocity',
  'horizonElectricPotential',
  'irreducibleMass',
  'compactness',
  'surfaceEscapeSpeed',
  'surfaceClockOffset',
  'surfaceHoverAcceleration',
  ...(['Prograde', 'Retrograde'] as const).flatMap(
    (d) =>
      [
        `photonOrbit${d}`,
        `marginallyBoundOrbit${d}`,
        `isco${d}`,
        `iscoEnergy${d}`,
        `iscoAngularMomentum${d}`,
        `iscoEfficiency${d}`,
      ] as const,
  ),
] as const;
export type BodyQuantity = (typeof BODY_QUANTITIES)[number];

// The reason texts of the body quantities, shared with /v1/spacetime (api/spacetime.ts).
export const BLACK_HOLE_ONLY = 'a property of a black hole\'s horizon; this body has a surface and no horizon';
export const SURFACE_ONLY = 'a black hole has no surface';
export const NAKED = 'spin² + charge² > 1: the vacuum exterior has no horizon';
const NO_ERGOSURFACE = 'g_tt has no root here: there is no ergosurface';
const NO_ISCO_EL = 'in the extremal limit the ISCO meets the horizon in Boyer–Lindquist r and E, L are not defined there';
/** Fallbacks (without the body-specific length) when a sweep's reason table is full. */
const BELOW_SURFACE_GENERIC = 'it would lie inside the body: it does not exist';

/** The properties of a black hole's outer horizon (physics/horizon.ts), shared with /v1/spacetime. */
export const HORIZON_QUANTITIES = [
  'surfaceGravity',
  'hawkingTemperature',
  'horizonArea',
  'horizonAngularVelocity',
  'horizonElectricPotential',
  'irreducibleMass',
] as const satisfies readonly BodyQuantity[];
const HORIZON_KEYS = new Set<string>(HORIZON_QUANTITIES);

/** Formats a geometric length as the SI text /v1/spacetime writes into its reasons ("1234 m"). */
export type LengthText = (rGeometric: number, index: number) => string;

/** One body quantity for one body: its geometric value, or NaN and the reason text. */
function evaluateOne(name: BodyQuantity, s: KerrNewman, R: number, length: (r: number) => string): { v: number; why: string; generic: string } {
  const none = { v: Number.NaN, why: '', generic: '' };
  const hasSurface = R === R;
  const below = (what: string, r: number) => ({
    v: Number.NaN,
    why: `the ${what} of the vacuum exterior would lie at ${length(r)} m, inside the body: it does not exist`,
    generic: BELOW_SURFACE_GENERIC,
  });
  if (name === 'schwarzschildRadius') return { ...none, v: 2 };
  if (name === 'outerHorizon' || name === 'innerHorizon' || HORIZON_KEYS.has(name)) {
    const hp = horizonProperties(s);
    if (hp && !hasSurface) {
      const v = name === 'outerHorizon' ? hp.outer : name === 'innerHorizon' ? hp.inner : hp[name as keyof HorizonProperties];
      return { ...none, v };
    }
    if (HORIZON_KEYS.has(name)) return { ...none, why: BLACK_HOLE_ONLY, generic: BLACK_HOLE_ONLY };
    if (!hp) return { ...none, why: NAKED, generic: NAKED };
    return below(name === 'outerHorizon' ? 'outer horizon' : 'inner horizon', name === 'outerHorizon' ? hp.outer : hp.inner);
  }
  if (name === 'ergosurfaceEquator' || name === 'ergosurfacePole') {
    const e = ergosurfaceRadius(s, name === 'ergosurfaceEquator' ? Math.PI / 2 : 0);
    if (e === null) return { ...none, why: NO_ERGOSURFACE, generic: NO_ERGOSURFACE };
    if (hasSurface && e < R) return below('ergosurface', e);
    return { ...none, v: e };
  }
  if (name === 'compactness' || name === 'surfaceEscapeSpeed' || name === 'surfaceClockOffset' || name === 'surfaceHoverAcceleration') {
    if (!hasSurface) return { ...none, why: SURFACE_ONLY, generic: SURFACE_ONLY };
    if (name === 'compactness') return { ...none, v: 2 / R };
    const at = evaluateLocal(s, R, Math.PI / 2, R);
    const key = name === 'surfaceEscapeSpeed' ? 'escapeSpeed' : name === 'surfaceClockOffset' ? 'staticClockOffset' : 'hoverAcceleration';
    const why = at.reasons[key] ?? '';
    return { v: at.values[key], why, generic: why };
  }
  // Characteristic orbits.
  const m = /^(photonOrbit|marginallyBoundOrbit|isco|iscoEnergy|iscoAngularMomentum|iscoEfficiency)(Prograde|Retrograde)$/.exec(name);
  const field = m![1]!;
  const d = m![2] as 'Prograde' | 'Retrograde';
  const kind = field.startsWith('isco') ? 'isco' : (field as 'photonOrbit' | 'marginallyBoundOrbit');
  const o = characteristicOrbits(s)[`${kind}${d}`];
  if (!o.exists) return { ...none, why: o.message, generic: o.message };
  if (hasSurface && o.r < R) {
    return {
      v: Number.NaN,
      why: `this orbit (r = ${length(o.r)} m) would lie inside the body: the vacuum exterior does not reach it`,
      generic: 'this orbit would lie inside the body: the vacuum exterior does not reach it',
    };
  }
  if (field === kind) return { ...none, v: o.r };
  const v = field === 'iscoEnergy' ? o.energy : field === 'iscoAngularMomentum' ? o.angularMomentum : o.bindingEnergy;
  if (o.energy === null) return { ...none, why: NO_ISCO_EL, generic: NO_ISCO_EL };
  return { ...none, v: v ?? Number.NaN };
}

/**
 * Evaluates body quantity `name` for n bodies (spin `a`, charge `q`, surface radius `surface` or NaN
 * for a black hole), writing value × factor into `out` (NaN where it does not exist) and reason codes
 * into `codes`, interning body-specific texts in `table`. A body outside the domain (naked singularity
 * without a surface, radius inside its horizon or ergosurface) gets its domain code. `length` formats
 * a geometric length of body `index` in metres for the reasons that name one; `lengthScale` (the
 * caller's metres per M) tells apart bodies whose reasons name different lengths.
 */
export function sweepBody(
  name: BodyQuantity,
  n: number,
  a: SweepParam,
  q: SweepParam,
  surface: SweepParam,
  factor: SweepParam,
  out: Float64Array,
  codes: Uint8Array,
  table: ReasonTable,
  length: LengthText,
  lengthScale: SweepParam = 1,
): void {
  const at = (p: SweepParam, i: number) => (typeof p === 'number' ? p : p[i]!);
  let lastA = Number.NaN;
  let lastQ = Number.NaN;
  let lastR = Number.NaN;
  let lastF = Number.NaN;
  let lastL = Number.NaN;
  let lastV = Number.NaN;
  let lastCode = 0;
  let first = true;
  for (let i = 0; i < n; i++) {
    const ai = at(a, i);
    const qi = at(q, i);
    const Ri = at(surface, i);
    const fi = at(factor, i);
    const li = at(lengthScale, i);
    // The reason may name a length in metres, so the factor and the length scale are part of the identity.
    const same =
      !first && ai === lastA && qi === lastQ && fi === lastF && li === lastL && (Ri === lastR || (Ri !== Ri && lastR !== lastR));
    if (!same) {
      first = false;
      lastA = ai;
      lastQ = qi;
      lastR = Ri;
      lastF = fi;
      lastL = li;
      const domain = bodyDomainCode(ai, qi, Ri);
      if (domain !== 0) {
        lastV = Number.NaN;
        lastCode = domain;
      } else {
        const r = evaluateOne(name, { a: ai, q: qi }, Ri, (x) => length(x, i));
        if (r.why !== '' || !(r.v - r.v === 0)) {
          lastV = Number.NaN;
          lastCode = r.why !== '' ? table.intern(r.why, r.generic) : table.intern(SI_NOT_FINITE, SI_NOT_FINITE);
        } else {
          const si = r.v * fi;
          lastV = si - si === 0 ? si : Number.NaN;
          lastCode = si - si === 0 ? REASON.none : REASON.siNotFinite;
        }
      }
    }
    out[i] = lastV;
    codes[i] = lastCode;
  }
}
