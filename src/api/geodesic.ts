/**
 * POST /v1/geodesic — a timelike or null geodesic of the body's field, followed through the horizons:
 * samples of its clocks and position (with Cartesian Kerr–Schild coordinates for plotting), the
 * constants of motion and their drift, the events (horizon crossings with their proper and river times,
 * turning points), how it ended, and the step statistics. The request is in ./geodesic-request.ts.
 */
import { z } from 'zod';
import { unphysical } from '../errors.js';
import { geodesic, TERMINATIONS, type EventKind, type Geodesic, type GeodesicRefused, type Termination } from '../physics/geodesic.js';
import { region } from '../physics/spacetime.js';
import { canonicalGeodesic, geodesicRequest, normalizeGeodesic, type GeodesicRequestInput } from './geodesic-request.js';
import type { Body } from './inputs.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, CAUTION, pointEcho, pointEchoSchema, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';

const EVENT_KINDS = ['outerHorizon', 'innerHorizon', 'singularity', 'surface', 'escape', 'radialTurningPoint', 'polarTurningPoint'] as const satisfies readonly EventKind[];
const TERMINATION_KINDS = ['escape', 'outerHorizon', 'innerHorizon', 'singularity', 'surface', 'maxLength', 'maxSteps', 'toleranceNotMet'] as const satisfies readonly Termination[];

const time = z
  .object({ value: z.number().nullable(), unit: z.literal('s'), geometric: z.number().nullable(), reason: z.string().optional() })
  .meta({ id: 'GeodesicTime' });
const length = z.object({ value: z.number(), unit: z.literal('m'), geometric: z.number() }).meta({ id: 'GeodesicLength' });

const values = z.array(z.number().nullable());
const column = (unit: string, description: string) =>
  z
    .object({
      unit: z.literal(unit),
      values: values.meta({ description: `SI values (${unit}); null where undefined (see nullReason).` }),
      geometric: values.meta({ description: 'The same in units of M (GM/c² or GM/c³).' }),
      nullReason: z.string().optional(),
    })
    .meta({ description });
const angleColumn = (description: string) =>
  z
    .object({
      unit: z.literal('rad'),
      values: values.meta({ description: 'rad; null where undefined (see nullReason).' }),
      nullReason: z.string().optional(),
    })
    .meta({ description });

const conserved = z.object({
  start: z.number(),
  end: z.number(),
  drift: z.number().meta({ description: '|end − start|.' }),
  relativeDrift: z.number().nullable().meta({ description: '|end − start| / scale (see the field); null where the scale is 0.' }),
});

const event = z.object({
  kind: z.enum(EVENT_KINDS),
  lambda: time.meta({ description: 'Proper time (affine parameter for light) since the launch.' }),
  riverTime: time,
  ingoingTime: time.meta({ description: 'Ingoing Kerr time v since the launch.' }),
  r: length,
  theta: z.number().meta({ description: 'rad' }),
  phi: z.number().meta({ description: 'Ingoing Kerr / Kerr–Schild azimuth φ̃, rad (not reduced mod 2π: it counts windings).' }),
});

export const geodesicResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    particle: z.enum(['massive', 'light']),
    start: z.object({
      point: pointEchoSchema,
      phi: z.number().meta({ description: 'rad' }),
      observer: z.enum(['static', 'zamo', 'river']).nullable(),
    }),
    outcome: z.enum(['escaped', 'plunged', 'boundOrbit', 'inFlight', 'hitSurface', 'undetermined']).meta({
      description:
        'escaped: reached the escape radius outward; plunged: crossed the outer horizon (or reached the singularity); boundOrbit: a massive particle with E < 1 still outside when the duration ran out; inFlight: otherwise still travelling at the end of the duration; hitSurface: reached a body\'s surface; undetermined: stopped by the step limit or the tolerance before any of these.',
    }),
    termination: z.object({ event: z.enum(TERMINATION_KINDS), description: z.string() }),
    horizonCrossings: z.object({
      outer: event.nullable().meta({ description: 'Where the path crossed the outer horizon: its proper and river times there.' }),
      inner: event.nullable().meta({ description: 'Where the path reached the inner horizon (stopped at r₋ + 1e−6 (r₊ − r₋)).' }),
    }),
    events: z.array(event).meta({ description: 'Every event in order, at most 1000 (eventCount counts all).' }),
    eventCount: z.number().int(),
    constants: z.object({
      energy: z.number().meta({ description: 'E = −p_t per unit rest mass (c²); for light, in units of the photon energy measured by the launching observer (or as given).' }),
      angularMomentum: z.number().meta({ description: 'L = p_φ per unit rest mass, GM/c.' }),
      energyDrift: z.number().meta({ description: 'Always 0: E = −p_v is a constant of the equations in ingoing coordinates, not integrated.' }),
      angularMomentumDrift: z.number().meta({ description: 'Always 0, like energyDrift.' }),
      carter: conserved.meta({ description: 'Carter constant K, (GM/c)²; relative drift scaled by |K| + (L − aE)².' }),
      massShell: conserved.meta({
        description:
          'g^{μν}p_μp_ν: −1 (massive) or 0 (light); relative drift scaled by max(1, E²). At a stop near the inner horizon on the branch where ingoing coordinates degenerate (E(r² + a²) − aL < 0 there, p_r ∝ 1/Δ) it is ill-conditioned and may read ~1e−4 while the path and its clocks keep their tolerance.',
      }),
    }),
    samples: z.object({
      count: z.number().int(),
      parameter: z.enum(['properTime', 'affineParameter']),
      lambda: column('s', 'Proper time (affine parameter for light, scaled to the observer\'s clock at the launch) since the launch.'),
      riverTime: column('s', 'River (Doran / Gullstrand–Painlevé) time since the launch: the proper time of observers falling from rest at infinity; smooth through both horizons.'),
      ingoingTime: column('s', 'Ingoing Kerr time v since the launch (t + r* outside).'),
      farAwayTime: column('s', 'Boyer–Lindquist t since the launch, the time of a clock far away; null from the outer horizon on (it diverges there).'),
      r: column('m', 'Boyer–Lindquist r.'),
      theta: angleColumn('Polar angle θ.'),
      phi: angleColumn('Ingoing Kerr / Kerr–Schild azimuth φ̃ (counts windings).'),
      phiBoyerLindquist: angleColumn('Boyer–Lindquist azimuth φ; null from the outer horizon on (it diverges there).'),
      x: column('m', 'Kerr–Schild Cartesian x: x + iy = (r + ia) sinθ e^{iφ̃}.'),
      y: column('m', 'Kerr–Schild Cartesian y.'),
      z: column('m', 'Kerr–Schild Cartesian z = r cos θ.'),
    }),
    steps: z.object({
      accepted: z.number().int(),
      rejected: z.number().int(),
      evaluations: z.number().int().meta({ description: 'Right-hand-side evaluations.' }),
      smallest: z.number().meta({ description: 'Smallest accepted step, GM/c³.' }),
      largest: z.number().meta({ description: 'Largest accepted step, GM/c³.' }),
      tolerance: z.number(),
      method: z.literal('DOP853'),
    }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'GeodesicResponse' });
export type GeodesicResponse = z.infer<typeof geodesicResponse>;

const REFUSAL_PATHS: Record<string, string> = {
  speed: '/start/speed',
  observer: '/start/observer',
  theta: '/start/point/theta',
  carter: '/start/carter',
  energy: '/start/energy',
  escapeRadius: '/escapeRadius',
  start: '/start',
};

function refused(r: GeodesicRefused): never {
  throw unphysical(REFUSAL_PATHS[r.field] ?? '/start', r.message);
}

const HORIZON_REASON = 'Boyer–Lindquist t and φ diverge at the outer horizon: undefined on and after the crossing';
const RIVER_REASON = 'no river time where 2r < Q² (no observer falls from rest at infinity to there)';

function seconds(geometric: number, body: Body, reason: string): z.infer<typeof time> {
  if (!Number.isFinite(geometric)) return { value: null, unit: 's', geometric: null, reason };
  return { value: geometric * body.tg, unit: 's', geometric };
}

function columnOf(values: Float64Array, count: number, scale: number, unit: string, reason?: string, withGeometric = true) {
  const si: (number | null)[] = new Array<number | null>(count);
  const geo: (number | null)[] = new Array<number | null>(count);
  let anyNull = false;
  for (let k = 0; k < count; k++) {
    const g = values[k]!;
    if (Number.isFinite(g) && Number.isFinite(g * scale)) {
      si[k] = g * scale;
      geo[k] = g;
    } else {
      si[k] = geo[k] = null;
      anyNull = true;
    }
  }
  const out: { unit: string; values: (number | null)[]; geometric?: (number | null)[]; nullReason?: string } = { unit, values: si };
  if (withGeometric) out.geometric = geo;
  if (anyNull) out.nullReason = reason ?? 'not finite in double precision';
  return out;
}

function outcomeOf(g: Geodesic, massive: boolean): GeodesicResponse['outcome'] {
  const crossed = g.events.some((e) => e.kind === 'outerHorizon');
  switch (g.termination) {
    case 'escape':
      return 'escaped';
    case 'surface':
      return 'hitSurface';
    case 'outerHorizon':
    case 'innerHorizon':
    case 'singularity':
      return 'plunged';
    case 'maxLength':
      if (crossed) return 'plunged';
      return massive && g.constants.E < 1 ? 'boundOrbit' : 'inFlight';
    default:
      return crossed ? 'plunged' : 'undetermined';
  }
}

export function computeGeodesic(input: GeodesicRequestInput): GeodesicResponse {
  const n = normalizeGeodesic(input);
  const { body } = n;
  const s = body.spacetime;
  const result = geodesic(s, n.physics);
  if (!result.ok) refused(result);
  const g = result;
  const rg = body.rg;
  const tg = body.tg;
  const ev = (e: Geodesic['events'][number]) => ({
    kind: e.kind,
    lambda: seconds(e.lambda, body, 'not finite'),
    riverTime: seconds(e.river, body, RIVER_REASON),
    ingoingTime: seconds(e.v, body, 'not finite'),
    r: { value: e.r * rg, unit: 'm' as const, geometric: e.r },
    theta: e.theta,
    phi: e.phi,
  });
  const outer = g.events.find((e) => e.kind === 'outerHorizon');
  const inner = g.events.find((e) => e.kind === 'innerHorizon');
  const smp = g.samples;
  const count = smp.count;
  const scaleK = Math.abs(g.start.carter) + (g.constants.L - s.a * g.constants.E) ** 2;
  const dK = Math.abs(g.end.carter - g.start.carter);
  const dH = Math.abs(g.end.twiceH - g.start.twiceH);
  const massive = input.particle === 'massive';
  const notes = [
    ...bodyNotes(body),
    'Integrated in ingoing Kerr coordinates (v, r, θ, φ̃), regular across both horizons, by Dormand–Prince 8(5,3) (DOP853) with its 7th-order dense output; samples and events come from the dense output.',
    'Clocks count from the launch (λ = 0). For light, λ is the affine parameter scaled so that it advances like the launching observer\'s clock at the launch (photon energy 1 in that frame), or by the energy given.',
  ];
  if (g.termination === 'toleranceNotMet' || g.termination === 'maxSteps') {
    notes.push(`Stopped early: ${TERMINATIONS[g.termination]}.`);
  }
  notes.push(CAUTION);
  return {
    service,
    body: bodyEcho(body),
    particle: input.particle,
    start: {
      point: pointEcho(n.point, region(s, n.point.rGeometric, n.point.theta, body.radiusGeometric ?? undefined)),
      phi: n.phi,
      observer: n.observer,
    },
    outcome: outcomeOf(g, massive),
    termination: { event: g.termination, description: TERMINATIONS[g.termination] },
    horizonCrossings: { outer: outer ? ev(outer) : null, inner: inner ? ev(inner) : null },
    events: g.events.map(ev),
    eventCount: g.eventCount,
    constants: {
      energy: g.constants.E,
      angularMomentum: g.constants.L,
      energyDrift: 0,
      angularMomentumDrift: 0,
      carter: { start: g.start.carter, end: g.end.carter, drift: dK, relativeDrift: scaleK > 0 ? dK / scaleK : null },
      massShell: { start: g.start.twiceH, end: g.end.twiceH, drift: dH, relativeDrift: dH / Math.max(1, g.constants.E ** 2) },
    },
    samples: {
      count,
      parameter: massive ? 'properTime' : 'affineParameter',
      lambda: columnOf(smp.lambda, count, tg, 's'),
      riverTime: columnOf(smp.river, count, tg, 's', RIVER_REASON),
      ingoingTime: columnOf(smp.v, count, tg, 's'),
      farAwayTime: columnOf(smp.t, count, tg, 's', HORIZON_REASON),
      r: columnOf(smp.r, count, rg, 'm'),
      theta: columnOf(smp.theta, count, 1, 'rad', undefined, false),
      phi: columnOf(smp.phi, count, 1, 'rad', undefined, false),
      phiBoyerLindquist: columnOf(smp.phiBL, count, 1, 'rad', HORIZON_REASON, false),
      x: columnOf(smp.x, count, rg, 'm'),
      y: columnOf(smp.y, count, rg, 'm'),
      z: columnOf(smp.z, count, rg, 'm'),
    } as GeodesicResponse['samples'],
    steps: { ...g.steps, tolerance: g.rtol, method: 'DOP853' },
    notes,
  };
}

export const geodesicRoute: ComputeRoute<GeodesicRequestInput> = {
  path: '/v1/geodesic',
  serializer: 'json',
  operationId: 'geodesic',
  summary: 'Follow a geodesic through the horizons',
  description:
    'The path of a massive particle or of light in the field of the body, launched from a point by a static observer, a ZAMO or a river free-faller with a speed and direction measured in that observer\'s frame, or given by its constants of motion (E, L, Carter constant) and the signs of its radial and polar motion. Integrated in horizon-penetrating ingoing Kerr coordinates by DOP853; returns evenly spaced samples (proper time, river time, ingoing and far-away time, r, θ, φ and Kerr–Schild x, y, z for plotting), the events (horizon crossings with their proper and river times, turning points, escape), the constants of motion and their drift, how the path ended and the step statistics. Samples and steps are bounded (413 beyond the limits); a path that cannot meet its tolerance stops with the status toleranceNotMet.',
  tag: 'orbits',
  body: geodesicRequest,
  response: geodesicResponse,
  compute: computeGeodesic,
  canonical: canonicalGeodesic,
};
