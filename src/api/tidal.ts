/**
 * POST /v1/tidal — tides at a point: the tidal tensor (electric part of the Riemann tensor) seen by a
 * static observer, a ZAMO and a river free-faller, its principal stretches and squeezes, the
 * differential acceleration across an object of given length, and, for a star, the tidal disruption
 * radius estimate and the Hills mass.
 */
import { z } from 'zod';
import { canonicalBody, canonicalPoint } from '../cache/key.js';
import { CATALOGUE_BY_NAME } from '../catalogue.js';
import { invalid, unphysical } from '../errors.js';
import { REASONS } from '../physics/local.js';
import { STATIONARY_REASONS } from '../physics/observers.js';
import { horizons, region } from '../physics/spacetime.js';
import {
  disruptionRadius,
  hillsMassRatio,
  tidesAt,
  type ObserverTides,
  type TetradAbsence,
  type TidalObserverKind,
} from '../physics/tidal.js';
import { C2, G, GM_SUN } from '../units/constants.js';
import { PRESETS } from '../units/presets.js';
import { toQuantity, type QuantityValue } from '../units/convert.js';
import {
  bodyInput,
  LIMITS,
  normalizeBody,
  normalizePoint,
  pointInput,
  quantityInput,
  readLength,
  readQuantity,
  type Body,
} from './inputs.js';
import {
  bodyEcho,
  bodyEchoSchema,
  bodyNotes,
  pointEcho,
  pointEchoSchema,
  quantityValue,
  service,
  serviceStamp,
} from './responses.js';
import type { ComputeRoute } from './route.js';

const KINDS = ['static', 'zamo', 'river'] as const;
const kind = z.enum(KINDS);

export const starInput = z
  .union([
    z.literal('sun').meta({ description: 'A Sun-like star: GM 1.3271244e20 m³/s², R 6.957e8 m (IAU 2015 B3 nominal).' }),
    z.strictObject({
      mass: quantityInput.meta({ description: 'Mass of the star: kg, or e.g. "0.5 Msun".' }),
      radius: quantityInput.meta({ description: 'Radius of the star: m, or e.g. "0.8 Rsun".' }),
    }),
  ], { error: 'star must be "sun" or an object { mass, radius } with both fields and no others' })
  .meta({ id: 'Star' });

export const tidalRequest = z
  .strictObject({
    body: bodyInput,
    point: pointInput,
    observers: z
      .array(kind)
      .min(1)
      .max(KINDS.length)
      .optional()
      .meta({
        description:
          'Whose frame: "static" (held at fixed r, θ, φ), "zamo" (zero angular momentum, co-rotating with the frame dragging), "river" (falling from rest at infinity with zero angular momentum). Default all three, in that order; each at most once.',
      }),
    length: quantityInput.optional().meta({
      description: 'Length of the object (probe, person, rod) across which the differential acceleration is given: m, or e.g. "2 m", "30 km". Default 1 m.',
    }),
    star: starInput.optional().meta({
      description: 'A star to test for tidal disruption by this body: its disruption radius (estimate) and the Hills mass. Omit for no disruption section.',
    }),
  })
  .meta({ id: 'TidalRequest' });
export type TidalRequest = z.infer<typeof tidalRequest>;

const direction = z
  .object({ radial: z.number(), polar: z.number(), azimuthal: z.number() })
  .meta({
    description:
      "Unit vector in the observer's frame: radial (outward), polar (towards increasing θ, i.e. southward), azimuthal (along the spin). Sign fixed so the largest component is positive.",
  });

const principal = z.object({
  effect: z.enum(['stretch', 'squeeze', 'none']).meta({
    description: 'stretch: ends pulled apart along this direction (eigenvalue < 0); squeeze: pushed together (> 0); none: |eigenvalue| ≤ 1e-12 of the largest.',
  }),
  tidalEigenvalue: quantityValue.meta({ description: 'Eigenvalue λ of the tidal tensor, s⁻² (geometric: c⁶/(GM)²); relative acceleration −λ per metre of separation.' }),
  direction,
  differentialAcceleration: quantityValue.meta({
    description: 'Relative acceleration −λL of the two ends of an object of the given length along this direction, m/s²; positive apart.',
  }),
});

const observerTides = z
  .object({
    kind,
    exists: z.boolean(),
    reason: z.string().optional().meta({ description: 'Why the observer (or its tidal tensor) is absent here.' }),
    tensor: z
      .object({
        axes: z.tuple([z.literal('radial'), z.literal('polar'), z.literal('azimuthal')]),
        unit: z.literal('s^-2'),
        components: z.array(z.array(z.number())).meta({ description: 'E_ij, rows and columns in the order of axes, s⁻².' }),
        geometric: z.array(z.array(z.number())).meta({ description: 'The same in c⁶/(GM)² (i.e. 1/(GM/c³)²).' }),
      })
      .nullable(),
    principal: z.array(principal).nullable().meta({ description: 'Principal axes, most stretching first (ascending eigenvalue).' }),
  })
  .meta({ id: 'ObserverTides' });

const disruption = z
  .object({
    star: z.object({
      preset: z.literal('sun').nullable(),
      mass: z.object({ value: z.number(), unit: z.literal('kg') }),
      radius: z.object({ value: z.number(), unit: z.literal('m') }),
      compactness: z.number().meta({ description: 'Gm⋆/(R⋆c²).' }),
    }),
    disruptionRadius: quantityValue.meta({ description: 'R⋆ (M/m⋆)^{1/3}: an order-of-magnitude estimate.' }),
    estimate: z.literal(true),
    outerHorizon: quantityValue,
    outsideHorizon: z.boolean().nullable().meta({ description: 'Whether the disruption radius lies outside the outer horizon (the disruption can be seen); null without a horizon.' }),
    outsideSurface: z.boolean().nullable().meta({ description: 'For a body with a surface: whether the disruption radius lies above it.' }),
    hillsMass: quantityValue.meta({ description: 'Hole mass at which the disruption radius equals the outer horizon, for a hole of this spin and charge; above it the star is swallowed whole.' }),
    hillsMassSolar: z.number().nullable().meta({ description: 'hillsMass in nominal solar masses (GM☉/G).' }),
  })
  .meta({ id: 'TidalDisruption' });

export const tidalResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    point: pointEchoSchema,
    length: z.object({ value: z.number(), unit: z.literal('m') }),
    observers: z.array(observerTides),
    disruption: disruption.nullable(),
    notes: z.array(z.string()),
  })
  .meta({ id: 'TidalResponse' });
export type TidalResponse = z.infer<typeof tidalResponse>;

const ABSENT: Record<TetradAbsence, string> = { ...STATIONARY_REASONS, noFlow: REASONS.noFlow };
const NOT_FINITE = 'the tidal tensor is not finite in double precision at this point (next to the singularity)';

interface Normalized {
  body: Body;
  point: ReturnType<typeof normalizePoint>;
  kinds: TidalObserverKind[];
  length: number;
  star: { preset: 'sun' | null; massKg: number; gm: number; radius: number } | null;
}

function normalize(input: TidalRequest): Normalized {
  const body = normalizeBody(input.body);
  const point = normalizePoint(input.point, body);
  const kinds = input.observers ?? [...KINDS];
  if (new Set(kinds).size !== kinds.length) throw invalid('/observers', 'each observer kind may appear only once');
  const length = input.length === undefined ? 1 : readLength(input.length, '/length', body).si;
  let star: Normalized['star'] = null;
  if (input.star === 'sun') {
    star = { preset: 'sun', massKg: GM_SUN / G, gm: GM_SUN, radius: PRESETS.sun.radius };
  } else if (input.star !== undefined) {
    const massKg = readQuantity(input.star.mass, 'mass', '/star/mass', body);
    if (!(massKg >= LIMITS.massMinKg && massKg <= LIMITS.massMaxKg)) {
      throw unphysical('/star/mass', `the star's mass must lie between ${LIMITS.massMinKg} kg and ${LIMITS.massMaxKg} kg (documented limit)`);
    }
    const radius = readLength(input.star.radius, '/star/radius', body).si;
    star = { preset: null, massKg, gm: G * massKg, radius };
  }
  if (star && !(star.gm / (star.radius * C2) < 0.5)) {
    throw unphysical('/star/radius', "the star's radius lies inside its own Schwarzschild radius 2Gm⋆/c²: that is a black hole, not a star");
  }
  return { body, point, kinds, length, star };
}

const q = (name: string, geometric: number, body: Body, reason?: string): QuantityValue => toQuantity(name, geometric, body, reason);

function observerSection(t: ObserverTides, body: Body, length: number): z.infer<typeof observerTides> {
  if (!t.exists) return { kind: t.kind, exists: false, reason: ABSENT[t.reason], tensor: null, principal: null };
  const toSI = 1 / (body.tg * body.tg);
  const si = t.tensor.map((row) => row.map((v) => v * toSI));
  if (!t.principal || !si.flat().every(Number.isFinite)) {
    return { kind: t.kind, exists: true, reason: NOT_FINITE, tensor: null, principal: null };
  }
  const largest = Math.max(...t.principal.map((p) => Math.abs(p.value)));
  return {
    kind: t.kind,
    exists: true,
    tensor: { axes: ['radial', 'polar', 'azimuthal'], unit: 's^-2', components: si, geometric: t.tensor },
    principal: t.principal.map((p) => {
      const effect = Math.abs(p.value) <= 1e-12 * largest ? 'none' : p.value < 0 ? 'stretch' : 'squeeze';
      const ev = q('tidalEigenvalue', p.value, body);
      const dv = ev.value === null ? null : -ev.value * length;
      return {
        effect,
        tidalEigenvalue: ev,
        direction: { radial: p.direction[0], polar: p.direction[1], azimuthal: p.direction[2] },
        differentialAcceleration:
          dv !== null && Number.isFinite(dv)
            ? { value: dv, unit: 'm/s^2' }
            : { value: null, unit: 'm/s^2', reason: 'not finite in double precision for this length' },
      };
    }),
  };
}

function disruptionSection(star: NonNullable<Normalized['star']>, body: Body): z.infer<typeof disruption> {
  const compactness = star.gm / (star.radius * C2);
  const rt = disruptionRadius(star.radius / body.rg, star.gm / body.gm);
  const h = horizons(body.spacetime);
  const noHorizon = 'this body has no horizon (spin² + charge² > 1)';
  const ratio = h ? hillsMassRatio(compactness, h.outer) : Number.NaN;
  const hills = ratio * star.massKg;
  const hillsOk = Number.isFinite(hills);
  return {
    star: {
      preset: star.preset,
      mass: { value: star.massKg, unit: 'kg' },
      radius: { value: star.radius, unit: 'm' },
      compactness,
    },
    disruptionRadius: q('disruptionRadius', rt, body),
    estimate: true,
    outerHorizon: h ? q('outerHorizon', h.outer, body) : { value: null, unit: 'm', geometric: null, reason: noHorizon },
    outsideHorizon: h && body.radius === null ? rt > h.outer : null,
    outsideSurface: body.radiusGeometric === null ? null : rt > body.radiusGeometric,
    hillsMass: hillsOk
      ? { value: hills, unit: 'kg', geometric: hills / body.massKg }
      : { value: null, unit: 'kg', geometric: null, reason: h ? 'not finite in double precision' : noHorizon },
    hillsMassSolar: hillsOk ? (hills * G) / GM_SUN : null,
  };
}

const TIDAL_NOTES = [
  "Tidal tensor E_ij = R_i0j0 in each observer's orthonormal frame (axes radial outward, polar southward, azimuthal along the spin); neighbouring free particles accelerate apart at −E·ξ, so a negative eigenvalue stretches and a positive one squeezes.",
  'The river observer falls from rest at infinity with zero angular momentum (Gullstrand–Painlevé / Doran free-faller); it exists through both horizons wherever 2GMr/c² ≥ Q² (geometrized).',
];
const DISRUPTION_NOTE =
  'Disruption radius R⋆(M/m⋆)^{1/3} is an order-of-magnitude estimate (Hills 1975; Rees 1988): the true radius depends on the star\'s structure and spin and the orbit by factors of order unity; the Hills mass compares it with the outer horizon of a hole of this spin and charge, ignoring the orbit\'s inclination.';

export function computeTidal(input: TidalRequest): TidalResponse {
  const n = normalize(input);
  const { body, point } = n;
  const tides = tidesAt(body.spacetime, point.rGeometric, point.theta, n.kinds);
  const notes = bodyNotes(body);
  notes.push(...TIDAL_NOTES);
  if (n.star) notes.push(DISRUPTION_NOTE);
  return {
    service,
    body: bodyEcho(body),
    point: pointEcho(point, region(body.spacetime, point.rGeometric, point.theta, body.radiusGeometric ?? undefined)),
    length: { value: n.length, unit: 'm' },
    observers: tides.map((t) => observerSection(t, body, n.length)),
    disruption: n.star ? disruptionSection(n.star, body) : null,
    notes,
  };
}

export const tidalRoute: ComputeRoute<TidalRequest> = {
  path: '/v1/tidal',
  operationId: 'tidal',
  summary: 'Tidal tensor, stretch and squeeze, and tidal disruption',
  description:
    'The tidal tensor (electric part of the Riemann tensor) at a point, in the frames of a static observer and a ZAMO (outside the outer horizon, and inside the inner one where they exist again) and a river free-faller (falling from rest at infinity; it exists between the horizons too): its components, eigenvalues in s⁻² labelled stretch or squeeze with their directions, and the differential acceleration across an object of given length. With a star ({ mass, radius } or "sun"): the tidal disruption radius R⋆(M/m⋆)^{1/3} (an estimate), whether it lies outside the horizon, and the Hills mass. An observer that cannot exist at the point is listed with the reason; the rest still stands.',
  tag: 'tides',
  body: tidalRequest,
  response: tidalResponse,
  compute: computeTidal,
  canonical: (input) => {
    const n = normalize(input);
    return {
      body: canonicalBody(n.body),
      point: canonicalPoint(n.point),
      kinds: n.kinds,
      length: n.length,
      star: n.star,
    };
  },
};

for (const name of ['tidalEigenvalue', 'disruptionRadius', 'hillsMass']) {
  if (!CATALOGUE_BY_NAME.has(name)) throw new Error(`catalogue lacks ${name}`);
}
