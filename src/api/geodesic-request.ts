/**
 * POST /v1/geodesic, the request: its zod schema, the documented limits, and its normalisation into a
 * physics request (src/physics/geodesic.ts) with the 400/413/422 checks a schema cannot express.
 */
import { z } from 'zod';
import { canonicalBody, canonicalPoint } from '../cache/key.js';
import { invalid, ProblemError, unphysical } from '../errors.js';
import type { GeodesicRequest } from '../physics/geodesic.js';
import { C } from '../units/constants.js';
import { bodyInput, normalizeBody, normalizePoint, pointInput, quantityInput, readAngle, readLength, readQuantity, type Body, type Point } from './inputs.js';

/** Documented limits of a geodesic request (README, Limits). */
export const GEODESIC_LIMITS = {
  /** Largest number of evenly spaced samples (the end point may add one more). */
  maxSamples: 10_000,
  defaultSamples: 500,
  /** Largest number of accepted integration steps. */
  maxSteps: 1_000_000,
  defaultSteps: 100_000,
  /** Largest duration (proper time or affine parameter), in GM/c³. */
  maxDuration: 1e12,
  defaultDuration: 5000,
  /** Tolerance range of the integrator (relative, per step). */
  minTolerance: 1e-14,
  maxTolerance: 1e-6,
  defaultTolerance: 1e-10,
  /** Largest escape radius, in GM/c² (beyond it fourth powers of r stay far from overflow). */
  maxEscapeRadius: 1e15,
} as const;

const pointWithPhi = pointInput.extend({
  phi: quantityInput.optional().meta({ description: 'Azimuth φ̃ (ingoing Kerr / Kerr–Schild) of the start, rad or e.g. "45 deg"; default 0.' }),
});

const launchStart = z
  .strictObject({
    kind: z.literal('launch'),
    point: pointWithPhi,
    observer: z.enum(['static', 'zamo', 'river']).meta({
      description:
        'The frame in which speed and direction are measured. static: at rest relative to the distant stars (only where g_tt < 0: outside the ergosurface, or inside the inner horizon but outside its inner ergosurface); zamo: zero angular momentum (outside the outer horizon or inside the inner one, where g_φφ > 0); river: falling freely from rest at infinity (E = 1, L = 0), everywhere 2r ≥ Q², inside the horizons too.',
    }),
    speed: quantityInput.optional().meta({
      description: 'Speed measured by the observer, e.g. "0.3 c" or m/s, in [0, c) for a massive particle (default 0: released at rest in that frame). Light needs none.',
    }),
    angle: quantityInput.optional().meta({
      description: 'Angle ψ of the launch direction from the outward radial direction of the observer\'s frame: 0 straight out, 90° tangential, 180° straight in. Default 0.',
    }),
    azimuth: quantityInput.optional().meta({
      description:
        'Angle χ around the radial direction, from the direction of increasing φ (the sense of the spin) towards the north (decreasing θ): 0 keeps a start on the equator in the equatorial plane, prograde; 180° retrograde. Default 0. Direction n = cos ψ e_r + sin ψ (cos χ e_φ − sin χ e_θ).',
    }),
  })
  .meta({ id: 'GeodesicLaunch' });

const constantsStart = z
  .strictObject({
    kind: z.literal('constants'),
    point: pointWithPhi,
    energy: z.number().meta({ description: 'E = −p_t per unit rest mass (units of c²); for light, any positive scale (the affine parameter scales with it).' }),
    angularMomentum: z.number().meta({ description: 'L = p_φ per unit rest mass, in units of GM/c (for light, in the same scale as energy).' }),
    carter: z.number().meta({ description: 'Carter constant K = p_θ² + cos²θ (a²(κ − E²) + L²/sin²θ), units of (GM/c)²; 0 for equatorial motion.' }),
    radialDirection: z.enum(['inward', 'outward']).meta({ description: 'Sign of dr/dλ at the start.' }),
    polarDirection: z.enum(['south', 'north']).optional().meta({ description: 'Sign of dθ/dλ at the start: south is increasing θ (default).' }),
  })
  .meta({ id: 'GeodesicConstants' });

export const geodesicRequest = z
  .strictObject({
    body: bodyInput,
    particle: z.enum(['massive', 'light']).meta({ description: 'A massive particle (timelike, λ = proper time) or light (null, λ an affine parameter).' }),
    start: z.discriminatedUnion('kind', [launchStart, constantsStart]).meta({ id: 'GeodesicStart' }),
    duration: quantityInput.optional().meta({
      description: `Largest proper time (or affine parameter for light) to follow, e.g. "2000 tg" or seconds; default ${GEODESIC_LIMITS.defaultDuration} GM/c³, at most ${GEODESIC_LIMITS.maxDuration} GM/c³.`,
    }),
    samples: z.number().int().min(2).optional().meta({
      description: `Samples evenly spaced in λ over the path: over [0, duration], or over [0, λ_end] when an event (horizon, singularity, surface, escape) ends it earlier (default ${GEODESIC_LIMITS.defaultSamples}, at most ${GEODESIC_LIMITS.maxSamples}: larger is a 413); the end point may add one.`,
    }),
    maxSteps: z.number().int().min(1).optional().meta({
      description: `Largest number of accepted integration steps (default ${GEODESIC_LIMITS.defaultSteps}, at most ${GEODESIC_LIMITS.maxSteps}: larger is a 413).`,
    }),
    tolerance: z.number().min(GEODESIC_LIMITS.minTolerance).max(GEODESIC_LIMITS.maxTolerance).optional().meta({
      description: `Relative tolerance of each integration step (absolute tolerance 1e−3 of it); default ${GEODESIC_LIMITS.defaultTolerance}.`,
    }),
    escapeRadius: quantityInput.optional().meta({ description: 'Radius at which an outgoing path counts as escaped, e.g. "1000 rg"; default max(1000 GM/c², 10 r₀).' }),
    stopAt: z.enum(['outerHorizon', 'innerHorizon']).optional().meta({
      description: 'Inside a black hole, stop at the outer horizon or follow the path on to the inner horizon (default; or to Σ ≤ 1e−4 M² of the singularity when there is no inner horizon).',
    }),
  })
  .meta({ id: 'GeodesicRequest' });
export type GeodesicRequestInput = z.infer<typeof geodesicRequest>;

export interface NormalizedGeodesic {
  body: Body;
  point: Point;
  phi: number;
  physics: GeodesicRequest;
  observer: 'static' | 'zamo' | 'river' | null;
}

function tooLarge(path: string, message: string): ProblemError {
  return new ProblemError('request-too-large', message, [{ path, message }]);
}

/** Normalises the request; 400/413/422 as documented. */
export function normalizeGeodesic(input: GeodesicRequestInput): NormalizedGeodesic {
  const body = normalizeBody(input.body);
  const L = GEODESIC_LIMITS;
  const samples = input.samples ?? L.defaultSamples;
  if (samples > L.maxSamples) throw tooLarge('/samples', `samples = ${samples} exceeds the limit of ${L.maxSamples} (documented limit)`);
  const maxSteps = input.maxSteps ?? L.defaultSteps;
  if (maxSteps > L.maxSteps) throw tooLarge('/maxSteps', `maxSteps = ${maxSteps} exceeds the limit of ${L.maxSteps} (documented limit)`);
  let duration: number = L.defaultDuration;
  if (input.duration !== undefined) {
    duration = readQuantity(input.duration, 'time', '/duration', body) / body.tg;
    if (!(duration > 0)) throw unphysical('/duration', 'the duration must be positive');
    if (!(duration <= L.maxDuration)) throw tooLarge('/duration', `the duration exceeds the limit of ${L.maxDuration} GM/c³ (${L.maxDuration * body.tg} s for this body)`);
  }
  const st = input.start;
  const point = normalizePoint(st.point, body, '/start/point');
  const phi = st.point.phi === undefined ? 0 : readQuantity(st.point.phi, 'angle', '/start/point/phi');
  if (!Number.isFinite(phi) || Math.abs(phi) > 1e6) throw unphysical('/start/point/phi', 'φ must be a finite angle of at most 1e6 rad');
  const r = point.rGeometric;
  let start: GeodesicRequest['start'];
  let observer: NormalizedGeodesic['observer'] = null;
  if (st.kind === 'launch') {
    observer = st.observer;
    let speed = 0;
    if (st.speed !== undefined) {
      if (input.particle === 'light') throw invalid('/start/speed', 'light moves at c: give no speed');
      speed = readQuantity(st.speed, 'speed', '/start/speed') / C;
      if (!(speed >= 0 && speed < 1)) throw unphysical('/start/speed', 'the speed of a massive particle must lie in [0, c)');
    }
    const psi = st.angle === undefined ? 0 : readAngle(st.angle, '/start/angle', 0, Math.PI, '[0°, 180°]');
    const chi = st.azimuth === undefined ? 0 : readAngle(st.azimuth, '/start/azimuth', -2 * Math.PI, 2 * Math.PI, '[−360°, 360°]');
    start = { kind: 'observer', observer: st.observer, r, theta: point.theta, phi, speed, psi, chi };
  } else {
    for (const [k, v] of [['energy', st.energy], ['angularMomentum', st.angularMomentum], ['carter', st.carter]] as const) {
      if (!(Math.abs(v) <= 1e12)) throw unphysical(`/start/${k}`, `|${k}| must not exceed 1e12 (geometric units)`);
    }
    if (input.particle === 'light' && !(st.energy > 0)) throw unphysical('/start/energy', 'light needs a positive energy');
    if (input.particle === 'massive' && !(st.energy > 0)) throw unphysical('/start/energy', 'a massive particle moving forward in time needs E > 0 here');
    start = {
      kind: 'constants',
      r,
      theta: point.theta,
      phi,
      E: st.energy,
      L: st.angularMomentum,
      carter: st.carter,
      radialSign: st.radialDirection === 'outward' ? 1 : -1,
      polarSign: st.polarDirection === 'north' ? -1 : 1,
    };
  }
  const physics: GeodesicRequest = {
    particle: input.particle === 'massive' ? 'timelike' : 'null',
    start,
    maxLength: duration,
    samples,
    maxSteps,
    rtol: input.tolerance ?? L.defaultTolerance,
    stopAt: input.stopAt ?? 'innerHorizon',
  };
  if (input.escapeRadius !== undefined) {
    const e = readLength(input.escapeRadius, '/escapeRadius', body).geometric;
    if (!(e <= L.maxEscapeRadius)) throw unphysical('/escapeRadius', `the escape radius must not exceed ${L.maxEscapeRadius} GM/c²`);
    physics.escapeRadius = e;
  } else {
    physics.escapeRadius = Math.min(L.maxEscapeRadius, Math.max(1000, 10 * r));
  }
  if (body.radiusGeometric !== null) physics.surfaceRadius = body.radiusGeometric;
  return { body, point, phi, physics, observer };
}

/** The canonical form for the cache key: everything normalised, defaults applied. */
export function canonicalGeodesic(input: GeodesicRequestInput): unknown {
  const n = normalizeGeodesic(input);
  return { body: canonicalBody(n.body), point: canonicalPoint(n.point), request: n.physics };
}
