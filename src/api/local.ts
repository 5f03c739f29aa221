/**
 * /v1/local — every flow and clock quantity at one point around one body.
 */
import { z } from 'zod';
import { canonicalBody, canonicalPoint } from '../cache/key.js';
import { CATALOGUE_BY_NAME } from '../catalogue.js';
import { evaluateLocal, LOCAL_QUANTITIES } from '../physics/local.js';
import { toQuantity } from '../units/convert.js';
import {
  bodyInput,
  bodyPointFromQuery,
  bodyPointQuery,
  normalizeBody,
  normalizePoint,
  pointInput,
  queryPath,
} from './inputs.js';
import {
  bodyEcho,
  bodyEchoSchema,
  bodyNotes,
  CAUTION,
  pointEcho,
  pointEchoSchema,
  quantityValue,
  service,
  serviceStamp,
} from './responses.js';
import type { ComputeRoute } from './route.js';

export const localRequest = z.strictObject({ body: bodyInput, point: pointInput }).meta({ id: 'LocalRequest' });
export type LocalRequest = z.infer<typeof localRequest>;

const metricComponents = (keys: readonly string[]) =>
  z.object(Object.fromEntries(keys.map((k) => [k, z.number().nullable()])));

export const localResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    point: pointEchoSchema,
    quantities: z.object(Object.fromEntries(LOCAL_QUANTITIES.map((n) => [n, quantityValue]))),
    hoverAccelerationComponents: z
      .object({ r: z.number().nullable(), theta: z.number().nullable(), unit: z.literal('1/M') })
      .meta({ description: 'Covariant components (a_r, a_θ) of the hovering observer\'s acceleration, geometric units.' }),
    metric: z.object({
      boyerLindquist: metricComponents(['tt', 'tphi', 'rr', 'thth', 'phph']).meta({
        description: 'Covariant Boyer–Lindquist components at the point, geometric units (t and r in GM/c³, GM/c²).',
      }),
      river: metricComponents(['TT', 'Tr', 'TPhi', 'rr', 'rPhi', 'thth', 'PhiPhi'])
        .nullable()
        .meta({
          description:
            'Covariant components in river coordinates (T, r, θ, Φ) — Gullstrand–Painlevé for a = 0, Doran otherwise — regular across the horizons; null where 2r < Q².',
        }),
    }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'LocalResponse' });
export type LocalResponse = z.infer<typeof localResponse>;

/** A copy of a record of numbers with every non-finite value as null (plain loop: runs per request). */
function finiteOrNull(o: object): Record<string, number | null> {
  const out: Record<string, number | null> = {};
  const record = o as Record<string, unknown>;
  for (const k in record) {
    if (!Object.hasOwn(record, k)) continue;
    const v = record[k];
    out[k] = typeof v === 'number' && Number.isFinite(v) ? v : null;
  }
  return out;
}

const LOCAL_NOTE =
  'Rates are dτ/dt against far-away time, offsets 1 − rate without cancellation; flowSpeed is measured by the local ZAMO.';

export function computeLocal(input: LocalRequest): LocalResponse {
  const body = normalizeBody(input.body);
  const point = normalizePoint(input.point, body);
  const local = evaluateLocal(body.spacetime, point.rGeometric, point.theta, body.radiusGeometric ?? undefined);
  const quantities: Record<string, ReturnType<typeof toQuantity>> = {};
  for (const n of LOCAL_QUANTITIES) quantities[n] = toQuantity(n, local.values[n], body, local.reasons[n]);
  const notes = bodyNotes(body);
  notes.push(LOCAL_NOTE, CAUTION);
  return {
    service,
    body: bodyEcho(body),
    point: pointEcho(point, local.region),
    quantities,
    hoverAccelerationComponents: { ...finiteOrNull(local.hoverComponents), unit: '1/M' } as LocalResponse['hoverAccelerationComponents'],
    metric: {
      boyerLindquist: finiteOrNull(local.boyerLindquist),
      river: local.river ? finiteOrNull(local.river) : null,
    },
    notes,
  };
}

export const localRoute: ComputeRoute<LocalRequest, z.infer<typeof bodyPointQuery>> = {
  path: '/v1/local',
  operationId: 'local',
  summary: 'Flow, clock and curvature quantities at a point',
  description:
    'Flow (river) speed, escape speed, static and ZAMO clock rates with their offsets, redshift to infinity, hover acceleration, frame-dragging rate, the curvature invariants (Kretschmann scalar R_abcd R^abcd, and R_ab R^ab — nonzero only with charge; the Ricci scalar R is 0 for the Maxwell field and not listed), and the metric in Boyer–Lindquist and river form, at one point around one body. Quantities that do not exist at the point are null with a reason.',
  tag: 'spacetime',
  body: localRequest,
  get: { query: bodyPointQuery, toInput: bodyPointFromQuery, pathFor: queryPath },
  response: localResponse,
  compute: computeLocal,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    return { body: canonicalBody(body), point: canonicalPoint(normalizePoint(input.point, body)) };
  },
};

// Every local quantity must be in the catalogue (checked at load; a missing entry is a programming error).
for (const n of LOCAL_QUANTITIES) if (!CATALOGUE_BY_NAME.has(n)) throw new Error(`catalogue lacks ${n}`);
