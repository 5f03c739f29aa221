/**
 * POST /v1/sweep — sweepable quantities (catalogue `sweepable`) over a grid of one or two axes (r,
 * altitude, θ, latitude, spin, charge, mass), as columnar JSON or, with Accept: text/csv, streamed CSV.
 *
 * This file holds the request and response schemas and the types shared by the sweep modules. The
 * request is validated and normalised once (prepareSweep, sweep-prepare.ts): the axes become typed
 * arrays in geometric units, and the physics layer (physics/sweep.ts, physics/sweep-body.ts) evaluates
 * each quantity in one pass over them (computeSweepColumns, sweep-columns.ts). The JSON and CSV texts
 * are written directly from the typed arrays (sweep-output.ts) with the shortest round-trip form of
 * each number; the cache key's canonical input is sweep-key.ts; the HTTP route is sweep-route.ts.
 *
 * Points outside the domain a single request accepts (below the surface, θ outside [0, π], a naked
 * singularity, a body radius inside its horizon) are null with the reason; when every point is
 * outside it, the sweep is refused with 422 as the single request would be.
 */
import { z } from 'zod';
import { CATALOGUE, type QuantityInfo } from '../catalogue.js';
import { LOCAL_QUANTITIES } from '../physics/local.js';
import type { SweepGrid, SweepParam } from '../physics/sweep.js';
import { BODY_QUANTITIES } from '../physics/sweep-body.js';
import { MAX_QUANTITY_LENGTH } from '../units/quantity.js';
import { bodyInput, pointInput, quantityInput, type Body } from './inputs.js';
import { bodyEchoSchema, serviceStamp } from './responses.js';

/** Default largest number of grid points (count₁ × count₂); the app passes the configured value. */
export const SWEEP_DEFAULT_MAX_POINTS = 1_000_000;

/** Rows per CSV chunk (a few hundred kB of text). */

const AXIS_VARIABLES = ['r', 'altitude', 'theta', 'latitude', 'spin', 'charge', 'mass'] as const;
export type AxisVariable = (typeof AXIS_VARIABLES)[number];

export const LOCAL_SET = new Set<string>(LOCAL_QUANTITIES);
const BODY_SET = new Set<string>(BODY_QUANTITIES);

/** The names a sweep accepts: every catalogue entry marked sweepable. */
export const SWEEPABLE_QUANTITIES: readonly string[] = CATALOGUE.filter((q) => q.sweepable).map((q) => q.name);
// Every sweepable catalogue entry must be evaluable here (a missing one is a programming error).
for (const n of SWEEPABLE_QUANTITIES) {
  if (!LOCAL_SET.has(n) && !BODY_SET.has(n)) throw new Error(`sweep cannot evaluate sweepable quantity ${n}`);
}

export const sweepAxis = z
  .strictObject({
    variable: z.enum(AXIS_VARIABLES).meta({
      description:
        'r (Boyer–Lindquist radius), altitude (above the surface of a body with a radius), theta (polar angle), latitude, spin (a/M), charge (Q/M) or mass.',
    }),
    from: quantityInput.meta({ description: 'First value: "1 rg", "1000 km", "0 deg", 0.5, "1 Msun"…' }),
    to: quantityInput.meta({ description: 'Last value (included).' }),
    count: z.number().int().min(1).meta({ description: 'Number of values (≥ 1); count 1 gives `from` alone.' }),
    spacing: z.enum(['linear', 'log']).default('linear').meta({
      description: 'linear, or log (geometric progression; from and to nonzero and of one sign).',
    }),
  })
  .meta({ id: 'SweepAxis' });

export const sweepRequest = z
  .strictObject({
    body: bodyInput,
    point: pointInput.optional().meta({
      description: 'Point template: the fixed coordinates; an axis over r/altitude or theta/latitude replaces the template\'s.',
    }),
    quantities: z
      .array(z.string().max(MAX_QUANTITY_LENGTH))
      .min(1)
      .max(CATALOGUE.length)
      .meta({ description: 'Names of sweepable quantities from GET /v1/quantities.' }),
    axes: z.array(sweepAxis).min(1).max(2).meta({ description: 'One or two axes; the last varies fastest.' }),
  })
  .meta({ id: 'SweepRequest' });
export type SweepRequest = z.infer<typeof sweepRequest>;

const nullReason = z.object({ reason: z.string(), count: z.number().int(), firstIndex: z.number().int() });

export const sweepResponse = z
  .object({
    service: serviceStamp,
    body: bodyEchoSchema.meta({ description: 'The body at the first grid point (axis variables vary from it).' }),
    axes: z.array(z.object({ variable: z.enum(AXIS_VARIABLES), unit: z.string(), values: z.array(z.number()) })),
    shape: z.array(z.number().int()).meta({ description: '[count₁] or [count₁, count₂]; values are row-major (the last axis fastest).' }),
    columns: z.record(
      z.string(),
      z.object({
        unit: z.string(),
        values: z.array(z.number().nullable()),
        nullReasons: z.array(nullReason).meta({ description: 'Each reason for a null, with how many points and the first (flat) index.' }),
      }),
    ),
    notes: z.array(z.string()),
  })
  .meta({ id: 'SweepResponse' });
export type SweepResponse = z.infer<typeof sweepResponse>;

/** One axis, normalised: reported values (in `unit`) and its length. */
export interface PreparedAxis {
  variable: AxisVariable;
  unit: string;
  values: Float64Array;
}

/** The scales of the body at every point (per point when a mass axis varies them). */
export interface Scales {
  rg: SweepParam;
  tg: SweepParam;
  massKg: SweepParam;
}

/** A validated, normalised sweep ready to compute. */
export interface PreparedSweep {
  /** The body at the first grid point, echoed in the response. */
  body: Body;
  quantities: QuantityInfo[];
  axes: PreparedAxis[];
  shape: number[];
  /** Number of grid points. */
  n: number;
  /** Every point in geometric units (row-major, the last axis fastest). */
  grid: SweepGrid;
  /** Body scales per point. */
  scales: Scales;
  /** The body parameters over the axes that change the body (length nBody; see bodyExpand). */
  bodies: { n: number; a: SweepParam; q: SweepParam; surface: SweepParam; scales: Scales; axis: number | 'all' | 'none' };
  /** Domain codes of every point (sweepDomain with the point checks), or null when no quantity needs the point. */
  domain: Uint8Array | null;
  notes: string[];
}

/** Computed columns: SI values (NaN where null), reason codes and the texts they index. */
export interface SweepColumns {
  columns: { info: QuantityInfo; values: Float64Array; codes: Uint8Array }[];
  reasons: readonly string[];
}
