/**
 * POST /v1/clocks — the rate of observer B's clock relative to observer A's, around one body.
 */
import { z } from 'zod';
import { compareClocks, signalFrequencyRatio, type RateSplit } from '../physics/observers.js';
import { JULIAN_YEAR } from '../units/constants.js';
import { bodyInput, normalizeBody } from './inputs.js';
import { canonicalBody } from '../cache/key.js';
import { canonicalObserver, normalizeObserver, observerEcho, observerEchoSchema, observerInput, type NormalizedObserver } from './observer.js';
import { bodyEcho, bodyEchoSchema, bodyNotes, CAUTION, service, serviceStamp } from './responses.js';
import type { ComputeRoute } from './route.js';

export const clocksRequest = z
  .strictObject({
    body: bodyInput,
    a: observerInput.meta({ description: 'The reference clock A.' }),
    b: observerInput.meta({ description: 'The compared clock B.' }),
  })
  .meta({ id: 'ClocksRequest' });
export type ClocksRequest = z.infer<typeof clocksRequest>;

const DAY = 86_400;

const gain = z
  .object({ value: z.number(), unit: z.literal('s'), microseconds: z.number(), nanoseconds: z.number() })
  .meta({ id: 'ClockGain', description: 'Time B\'s clock gains on A\'s over the interval of A\'s clock (negative: loses).' });
type Gain = z.infer<typeof gain>;

const part = z.object({
  logRatio: z.number().meta({ description: 'This part of ln(rate_B/rate_A).' }),
  gainPerDay: gain,
});

export const clocksResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema,
    a: observerEchoSchema,
    b: observerEchoSchema,
    comparison: z.object({
      rateRatio: z.object({ value: z.number(), unit: z.literal('1') }).meta({ description: 'rate_B / rate_A: seconds of B per second of A.' }),
      fractionalOffset: z
        .object({ value: z.number(), unit: z.literal('1') })
        .meta({ description: 'rate_B / rate_A − 1, computed without cancellation (positive: B runs fast).' }),
      gainPerDay: gain,
      gainPerYear: gain,
      parts: z
        .object({ gravitational: part, frameDragging: part, motion: part })
        .nullable()
        .meta({ description: 'The exact split of ln(rate_B/rate_A); null where either clock has no static observer beside it.' }),
      signal: z
        .object({
          frequencyRatio: z.number().meta({ description: 'ν received at B / ν emitted at A.' }),
          frequencyShift: z.number().meta({ description: 'frequencyRatio − 1 (positive: blueshift), without cancellation.' }),
          redshift: z.number().meta({ description: 'z = ν_A/ν_B − 1.' }),
        })
        .nullable()
        .meta({ description: 'A light signal from A to B; for static (or distant) observers only.' }),
    }),
    notes: z.array(z.string()),
  })
  .meta({ id: 'ClocksResponse' });
export type ClocksResponse = z.infer<typeof clocksResponse>;

function gainOver(fraction: number, seconds: number): Gain {
  const value = fraction * seconds;
  return { value, unit: 's', microseconds: value * 1e6, nanoseconds: value * 1e9 };
}

const SPLIT_NOTE =
  'parts: ln(rate_B/rate_A) = gravitational + frameDragging + motion exactly, where ln(dτ/dt) = ln √(−g_tt) (the static clock at the same point) + ln(1 + Ω g_tφ/g_tt) (coupling of the motion to frame dragging) + ln(1/γ) (γ the Lorentz factor relative to the static observer). In weak fields these are the familiar gravitational (potential) and velocity terms; each part\'s gainPerDay is logRatio × 86400 s, so the parts add up to the total to first order.';
const GAIN_NOTE = 'gainPerDay and gainPerYear (Julian year, 365.25 d) are counted on A\'s clock.';

/** r_B − r_A in units of M, exact when both points were given as altitudes. */
function radialSeparation(a: NormalizedObserver, b: NormalizedObserver, rg: number): number | undefined {
  if (!a.point || !b.point) return undefined;
  if (a.input.point?.altitude !== undefined && b.input.point?.altitude !== undefined) {
    return ((b.point.altitude ?? 0) - (a.point.altitude ?? 0)) / rg;
  }
  return undefined;
}

function partsOf(split: RateSplit) {
  const one = (logRatio: number) => ({ logRatio, gainPerDay: gainOver(logRatio, DAY) });
  return { gravitational: one(split.gravitational), frameDragging: one(split.frameDragging), motion: one(split.motion) };
}

export function computeClocks(input: ClocksRequest): ClocksResponse {
  const body = normalizeBody(input.body);
  const a = normalizeObserver(input.a, body, '/a');
  const b = normalizeObserver(input.b, body, '/b');
  const dr = radialSeparation(a, b, body.rg);
  const cmp = compareClocks(body.spacetime, a.observer, b.observer, dr);
  const signal = signalFrequencyRatio(body.spacetime, a.observer, b.observer, dr);
  const notes = bodyNotes(body);
  notes.push(GAIN_NOTE, SPLIT_NOTE, CAUTION);
  return {
    service,
    body: bodyEcho(body),
    a: observerEcho(a, body),
    b: observerEcho(b, body),
    comparison: {
      rateRatio: { value: cmp.ratio, unit: '1' },
      fractionalOffset: { value: cmp.fractionalOffset, unit: '1' },
      gainPerDay: gainOver(cmp.fractionalOffset, DAY),
      gainPerYear: gainOver(cmp.fractionalOffset, JULIAN_YEAR),
      parts: cmp.parts ? partsOf(cmp.parts) : null,
      signal: signal ? { frequencyRatio: signal.ratio, frequencyShift: signal.shift, redshift: signal.redshift } : null,
    },
    notes,
  };
}

export const clocksRoute: ComputeRoute<ClocksRequest> = {
  path: '/v1/clocks',
  operationId: 'clocks',
  summary: 'Compare two clocks around one body',
  description:
    'The rate of observer B\'s clock relative to observer A\'s (static, ZAMO, circular orbit, rotating with the body, or far away): ratio, fractional offset without cancellation, time gained per day and per year, its exact split into gravitational, frame-dragging and motion parts, and for static observers the frequency ratio of a light signal from A to B.',
  tag: 'clocks',
  body: clocksRequest,
  response: clocksResponse,
  compute: computeClocks,
  canonical: (input) => {
    const body = normalizeBody(input.body);
    const a = normalizeObserver(input.a, body, '/a');
    const b = normalizeObserver(input.b, body, '/b');
    return { body: canonicalBody(body), a: canonicalObserver(a), b: canonicalObserver(b), dr: radialSeparation(a, b, body.rg) ?? null };
  },
};
