/**
 * The shared request pieces — body and point — as zod schemas, and their normalisation into SI and
 * geometric values with the physical checks (422) that a schema cannot express.
 */
import { z } from 'zod';
import { type BodyScales } from '../catalogue.js';
import { invalid, unphysical } from '../errors.js';
import { ergosurfaceRadius, horizons, type KerrNewman } from '../physics/spacetime.js';
import { C, C2, CHARGE_TO_LENGTH, G } from '../units/constants.js';
import { PRESETS } from '../units/presets.js';
import { isPlainNumber, MAX_QUANTITY_LENGTH, QuantityError, toLength, toSI, type Dimension } from '../units/quantity.js';

/** Documented limits of the inputs. */
export const LIMITS = {
  /** Mass range, kg: below it GM/c² underflows meaningful scales; above it exceeds any known object. */
  massMinKg: 1e-30,
  massMaxKg: 1e60,
  /** Largest |spin| and |charge| (a/M, Q/M) accepted for a body with a surface. */
  maxSpinOrCharge: 1e20,
  /** Largest r in units of GM/c²; beyond it fourth powers of r approach the double-precision range. */
  maxRadiusGeometric: 1e60,
} as const;

export const quantityInput = z
  .union([z.number(), z.string().max(MAX_QUANTITY_LENGTH)])
  .meta({
    description:
      'A number in the SI unit, or a string "<number> <unit>" such as "10 Msun", "6 rg", "35786 km", "60 deg", "0.5 c".',
  });

export const presetName = z.enum(['sun', 'earth']).meta({
  description: 'A body preset: "sun" (IAU 2015 nominal values) or "earth" (IERS 2010 GM, WGS84 radius).',
});

export const bodyObject = z
  .strictObject({
    mass: quantityInput.meta({ description: 'Mass: kg, or e.g. "10 Msun", "1 Mearth".' }),
    spin: quantityInput.optional().meta({
      description:
        'Spin: a number is a/M = cJ/(GM²) ≥ 0 (≤ 1 for a black hole); a string with a unit of angular momentum ("5.86e33 kg m^2/s") is J. Default 0.',
    }),
    charge: quantityInput.optional().meta({
      description: 'Charge: a number is the geometrized Q/M; a string in coulombs ("1e20 C") is Q. Default 0.',
    }),
    radius: quantityInput.optional().meta({
      description:
        'Radius of a body with a surface (Boyer–Lindquist r of its equator). Omit for a black hole.',
    }),
  })
  .meta({ id: 'BodyParameters' });

export const bodyInput = z.union([presetName, bodyObject]).meta({ id: 'Body' });

export const pointInput = z
  .strictObject({
    r: quantityInput.optional().meta({ description: 'Boyer–Lindquist radius: m, or e.g. "6 rg", "35786 km".' }),
    altitude: quantityInput
      .optional()
      .meta({ description: 'Height above the equatorial radius of a body with a surface (instead of r).' }),
    theta: quantityInput
      .optional()
      .meta({ description: 'Polar angle from the spin axis, rad or e.g. "60 deg"; default π/2 (equator).' }),
    latitude: quantityInput.optional().meta({
      description: 'Latitude from the equatorial plane, −90° to 90° (instead of theta): θ = 90° − latitude.',
    }),
  })
  .meta({ id: 'Point' });

export type BodyInput = z.infer<typeof bodyInput>;
export type PointInput = z.infer<typeof pointInput>;

export type Family = 'schwarzschild' | 'reissnerNordstrom' | 'kerr' | 'kerrNewman';

/** A normalised body: SI scales, dimensionless spin and charge, and the spacetime it generates. */
export interface Body extends BodyScales {
  preset: 'sun' | 'earth' | null;
  /** GM, m^3 s^-2. */
  gm: number;
  /** a/M. */
  spin: number;
  /** Q/M (geometrized). */
  charge: number;
  chargeCoulomb: number;
  /** J, kg m^2 s^-1. */
  angularMomentum: number;
  /** Equatorial radius in m, or null for a black hole. */
  radius: number | null;
  /** Rotation rate of the surface, rad/s, when the preset defines one (the Earth), else null. */
  rotationRate: number | null;
  /** radius / rg, or null. */
  radiusGeometric: number | null;
  family: Family;
  spacetime: KerrNewman;
}

export interface Point {
  /** Boyer–Lindquist r, m. */
  r: number;
  /** r / rg. */
  rGeometric: number;
  /** Height above the equatorial surface, m, or null for a black hole. */
  altitude: number | null;
  theta: number;
}

/** Runs a units-layer read, turning a QuantityError into a 400 naming the field. */
function at<T>(path: string, fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof QuantityError) throw invalid(path, err.message);
    throw err;
  }
}

/** A client quantity in SI; 400 naming the field when it cannot be read as that dimension. */
export function readQuantity(input: number | string, dim: Dimension, path: string, scale?: { rg: number; tg: number }): number {
  return at(path, () => toSI(input, dim, scale));
}
const read = readQuantity;

/**
 * A client length as { si (m), geometric (units of GM/c²) } — exact for lengths given in rg — that
 * must be positive (or ≥ 0 with `allowZero`) and within the documented limit; 400 if unreadable, 422
 * outside that range.
 */
export function readLength(
  input: number | string,
  path: string,
  scale: { rg: number; tg: number },
  allowZero = false,
): { si: number; geometric: number } {
  const l = at(path, () => toLength(input, scale));
  if (!(allowZero ? l.geometric >= 0 : l.geometric > 0)) throw unphysical(path, `must be ${allowZero ? '≥ 0' : 'positive'}`);
  if (!(l.geometric <= LIMITS.maxRadiusGeometric)) {
    throw unphysical(path, `must not exceed ${LIMITS.maxRadiusGeometric} GM/c² (documented limit)`);
  }
  return l;
}

/**
 * A client coordinate length of either sign (a Cartesian x, y or z) as { si, geometric } — exact for
 * lengths given in rg — whose magnitude is within the documented limit; 400 if unreadable, 422 beyond it.
 */
export function readSignedLength(input: number | string, path: string, scale: { rg: number; tg: number }): { si: number; geometric: number } {
  const l = at(path, () => toLength(input, scale));
  if (!(Math.abs(l.geometric) <= LIMITS.maxRadiusGeometric)) {
    throw unphysical(path, `|value| must not exceed ${LIMITS.maxRadiusGeometric} GM/c² (documented limit)`);
  }
  return l;
}

/** A client angle in rad that must lie in [lo, hi]; 400 if unreadable, 422 outside the range. */
export function readAngle(input: number | string, path: string, lo: number, hi: number, range: string): number {
  const x = read(input, 'angle', path);
  if (!(x >= lo && x <= hi)) throw unphysical(path, `must lie in ${range}`);
  return x;
}

function familyOf(a: number, q: number): Family {
  if (a === 0) return q === 0 ? 'schwarzschild' : 'reissnerNordstrom';
  return q === 0 ? 'kerr' : 'kerrNewman';
}

/** Normalises a body; `path` is where it sits in the request (for error messages). */
export function normalizeBody(input: BodyInput, path = '/body'): Body {
  let gm: number;
  let spinIn: number | string | undefined;
  let chargeIn: number | string | undefined;
  let radius: number | null = null;
  let radiusGiven: number | null = null;
  let preset: Body['preset'] = null;
  if (typeof input === 'string') {
    const p = PRESETS[input];
    preset = p.name;
    gm = p.gm;
    radius = p.radius;
    // a/M = cJ/(G M²) = c J G / (GM)².
    spinIn = (C * p.angularMomentum * G) / (gm * gm);
  } else {
    const massKg = read(input.mass, 'mass', `${path}/mass`);
    if (!(massKg > 0)) throw unphysical(`${path}/mass`, 'mass must be positive');
    if (massKg < LIMITS.massMinKg || massKg > LIMITS.massMaxKg) {
      throw unphysical(
        `${path}/mass`,
        `mass must lie between ${LIMITS.massMinKg} kg and ${LIMITS.massMaxKg} kg (documented limit)`,
      );
    }
    gm = G * massKg;
    spinIn = input.spin;
    chargeIn = input.charge;
    if (input.radius !== undefined) {
      // A radius given in rg keeps its number exactly as the geometric radius (see toLength).
      const given = at(`${path}/radius`, () => toLength(input.radius!, { rg: gm / C2, tg: gm / (C2 * C) }));
      radius = given.si;
      radiusGiven = given.geometric;
      if (!(radius > 0)) throw unphysical(`${path}/radius`, 'radius must be positive');
    }
  }
  const massKg = gm / G;
  const rg = gm / C2;
  const tg = rg / C;

  // A plain number is a/M (and Q/M); a quantity with a unit is J (and Q in coulombs).
  let spin = 0;
  if (spinIn !== undefined) {
    const unitless = isPlainNumber(spinIn);
    spin = read(spinIn, unitless ? 'none' : 'angularMomentum', `${path}/spin`);
    if (!unitless) spin = (C * spin * G) / (gm * gm);
  }
  if (spin < 0) {
    throw invalid(`${path}/spin`, 'spin is a magnitude (≥ 0); the orbit direction says prograde or retrograde');
  }
  let charge = 0;
  if (chargeIn !== undefined) {
    const unitless = isPlainNumber(chargeIn);
    charge = read(chargeIn, unitless ? 'none' : 'charge', `${path}/charge`);
    if (!unitless) charge = (charge * CHARGE_TO_LENGTH) / rg;
  }
  for (const [name, v] of [['spin', spin], ['charge', charge]] as const) {
    if (!Number.isFinite(v) || Math.abs(v) > LIMITS.maxSpinOrCharge) {
      throw unphysical(`${path}/${name}`, `|${name}| must not exceed ${LIMITS.maxSpinOrCharge} (in units of M)`);
    }
  }
  const spacetime: KerrNewman = { a: spin, q: charge };
  const h = horizons(spacetime);
  let radiusGeometric: number | null = null;
  if (radius === null) {
    if (!h) {
      throw nakedSingularity(path, spin, charge);
    }
  } else {
    radiusGeometric = radiusGiven ?? radius / rg;
    if (radiusGeometric > LIMITS.maxRadiusGeometric) {
      throw unphysical(`${path}/radius`, `radius must not exceed ${LIMITS.maxRadiusGeometric} GM/c² (documented limit)`);
    }
    if (h && radiusGeometric <= h.outer) {
      throw unphysical(
        `${path}/radius`,
        `radius ${radius} m lies inside the outer horizon (${h.outer * rg} m): this is a black hole; omit the radius`,
      );
    }
    const ergo = ergosurfaceRadius(spacetime, Math.PI / 2);
    if (ergo !== null && radiusGeometric <= ergo) {
      throw unphysical(
        `${path}/radius`,
        `radius ${radius} m lies inside the body's own ergosurface (${ergo * rg} m at the equator); the vacuum exterior cannot describe such a body`,
      );
    }
  }
  return {
    preset,
    gm,
    massKg,
    rg,
    tg,
    spin,
    charge,
    chargeCoulomb: (charge * rg) / CHARGE_TO_LENGTH,
    angularMomentum: (spin * gm * gm) / (C * G),
    radius,
    radiusGeometric,
    rotationRate: preset ? PRESETS[preset].rotationRate : null,
    family: familyOf(spin, charge),
    spacetime,
  };
}

/** The 422 for spin² + charge² > 1 without a surface, naming both fields. */
function nakedSingularity(path: string, spin: number, charge: number) {
  const message = `spin² + charge² = ${spin * spin + charge * charge} > 1: a black hole cannot have this spin and charge (it would be a naked singularity); give a radius for a body with a surface`;
  const err = unphysical(`${path}/spin`, message);
  err.errors?.push({ path: `${path}/charge`, message });
  return err;
}

/** Normalises a point around a normalised body. */
export function normalizePoint(input: PointInput, body: Body, path = '/point'): Point {
  const scale = { rg: body.rg, tg: body.tg };
  let theta = Math.PI / 2;
  if (input.theta !== undefined && input.latitude !== undefined) {
    throw invalid(path, 'give either theta or latitude, not both');
  }
  if (input.latitude !== undefined) {
    const latitude = read(input.latitude, 'angle', `${path}/latitude`);
    if (latitude < -Math.PI / 2 || latitude > Math.PI / 2) {
      throw unphysical(`${path}/latitude`, 'latitude must lie in [−90°, 90°]');
    }
    theta = Math.PI / 2 - latitude;
  }
  if (input.theta !== undefined) {
    theta = read(input.theta, 'angle', `${path}/theta`);
    if (theta < 0 || theta > Math.PI) {
      throw unphysical(`${path}/theta`, 'theta is the polar angle from the spin axis and must lie in [0, π] (0° to 180°)');
    }
  }
  if (input.r !== undefined && input.altitude !== undefined) {
    throw invalid(path, 'give either r or altitude, not both');
  }
  let r: number;
  let rGeometric: number;
  let altitude: number | null = null;
  const rInput = input.r;
  if (rInput !== undefined) {
    ({ si: r, geometric: rGeometric } = at(`${path}/r`, () => toLength(rInput, scale)));
    if (body.radius !== null) altitude = r - body.radius;
  } else if (input.altitude !== undefined) {
    if (body.radius === null) {
      throw invalid(`${path}/altitude`, 'altitude needs a body with a surface (a radius); give r for a black hole');
    }
    altitude = read(input.altitude, 'length', `${path}/altitude`, scale);
    r = body.radius + altitude;
    rGeometric = r / body.rg;
  } else {
    throw invalid(path, 'give r or altitude');
  }
  const where = rInput !== undefined ? `${path}/r` : `${path}/altitude`;
  if (!(r > 0)) throw unphysical(where, 'r must be positive (r = 0 is the central singularity)');
  if (!(rGeometric <= LIMITS.maxRadiusGeometric)) {
    throw unphysical(where, `r must not exceed ${LIMITS.maxRadiusGeometric} GM/c² (documented limit)`);
  }
  // Compared in units of GM/c², exactly as the physics layer classifies the point.
  if (body.radiusGeometric !== null && rGeometric < body.radiusGeometric) {
    throw unphysical(
      where,
      `the point (r = ${r} m) lies below the body's surface (radius ${body.radius} m): the vacuum exterior does not apply inside a body`,
    );
  }
  return { r, rGeometric, altitude, theta };
}

const queryValue = (description: string) => z.string().max(MAX_QUANTITY_LENGTH).optional().meta({ description });

/** Query string of the flat GET endpoints: a body and a point, each field a string. */
export const bodyPointQuery = z
  .strictObject({
    body: presetName.optional(),
    mass: queryValue('Mass, e.g. "10 Msun" or kg (instead of body).'),
    spin: queryValue('a/M (or angular momentum with a unit, e.g. "5.86e33 kg m^2/s"). Default 0.'),
    charge: queryValue('Q/M (or coulombs with a unit, e.g. "1e20 C"). Default 0.'),
    radius: queryValue('Radius of a body with a surface; omit for a black hole.'),
    r: queryValue('Boyer–Lindquist radius, e.g. "6 rg", "35786 km", or m.'),
    altitude: queryValue('Height above the equatorial surface (instead of r).'),
    theta: queryValue('Polar angle from the spin axis, e.g. "60 deg", or rad; default the equator.'),
    latitude: queryValue('Latitude, e.g. "40 deg" (instead of theta).'),
  })
  .meta({ id: 'BodyPointQuery' });
export type BodyPointQuery = z.infer<typeof bodyPointQuery>;

/** Builds the POST-shaped { body, point } from the flat query. */
export function bodyPointFromQuery(q: BodyPointQuery): { body: BodyInput; point: PointInput } {
  const hasParameters = q.mass !== undefined || q.spin !== undefined || q.charge !== undefined || q.radius !== undefined;
  let body: BodyInput;
  if (q.body !== undefined) {
    if (hasParameters) throw invalid('/body', 'give either body (a preset name) or mass, spin, charge, radius — not both');
    body = q.body;
  } else {
    if (q.mass === undefined) throw invalid('/body/mass', 'give body (a preset name) or mass');
    body = { mass: q.mass };
    if (q.spin !== undefined) body.spin = q.spin;
    if (q.charge !== undefined) body.charge = q.charge;
    if (q.radius !== undefined) body.radius = q.radius;
  }
  const point: PointInput = {};
  if (q.r !== undefined) point.r = q.r;
  if (q.altitude !== undefined) point.altitude = q.altitude;
  if (q.theta !== undefined) point.theta = q.theta;
  if (q.latitude !== undefined) point.latitude = q.latitude;
  return { body, point };
}

/** Maps POST-style error paths ("/body/mass", "/point") to the query parameter names. */
export function queryPath(path: string): string {
  const segs = path.split('/').filter(Boolean);
  const [head, field] = segs;
  if (head === 'body') return field ?? 'body';
  if (head === 'point') return field ?? 'r';
  return head ?? 'query';
}
