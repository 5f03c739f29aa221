/**
 * Light: POST /v1/light/deflection (bending of a ray), POST /v1/light/delay (Shapiro delay) and
 * POST /v1/shadow (the critical curve of a black hole and its angular size).
 */
import { z } from 'zod';
import { invalid, ProblemError, unphysical } from '../errors.js';
import { deflection, LIGHT_REASONS, type RayInput } from '../physics/deflection.js';
import { shapiroDelay } from '../physics/delay.js';
import { shadow } from '../physics/shadow.js';
import { distantAngularSize, staticObserverShadowRadius } from '../physics/shadow-angular-size.js';
import { bodyInput, normalizeBody, quantityInput, readAngle, readLength, type Body } from './inputs.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';
import { canonicalBody } from '../cache/key.js';

const ARCSEC = Math.PI / (180 * 3600);
const MICROARCSEC = ARCSEC * 1e-6;

const rayInput = z
  .strictObject({
    impactParameter: quantityInput.optional().meta({ description: 'Impact parameter b = L/E, e.g. "10 rg", "1 Rsun".' }),
    closestApproach: quantityInput.optional().meta({ description: 'Or: Boyer–Lindquist radius of closest approach r₀.' }),
  })
  .meta({ id: 'Ray', description: 'Give exactly one of impactParameter and closestApproach.' });
type RayIn = z.infer<typeof rayInput>;

const length = (body: Body, v: number | string, path: string) => readLength(v, path, body);

function ray(body: Body, r: RayIn, path: string): RayInput {
  if ((r.impactParameter === undefined) === (r.closestApproach === undefined)) {
    throw invalid(path, 'give exactly one of impactParameter and closestApproach');
  }
  return r.impactParameter !== undefined
    ? { impactParameter: length(body, r.impactParameter, `${path}/impactParameter`).geometric }
    : { closestApproach: length(body, r.closestApproach!, `${path}/closestApproach`).geometric };
}

/** A refusal from the physics layer as a 422 (or, for a quadrature that did not converge, its own type). */
function refusal(reason: string, message: string, path: string): ProblemError {
  if (reason === 'notConverged') return new ProblemError('tolerance-not-met', message, [{ path, message }]);
  return unphysical(path, message);
}

const angleValue = z
  .object({ value: z.number().nullable(), unit: z.literal('rad'), arcseconds: z.number().nullable(), reason: z.string().optional() })
  .meta({ id: 'Angle' });
type Angle = z.infer<typeof angleValue>;
const lengthValue = z
  .object({ value: z.number().nullable(), unit: z.literal('m'), geometric: z.number().nullable(), reason: z.string().optional() })
  .meta({ id: 'Length' });
type Length = z.infer<typeof lengthValue>;

function angle(x: number | null, reason?: string): Angle {
  if (x === null || !Number.isFinite(x)) return { value: null, unit: 'rad', arcseconds: null, reason: reason ?? 'not finite' };
  return { value: x, unit: 'rad', arcseconds: x / ARCSEC };
}
function len(body: Body, x: number | null, reason?: string): Length {
  if (x === null || !Number.isFinite(x)) return { value: null, unit: 'm', geometric: null, reason: reason ?? 'not finite' };
  return { value: x * body.rg, unit: 'm', geometric: x };
}

// ---- deflection ----------------------------------------------------------------------------------

export const deflectionRequest = z
  .strictObject({
    body: bodyInput,
    ray: rayInput,
    direction: z.enum(['prograde', 'retrograde']).optional().meta({
      description: 'For a spinning hole: the ray passes in the equatorial plane with or against the spin (default prograde).',
    }),
    tolerance: z.number().min(1e-15).max(1e-3).optional().meta({ description: 'Relative tolerance of the quadrature (default 1e-12).' }),
  })
  .meta({ id: 'DeflectionRequest' });
export type DeflectionRequest = z.infer<typeof deflectionRequest>;

export const deflectionResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    direction: z.enum(['prograde', 'retrograde']),
    deflection: angleValue.meta({ description: 'Exact total bending angle of the ray; null with the reason when it is captured.' }),
    weakFieldFirstOrder: angleValue.meta({ description: '4GM/(c²b).' }),
    weakFieldSecondOrder: angleValue.meta({ description: '4GM/(c²b) plus the second-order term (15π/4 − 3πQ²/4 ∓ 4a)(GM/c²b)².' }),
    impactParameter: lengthValue,
    closestApproach: lengthValue,
    criticalImpactParameter: lengthValue.meta({ description: 'Below it the ray is captured.' }),
    photonOrbit: lengthValue.meta({ description: 'Radius of the equatorial circular photon orbit for this direction.' }),
    method: z.enum(['darwin', 'series', 'quadrature', 'none']),
    errorEstimate: z.object({ value: z.number(), unit: z.literal('rad') }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'DeflectionResponse' });
export type DeflectionResponse = z.infer<typeof deflectionResponse>;

export function computeDeflection(input: DeflectionRequest): DeflectionResponse {
  const body = normalizeBody(input.body);
  const req = { ray: ray(body, input.ray, '/ray'), direction: input.direction ?? 'prograde' } as const;
  const withSurface = body.radiusGeometric === null ? req : { ...req, surfaceRadius: body.radiusGeometric };
  const d = deflection(body.spacetime, withSurface, input.tolerance === undefined ? {} : { relativeTolerance: input.tolerance });
  if (!d.ok) throw refusal(d.reason, d.message, d.reason === 'insidePhotonOrbit' || d.reason === 'insideBody' ? '/ray' : '/body');
  const why = d.reason ? LIGHT_REASONS[d.reason] : undefined;
  const noPhotonOrbit = 'no circular photon orbit exists outside this body';
  const notes = bodyNotes(body);
  notes.push(
    d.method === 'darwin'
      ? 'Exact deflection from Darwin\'s elliptic-integral form (Carlson\'s R_F).'
      : d.method === 'series'
        ? 'Exact deflection from its convergent series in GM/(c²b) (far from the photon orbit).'
        : d.method === 'quadrature'
          ? 'Exact deflection by tanh-sinh quadrature of the equatorial orbit equation.'
          : 'No deflection angle: the ray does not pass a closest approach and come back out (the reason is given with it).',
  );
  if (body.spin !== 0) notes.push('With spin the ray is taken in the equatorial plane.');
  return {
    service,
    body: bodyEcho(body),
    direction: d.direction,
    deflection: angle(d.deflection, why),
    weakFieldFirstOrder: angle(d.weakFieldFirstOrder),
    weakFieldSecondOrder: angle(d.weakFieldSecondOrder),
    impactParameter: len(body, d.impactParameter),
    closestApproach: len(body, d.closestApproach, why),
    criticalImpactParameter: len(body, d.criticalImpactParameter, noPhotonOrbit),
    photonOrbit: len(body, d.photonOrbitRadius, noPhotonOrbit),
    method: d.method,
    errorEstimate: { value: d.errorEstimate, unit: 'rad' },
    notes,
  };
}

export const deflectionRoute: ComputeRoute<DeflectionRequest> = {
  path: '/v1/light/deflection',
  operationId: 'deflection',
  summary: 'Bending of a light ray',
  description:
    'Exact deflection of a ray given by its impact parameter or closest approach — Darwin\'s elliptic-integral form for Schwarzschild, quadrature of the orbit equation for Reissner–Nordström and equatorial Kerr–Newman (prograde and retrograde) — with the weak-field first- and second-order values beside it, and capture below the critical impact parameter.',
  tag: 'light',
  body: deflectionRequest,
  response: deflectionResponse,
  compute: computeDeflection,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    return { body: canonicalBody(body), ray: ray(body, input.ray, '/ray'), direction: input.direction ?? 'prograde', tolerance: input.tolerance ?? null };
  },
};

// ---- Shapiro delay -------------------------------------------------------------------------------

export const delayRequest = z
  .strictObject({
    body: bodyInput,
    from: quantityInput.meta({ description: 'Distance of one end from the body (e.g. "1 AU").' }),
    to: quantityInput.meta({ description: 'Distance of the other end (e.g. "1.52 AU").' }),
    ray: rayInput,
  })
  .meta({ id: 'DelayRequest' });
export type DelayRequest = z.infer<typeof delayRequest>;

const timeValue = z.object({ value: z.number(), unit: z.literal('s'), microseconds: z.number() }).meta({ id: 'Duration' });
type Duration = z.infer<typeof timeValue>;

export const delayResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    oneWay: timeValue.meta({
      description:
        'Exact excess coordinate time of the signal over the straight flat-space path, with r₁, r₂, r₀ read as Schwarzschild radii. That reading of the radii is a choice of coordinates and changes the excess by terms of order GM/c³ per leg; observations are analysed with the weak-field formula (weakFieldOneWay) in the coordinates of the ephemerides.',
    }),
    roundTrip: timeValue,
    weakFieldOneWay: timeValue.meta({ description: 'Shapiro\'s logarithmic formula (2GM/c³) ln[(r₁ + √(r₁² − r₀²))(r₂ + √(r₂² − r₀²))/r₀²].' }),
    weakFieldRoundTrip: timeValue,
    weakFieldCorrectedOneWay: timeValue.meta({ description: 'The logarithmic formula with the further first-order terms (Weinberg 1972).' }),
    flatTravelTime: timeValue.meta({ description: 'Light time along the straight path, √(r₁² − r₀²) + √(r₂² − r₀²) over c.' }),
    closestApproach: lengthValue,
    impactParameter: lengthValue,
    errorEstimate: timeValue,
    notes: z.array(z.string()),
  })
  .meta({ id: 'DelayResponse' });
export type DelayResponse = z.infer<typeof delayResponse>;

export function computeDelay(input: DelayRequest): DelayResponse {
  const body = normalizeBody(input.body);
  const r1 = length(body, input.from, '/from');
  const r2 = length(body, input.to, '/to');
  const req = { r1: r1.geometric, r2: r2.geometric, ray: ray(body, input.ray, '/ray') };
  const d = shapiroDelay(body.radiusGeometric === null ? req : { ...req, surfaceRadius: body.radiusGeometric });
  if (!d.ok) throw refusal(d.reason, d.message, d.reason === 'endBelowClosestApproach' ? '/to' : '/ray');
  const t = (x: number): Duration => ({ value: x * body.tg, unit: 's', microseconds: x * body.tg * 1e6 });
  const notes = bodyNotes(body);
  notes.push(
    'The delay is computed in the Schwarzschild field of the mass (spin and charge are not included); times are coordinate times of a far-away clock, before any conversion to the clocks at the ends.',
    'The exact delay is measured against √(r² − r₀²) in Schwarzschild coordinates; the weak-field formula is what observations quote — the two differ by terms of order GM/c³ per leg.',
  );
  return {
    service,
    body: bodyEcho(body),
    oneWay: t(d.oneWay),
    roundTrip: t(d.roundTrip),
    weakFieldOneWay: t(d.weakFieldOneWay),
    weakFieldRoundTrip: t(2 * d.weakFieldOneWay),
    weakFieldCorrectedOneWay: t(d.weakFieldCorrectedOneWay),
    flatTravelTime: t(d.flatTravelTime),
    closestApproach: len(body, d.closestApproach),
    impactParameter: len(body, d.impactParameter),
    errorEstimate: t(d.errorEstimate),
    notes,
  };
}

export const delayRoute: ComputeRoute<DelayRequest> = {
  path: '/v1/light/delay',
  operationId: 'delay',
  summary: 'Shapiro delay of a signal passing a body',
  description:
    'Excess travel time of a signal between two points whose path passes the body at closest approach r₀: the exact Schwarzschild coordinate-time integral and the weak-field formula, one way and round trip.',
  tag: 'light',
  body: delayRequest,
  response: delayResponse,
  compute: computeDelay,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    return { body: canonicalBody(body), from: length(body, input.from, '/from'), to: length(body, input.to, '/to'), ray: ray(body, input.ray, '/ray') };
  },
};

// ---- shadow --------------------------------------------------------------------------------------

export const shadowRequest = z
  .strictObject({
    body: bodyInput,
    inclination: quantityInput.meta({ description: 'Angle between the line of sight and the spin axis, 0° to 180° (e.g. "17 deg").' }),
    distance: quantityInput.optional().meta({ description: 'Distance of the observer (e.g. "16.8 Mpc") for angular sizes.' }),
    points: z.number().int().min(8).max(4096).optional().meta({ description: 'Points on the curve (8 to 4096, default 256).' }),
  })
  .meta({ id: 'ShadowRequest' });
export type ShadowRequest = z.infer<typeof shadowRequest>;

const angularSize = z
  .object({ value: z.number().nullable(), unit: z.literal('rad'), microarcseconds: z.number().nullable(), reason: z.string().optional() })
  .meta({ id: 'AngularSize' });

export const shadowResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    inclination: z.object({ value: z.number(), unit: z.literal('rad'), degrees: z.number() }),
    curve: z
      .object({ alpha: z.array(z.number()), beta: z.array(z.number()), unit: z.literal('GM/c^2') })
      .meta({ description: 'Celestial coordinates (α, β) of the critical curve, in units of GM/c², α along the projected equator.' }),
    horizontalDiameter: lengthValue,
    verticalDiameter: lengthValue,
    meanRadius: lengthValue,
    centreDisplacement: lengthValue.meta({ description: 'α of the midpoint of the horizontal extent.' }),
    circularityDeviation: z.number().meta({ description: 'ΔC: rms deviation of the radius from its mean, over the mean.' }),
    diameterAsymmetry: z.number().meta({ description: '(horizontal − vertical diameter) / vertical diameter.' }),
    angularDiameter: angularSize.meta({
      description: 'Angular diameter seen from `distance`: Synge\'s exact formula for a non-rotating hole, 2·meanRadius·GM/(c²D) otherwise.',
    }),
    angularScale: angularSize.meta({ description: 'GM/(c²D): the angle subtended by one gravitational radius.' }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'ShadowResponse' });
export type ShadowResponse = z.infer<typeof shadowResponse>;

export function computeShadow(input: ShadowRequest): ShadowResponse {
  const body = normalizeBody(input.body);
  if (body.radius !== null) throw unphysical('/body', 'a body with a surface casts no black-hole shadow; omit the radius for a black hole');
  const inc = readAngle(input.inclination, '/inclination', 0, Math.PI, '[0°, 180°]');
  const sh = shadow(body.spacetime, inc, input.points ?? 256);
  if (!sh.ok) throw unphysical(sh.reason === 'invalidPointCount' ? '/points' : '/body', sh.message);
  const notes = bodyNotes(body);
  const noDistance = 'give distance for angular sizes';
  let angularDiameter: z.infer<typeof angularSize> = { value: null, unit: 'rad', microarcseconds: null, reason: noDistance };
  let angularScale: z.infer<typeof angularSize> = { ...angularDiameter };
  if (input.distance !== undefined) {
    const D = length(body, input.distance, '/distance');
    const far = distantAngularSize(body.spacetime, 2 * sh.meanRadius, D.geometric);
    if (!far.ok) throw unphysical('/distance', far.message);
    const exact = body.spin === 0 ? staticObserverShadowRadius(body.spacetime, D.geometric) : null;
    const diameter = exact && exact.ok ? 2 * exact.angularRadius : far.angle;
    angularDiameter = { value: diameter, unit: 'rad', microarcseconds: diameter / MICROARCSEC };
    angularScale = { value: 1 / D.geometric, unit: 'rad', microarcseconds: 1 / D.geometric / MICROARCSEC };
    notes.push(
      exact && exact.ok
        ? 'angularDiameter: Synge\'s exact formula for a static observer at this distance (Synge 1966).'
        : 'angularDiameter: distant-observer size 2·meanRadius·GM/(c²D); corrections are of order GM/(c²D).',
    );
  }
  notes.push('Critical curve by Bardeen\'s construction from the spherical photon orbits, with charge.');
  return {
    service,
    body: bodyEcho(body),
    inclination: { value: inc, unit: 'rad', degrees: (inc * 180) / Math.PI },
    curve: { alpha: Array.from(sh.alpha), beta: Array.from(sh.beta), unit: 'GM/c^2' },
    horizontalDiameter: len(body, sh.horizontalDiameter),
    verticalDiameter: len(body, sh.verticalDiameter),
    meanRadius: len(body, sh.meanRadius),
    centreDisplacement: len(body, sh.centreDisplacement),
    circularityDeviation: sh.circularityDeviation,
    diameterAsymmetry: sh.diameterAsymmetry,
    angularDiameter,
    angularScale,
    notes,
  };
}

export const shadowRoute: ComputeRoute<ShadowRequest> = {
  path: '/v1/shadow',
  operationId: 'shadow',
  summary: 'The shadow of a black hole',
  description:
    'The critical curve of a Kerr–Newman black hole seen from inclination i, sampled for plotting; its horizontal and vertical diameters, mean radius, centre displacement and asymmetry; and its angular size in microarcseconds for an observer at a given distance.',
  tag: 'light',
  body: shadowRequest,
  response: shadowResponse,
  compute: computeShadow,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    return {
      body: canonicalBody(body),
      inclination: readAngle(input.inclination, '/inclination', 0, Math.PI, '[0°, 180°]'),
      distance: input.distance === undefined ? null : length(body, input.distance, '/distance'),
      points: input.points ?? 256,
    };
  },
};
