/**
 * GET|POST /v1/orbits/circular — a circular equatorial orbit at r: frequencies, periods, energy,
 * angular momentum, stability, epicyclic and precession frequencies.
 * POST /v1/orbits/precession — weak-field precessions: periapsis advance of an eccentric orbit, and the
 * geodetic and frame-dragging precessions of a gyroscope on a circular orbit.
 */
import { z } from 'zod';
import { canonicalBody, canonicalPoint } from '../cache/key.js';
import { invalid, unphysical } from '../errors.js';
import { circularOrbit } from '../physics/orbits.js';
import {
  geodeticPrecessionRate,
  lenseThirringGyroscopePrecession,
  lenseThirringNodalRate,
  periapsisAdvance,
} from '../physics/precession.js';
import { JULIAN_YEAR } from '../units/constants.js';
import { toQuantity } from '../units/convert.js';
import {
  bodyInput,
  bodyPointFromQuery,
  bodyPointQuery,
  normalizeBody,
  normalizePoint,
  pointInput,
  queryPath,
  quantityInput,
  readAngle,
  readLength,
  readQuantity,
} from './inputs.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, pointEcho, pointEchoSchema, quantityValue, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';
import { region } from '../physics/spacetime.js';

const direction = z.enum(['prograde', 'retrograde']).meta({ description: 'With or against the body\'s spin (default prograde).' });

export const circularRequest = z
  .strictObject({ body: bodyInput, point: pointInput, direction: direction.optional() })
  .meta({ id: 'CircularOrbitRequest' });
export type CircularRequest = z.infer<typeof circularRequest>;

export const circularQuery = bodyPointQuery.extend({ direction: direction.optional() }).meta({ id: 'CircularOrbitQuery' });

export const ORBIT_QUANTITIES = [
  'orbitalAngularVelocity',
  'orbitalFrequency',
  'coordinatePeriod',
  'properPeriod',
  'orbitalSpeed',
  'orbitClockRate',
  'specificEnergy',
  'bindingEnergy',
  'specificAngularMomentum',
  'radialEpicyclicFrequency',
  'verticalEpicyclicFrequency',
  'periastronPrecessionFrequency',
  'nodalPrecessionFrequency',
] as const;
type OrbitQuantity = (typeof ORBIT_QUANTITIES)[number];

export const circularResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    point: pointEchoSchema,
    direction: direction,
    orbit: z.object({
      exists: z.boolean(),
      stable: z.boolean().nullable().meta({ description: 'Radially and vertically stable (outside the ISCO).' }),
      bound: z.boolean().nullable().meta({ description: 'Specific energy below 1 (inside the marginally bound orbit: unbound).' }),
      reason: z.string().optional(),
    }),
    quantities: z.object(Object.fromEntries(ORBIT_QUANTITIES.map((n) => [n, quantityValue]))),
    notes: z.array(z.string()),
  })
  .meta({ id: 'CircularOrbitResponse' });
export type CircularResponse = z.infer<typeof circularResponse>;

const TWO_PI = 2 * Math.PI;

export function computeCircular(input: CircularRequest): CircularResponse {
  const body = normalizeBody(input.body);
  const point = normalizePoint(input.point, body);
  if (Math.abs(Math.cos(point.theta)) > 1e-12) {
    throw unphysical('/point/theta', 'circular geodesic orbits are computed in the equatorial plane (θ = 90°)');
  }
  const dir = input.direction ?? 'prograde';
  const o = circularOrbit(body.spacetime, point.rGeometric, dir);
  if (!o.exists && (o.reason === 'insideHorizon' || o.reason === 'onHorizon')) {
    throw unphysical(input.point.r !== undefined ? '/point/r' : '/point/altitude', o.message);
  }
  const geo = new Map<OrbitQuantity, number>();
  let reason: string | undefined;
  const notes = bodyNotes(body);
  if (o.exists) {
    const absOmega = Math.abs(o.angularVelocity);
    const hz = (x: number | null) => (x === null ? Number.NaN : x / TWO_PI);
    geo.set('orbitalAngularVelocity', o.angularVelocity);
    geo.set('orbitalFrequency', absOmega / TWO_PI);
    geo.set('coordinatePeriod', o.coordinatePeriod);
    geo.set('properPeriod', o.properPeriod);
    geo.set('orbitalSpeed', o.zamoSpeed ?? Number.NaN);
    geo.set('orbitClockRate', o.clockRate);
    geo.set('specificEnergy', o.energy);
    geo.set('bindingEnergy', o.bindingEnergy);
    geo.set('specificAngularMomentum', o.angularMomentum);
    geo.set('radialEpicyclicFrequency', hz(o.radialEpicyclicFrequency));
    geo.set('verticalEpicyclicFrequency', hz(o.verticalEpicyclicFrequency));
    geo.set('periastronPrecessionFrequency', hz(o.periastronPrecession));
    geo.set('nodalPrecessionFrequency', hz(o.nodalPrecession));
    if (!o.stable) notes.push('Inside the ISCO: the orbit exists but is unstable (κ_r² < 0); a small push makes it plunge or escape.');
    if (!o.bound) notes.push('Unbound (E > 1): inside the marginally bound orbit a small outward push lets the body escape.');
  } else {
    reason = o.message;
  }
  const epicyclic = 'κ² < 0: the orbit is unstable to this oscillation, so it has no epicyclic frequency';
  const quantities = Object.fromEntries(
    ORBIT_QUANTITIES.map((n) => {
      let why = reason;
      if (!why && /Epicyclic|Precession/.test(n)) why = epicyclic;
      if (!why && n === 'orbitalSpeed') why = 'no ZAMO exists here to measure the speed';
      return [n, toQuantity(n, geo.get(n) ?? Number.NaN, body, why)];
    }),
  );
  notes.push(
    'Frequencies are per far-away time, in Hz (cycles per second); orbitalAngularVelocity is signed (negative for retrograde). Periastron and nodal precession frequencies are Ω − κ_r and Ω − κ_θ.',
  );
  return {
    service,
    body: bodyEcho(body),
    point: pointEcho(point, region(body.spacetime, point.rGeometric, point.theta, body.radiusGeometric ?? undefined)),
    direction: dir,
    orbit: o.exists
      ? { exists: true, stable: o.stable, bound: o.bound }
      : { exists: false, stable: null, bound: null, reason: o.message },
    quantities,
    notes,
  };
}

export const circularRoute: ComputeRoute<CircularRequest, z.infer<typeof circularQuery>> = {
  path: '/v1/orbits/circular',
  operationId: 'circularOrbit',
  summary: 'A circular equatorial orbit',
  description:
    'Orbital angular velocity and frequency, coordinate and proper period, speed measured by the local ZAMO, specific energy and angular momentum, stability, radial and vertical epicyclic frequencies, periastron and nodal precession frequencies — in SI and geometric units. Null with the reason below the photon orbit; flagged unstable inside the ISCO and unbound inside the marginally bound orbit.',
  tag: 'orbits',
  body: circularRequest,
  get: {
    query: circularQuery,
    toInput: (q) => {
      const { direction: d, ...rest } = q;
      const out: CircularRequest = bodyPointFromQuery(rest);
      if (d !== undefined) out.direction = d;
      return out;
    },
    pathFor: queryPath,
  },
  response: circularResponse,
  compute: computeCircular,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    const point = normalizePoint(input.point, body);
    return { body: canonicalBody(body), point: canonicalPoint(point), direction: input.direction ?? 'prograde' };
  },
};

// ---- weak-field precessions ----------------------------------------------------------------------

export const precessionRequest = z
  .strictObject({
    body: bodyInput,
    orbit: z.strictObject({
      semiMajorAxis: quantityInput.meta({ description: 'Semi-major axis (for the gyroscope: the circular orbit radius), e.g. "7020 km", "0.387 AU".' }),
      eccentricity: z.number().min(0).lt(1).optional().meta({ description: 'Eccentricity, 0 ≤ e < 1 (default 0).' }),
      inclination: quantityInput.optional().meta({
        description: 'Angle between the orbit normal and the body\'s spin axis: 0 equatorial prograde, "90 deg" polar (default 0).',
      }),
      period: quantityInput.optional().meta({ description: 'Orbital period for the per-century rates (default Kepler\'s).' }),
    }),
  })
  .meta({ id: 'PrecessionRequest' });
export type PrecessionRequest = z.infer<typeof precessionRequest>;

const angle = z
  .object({ value: z.number(), unit: z.literal('rad'), arcseconds: z.number() })
  .meta({ id: 'AngleValue' });
const rate = z
  .object({ value: z.number(), unit: z.literal('rad/s'), milliarcsecondsPerYear: z.number() })
  .meta({ id: 'AngularRate' });

export const precessionResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    orbit: z.object({
      semiMajorAxis: z.object({ value: z.number(), unit: z.literal('m'), geometric: z.number() }),
      eccentricity: z.number(),
      inclination: z.object({ value: z.number(), unit: z.literal('rad') }),
      period: z.object({ value: z.number(), unit: z.literal('s') }),
    }),
    periapsisAdvancePerOrbit: angle,
    periapsisAdvancePerCentury: angle,
    periapsisAdvanceParts: z.object({ schwarzschild: angle, charge: angle, frameDragging: angle }).meta({
      description: 'Per orbit: 6πGM/(c²a(1−e²)), the charge term, and the Lense–Thirring term.',
    }),
    nodalPrecession: rate.meta({ description: 'Lense–Thirring drift of the ascending node.' }),
    geodeticPrecession: rate.meta({ description: 'de Sitter precession of a gyroscope on the circular orbit of radius semiMajorAxis.' }),
    frameDraggingPrecession: rate.meta({ description: 'Orbit-averaged Lense–Thirring (Schiff) precession of the gyroscope, magnitude.' }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'PrecessionResponse' });
export type PrecessionResponse = z.infer<typeof precessionResponse>;

const ARCSEC = Math.PI / (180 * 3600);
const CENTURY = 100 * JULIAN_YEAR;

export function computePrecession(input: PrecessionRequest): PrecessionResponse {
  const body = normalizeBody(input.body);
  const o = input.orbit;
  const A = readLength(o.semiMajorAxis, '/orbit/semiMajorAxis', body);
  const e = o.eccentricity ?? 0;
  if (A.geometric * (1 - e) < 100) {
    throw unphysical('/orbit/semiMajorAxis', 'weak-field formulas need the periapsis far outside the body\'s gravitational radius (a(1 − e) ≥ 100 GM/c²); use /v1/orbits/circular in strong fields');
  }
  if (body.radius !== null && A.si * (1 - e) < body.radius) {
    throw unphysical('/orbit/semiMajorAxis', `the periapsis ${A.si * (1 - e)} m lies below the body's surface (radius ${body.radius} m)`);
  }
  const inclination = o.inclination === undefined ? 0 : readAngle(o.inclination, '/orbit/inclination', 0, Math.PI, '[0°, 180°]');
  let periodGeo: number | undefined;
  if (o.period !== undefined) {
    const p = readQuantity(o.period, 'time', '/orbit/period', body);
    if (!(p > 0)) throw unphysical('/orbit/period', 'the period must be positive');
    periodGeo = p / body.tg;
  }
  const s = body.spacetime;
  const adv = periapsisAdvance(s, A.geometric, e, periodGeo === undefined ? { inclination } : { inclination, period: periodGeo });
  if (!adv) throw unphysical('/orbit', 'the orbit elements are outside the domain of the weak-field formulas');
  const toAngle = (x: number) => ({ value: x, unit: 'rad' as const, arcseconds: x / ARCSEC });
  const toRate = (geo: number) => {
    const si = geo / body.tg;
    return { value: si, unit: 'rad/s' as const, milliarcsecondsPerYear: (si * JULIAN_YEAR) / (ARCSEC / 1000) };
  };
  const periodSi = adv.period * body.tg;
  const notes = bodyNotes(body);
  notes.push(
    'Leading post-Newtonian order in each effect; the body\'s quadrupole (J2) is not included (for the Earth it dominates the classical node and periapsis motion).',
    'The gyroscope precessions are for a circular orbit of radius semiMajorAxis; the frame-dragging one needs the body\'s angular momentum (spin).',
  );
  return {
    service,
    body: bodyEcho(body),
    orbit: {
      semiMajorAxis: { value: A.si, unit: 'm', geometric: A.geometric },
      eccentricity: e,
      inclination: { value: inclination, unit: 'rad' },
      period: { value: periodSi, unit: 's' },
    },
    periapsisAdvancePerOrbit: toAngle(adv.perOrbit),
    periapsisAdvancePerCentury: toAngle((adv.perOrbit * CENTURY) / periodSi),
    periapsisAdvanceParts: { schwarzschild: toAngle(adv.schwarzschild), charge: toAngle(adv.charge), frameDragging: toAngle(adv.frameDragging) },
    nodalPrecession: toRate(lenseThirringNodalRate(s.a, A.geometric, e)),
    geodeticPrecession: toRate(geodeticPrecessionRate(A.geometric)),
    frameDraggingPrecession: toRate(lenseThirringGyroscopePrecession(s.a, A.geometric, inclination).magnitude),
    notes,
  };
}

export const precessionRoute: ComputeRoute<PrecessionRequest> = {
  path: '/v1/orbits/precession',
  operationId: 'precession',
  summary: 'Weak-field precessions of orbits and gyroscopes',
  description:
    'Periapsis advance of an eccentric orbit per orbit and per century (Schwarzschild, charge and frame-dragging parts), the Lense–Thirring drift of the node, and the geodetic and frame-dragging precessions of a gyroscope on a circular orbit — for bodies such as the Sun and the Earth, at leading post-Newtonian order.',
  tag: 'orbits',
  body: precessionRequest,
  response: precessionResponse,
  compute: computePrecession,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    const o = input.orbit;
    return {
      body: canonicalBody(body),
      semiMajorAxis: readLength(o.semiMajorAxis, '/orbit/semiMajorAxis', body),
      eccentricity: o.eccentricity ?? 0,
      inclination: o.inclination === undefined ? 0 : readAngle(o.inclination, '/orbit/inclination', 0, Math.PI, '[0°, 180°]'),
      period: o.period === undefined ? null : readQuantity(o.period, 'time', '/orbit/period', body),
    };
  },
};
