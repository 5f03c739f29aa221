/**
 * POST /v1/proper-time — proper-time intervals: a stationary clock over a far-away time (or the
 * reverse), radial free fall between two radii (through the horizons where the path goes), and N
 * revolutions of a circular orbit.
 */
import { z } from 'zod';
import { ProblemError, invalid, unphysical } from '../errors.js';
import { freeFall } from '../physics/free-fall.js';
import { FALL_REASONS, type FallStart, type FreeFall, type FreeFallRefused } from '../physics/free-fall-types.js';
import { circularOrbitRevolutions, stationaryFarAwayTime, stationaryProperTime } from '../physics/proper-time.js';
import { region } from '../physics/spacetime.js';
import { bodyInput, normalizeBody, normalizePoint, pointInput, quantityInput, readAngle, readLength, readQuantity, type Body } from './inputs.js';
import { canonicalBody, canonicalPoint } from '../cache/key.js';
import { canonicalObserver, normalizeObserver, observerEcho, observerEchoSchema, observerInput } from './observer.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, CAUTION, pointEchoSchema, pointEcho, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';

const stationaryInterval = z.strictObject({
  kind: z.literal('stationary'),
  observer: observerInput,
  farAwayTime: quantityInput.optional().meta({ description: 'Far-away (coordinate) time elapsed, s or e.g. "1 day".' }),
  properTime: quantityInput.optional().meta({ description: 'Or: proper time elapsed on the observer\'s clock.' }),
});

const freeFallInterval = z.strictObject({
  kind: z.literal('freeFall'),
  from: quantityInput.meta({ description: 'Start radius r₁ (Boyer–Lindquist), e.g. "10 rg".' }),
  to: quantityInput.meta({ description: 'End radius r₂; may lie inside the horizon, 0 for the singularity.' }),
  start: z.enum(['restAtInfinity', 'rest', 'launch']).meta({
    description:
      'restAtInfinity: falling from rest at infinity (E = 1, the river frame); rest: released at rest at r₁; launch: thrown from r₁ with speed (inward or outward).',
  }),
  speed: quantityInput.optional().meta({
    description: 'For launch: speed at r₁ measured by the local static observer (the ZAMO when the body spins), e.g. "0.5 c".',
  }),
  direction: z.enum(['inward', 'outward']).optional().meta({ description: 'For launch (default inward).' }),
  theta: quantityInput.optional().meta({
    description: 'Polar angle of the path: any when spin is 0; 0 (the axis) or 90° (the equator, the default) when it spins.',
  }),
  tolerance: z.number().min(1e-15).max(1e-3).optional().meta({ description: 'Relative tolerance of the quadrature (default 1e-12).' }),
});

const orbitInterval = z.strictObject({
  kind: z.literal('orbit'),
  point: pointInput.meta({ description: 'The orbit radius (equatorial).' }),
  direction: z.enum(['prograde', 'retrograde']).optional().meta({ description: 'Default prograde.' }),
  revolutions: z.number().positive().max(1e15).meta({ description: 'Number of revolutions N > 0.' }),
});

export const properTimeRequest = z
  .strictObject({
    body: bodyInput,
    interval: z.discriminatedUnion('kind', [stationaryInterval, freeFallInterval, orbitInterval]).meta({ id: 'Interval' }),
  })
  .meta({ id: 'ProperTimeRequest' });
export type ProperTimeRequest = z.infer<typeof properTimeRequest>;

const time = z
  .object({ value: z.number().nullable(), unit: z.literal('s'), geometric: z.number().nullable(), reason: z.string().optional() })
  .meta({ id: 'TimeValue' });
type Time = z.infer<typeof time>;

export const properTimeResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    kind: z.enum(['stationary', 'freeFall', 'orbit']),
    observer: observerEchoSchema.nullable().meta({ description: 'The clock, for stationary and orbit intervals.' }),
    fall: z
      .object({
        from: pointEchoSchema,
        to: pointEchoSchema,
        start: z.enum(['restAtInfinity', 'rest', 'launch']),
        geometry: z.enum(['radial', 'axis', 'equator']),
        direction: z.enum(['inward', 'outward', 'none']),
        energy: z.number().meta({ description: 'Energy per unit mass E = −u_t (units of c²).' }),
        method: z.enum(['closedForm', 'quadrature']),
        tolerance: z.number().meta({ description: 'Relative tolerance asked of the quadrature.' }),
        errorEstimate: z.object({ properTime: z.number(), riverTime: z.number().nullable(), farAwayTime: z.number().nullable() }).meta({
          description: 'Absolute error estimates of the quadrature, s (0 for closed forms: rounding only).',
        }),
        evaluations: z.number().int(),
      })
      .nullable(),
    properTime: time.meta({ description: 'Time on the moving (or stationary) clock.' }),
    farAwayTime: time.meta({ description: 'Boyer–Lindquist time t, the time of a clock at rest far away.' }),
    riverTime: time
      .nullable()
      .meta({ description: 'Gullstrand–Painlevé / Doran time T, the proper time of observers falling from rest at infinity (free fall only).' }),
    lag: time.nullable().meta({ description: 'farAwayTime − properTime for a stationary clock, without cancellation.' }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'ProperTimeResponse' });
export type ProperTimeResponse = z.infer<typeof properTimeResponse>;

function seconds(geometric: number | null, body: Body, reason?: string): Time {
  const ok = geometric !== null && Number.isFinite(geometric) && Number.isFinite(geometric * body.tg);
  const out: Time = { value: ok ? geometric * body.tg : null, unit: 's', geometric: ok ? geometric : null };
  if (!ok) out.reason = reason ?? 'the value is not finite in double precision';
  return out;
}

const FALL_PATHS: Record<FreeFallRefused['reason'], string> = {
  invalidInput: '/interval',
  unsupportedGeometry: '/interval/theta',
  startInsideHorizon: '/interval/from',
  startUnreachable: '/interval/from',
  wrongDirection: '/interval/to',
  turnsBack: '/interval/to',
  notConverged: '/interval/tolerance',
};

type FallInput = z.infer<typeof freeFallInterval>;

function computeFall(body: Body, f: FallInput): Omit<ProperTimeResponse, 'service' | 'body' | 'notes'> & { notes: string[] } {
  const radius = (v: number | string, path: string) => {
    const r = readLength(v, path, body, true);
    if (body.radius !== null && r.si < body.radius) {
      throw unphysical(path, `r = ${r.si} m lies below the body's surface (radius ${body.radius} m)`);
    }
    return r;
  };
  const r1 = radius(f.from, '/interval/from');
  const r2 = radius(f.to, '/interval/to');
  if (!(r1.geometric > 0)) throw unphysical('/interval/from', 'the start radius must be positive');
  let theta = Math.PI / 2;
  if (f.theta !== undefined) {
    theta = readAngle(f.theta, '/interval/theta', 0, Math.PI, '[0, π]');
  }
  let start: FallStart;
  if (f.start === 'launch') {
    if (f.speed === undefined) throw invalid('/interval/speed', 'a launch needs a speed');
    const v = readQuantity(f.speed, 'speed', '/interval/speed') / 299_792_458;
    if (!(v >= 0 && v < 1)) throw unphysical('/interval/speed', 'the launch speed must lie in [0, c)');
    start = { kind: 'launch', speed: v, direction: f.direction ?? 'inward' };
  } else {
    for (const k of ['speed', 'direction'] as const) {
      if (f[k] !== undefined) throw invalid(`/interval/${k}`, `${k} applies to a launch only`);
    }
    start = { kind: f.start };
  }
  const options = f.tolerance === undefined ? {} : { relativeTolerance: f.tolerance };
  const result = freeFall(body.spacetime, { r1: r1.geometric, r2: r2.geometric, theta, start }, options);
  if (!result.ok) {
    const path = FALL_PATHS[result.reason];
    let message = result.message;
    if (result.turningRadius !== undefined) message += ` (turning radius ${result.turningRadius * body.rg} m = ${result.turningRadius} GM/c²)`;
    if (result.reason === 'notConverged') throw new ProblemError('tolerance-not-met', message, [{ path, message }]);
    throw unphysical(path, message);
  }
  const ff: FreeFall = result;
  const reasonText = (r?: keyof typeof FALL_REASONS) => (r ? FALL_REASONS[r] : undefined);
  const point = (r: { si: number; geometric: number }) =>
    pointEcho(
      { r: r.si, rGeometric: r.geometric, altitude: body.radius === null ? null : r.si - body.radius, theta },
      region(body.spacetime, r.geometric, theta, body.radiusGeometric ?? undefined),
    );
  const err = (x: number | null) => (x === null ? null : x * body.tg);
  return {
    kind: 'freeFall',
    observer: null,
    fall: {
      from: point(r1),
      to: point(r2),
      start: f.start,
      geometry: ff.geometry,
      direction: ff.direction,
      energy: ff.energy,
      method: ff.method,
      tolerance: ff.tolerance,
      errorEstimate: { properTime: ff.errorEstimate.properTime * body.tg, riverTime: err(ff.errorEstimate.riverTime), farAwayTime: err(ff.errorEstimate.farAwayTime) },
      evaluations: ff.evaluations,
    },
    properTime: seconds(ff.properTime, body),
    farAwayTime: seconds(ff.farAwayTime, body, reasonText(ff.farAwayTimeReason)),
    riverTime: seconds(ff.riverTime, body, reasonText(ff.riverTimeReason)),
    lag: null,
    notes: ff.notes,
  };
}

export function computeProperTime(input: ProperTimeRequest): ProperTimeResponse {
  const body = normalizeBody(input.body);
  const iv = input.interval;
  let part: ReturnType<typeof computeFall>;
  if (iv.kind === 'freeFall') {
    part = computeFall(body, iv);
  } else if (iv.kind === 'stationary') {
    const n = normalizeObserver(iv.observer, body, '/interval/observer');
    if ((iv.farAwayTime === undefined) === (iv.properTime === undefined)) {
      throw invalid('/interval', 'give exactly one of farAwayTime and properTime');
    }
    const given = iv.farAwayTime ?? iv.properTime!;
    const path = iv.farAwayTime !== undefined ? '/interval/farAwayTime' : '/interval/properTime';
    const t = readQuantity(given, 'time', path, body);
    if (!(t >= 0)) throw unphysical(path, 'the interval must not be negative');
    const geo = t / body.tg;
    const s = iv.farAwayTime !== undefined ? stationaryProperTime(n.observer, geo) : stationaryFarAwayTime(n.observer, geo);
    part = {
      kind: 'stationary',
      observer: observerEcho(n, body),
      fall: null,
      properTime: seconds(s.properTime, body),
      farAwayTime: seconds(s.farAwayTime, body),
      riverTime: null,
      lag: seconds(s.lag, body),
      notes: [],
    };
  } else {
    const point = normalizePoint(iv.point, body, '/interval/point');
    const result = circularOrbitRevolutions(body.spacetime, point.rGeometric, iv.direction ?? 'prograde', iv.revolutions);
    if (!('properTime' in result)) throw unphysical('/interval/point', `no circular orbit here: ${result.message}`);
    const n = { observer: result.observer, point, input: { kind: 'circular' as const, direction: iv.direction ?? 'prograde' } };
    part = {
      kind: 'orbit',
      observer: observerEcho(n, body),
      fall: null,
      properTime: seconds(result.properTime, body),
      farAwayTime: seconds(result.farAwayTime, body),
      riverTime: null,
      lag: seconds(result.lag, body),
      notes: [`${iv.revolutions} revolution(s): farAwayTime = 2πN/|Ω|, properTime = (dτ/dt)·farAwayTime on the orbiting clock.`],
    };
  }
  const notes = [...bodyNotes(body), ...part.notes, CAUTION];
  return { service, body: bodyEcho(body), ...part, notes };
}

export const properTimeRoute: ComputeRoute<ProperTimeRequest> = {
  path: '/v1/proper-time',
  operationId: 'properTime',
  summary: 'Proper-time intervals',
  description:
    'How much time a clock experiences: a stationary observer over a far-away time (or the far-away time during a proper time), a radial free fall from r₁ to r₂ — from rest at infinity, from rest, or launched with a speed — with proper, river (Gullstrand–Painlevé / Doran) and far-away times, through the horizons down to the singularity where the path goes; and N revolutions of a circular orbit.',
  tag: 'clocks',
  body: properTimeRequest,
  response: properTimeResponse,
  compute: computeProperTime,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    const iv = input.interval;
    const time = (v: number | string | undefined, path: string) => (v === undefined ? null : readQuantity(v, 'time', path, body));
    let interval: unknown;
    if (iv.kind === 'stationary') {
      interval = {
        kind: iv.kind,
        observer: canonicalObserver(normalizeObserver(iv.observer, body, '/interval/observer')),
        farAwayTime: time(iv.farAwayTime, '/interval/farAwayTime'),
        properTime: time(iv.properTime, '/interval/properTime'),
      };
    } else if (iv.kind === 'freeFall') {
      interval = {
        kind: iv.kind,
        from: readLength(iv.from, '/interval/from', body, true),
        to: readLength(iv.to, '/interval/to', body, true),
        start: iv.start,
        speed: iv.speed === undefined ? null : readQuantity(iv.speed, 'speed', '/interval/speed'),
        direction: iv.start === 'launch' ? (iv.direction ?? 'inward') : (iv.direction ?? null),
        theta: iv.theta === undefined ? Math.PI / 2 : readQuantity(iv.theta, 'angle', '/interval/theta'),
        tolerance: iv.tolerance ?? null,
      };
    } else {
      interval = {
        kind: iv.kind,
        point: canonicalPoint(normalizePoint(iv.point, body, '/interval/point')),
        direction: iv.direction ?? 'prograde',
        revolutions: iv.revolutions,
      };
    }
    return { body: canonicalBody(body), interval };
  },
};
