/**
 * Response pieces shared by the compute endpoints: the quantity value schema, the echo of the
 * normalised body and point, the service stamp and the standard notes.
 */
import { z } from 'zod';
import { PRESETS } from '../units/presets.js';
import { SERVICE_NAME, VERSION } from '../version.js';
import type { Body, Point } from './inputs.js';

export const quantityValue = z
  .object({
    value: z.number().nullable().meta({ description: 'SI value; null where the quantity does not exist here.' }),
    unit: z.string().meta({ description: 'SI unit of value ("1" for dimensionless).' }),
    geometric: z
      .number()
      .nullable()
      .optional()
      .meta({ description: 'Value in geometric units G = c = M = 1 (present for quantities with a dimension).' }),
    reason: z.string().optional().meta({ description: 'Why value is null.' }),
  })
  .meta({ id: 'QuantityValue' });

export const serviceStamp = z
  .object({ name: z.literal(SERVICE_NAME), version: z.string() })
  .meta({ id: 'Service' });

const siValue = z.object({ value: z.number(), unit: z.string() });
const siGeometric = z.object({ value: z.number(), unit: z.string(), geometric: z.number() });

export const bodyEchoSchema = z
  .object({
    preset: z.enum(['sun', 'earth']).nullable(),
    kind: z.enum(['blackHole', 'bodyWithSurface']),
    family: z.enum(['schwarzschild', 'reissnerNordstrom', 'kerr', 'kerrNewman']),
    mass: siValue,
    gm: siValue,
    rg: siValue,
    tg: siValue,
    spin: z.number().meta({ description: 'a/M = cJ/(GM²).' }),
    charge: z.number().meta({ description: 'Q/M, geometrized.' }),
    chargeCoulomb: siValue,
    angularMomentum: siValue,
    radius: siGeometric.nullable(),
  })
  .meta({ id: 'NormalizedBody' });

export const pointEchoSchema = z
  .object({
    r: siGeometric,
    altitude: siValue.nullable(),
    theta: z.object({ value: z.number(), unit: z.literal('rad'), degrees: z.number() }),
    region: z.enum([
      'outside',
      'ergoregion',
      'outerHorizon',
      'betweenHorizons',
      'innerHorizon',
      'insideInnerHorizon',
      'singularity',
      'belowSurface',
    ]),
  })
  .meta({ id: 'NormalizedPoint' });

export function bodyEcho(b: Body): z.infer<typeof bodyEchoSchema> {
  return {
    preset: b.preset,
    kind: b.radius === null ? 'blackHole' : 'bodyWithSurface',
    family: b.family,
    mass: { value: b.massKg, unit: 'kg' },
    gm: { value: b.gm, unit: 'm^3/s^2' },
    rg: { value: b.rg, unit: 'm' },
    tg: { value: b.tg, unit: 's' },
    spin: b.spin,
    charge: b.charge,
    chargeCoulomb: { value: b.chargeCoulomb, unit: 'C' },
    angularMomentum: { value: b.angularMomentum, unit: 'kg m^2/s' },
    radius: b.radius === null ? null : { value: b.radius, unit: 'm', geometric: b.radiusGeometric ?? 0 },
  };
}

export function pointEcho(p: Point, region: z.infer<typeof pointEchoSchema>['region']): z.infer<typeof pointEchoSchema> {
  return {
    r: { value: p.r, unit: 'm', geometric: p.rGeometric },
    altitude: p.altitude === null ? null : { value: p.altitude, unit: 'm' },
    theta: { value: p.theta, unit: 'rad', degrees: (p.theta * 180) / Math.PI },
    region,
  };
}

export const service = { name: SERVICE_NAME, version: VERSION } as const;

export const CAUTION =
  'Validated physics, not a certified timing or navigation product; defer to the applicable standards (IERS, IAU, ITU-R TF) and licensed practice.';

const COORDINATES = 'r is the Boyer–Lindquist radius; θ the polar angle from the spin axis.';
const EXTERIOR =
  'Outside a body: the vacuum exterior with its mass, spin and charge only (no quadrupole — the Earth\'s J2 is ~0.1% of g — no interior).';
const OVERSPUN = 'spin² + charge² > 1: no horizon; the exterior holds only outside the body.';
const PRESET_NOTES = Object.fromEntries(
  Object.values(PRESETS).map((p) => [p.name, `Preset ${p.name}: ${p.sources.join('; ')}.`]),
) as Record<keyof typeof PRESETS, string>;

/** Notes that every response about this body carries (short: they travel with every response). */
export function bodyNotes(b: Body): string[] {
  const notes = [COORDINATES];
  if (b.radius !== null) notes.push(EXTERIOR);
  if (b.spacetime.a * b.spacetime.a + b.spacetime.q * b.spacetime.q > 1) notes.push(OVERSPUN);
  if (b.preset) notes.push(PRESET_NOTES[b.preset]);
  return notes;
}
