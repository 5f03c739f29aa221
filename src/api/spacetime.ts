/**
 * /v1/spacetime — the body normalised, its horizons and ergosurface, the thermodynamic properties of a
 * black hole's horizon, and for a body with a surface the values at its equator.
 */
import { z } from 'zod';
import { canonicalBody } from '../cache/key.js';
import { horizonProperties } from '../physics/horizon.js';
import { characteristicOrbits } from '../physics/characteristic-orbits.js';
import { BLACK_HOLE_ONLY, BODY_QUANTITIES, HORIZON_QUANTITIES, NAKED, SURFACE_ONLY, type BodyQuantity } from '../physics/sweep-body.js';
import { evaluateLocal } from '../physics/local.js';
import { ergosurfaceRadius } from '../physics/spacetime.js';
import { toQuantity, type QuantityValue } from '../units/convert.js';
import { bodyInput, bodyPointFromQuery, bodyPointQuery, normalizeBody, queryPath, type Body } from './inputs.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, quantityValue, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';

/** The body-only quantities, one list for this endpoint and the sweeps (physics/sweep-body.ts). */
export const SPACETIME_QUANTITIES = BODY_QUANTITIES;
type SpacetimeQuantity = BodyQuantity;

const SURFACE_QUANTITIES = ['compactness', 'surfaceEscapeSpeed', 'surfaceClockOffset', 'surfaceHoverAcceleration'] as const;

export const spacetimeRequest = z.strictObject({ body: bodyInput }).meta({ id: 'SpacetimeRequest' });
export type SpacetimeRequest = z.infer<typeof spacetimeRequest>;

export const bodyQuery = bodyPointQuery.pick({ body: true, mass: true, spin: true, charge: true, radius: true }).meta({ id: 'BodyQuery' });

export const spacetimeResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    quantities: z.object(Object.fromEntries(SPACETIME_QUANTITIES.map((n) => [n, quantityValue]))),
    notes: z.array(z.string()),
  })
  .meta({ id: 'SpacetimeResponse' });
export type SpacetimeResponse = z.infer<typeof spacetimeResponse>;


export function computeSpacetime(input: SpacetimeRequest): SpacetimeResponse {
  const body = normalizeBody(input.body);
  const s = body.spacetime;
  const geo = new Map<SpacetimeQuantity, number>();
  const reasons = new Map<SpacetimeQuantity, string>();
  const R = body.radiusGeometric;
  const belowSurface = (name: string, r: number) =>
    `the ${name} of the vacuum exterior would lie at ${r * body.rg} m, inside the body: it does not exist`;

  geo.set('schwarzschildRadius', 2);
  const hp = horizonProperties(s);
  if (hp && R === null) {
    geo.set('outerHorizon', hp.outer);
    geo.set('innerHorizon', hp.inner);
    for (const k of HORIZON_QUANTITIES) geo.set(k, hp[k]);
  } else {
    reasons.set('outerHorizon', hp ? belowSurface('outer horizon', hp.outer) : NAKED);
    reasons.set('innerHorizon', hp ? belowSurface('inner horizon', hp.inner) : NAKED);
    for (const k of HORIZON_QUANTITIES) reasons.set(k, BLACK_HOLE_ONLY);
  }
  for (const [k, theta] of [['ergosurfaceEquator', Math.PI / 2], ['ergosurfacePole', 0]] as const) {
    const e = ergosurfaceRadius(s, theta);
    if (e === null) reasons.set(k, 'g_tt has no root here: there is no ergosurface');
    else if (R !== null && e < R) reasons.set(k, belowSurface('ergosurface', e));
    else geo.set(k, e);
  }
  if (R === null) {
    for (const k of SURFACE_QUANTITIES) reasons.set(k, SURFACE_ONLY);
  } else {
    geo.set('compactness', 2 / R);
    const at = evaluateLocal(s, R, Math.PI / 2, R);
    geo.set('surfaceEscapeSpeed', at.values.escapeSpeed);
    geo.set('surfaceClockOffset', at.values.staticClockOffset);
    geo.set('surfaceHoverAcceleration', at.values.hoverAcceleration);
    if (at.reasons.escapeSpeed) reasons.set('surfaceEscapeSpeed', at.reasons.escapeSpeed);
    if (at.reasons.staticClockOffset) reasons.set('surfaceClockOffset', at.reasons.staticClockOffset);
    if (at.reasons.hoverAcceleration) reasons.set('surfaceHoverAcceleration', at.reasons.hoverAcceleration);
  }
  setCharacteristicOrbits(body, geo, reasons);
  const quantities = {} as Record<SpacetimeQuantity, QuantityValue>;
  for (const n of SPACETIME_QUANTITIES) {
    quantities[n] = toQuantity(n, geo.get(n) ?? Number.NaN, body, reasons.get(n));
  }
  return { service, body: bodyEcho(body), quantities, notes: spacetimeNotes(body) };
}

/** Photon orbit, marginally bound orbit and ISCO in both directions, with E, L and 1 − E at the ISCO. */
function setCharacteristicOrbits(body: Body, geo: Map<SpacetimeQuantity, number>, reasons: Map<SpacetimeQuantity, string>): void {
  const orbits = characteristicOrbits(body.spacetime);
  const R = body.radiusGeometric;
  for (const d of ['Prograde', 'Retrograde'] as const) {
    for (const kind of ['photonOrbit', 'marginallyBoundOrbit', 'isco'] as const) {
      const o = orbits[`${kind}${d}`];
      const names: SpacetimeQuantity[] =
        kind === 'isco' ? [`isco${d}`, `iscoEnergy${d}`, `iscoAngularMomentum${d}`, `iscoEfficiency${d}`] : [`${kind}${d}`];
      let why: string | undefined;
      if (!o.exists) why = o.message;
      else if (R !== null && o.r < R) why = `this orbit (r = ${o.r * body.rg} m) would lie inside the body: the vacuum exterior does not reach it`;
      if (why || !o.exists) {
        for (const n of names) reasons.set(n, why ?? '');
        continue;
      }
      geo.set(names[0]!, o.r);
      if (kind === 'isco') {
        geo.set(`iscoEnergy${d}`, o.energy ?? Number.NaN);
        geo.set(`iscoAngularMomentum${d}`, o.angularMomentum ?? Number.NaN);
        geo.set(`iscoEfficiency${d}`, o.bindingEnergy ?? Number.NaN);
        if (o.energy === null) {
          for (const n of names.slice(1)) reasons.set(n, 'in the extremal limit the ISCO meets the horizon in Boyer–Lindquist r and E, L are not defined there');
        }
      }
    }
  }
}

function spacetimeNotes(body: Body): string[] {
  const notes = bodyNotes(body);
  if (body.radius === null) {
    notes.push(
      'Hawking temperature assumes an isolated hole in vacuum; horizonElectricPotential is measured in the frame co-rotating with the horizon.',
    );
  } else {
    notes.push(
      'Surface values are at the equator for an observer at rest relative to distant stars (no rotation of the ground and no centrifugal term).',
    );
  }
  return notes;
}

export const spacetimeRoute: ComputeRoute<SpacetimeRequest, z.infer<typeof bodyQuery>> = {
  path: '/v1/spacetime',
  operationId: 'spacetime',
  summary: 'Horizons, ergosurface and horizon properties of a body',
  description:
    'The body normalised (kg, GM/c² in m, GM/c³ in s, a/M, Q/M), its horizons and ergosurface, and for a black hole the surface gravity, Hawking temperature, horizon area, angular velocity and electric potential, and irreducible mass; for a body with a surface, its compactness and the escape speed, clock offset and hover acceleration at its equator.',
  tag: 'spacetime',
  body: spacetimeRequest,
  get: { query: bodyQuery, toInput: (q) => ({ body: bodyPointFromQuery(q).body }), pathFor: queryPath },
  response: spacetimeResponse,
  compute: computeSpacetime,
  canonical: (input) => ({ body: canonicalBody(normalizeBody(input.body)) }),
};
