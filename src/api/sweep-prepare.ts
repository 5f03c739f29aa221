/**
 * Normalisation of a sweep request (prepareSweep): validation, the axes as typed arrays in geometric
 * units, the body parameters and scales per point, the domain codes, and the notes. 400 for a
 * malformed request, 413 for too many points, 422 when every point is outside the accepted domain.
 */
import { CATALOGUE_BY_NAME, type QuantityInfo } from '../catalogue.js';
import { invalid, ProblemError, unphysical } from '../errors.js';
import { ReasonTable, sweepDomain, type SweepGrid, type SweepParam } from '../physics/sweep.js';
import { C, C2, CHARGE_TO_LENGTH, G } from '../units/constants.js';
import { isPlainNumber, needsBodyScale } from '../units/quantity.js';
import { LIMITS, normalizeBody, readLength, readQuantity, type Body, type BodyInput, type Family } from './inputs.js';
import { bodyNotes } from './responses.js';
import { parseOr400 } from './route.js';
import { expand } from './sweep-columns.js';
import {
  LOCAL_SET,
  SWEEP_DEFAULT_MAX_POINTS,
  SWEEPABLE_QUANTITIES,
  sweepRequest,
  type AxisVariable,
  type PreparedAxis,
  type PreparedSweep,
  type Scales,
  type SweepRequest,
} from './sweep.js';

// ---------------------------------------------------------------------------------------------------
// Normalisation

/** Evenly (linear) or geometrically (log) spaced values from `from` to `to` inclusive. */
export function spaced(from: number, to: number, count: number, spacing: 'linear' | 'log', path: string): Float64Array {
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
export function readMass(input: number | string, path: string): number {
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
export function readSpinChargePlain(kind: 'spin' | 'charge', x: number | string, path: string): number {
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
