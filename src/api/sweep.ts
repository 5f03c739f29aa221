/**
 * POST /v1/sweep — sweepable quantities (catalogue `sweepable`) over a grid of one or two axes (r,
 * altitude, θ, latitude, spin, charge, mass), as columnar JSON or, with Accept: text/csv, streamed CSV.
 *
 * The request is validated and normalised once (prepareSweep): the axes become typed arrays in
 * geometric units, and the physics layer (physics/sweep.ts, physics/sweep-body.ts) evaluates each
 * quantity in one pass over them (computeSweepColumns). The JSON and CSV texts are written directly
 * from the typed arrays (sweepJson, sweepCsvChunks) with the shortest round-trip form of each number.
 *
 * Points outside the domain a single request accepts (below the surface, θ outside [0, π], a naked
 * singularity, a body radius inside its horizon) are null with the reason; when every point is
 * outside it, the sweep is refused with 422 as the single request would be.
 */
import { z } from 'zod';
import { CATALOGUE, CATALOGUE_BY_NAME, siFactor, type BodyScales, type QuantityInfo } from '../catalogue.js';
import { invalid, ProblemError, unphysical } from '../errors.js';
import { LOCAL_QUANTITIES, type LocalQuantity } from '../physics/local.js';
import { ReasonTable, sweepDomain, sweepLocal, type SweepGrid, type SweepParam } from '../physics/sweep.js';
import { BODY_QUANTITIES, sweepBody, type BodyQuantity } from '../physics/sweep-body.js';
import { C, C2, CHARGE_TO_LENGTH, G } from '../units/constants.js';
import { isPlainNumber, MAX_QUANTITY_LENGTH, needsBodyScale, toLength } from '../units/quantity.js';
import {
  bodyInput,
  LIMITS,
  normalizeBody,
  pointInput,
  quantityInput,
  readLength,
  readQuantity,
  type Body,
  type BodyInput,
  type Family,
} from './inputs.js';
import { bodyEchoSchema, bodyNotes, serviceStamp } from './responses.js';
import { parseOr400 } from './route.js';
import { canonicalBody } from '../cache/key.js';

/** Default largest number of grid points (count₁ × count₂); the app passes the configured value. */
export const SWEEP_DEFAULT_MAX_POINTS = 1_000_000;

/** Rows per CSV chunk (a few hundred kB of text). */

const AXIS_VARIABLES = ['r', 'altitude', 'theta', 'latitude', 'spin', 'charge', 'mass'] as const;
type AxisVariable = (typeof AXIS_VARIABLES)[number];

const LOCAL_SET = new Set<string>(LOCAL_QUANTITIES);
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
interface Scales {
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

// ---------------------------------------------------------------------------------------------------
// Normalisation

/** Evenly (linear) or geometrically (log) spaced values from `from` to `to` inclusive. */
function spaced(from: number, to: number, count: number, spacing: 'linear' | 'log', path: string): Float64Array {
  const out = new Float64Array(count);
  if (spacing === 'log' && !(from * to > 0)) {
    throw invalid(path, 'log spacing needs from and to nonzero and of the same sign (it cannot reach or cross zero)');
  }
  const last = count - 1;
  const ratio = to / from;
  for (let i = 0; i < count; i++) {
    const t = last === 0 ? 0 : i / last;
    out[i] = spacing === 'linear' ? from + (to - from) * t : from * Math.pow(ratio, t);
  }
  if (last > 0) out[last] = to;
  out[0] = from;
  return out;
}

/** Expands values along axis `axis` (or one value) to the full row-major grid. */
function expand(values: Float64Array | number, axis: number, shape: number[]): SweepParam {
  if (typeof values === 'number') return values;
  if (shape.length === 1) return values;
  const [n1, n2] = shape as [number, number];
  const out = new Float64Array(n1 * n2);
  if (axis === 0) {
    for (let i = 0; i < n1; i++) out.fill(values[i]!, i * n2, (i + 1) * n2);
  } else {
    for (let i = 0; i < n1; i++) out.set(values, i * n2);
  }
  return out;
}

/** Reads spin (a/M) or charge (Q/M) as normalizeBody does; with `gm`, a value with a unit is J or C. */
function readSpinCharge(kind: 'spin' | 'charge', input: number | string, path: string, gm: number): number {
  const unitless = isPlainNumber(input);
  let v = readQuantity(input, unitless ? 'none' : kind === 'spin' ? 'angularMomentum' : 'charge', path);
  if (!unitless) v = kind === 'spin' ? (C * v * G) / (gm * gm) : (v * CHARGE_TO_LENGTH) / (gm / C2);
  if (kind === 'spin' && v < 0) {
    throw invalid(path, 'spin is a magnitude (≥ 0); the orbit direction says prograde or retrograde');
  }
  if (!Number.isFinite(v) || Math.abs(v) > LIMITS.maxSpinOrCharge) {
    throw unphysical(path, `|${kind}| must not exceed ${LIMITS.maxSpinOrCharge} (in units of M)`);
  }
  return v;
}

/** Reads a mass in kg within the documented limits (422 outside). */
function readMass(input: number | string, path: string): number {
  const m = readQuantity(input, 'mass', path);
  if (!(m > 0)) throw unphysical(path, 'mass must be positive');
  if (m < LIMITS.massMinKg || m > LIMITS.massMaxKg) {
    throw unphysical(path, `mass must lie between ${LIMITS.massMinKg} kg and ${LIMITS.massMaxKg} kg (documented limit)`);
  }
  return m;
}

function familyOf(a: number, q: number): Family {
  if (a === 0) return q === 0 ? 'schwarzschild' : 'reissnerNordstrom';
  return q === 0 ? 'kerr' : 'kerrNewman';
}

/** The scales of a mass as normalizeBody computes them (gm = G m; m = gm/G; rg = gm/c²; tg = rg/c). */
function scalesOf(massInput: number): { gm: number; massKg: number; rg: number; tg: number } {
  const gm = G * massInput;
  const rg = gm / C2;
  return { gm, massKg: gm / G, rg, tg: rg / C };
}

/** Validates and normalises a sweep request (400 malformed, 413 too many points, 422 unphysical). */
export function prepareSweep(input: unknown, maxPoints: number = SWEEP_DEFAULT_MAX_POINTS): PreparedSweep {
  const req = parseOr400(sweepRequest, input);

  // Quantities.
  const quantities: QuantityInfo[] = [];
  const seen = new Set<string>();
  req.quantities.forEach((name, i) => {
    const info = CATALOGUE_BY_NAME.get(name);
    const path = `/quantities/${i}`;
    if (!info) throw invalid(path, `unknown quantity "${name}"; sweepable quantities: ${SWEEPABLE_QUANTITIES.join(', ')}`);
    if (!info.sweepable) {
      throw invalid(path, `"${name}" cannot be swept (it depends on more than the body and the point); sweepable quantities: ${SWEEPABLE_QUANTITIES.join(', ')}`);
    }
    if (seen.has(name)) throw invalid(path, `"${name}" is listed twice`);
    seen.add(name);
    quantities.push(info);
  });
  const needsPoint = quantities.some((q) => LOCAL_SET.has(q.name));

  // Axes: shape and limit first (before any array is allocated).
  const shape = req.axes.map((a) => a.count);
  const n = shape.reduce((p, c) => p * c, 1);
  if (n > maxPoints) {
    throw new ProblemError(
      'request-too-large',
      `the sweep has ${n} points (${shape.join(' × ')}); the limit is ${maxPoints} points`,
      [{ path: '/axes', message: `at most ${maxPoints} points` }],
    );
  }
  const byVariable = new Map<AxisVariable, number>();
  req.axes.forEach((a, k) => {
    if (byVariable.has(a.variable)) throw invalid(`/axes/${k}/variable`, `two axes over ${a.variable}`);
    byVariable.set(a.variable, k);
  });
  for (const [x, y] of [['r', 'altitude'], ['theta', 'latitude']] as const) {
    if (byVariable.has(x) && byVariable.has(y)) throw invalid('/axes', `give an axis over ${x} or ${y}, not both`);
  }
  const axisOf = (v: AxisVariable) => byVariable.get(v);
  const massAxis = axisOf('mass');
  const radialAxis = axisOf('r') ?? axisOf('altitude');

  // Body template.
  const bodyIn: BodyInput = req.body;
  const point = req.point ?? {};
  let base: { massInput: number; spinIn: number | string | undefined; chargeIn: number | string | undefined; radiusIn: number | string | undefined; preset: Body['preset']; presetBody: Body | null };
  if (typeof bodyIn === 'string') {
    if (massAxis !== undefined) throw invalid(`/axes/${massAxis}`, 'a mass axis needs a body given by its parameters (mass, spin, charge, radius), not a preset');
    const b = normalizeBody(bodyIn);
    base = { massInput: b.massKg, spinIn: b.spin, chargeIn: b.charge, radiusIn: b.radius ?? undefined, preset: b.preset, presetBody: b };
  } else {
    base = { massInput: 0, spinIn: bodyIn.spin, chargeIn: bodyIn.charge, radiusIn: bodyIn.radius, preset: null, presetBody: null };
    if (massAxis === undefined) base.massInput = readMass(bodyIn.mass, '/body/mass');
    else {
      // The template's mass must still be readable, though the axis replaces it.
      readMass(bodyIn.mass, '/body/mass');
      for (const k of ['spin', 'charge'] as const) {
        const v = bodyIn[k];
        if (v !== undefined && !isPlainNumber(v)) {
          throw invalid(`/body/${k}`, `with a mass axis give ${k} as a plain number (${k === 'spin' ? 'a/M' : 'Q/M'}), not with a unit`);
        }
      }
    }
  }

  // Axis values.
  const axes: PreparedAxis[] = [];
  const massValues = massAxis !== undefined ? readAxisRaw(req.axes[massAxis]!, massAxis, (x, p) => readMass(x, p)) : null;
  const pb = base.presetBody;
  const first = pb ? { gm: pb.gm, massKg: pb.massKg, rg: pb.rg, tg: pb.tg } : scalesOf(massValues ? massValues[0]! : base.massInput);
  const firstScale = { rg: first.rg, tg: first.tg };

  // Per-mass scales over the mass axis (or one value).
  let scaleAxis: { gm: Float64Array; massKg: Float64Array; rg: Float64Array; tg: Float64Array } | null = null;
  if (massValues) {
    const m = massValues.length;
    scaleAxis = { gm: new Float64Array(m), massKg: new Float64Array(m), rg: new Float64Array(m), tg: new Float64Array(m) };
    for (let j = 0; j < m; j++) {
      const s = scalesOf(massValues[j]!);
      scaleAxis.gm[j] = s.gm;
      scaleAxis.massKg[j] = s.massKg;
      scaleAxis.rg[j] = s.rg;
      scaleAxis.tg[j] = s.tg;
    }
  }

  // Spin and charge: axis values or the template's.
  const spinBase =
    base.presetBody ? base.presetBody.spin : base.spinIn === undefined ? 0 : readSpinCharge('spin', base.spinIn, '/body/spin', first.gm);
  const chargeBase =
    base.presetBody ? base.presetBody.charge : base.chargeIn === undefined ? 0 : readSpinCharge('charge', base.chargeIn, '/body/charge', first.gm);
  const spinAxis = axisOf('spin');
  const chargeAxis = axisOf('charge');
  const spinValues = spinAxis !== undefined ? readAxisRaw(req.axes[spinAxis]!, spinAxis, (x, p) => readSpinChargePlain('spin', x, p)) : null;
  const chargeValues = chargeAxis !== undefined ? readAxisRaw(req.axes[chargeAxis]!, chargeAxis, (x, p) => readSpinChargePlain('charge', x, p)) : null;

  // Surface radius (geometric), per mass value when the mass varies.
  let radiusSI: number | null = null;
  let surfaceAxis: Float64Array | null = null;
  let surfaceBase = Number.NaN;
  if (base.presetBody) {
    radiusSI = base.presetBody.radius;
    surfaceBase = base.presetBody.radiusGeometric ?? Number.NaN;
  } else if (base.radiusIn !== undefined) {
    const radiusIn = base.radiusIn;
    // As normalizeBody reads it: a radius given in rg keeps its number as the geometric radius.
    const radiusAt = (rg: number, tg: number) => {
      const R = readLength(radiusIn, '/body/radius', { rg, tg });
      return R;
    };
    const R0 = radiusAt(first.rg, first.tg);
    radiusSI = R0.si;
    surfaceBase = R0.geometric;
    if (scaleAxis) {
      surfaceAxis = new Float64Array(scaleAxis.rg.length);
      for (let j = 0; j < surfaceAxis.length; j++) surfaceAxis[j] = radiusAt(scaleAxis.rg[j]!, scaleAxis.tg[j]!).geometric;
    }
  }
  const hasSurface = radiusSI !== null;

  // Radial coordinate (geometric), as normalizePoint computes it.
  let rParam: SweepParam = Number.NaN;
  let radialReport: PreparedAxis | null = null;
  if (radialAxis !== undefined) {
    const ax = req.axes[radialAxis]!;
    const path = `/axes/${radialAxis}`;
    if (ax.variable === 'altitude') {
      if (!hasSurface) throw invalid(`${path}/variable`, 'altitude needs a body with a surface (a radius); sweep r for a black hole');
      if (massAxis !== undefined) throw invalid(`${path}/variable`, 'an altitude axis cannot be combined with a mass axis; sweep r');
      const alt = readAxisRaw(ax, radialAxis, (x, p) => readQuantity(x, 'length', p, firstScale));
      const rg = new Float64Array(alt.length);
      for (let i = 0; i < alt.length; i++) rg[i] = (radiusSI! + alt[i]!) / first.rg;
      rParam = expand(rg, radialAxis, shape);
      radialReport = { variable: 'altitude', unit: 'm', values: alt };
    } else {
      const inRg = needsBodyScale(ax.from) || needsBodyScale(ax.to);
      const bothRg = needsBodyScale(ax.from) && needsBodyScale(ax.to);
      if (massAxis !== undefined && inRg && !bothRg) {
        throw invalid(path, 'with a mass axis give both ends of the r axis in rg, or both in metres');
      }
      if (inRg) {
        const g = readAxisRaw(ax, radialAxis, (x, p) => readLength(x, p, firstScale).geometric);
        rParam = expand(g, radialAxis, shape);
        if (massAxis !== undefined) radialReport = { variable: 'r', unit: 'rg', values: g };
        else radialReport = { variable: 'r', unit: 'm', values: g.map((x) => x * first.rg) };
      } else {
        const si = readAxisRaw(ax, radialAxis, (x, p) => readLength(x, p, firstScale).si);
        radialReport = { variable: 'r', unit: 'm', values: si };
        if (massAxis === undefined) rParam = expand(si.map((x) => x / first.rg), radialAxis, shape);
        else rParam = perPoint(shape, radialAxis, massAxis, (i, j) => si[i]! / scaleAxis!.rg[j]!);
      }
    }
  } else if (point.r !== undefined || point.altitude !== undefined) {
    if (point.r !== undefined && point.altitude !== undefined) throw invalid('/point', 'give either r or altitude, not both');
    if (point.r !== undefined) {
      const l = readLength(point.r, '/point/r', firstScale);
      if (massAxis === undefined || needsBodyScale(point.r)) rParam = l.geometric;
      else rParam = expand(scaleAxis!.rg.map((rg) => l.si / rg), massAxis, shape);
    } else {
      if (!hasSurface) throw invalid('/point/altitude', 'altitude needs a body with a surface (a radius); give r for a black hole');
      if (massAxis !== undefined) throw invalid('/point/altitude', 'an altitude cannot be combined with a mass axis; give r');
      const alt = readQuantity(point.altitude!, 'length', '/point/altitude', firstScale);
      rParam = (radiusSI! + alt) / first.rg;
    }
  } else if (needsPoint) {
    throw invalid('/point', 'give r or altitude in the point, or sweep r or altitude');
  }

  // Polar angle.
  let thetaParam: SweepParam = Math.PI / 2;
  let angleReport: PreparedAxis | null = null;
  const angleAxis = axisOf('theta') ?? axisOf('latitude');
  if (angleAxis !== undefined) {
    const ax = req.axes[angleAxis]!;
    const vals = readAxisRaw(ax, angleAxis, (x, p) => readQuantity(x, 'angle', p));
    angleReport = { variable: ax.variable, unit: 'rad', values: vals };
    thetaParam = expand(ax.variable === 'theta' ? vals : vals.map((l) => Math.PI / 2 - l), angleAxis, shape);
  } else {
    if (point.theta !== undefined && point.latitude !== undefined) throw invalid('/point', 'give either theta or latitude, not both');
    if (point.theta !== undefined) thetaParam = readQuantity(point.theta, 'angle', '/point/theta');
    else if (point.latitude !== undefined) thetaParam = Math.PI / 2 - readQuantity(point.latitude, 'angle', '/point/latitude');
  }

  // Assemble the reported axes in request order.
  req.axes.forEach((ax, k) => {
    if (k === radialAxis) axes.push(radialReport!);
    else if (k === angleAxis) axes.push(angleReport!);
    else if (k === spinAxis) axes.push({ variable: 'spin', unit: '1', values: spinValues! });
    else if (k === chargeAxis) axes.push({ variable: 'charge', unit: '1', values: chargeValues! });
    // The masses as read (not G·m/G), so a single request with one of them reproduces its point exactly.
    else axes.push({ variable: 'mass', unit: 'kg', values: massValues! });
  });

  // Body parameters over the axes that change the body.
  const bodyAxes = [spinAxis, chargeAxis, massAxis].filter((k): k is number => k !== undefined);
  const distinct = new Set(bodyAxes);
  const aAxis = spinValues ?? spinBase;
  const qAxis = chargeValues ?? chargeBase;
  const sAxis = surfaceAxis ?? surfaceBase;
  const scalesAxis: Scales = scaleAxis
    ? { rg: scaleAxis.rg, tg: scaleAxis.tg, massKg: scaleAxis.massKg }
    : { rg: first.rg, tg: first.tg, massKg: first.massKg };
  const onGrid = (v: Float64Array | number, k: number | undefined) => (k === undefined || typeof v === 'number' ? v : expand(v, k, shape));
  const scales: Scales = {
    rg: onGrid(scalesAxis.rg, massAxis),
    tg: onGrid(scalesAxis.tg, massAxis),
    massKg: onGrid(scalesAxis.massKg, massAxis),
  };
  const grid: SweepGrid = {
    n,
    a: onGrid(aAxis, spinAxis),
    q: onGrid(qAxis, chargeAxis),
    r: rParam,
    theta: thetaParam,
    surface: onGrid(sAxis, massAxis),
  };
  let bodies: PreparedSweep['bodies'];
  if (distinct.size === 0) bodies = { n: 1, a: spinBase, q: chargeBase, surface: surfaceBase, scales: scalesAxis, axis: 'none' };
  else if (distinct.size === 1) {
    const k = bodyAxes[0]!;
    bodies = { n: shape[k]!, a: aAxis, q: qAxis, surface: sAxis, scales: scalesAxis, axis: k };
  } else bodies = { n, a: grid.a, q: grid.q, surface: grid.surface, scales, axis: 'all' };

  // The whole grid outside the domain: refuse as the single request would.
  const domain = new Uint8Array(n);
  if (sweepDomain(grid, domain, needsPoint) === 0) {
    const table = new ReasonTable();
    const where = needsPoint && radialAxis !== undefined ? `/axes/${radialAxis}` : '/axes';
    throw unphysical(where, `every point of the sweep is outside the physical domain: ${table.texts[domain[0]!]}`);
  }

  const echo = echoBody(base.presetBody, base.preset, first, at0(grid.a), at0(grid.q), radiusSI);
  const notes = bodyNotes(echo);
  notes.push(
    'Axes and columns are in SI units (r and altitude in m, angles in rad, mass in kg; r in rg when a mass axis varies GM/c²); the body echo is the body at the first point.',
    'Values are row-major: the last axis varies fastest (flat index i = i₁·count₂ + i₂). null where a quantity does not exist; nullReasons gives each reason with its count and first flat index.',
  );
  if (needsPoint && radialAxis !== undefined && !hasSurface) {
    notes.push('Points at or inside the outer horizon are kept: quantities that do not exist there are null with the reason (the horizon depends on spin and charge).');
  }
  return { body: echo, quantities, axes, shape, n, grid, scales, bodies, domain: needsPoint ? domain : null, notes };
}

// ---------------------------------------------------------------------------------------------------
// Cache key

/** One end of an r axis or the point's r: geometric (given in rg) or metres, as prepareSweep reads it. */
type CanonicalLength = { rg: number } | { m: number };

/**
 * The canonical input of a sweep's cache key: what prepareSweep reads from the request, as exact
 * doubles, without allocating the grid. Requests with equal canonical inputs give byte-identical
 * responses, so key order, equivalent unit spellings ("35786 km" and 35786000, "10 Msun" and
 * "1e1 Msun") and omitted defaults (spacing linear, θ = π/2) share one cache entry:
 *
 * - body: canonicalBody(normalizeBody(body)), without the spin or charge an axis replaces; with a mass
 *   axis (which replaces the mass and reads the radius per mass) the validated body as given;
 * - point: r (in rg, or in m with a mass axis when not given in rg) or altitude (m), and θ (rad) —
 *   each only when no axis replaces it, as prepareSweep uses it;
 * - axes: variable, from and to in SI (mass kg, altitude m, angles rad, r in m) or geometric units
 *   (r given in rg, spin, charge), count, spacing; quantities in order.
 *
 * Anything it cannot read (the request will be refused, or an edge normalizeBody rejects while a sweep
 * accepts it, such as a template spin that an axis replaces) falls back to the validated request
 * itself, under another tag so that the two forms never share a key; errors then come from
 * prepareSweep as before.
 */
export function sweepCacheInput(req: SweepRequest, maxPoints: number): unknown {
  try {
    return { maxPoints, canonical: canonicalSweep(req) };
  } catch {
    return { maxPoints, request: req };
  }
}

function canonicalSweep(req: SweepRequest): unknown {
  const variables = req.axes.map((a) => a.variable);
  const has = (v: AxisVariable) => variables.includes(v);
  const massAxis = has('mass');
  let body: unknown;
  let scale = { rg: Number.NaN, tg: Number.NaN };
  if (massAxis) body = { asGiven: req.body };
  else {
    const b = normalizeBody(req.body);
    // An axis over spin or charge replaces the template's (which is only checked).
    body = { ...canonicalBody(b), spin: has('spin') ? null : b.spin, charge: has('charge') ? null : b.charge };
    scale = { rg: b.rg, tg: b.tg };
  }
  const length = (x: number | string, path: string): CanonicalLength => {
    if (massAxis && !needsBodyScale(x)) return { m: readQuantity(x, 'length', path) };
    return { rg: massAxis ? toLength(x, { rg: 1, tg: 1 }).geometric : readLength(x, path, scale).geometric };
  };
  const axes = req.axes.map((ax, k) => {
    const path = `/axes/${k}`;
    let ends: [unknown, unknown];
    switch (ax.variable) {
      case 'mass':
        ends = [readMass(ax.from, `${path}/from`), readMass(ax.to, `${path}/to`)];
        break;
      case 'spin':
      case 'charge':
        ends = [readSpinChargePlain(ax.variable, ax.from, `${path}/from`), readSpinChargePlain(ax.variable, ax.to, `${path}/to`)];
        break;
      case 'theta':
      case 'latitude':
        ends = [readQuantity(ax.from, 'angle', `${path}/from`), readQuantity(ax.to, 'angle', `${path}/to`)];
        break;
      case 'altitude':
        if (massAxis) throw new Error('not canonical');
        ends = [readQuantity(ax.from, 'length', `${path}/from`, scale), readQuantity(ax.to, 'length', `${path}/to`, scale)];
        break;
      default: {
        // r: both ends in rg (geometric) when either is, else both in metres, as prepareSweep reads them.
        const inRg = needsBodyScale(ax.from) || needsBodyScale(ax.to);
        if (massAxis) ends = [length(ax.from, `${path}/from`), length(ax.to, `${path}/to`)];
        else {
          const read = (x: number | string, p: string) => readLength(x, p, scale);
          ends = inRg ? [read(ax.from, `${path}/from`).geometric, read(ax.to, `${path}/to`).geometric] : [{ m: read(ax.from, `${path}/from`).si }, { m: read(ax.to, `${path}/to`).si }];
        }
      }
    }
    return { variable: ax.variable, from: ends[0], to: ends[1], count: ax.count, spacing: ax.spacing };
  });
  const point = req.point ?? {};
  const canonicalPointOut: { r?: CanonicalLength; altitude?: number; theta?: number } = {};
  if (!has('r') && !has('altitude')) {
    if (point.r !== undefined && point.altitude !== undefined) throw new Error('not canonical');
    if (point.r !== undefined) canonicalPointOut.r = massAxis ? length(point.r, '/point/r') : { rg: readLength(point.r, '/point/r', scale).geometric };
    else if (point.altitude !== undefined) canonicalPointOut.altitude = readQuantity(point.altitude, 'length', '/point/altitude', scale);
  }
  if (!has('theta') && !has('latitude')) {
    if (point.theta !== undefined && point.latitude !== undefined) throw new Error('not canonical');
    if (point.theta !== undefined) canonicalPointOut.theta = readQuantity(point.theta, 'angle', '/point/theta');
    else if (point.latitude !== undefined) canonicalPointOut.theta = Math.PI / 2 - readQuantity(point.latitude, 'angle', '/point/latitude');
    else canonicalPointOut.theta = Math.PI / 2;
  }
  return { body, point: canonicalPointOut, axes, quantities: req.quantities };
}

/** Reads an axis's two ends with `read` (which validates each) and spaces the values. */
function readAxisRaw(
  ax: SweepRequest['axes'][number],
  k: number,
  read: (x: number | string, path: string) => number,
): Float64Array {
  const from = read(ax.from, `/axes/${k}/from`);
  const to = read(ax.to, `/axes/${k}/to`);
  return spaced(from, to, ax.count, ax.spacing, `/axes/${k}/spacing`);
}

/** Spin or charge on an axis: plain numbers (a/M, Q/M), the same limits as a body's. */
function readSpinChargePlain(kind: 'spin' | 'charge', x: number | string, path: string): number {
  if (!isPlainNumber(x)) throw invalid(path, `a ${kind} axis takes plain numbers (${kind === 'spin' ? 'a/M' : 'Q/M'})`);
  return readSpinCharge(kind, x, path, 1);
}

/** A per-point array over a 2-D grid from f(index on axis `ka`, index on axis `kb`). */
function perPoint(shape: number[], ka: number, kb: number, f: (i: number, j: number) => number): Float64Array {
  const [n1, n2] = shape as [number, number];
  const out = new Float64Array(n1 * n2);
  for (let i1 = 0; i1 < n1; i1++) {
    for (let i2 = 0; i2 < n2; i2++) {
      const idx = [i1, i2];
      out[i1 * n2 + i2] = f(idx[ka]!, idx[kb]!);
    }
  }
  return out;
}

const at0 = (p: SweepParam): number => (typeof p === 'number' ? p : p[0]!);

/** The Body of the first grid point (the preset's, with an axis's first spin or charge). */
function echoBody(
  preset: Body | null,
  presetName: Body['preset'],
  s: { gm: number; massKg: number; rg: number; tg: number },
  spin: number,
  charge: number,
  radius: number | null,
): Body {
  const radiusGeometric = radius === null ? null : radius / s.rg;
  return {
    preset: presetName,
    gm: s.gm,
    massKg: s.massKg,
    rg: s.rg,
    tg: s.tg,
    spin,
    charge,
    chargeCoulomb: (charge * s.rg) / CHARGE_TO_LENGTH,
    angularMomentum: (spin * s.gm * s.gm) / (C * G),
    radius,
    radiusGeometric,
    rotationRate: preset ? preset.rotationRate : null,
    family: familyOf(spin, charge),
    spacetime: { a: spin, q: charge },
  };
}

// ---------------------------------------------------------------------------------------------------
// Compute

/** The SI factor of `scale` at every point (or body), given per-point or single scales. */
function factorOf(info: QuantityInfo, s: Scales, n: number): SweepParam {
  if (typeof s.rg === 'number') return siFactor(info.scale, s as unknown as BodyScales);
  const out = new Float64Array(n);
  const p = { rg: 0, tg: 0, massKg: 0 };
  for (let i = 0; i < n; i++) {
    p.rg = (s.rg as Float64Array)[i]!;
    p.tg = (s.tg as Float64Array)[i]!;
    p.massKg = (s.massKg as Float64Array)[i]!;
    out[i] = siFactor(info.scale, p);
  }
  return out;
}

/** Evaluates every requested quantity over the grid: one pass per quantity over typed arrays. */
export function computeSweepColumns(prepared: PreparedSweep): SweepColumns {
  const { grid, n, bodies } = prepared;
  const table = new ReasonTable();
  // The domain pass of prepareSweep, reused (a second pass over 1e6 points costs as much as a quantity).
  let domain = prepared.domain;
  if (domain === null) {
    domain = new Uint8Array(n);
    sweepDomain(grid, domain, true);
  }
  const columns: SweepColumns['columns'] = [];
  for (const info of prepared.quantities) {
    const values = new Float64Array(n);
    const codes = new Uint8Array(n);
    if (LOCAL_SET.has(info.name)) {
      sweepLocal(info.name as LocalQuantity, grid, domain, factorOf(info, prepared.scales, n), values, codes);
    } else {
      const m = bodies.n;
      const bv = new Float64Array(m);
      const bc = new Uint8Array(m);
      const rgAt = (i: number) => (typeof bodies.scales.rg === 'number' ? bodies.scales.rg : bodies.scales.rg[i]!);
      sweepBody(info.name as BodyQuantity, m, bodies.a, bodies.q, bodies.surface, factorOf(info, bodies.scales, m), bv, bc, table, (r, i) => String(r * rgAt(i)), bodies.scales.rg);
      if (bodies.axis === 'all') {
        values.set(bv);
        codes.set(bc);
      } else if (bodies.axis === 'none') {
        values.fill(bv[0]!);
        codes.fill(bc[0]!);
      } else {
        const ev = expand(bv, bodies.axis, prepared.shape) as Float64Array;
        values.set(ev);
        codes.set(Uint8Array.from(expand(Float64Array.from(bc), bodies.axis, prepared.shape) as Float64Array));
      }
    }
    columns.push({ info, values, codes });
  }
  return { columns, reasons: table.texts };
}
