/**
 * The body of a sweep, for prepareSweep: the template (a preset or its parameters), the mass axis and
 * the scales it gives, spin and charge (template and axes), and the surface radius. Read as
 * normalizeBody reads a single body; 400 for a malformed value, 422 outside the documented limits.
 */
import { invalid, unphysical } from '../errors.js';
import { C, C2, CHARGE_TO_LENGTH, G } from '../units/constants.js';
import { isPlainNumber } from '../units/quantity.js';
import { LIMITS, normalizeBody, readLength, readQuantity, type Body, type BodyInput } from './inputs.js';
import { readAxisRaw } from './sweep-point.js';
import type { SweepRequest } from './sweep.js';

type Axes = SweepRequest['axes'];
/** The scales of one mass: gm = G m (m³ s⁻²), massKg, rg = GM/c² (m), tg = GM/c³ (s). */
export type MassScale = { gm: number; massKg: number; rg: number; tg: number };

/** The body as given: a preset (normalised) or its parameters, the mass read unless an axis replaces it. */
export interface BodyTemplate {
  massInput: number;
  spinIn: number | string | undefined;
  chargeIn: number | string | undefined;
  radiusIn: number | string | undefined;
  preset: Body['preset'];
  presetBody: Body | null;
}

/**
 * Reads the body template. A preset cannot be combined with a mass axis; with a mass axis the template's
 * mass must still be readable, and its spin and charge must be plain numbers (a/M, Q/M).
 */
export function readBodyTemplate(bodyIn: BodyInput, massAxis: number | undefined): BodyTemplate {
  if (typeof bodyIn === 'string') {
    if (massAxis !== undefined) throw invalid(`/axes/${massAxis}`, 'a mass axis needs a body given by its parameters (mass, spin, charge, radius), not a preset');
    const b = normalizeBody(bodyIn);
    return { massInput: b.massKg, spinIn: b.spin, chargeIn: b.charge, radiusIn: b.radius ?? undefined, preset: b.preset, presetBody: b };
  }
  const base: BodyTemplate = { massInput: 0, spinIn: bodyIn.spin, chargeIn: bodyIn.charge, radiusIn: bodyIn.radius, preset: null, presetBody: null };
  if (massAxis === undefined) base.massInput = readMass(bodyIn.mass, '/body/mass');
  else {
    // The template's mass must still be readable, though the axis replaces it.
    readMass(bodyIn.mass, '/body/mass');
    for (const k of ['spin', 'charge'] as const) {
      const v = bodyIn[k];
      if (v !== undefined && !isPlainNumber(v)) {
        throw invalid(`/body/${k}`, `with a mass axis give ${k} as a plain number (${k === 'spin' ? 'a/M' : 'Q/M'}), not with a unit`);
      }
    }
  }
  return base;
}

/** The masses of the mass axis as read (or null), the scales at the first point, and per mass value. */
export interface MassScales {
  values: Float64Array | null;
  first: MassScale;
  perMass: { gm: Float64Array; massKg: Float64Array; rg: Float64Array; tg: Float64Array } | null;
}

/** Reads the mass axis (if any) and the scales: the preset's, the template's, or one per mass value. */
export function readMassScales(axes: Axes, massAxis: number | undefined, base: BodyTemplate): MassScales {
  const values = massAxis !== undefined ? readAxisRaw(axes[massAxis]!, massAxis, (x, p) => readMass(x, p)) : null;
  const pb = base.presetBody;
  const first = pb ? { gm: pb.gm, massKg: pb.massKg, rg: pb.rg, tg: pb.tg } : scalesOf(values ? values[0]! : base.massInput);
  if (!values) return { values, first, perMass: null };
  const m = values.length;
  const perMass = { gm: new Float64Array(m), massKg: new Float64Array(m), rg: new Float64Array(m), tg: new Float64Array(m) };
  for (let j = 0; j < m; j++) {
    const s = scalesOf(values[j]!);
    perMass.gm[j] = s.gm;
    perMass.massKg[j] = s.massKg;
    perMass.rg[j] = s.rg;
    perMass.tg[j] = s.tg;
  }
  return { values, first, perMass };
}

/** Spin and charge of the template (a/M, Q/M) and the values of their axes (null where not swept). */
export interface SpinCharge {
  spinBase: number;
  chargeBase: number;
  spinValues: Float64Array | null;
  chargeValues: Float64Array | null;
}

/** Reads the template's spin and charge (a unit reads them as J and C of the first mass), then their axes (indices `spin`, `charge`). */
export function readSpinAndCharge(
  axes: Axes,
  spin: number | undefined,
  charge: number | undefined,
  base: BodyTemplate,
  gm: number,
): SpinCharge {
  const pb = base.presetBody;
  const spinBase = pb ? pb.spin : base.spinIn === undefined ? 0 : readSpinCharge('spin', base.spinIn, '/body/spin', gm);
  const chargeBase = pb ? pb.charge : base.chargeIn === undefined ? 0 : readSpinCharge('charge', base.chargeIn, '/body/charge', gm);
  const spinValues = spin !== undefined ? readAxisRaw(axes[spin]!, spin, (x, p) => readSpinChargePlain('spin', x, p)) : null;
  const chargeValues = charge !== undefined ? readAxisRaw(axes[charge]!, charge, (x, p) => readSpinChargePlain('charge', x, p)) : null;
  return { spinBase, chargeBase, spinValues, chargeValues };
}

/** The surface: radius in m at the first point (null without one), geometric radius, per mass value. */
export interface Surface {
  radiusSI: number | null;
  /** Geometric radius at the first point (NaN without a surface). */
  surfaceBase: number;
  /** Geometric radius per mass value, when a mass axis varies it. */
  surfaceAxis: Float64Array | null;
}

/** The surface radius (geometric), per mass value when the mass varies. */
export function readSurface(base: BodyTemplate, masses: MassScales): Surface {
  if (base.presetBody) {
    return { radiusSI: base.presetBody.radius, surfaceBase: base.presetBody.radiusGeometric ?? Number.NaN, surfaceAxis: null };
  }
  if (base.radiusIn === undefined) return { radiusSI: null, surfaceBase: Number.NaN, surfaceAxis: null };
  const radiusIn = base.radiusIn;
  // As normalizeBody reads it: a radius given in rg keeps its number as the geometric radius.
  const radiusAt = (rg: number, tg: number) => readLength(radiusIn, '/body/radius', { rg, tg });
  const R0 = radiusAt(masses.first.rg, masses.first.tg);
  let surfaceAxis: Float64Array | null = null;
  const perMass = masses.perMass;
  if (perMass) {
    surfaceAxis = new Float64Array(perMass.rg.length);
    for (let j = 0; j < surfaceAxis.length; j++) surfaceAxis[j] = radiusAt(perMass.rg[j]!, perMass.tg[j]!).geometric;
  }
  return { radiusSI: R0.si, surfaceBase: R0.geometric, surfaceAxis };
}

/** Reads spin (a/M) or charge (Q/M) as normalizeBody does; with `gm`, a value with a unit is J or C. */
function readSpinCharge(kind: 'spin' | 'charge', input: number | string, path: string, gm: number): number {
  const unitless = isPlainNumber(input);
  let v = readQuantity(input, unitless ? 'none' : kind === 'spin' ? 'angularMomentum' : 'charge', path);
  if (!unitless) v = kind === 'spin' ? (C * v * G) / (gm * gm) : (v * CHARGE_TO_LENGTH) / (gm / C2);
  if (kind === 'spin' && v < 0) {
    throw invalid(path, 'spin is a magnitude (≥ 0); the orbit direction says prograde or retrograde');
  }
  if (!Number.isFinite(v) || Math.abs(v) > LIMITS.maxSpinOrCharge) {
    throw unphysical(path, `|${kind}| must not exceed ${LIMITS.maxSpinOrCharge} (in units of M)`);
  }
  return v;
}

/** Spin or charge on an axis: plain numbers (a/M, Q/M), the same limits as a body's. */
export function readSpinChargePlain(kind: 'spin' | 'charge', x: number | string, path: string): number {
  if (!isPlainNumber(x)) throw invalid(path, `a ${kind} axis takes plain numbers (${kind === 'spin' ? 'a/M' : 'Q/M'})`);
  return readSpinCharge(kind, x, path, 1);
}

/** Reads a mass in kg within the documented limits (422 outside). */
export function readMass(input: number | string, path: string): number {
  const m = readQuantity(input, 'mass', path);
  if (!(m > 0)) throw unphysical(path, 'mass must be positive');
  if (m < LIMITS.massMinKg || m > LIMITS.massMaxKg) {
    throw unphysical(path, `mass must lie between ${LIMITS.massMinKg} kg and ${LIMITS.massMaxKg} kg (documented limit)`);
  }
  return m;
}

/** The scales of a mass as normalizeBody computes them (gm = G m; m = gm/G; rg = gm/c²; tg = rg/c). */
function scalesOf(massInput: number): MassScale {
  const gm = G * massInput;
  const rg = gm / C2;
  return { gm, massKg: gm / G, rg, tg: rg / C };
}
