/**
 * POST /v1/transform — events, vectors and covectors converted between the Boyer–Lindquist, river
 * (Doran / Gullstrand–Painlevé) and Kerr–Schild Cartesian charts of one body's spacetime, in batches.
 */
import { z } from 'zod';
import { canonicalBody } from '../cache/key.js';
import { ProblemError, unphysical } from '../errors.js';
import {
  COORDINATE_SYSTEMS,
  fromHub,
  toHub,
  TRANSFORM_REASONS,
  type CoordinateSystem,
  type Vec4,
} from '../physics/coordinates.js';
import { jacobians, metricAt, transformCovector, transformVector, type Mat4 } from '../physics/coordinate-jacobians.js';
import { region as regionOf } from '../physics/spacetime.js';
import { bodyInput, normalizeBody, quantityInput, readAngle, readLength, readQuantity, readSignedLength, LIMITS, type Body } from './inputs.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, pointEchoSchema, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';

/** Documented limits of one request (README, OpenAPI). */
export const TRANSFORM_LIMITS = {
  /** Events per request. */
  maxEvents: 1000,
  /** Vectors plus covectors per event. */
  maxVectorsPerEvent: 8,
  /** Largest |component| of a vector or covector. */
  maxComponent: 1e100,
} as const;

const system = z.enum(['boyerLindquist', 'river', 'kerrSchild']).meta({
  description:
    'boyerLindquist (t, r, θ, φ); river (T, r, θ, Φ) — Doran, Gullstrand–Painlevé when spin is 0; kerrSchild (t, x, y, z) — ingoing Kerr–Schild Cartesian, x + iy = (r + ia) sinθ e^{iφ̄}, z = r cosθ.',
});
const components = z.tuple([z.number(), z.number(), z.number(), z.number()]);

const eventInput = z
  .strictObject({
    coordinates: z.tuple([quantityInput, quantityInput, quantityInput, quantityInput]).meta({
      description:
        'The event in the source chart, in the order of its coordinates: times in s or e.g. "3 tg", lengths in m or e.g. "10 rg", angles in rad or e.g. "30 deg".',
    }),
    vectors: z.array(components).optional().meta({
      description: 'Contravariant components at the event (geometric units: t in GM/c³, lengths in GM/c², angles in rad).',
    }),
    covectors: z.array(components).optional().meta({ description: 'Covariant components (one-forms) at the event, geometric units.' }),
  })
  .meta({ id: 'TransformEvent' });

export const transformRequest = z
  .strictObject({
    body: bodyInput,
    from: system,
    to: z.array(system).min(1).max(3).optional().meta({ description: 'Target charts (default all three, the source included).' }),
    events: z.array(eventInput).min(1).meta({ description: `At most ${TRANSFORM_LIMITS.maxEvents} events (larger: 413).` }),
    metric: z.boolean().optional().meta({ description: 'Also return the covariant metric components in each target chart (default false).' }),
    jacobian: z.boolean().optional().meta({ description: 'Also return ∂x′/∂x from the source to each target chart (default false).' }),
  })
  .meta({ id: 'TransformRequest' });
export type TransformRequest = z.infer<typeof transformRequest>;

const time = z.object({ value: z.number(), unit: z.literal('s'), geometric: z.number() });
const length = z.object({ value: z.number(), unit: z.literal('m'), geometric: z.number() });
const angle = z.object({ value: z.number(), unit: z.literal('rad'), degrees: z.number() });
const matrix = z.array(z.array(z.number()));

const target = <T extends z.ZodRawShape>(id: string, coordinates: z.ZodObject<T>) =>
  z
    .object({
      coordinates: coordinates.nullable(),
      reason: z.string().optional().meta({ description: 'Why coordinates is null: the chart does not reach this event.' }),
      vectors: matrix.nullable().optional(),
      covectors: matrix.nullable().optional(),
      jacobian: matrix.nullable().optional().meta({ description: '∂x′/∂x, rows the target coordinates, geometric units.' }),
      metric: matrix.nullable().optional().meta({ description: 'Covariant metric components in this chart, geometric units.' }),
      derivativeReason: z.string().optional().meta({ description: 'Why vectors, covectors, jacobian or metric are null here.' }),
    })
    .meta({ id });

const blTarget = target('BoyerLindquistEvent', z.object({ t: time, r: length, theta: angle, phi: angle }));
const riverTarget = target('RiverEvent', z.object({ T: time, r: length, theta: angle, Phi: angle }));
const ksTarget = target('KerrSchildEvent', z.object({ t: time, x: length, y: length, z: length }));

export const transformResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    from: system,
    to: z.array(system),
    events: z.array(
      z.object({
        r: length.meta({ description: 'The Boyer–Lindquist (= Kerr–Schild) radius of the event.' }),
        region: pointEchoSchema.shape.region,
        boyerLindquist: blTarget.optional(),
        river: riverTarget.optional(),
        kerrSchild: ksTarget.optional(),
      }),
    ),
    notes: z.array(z.string()),
  })
  .meta({ id: 'TransformResponse' });
export type TransformResponse = z.infer<typeof transformResponse>;

/** One event, normalised: geometric coordinates in the source chart, and its vectors. */
interface Normalized {
  coordinates: Vec4;
  vectors: Vec4[] | undefined;
  covectors: Vec4[] | undefined;
}

function readComponents(list: Vec4[] | undefined, path: string): Vec4[] | undefined {
  list?.forEach((v, k) =>
    v.forEach((x, i) => {
      if (!(Math.abs(x) <= TRANSFORM_LIMITS.maxComponent)) {
        throw unphysical(`${path}/${k}/${i}`, `components must be finite with |x| ≤ ${TRANSFORM_LIMITS.maxComponent}`);
      }
    }),
  );
  return list;
}

function normalizeEvent(body: Body, from: CoordinateSystem, e: TransformRequest['events'][number], path: string): Normalized {
  const scale = { rg: body.rg, tg: body.tg };
  const c = e.coordinates;
  const p = `${path}/coordinates`;
  const t = readQuantity(c[0], 'time', `${p}/0`, scale) / body.tg;
  if (!(Math.abs(t) <= LIMITS.maxRadiusGeometric)) throw unphysical(`${p}/0`, `|time| must not exceed ${LIMITS.maxRadiusGeometric} GM/c³ (documented limit)`);
  let coordinates: Vec4;
  if (from === 'kerrSchild') {
    coordinates = [t, readSignedLength(c[1], `${p}/1`, scale).geometric, readSignedLength(c[2], `${p}/2`, scale).geometric, readSignedLength(c[3], `${p}/3`, scale).geometric];
  } else {
    const r = readLength(c[1], `${p}/1`, scale, true).geometric;
    const theta = readAngle(c[2], `${p}/2`, 0, Math.PI, '[0, π] (0° to 180°)');
    coordinates = [t, r, theta, readQuantity(c[3], 'angle', `${p}/3`)];
  }
  const count = (e.vectors?.length ?? 0) + (e.covectors?.length ?? 0);
  if (count > TRANSFORM_LIMITS.maxVectorsPerEvent) {
    throw new ProblemError('request-too-large', `${path}: ${count} vectors and covectors; at most ${TRANSFORM_LIMITS.maxVectorsPerEvent} per event (documented limit)`, [
      { path, message: `at most ${TRANSFORM_LIMITS.maxVectorsPerEvent} vectors and covectors per event` },
    ]);
  }
  return { coordinates, vectors: readComponents(e.vectors as Vec4[] | undefined, `${path}/vectors`), covectors: readComponents(e.covectors as Vec4[] | undefined, `${path}/covectors`) };
}

function normalize(input: TransformRequest): { body: Body; from: CoordinateSystem; to: CoordinateSystem[]; events: Normalized[] } {
  if (input.events.length > TRANSFORM_LIMITS.maxEvents) {
    throw new ProblemError('request-too-large', `${input.events.length} events; at most ${TRANSFORM_LIMITS.maxEvents} per request (documented limit)`, [
      { path: '/events', message: `at most ${TRANSFORM_LIMITS.maxEvents} events` },
    ]);
  }
  const body = normalizeBody(input.body);
  const to = input.to ? COORDINATE_SYSTEMS.filter((s) => input.to!.includes(s)) : [...COORDINATE_SYSTEMS];
  const events = input.events.map((e, i) => normalizeEvent(body, input.from, e, `/events/${i}`));
  return { body, from: input.from, to, events };
}

const finiteMatrix = (m: number[][]) => m.every((row) => row.every(Number.isFinite));
const asRows = (m: Mat4) => m.map((row) => [...row]);

const SOURCE_REASONS: Record<string, string> = {
  onHorizon: 'the event is on a horizon, where Boyer–Lindquist coordinates do not exist; give it in the river or Kerr–Schild chart',
};

export function computeTransform(input: TransformRequest): TransformResponse {
  const { body, from, to, events } = normalize(input);
  const s = body.spacetime;
  const surface = body.radiusGeometric ?? undefined;
  const { rg, tg } = body;
  const tq = (x: number) => ({ value: x * tg, unit: 's' as const, geometric: x });
  const lq = (x: number) => ({ value: x * rg, unit: 'm' as const, geometric: x });
  const aq = (x: number) => ({ value: x, unit: 'rad' as const, degrees: (x * 180) / Math.PI });
  const out = events.map((ev, i) => {
    const where = `/events/${i}/coordinates`;
    const hub = toHub(from, s, ev.coordinates);
    if (!hub.ok) {
      const message = SOURCE_REASONS[hub.reason] ?? TRANSFORM_REASONS[hub.reason];
      if (hub.reason === 'notConverged') throw new ProblemError('tolerance-not-met', `${where}: ${message}`, [{ path: where, message }]);
      throw unphysical(where, message);
    }
    const h = hub.value;
    const [, r, theta] = h;
    if (surface !== undefined && r < surface) {
      throw unphysical(where, `the event (r = ${r * rg} m) lies below the body's surface (radius ${body.radius} m): the vacuum exterior does not apply inside a body`);
    }
    const entry: TransformResponse['events'][number] = { r: lq(r), region: regionOf(s, r, theta, surface) };
    for (const sys of to) {
      const result: Record<string, unknown> = {};
      const mapped = from === sys ? { ok: true as const, value: ev.coordinates } : fromHub(sys, s, h);
      const values = mapped.ok && mapped.value.every(Number.isFinite) ? mapped.value : null;
      if (values === null) {
        result.coordinates = null;
        result.reason = mapped.ok ? 'not finite in double precision here' : TRANSFORM_REASONS[mapped.reason];
      } else {
        const [c0, c1, c2, c3] = values;
        result.coordinates =
          sys === 'boyerLindquist'
            ? { t: tq(c0), r: lq(c1), theta: aq(c2), phi: aq(c3) }
            : sys === 'river'
              ? { T: tq(c0), r: lq(c1), theta: aq(c2), Phi: aq(c3) }
              : { t: tq(c0), x: lq(c1), y: lq(c2), z: lq(c3) };
      }
      const wantsDerivatives = ev.vectors !== undefined || ev.covectors !== undefined || input.jacobian === true || input.metric === true;
      if (wantsDerivatives) {
        const { forward, inverse } = values ? jacobians(s, from, sys, h) : { forward: null, inverse: null };
        const reasons: string[] = [];
        const onAxis = theta === 0 || theta === Math.PI;
        const why = values === null ? (result.reason as string) : onAxis ? TRANSFORM_REASONS.axis : 'not finite in double precision here';
        const finiteOr = (m: number[][] | null, label: string) => {
          if (m !== null && finiteMatrix(m)) return m;
          if (m !== null) reasons.push(`${label}: not finite in double precision here`);
          else reasons.push(`${label}: ${why}`);
          return null;
        };
        if (ev.vectors !== undefined) result.vectors = finiteOr(forward && ev.vectors.map((v) => transformVector(forward, v)), 'vectors');
        if (ev.covectors !== undefined) result.covectors = finiteOr(inverse && ev.covectors.map((w) => transformCovector(inverse, w)), 'covectors');
        if (input.jacobian === true) result.jacobian = finiteOr(forward && asRows(forward), 'jacobian');
        if (input.metric === true) {
          const g = values ? asRows(metricAt(sys, s, h)) : null;
          if (g !== null && finiteMatrix(g)) result.metric = g;
          else {
            result.metric = null;
            reasons.push(`metric: ${values === null ? why : 'not finite in double precision here'}`);
          }
        }
        if (reasons.length > 0) result.derivativeReason = reasons.join('; ');
      }
      (entry as Record<string, unknown>)[sys] = result;
    }
    return entry;
  });
  const notes = bodyNotes(body);
  notes.push(...TRANSFORM_NOTES);
  return { service, body: bodyEcho(body), from, to, events: out, notes };
}

const TRANSFORM_NOTES = [
  'Charts: Boyer–Lindquist (t, r, θ, φ); river (T, r, θ, Φ) with dT = dt + √((2r − Q²)(r² + a²))/Δ dr, dΦ = dφ + a√(2r − Q²)/(√(r² + a²) Δ) dr (Doran; Gullstrand–Painlevé for a = 0), T the proper time of the observers falling from rest at infinity; ingoing Kerr–Schild (t, x, y, z) with dt̄ = dt + (2r − Q²)/Δ dr, dφ̄ = dφ + a/Δ dr, x + iy = (r + ia) sinθ e^{iφ̄}, z = r cosθ. All share r and θ.',
  'Additive constants, fixed at infinity: φ̄ − φ → 0, Φ − φ → 0, t̄ − t − 2(GM/c³) ln(r c²/GM) → 0 and T − t − 2√(2GMr)/c² → 0 as r → ∞ (Schwarzschild: the textbook Gullstrand–Painlevé T and t̄ = t + 2GM/c³ ln|r c²/(GM) − 2|). Inside the horizons the logarithms are of |r − r±|.',
  'Vectors transform with J = ∂x′/∂x, covectors with its inverse; both, and the Jacobian and metric, are in geometric units (t in GM/c³, lengths in GM/c², angles in rad). Azimuths from Cartesian coordinates lie in (−π, π]; otherwise the source azimuth is shifted, not reduced.',
  'Kerr–Schild Cartesian points are read on the sheet r ≥ 0: a point of the disk r = 0 (z = 0, x² + y² < a²) is given the θ ≤ 90° of its upper face; on the axis φ̄ is taken as 0 and the angular charts have no Jacobian.',
];

export const transformRoute: ComputeRoute<TransformRequest> = {
  path: '/v1/transform',
  serializer: 'json',
  operationId: 'transform',
  summary: 'Events, vectors and covectors between Boyer–Lindquist, river and Kerr–Schild coordinates',
  description: `Converts a batch of events (at most ${TRANSFORM_LIMITS.maxEvents}) given in one chart — Boyer–Lindquist, river (Doran / Gullstrand–Painlevé) or ingoing Kerr–Schild Cartesian — into the others, with contravariant vectors (J = ∂x′/∂x), covectors (inverse transpose), and optionally the Jacobian and the metric components in each target chart. A chart that does not reach an event (Boyer–Lindquist on a horizon, river where 2GMr/c² < Q²) gives null with the reason.`,
  tag: 'spacetime',
  body: transformRequest,
  response: transformResponse,
  compute: computeTransform,
  canonical: (input) => {
    const n = normalize(input);
    return { body: canonicalBody(n.body), from: n.from, to: n.to, events: n.events, metric: input.metric ?? false, jacobian: input.jacobian ?? false };
  },
};
