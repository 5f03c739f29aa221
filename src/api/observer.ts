/**
 * The observer object, the same in every endpoint that takes one:
 *   { kind: "static" | "zamo" | "circular" | "rotating" | "distant", point?, direction?, angularVelocity? }
 * Its normalisation into a physics observer (422 where it cannot exist), and its echo in responses.
 */
import { z } from 'zod';
import { invalid, unphysical } from '../errors.js';
import { stationaryObserver, distantObserver, type Observer, type ObserverSpec } from '../physics/observers.js';
import { C } from '../units/constants.js';
import { normalizePoint, pointInput, quantityInput, readQuantity, type Body, type Point } from './inputs.js';
import { pointEcho, pointEchoSchema } from './responses.js';
import { region } from '../physics/spacetime.js';
import { canonicalPoint } from '../cache/key.js';

export const observerInput = z
  .strictObject({
    kind: z.enum(['static', 'zamo', 'circular', 'rotating', 'distant']).meta({
      description:
        'static: held at fixed r, θ, φ; zamo: zero angular momentum (co-rotating with the frame dragging); circular: free circular orbit in the equatorial plane; rotating: carried around the axis at angularVelocity (a clock on a spinning planet); distant: at rest far away (the reference of far-away time).',
    }),
    point: pointInput.optional().meta({ description: 'Where the observer is (all kinds but distant).' }),
    direction: z
      .enum(['prograde', 'retrograde'])
      .optional()
      .meta({ description: 'For circular: with or against the body\'s spin (default prograde).' }),
    angularVelocity: quantityInput.optional().meta({
      description:
        'For rotating: dφ/dt in rad/s (or e.g. "15 deg/h"), positive with the spin. Defaults to the preset\'s rotation rate (the Earth: 7.292115e-5 rad/s, IERS 2010).',
    }),
  })
  .meta({ id: 'Observer' });
export type ObserverInput = z.infer<typeof observerInput>;

export interface NormalizedObserver {
  observer: Observer;
  point: Point | null;
  input: ObserverInput;
}

/** Builds the physics observer; 400 for missing or misplaced fields, 422 where it cannot exist. */
export function normalizeObserver(input: ObserverInput, body: Body, path: string): NormalizedObserver {
  if (input.kind === 'distant') {
    for (const k of ['point', 'direction', 'angularVelocity'] as const) {
      if (input[k] !== undefined) throw invalid(`${path}/${k}`, `a distant observer takes no ${k}`);
    }
    return { observer: distantObserver(), point: null, input };
  }
  if (input.point === undefined) throw invalid(`${path}/point`, `a ${input.kind} observer needs a point`);
  if (input.direction !== undefined && input.kind !== 'circular') {
    throw invalid(`${path}/direction`, 'direction applies to circular orbits only');
  }
  if (input.angularVelocity !== undefined && input.kind !== 'rotating') {
    throw invalid(`${path}/angularVelocity`, 'angularVelocity applies to rotating observers only');
  }
  const point = normalizePoint(input.point, body, `${path}/point`);
  const r = point.rGeometric;
  const theta = point.theta;
  let spec: ObserverSpec;
  switch (input.kind) {
    case 'static':
    case 'zamo':
      spec = { kind: input.kind, r, theta };
      break;
    case 'circular':
      spec = { kind: 'circular', r, theta, direction: input.direction ?? 'prograde' };
      break;
    case 'rotating': {
      let omega: number;
      if (input.angularVelocity !== undefined) {
        omega = readQuantity(input.angularVelocity, 'angularVelocity', `${path}/angularVelocity`);
      } else if (body.rotationRate !== null) {
        omega = body.rotationRate;
      } else {
        throw invalid(`${path}/angularVelocity`, 'a rotating observer needs angularVelocity (this body has no preset rotation rate)');
      }
      spec = { kind: 'rotating', r, theta, angularVelocity: omega * body.tg };
      break;
    }
  }
  const result = stationaryObserver(body.spacetime, spec);
  if (!result.exists) throw unphysical(`${path}/kind`, `no ${input.kind} observer here: ${result.message}`);
  return { observer: result, point, input };
}

/** The canonical form of a normalised observer for cache keys: what its part of a response depends on. */
export function canonicalObserver(n: NormalizedObserver): unknown {
  return {
    kind: n.observer.kind,
    point: n.point ? canonicalPoint(n.point) : null,
    direction: n.observer.kind === 'circular' ? (n.input.direction ?? 'prograde') : null,
    angularVelocity: n.observer.angularVelocity,
  };
}

const value = z.object({
  value: z.number().nullable(),
  unit: z.string(),
  geometric: z.number().nullable().optional(),
  reason: z.string().optional(),
});

export const observerEchoSchema = z
  .object({
    kind: z.enum(['static', 'zamo', 'circular', 'rotating', 'distant']),
    point: pointEchoSchema.nullable(),
    direction: z.enum(['prograde', 'retrograde']).nullable(),
    angularVelocity: value.meta({ description: 'dφ/dt of the observer, rad/s.' }),
    clockRate: value.meta({ description: 'dτ/dt against far-away time.' }),
    clockOffset: value.meta({ description: '1 − clockRate, without cancellation.' }),
    speedRelativeToZamo: value.meta({ description: 'Speed measured by the local ZAMO (signed, + along the spin).' }),
    speedRelativeToStatic: value.meta({
      description: 'Speed measured by the local static observer; null where none exists (ergoregion).',
    }),
  })
  .meta({ id: 'ObserverState' });

/** The observer as the response shows it. */
export function observerEcho(n: NormalizedObserver, body: Body): z.infer<typeof observerEchoSchema> {
  const o = n.observer;
  const speed = (v: number | null, reason: string) =>
    v === null ? { value: null, unit: 'm/s', geometric: null, reason } : { value: v * C, unit: 'm/s', geometric: v };
  return {
    kind: o.kind,
    point: n.point ? pointEcho(n.point, region(body.spacetime, n.point.rGeometric, n.point.theta, body.radiusGeometric ?? undefined)) : null,
    direction: o.kind === 'circular' ? (n.input.direction ?? 'prograde') : null,
    angularVelocity: { value: o.angularVelocity / body.tg, unit: 'rad/s', geometric: o.angularVelocity },
    clockRate: { value: o.rate, unit: '1' },
    clockOffset: { value: o.offset, unit: '1' },
    speedRelativeToZamo: speed(o.velocityRelativeToZamo, 'no zero-angular-momentum observer exists here'),
    speedRelativeToStatic: speed(o.velocityRelativeToStatic, 'no static observer exists here (on or inside the ergosurface)'),
  };
}
