/**
 * Normalisation of a sweep request (prepareSweep): validation, the axes as typed arrays in geometric
 * units, the body parameters and scales per point, the domain codes, and the notes. 400 for a
 * malformed request, 413 for too many points, 422 when every point is outside the accepted domain.
 * The body is read in sweep-body-input.ts; the point (r, θ) and the values of an axis in sweep-point.ts.
 */
import { CATALOGUE_BY_NAME, type QuantityInfo } from '../catalogue.js';
import { invalid, ProblemError, unphysical } from '../errors.js';
import { ReasonTable, sweepDomain, type SweepGrid, type SweepParam } from '../physics/sweep.js';
import { C, CHARGE_TO_LENGTH, G } from '../units/constants.js';
import type { Body, Family } from './inputs.js';
import { bodyNotes } from './responses.js';
import { parseOr400 } from './route.js';
import {
  readBodyTemplate,
  readMass,
  readMassScales,
  readSpinAndCharge,
  readSpinChargePlain,
  readSurface,
  type MassScale,
  type MassScales,
  type SpinCharge,
  type Surface,
} from './sweep-body-input.js';
import { expand } from './sweep-columns.js';
import { readAngle, readRadial, spaced, type PointContext } from './sweep-point.js';
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

export { readMass, readSpinChargePlain, spaced };

type Axes = SweepRequest['axes'];

/** Validates and normalises a sweep request (400 malformed, 413 too many points, 422 unphysical). */
export function prepareSweep(input: unknown, maxPoints: number = SWEEP_DEFAULT_MAX_POINTS): PreparedSweep {
  const req = parseOr400(sweepRequest, input);
  const quantities = readQuantities(req.quantities);
  const needsPoint = quantities.some((q) => LOCAL_SET.has(q.name));
  const layout = readLayout(req.axes, maxPoints);
  const { shape, n } = layout;
  const base = readBodyTemplate(req.body, layout.mass);
  const masses = readMassScales(req.axes, layout.mass, base);
  const spinCharge = readSpinAndCharge(req.axes, layout.spin, layout.charge, base, masses.first.gm);
  const surface = readSurface(base, masses);

  const point = req.point ?? {};
  const ctx: PointContext = {
    axes: req.axes,
    shape,
    massAxis: layout.mass,
    first: masses.first,
    rgPerMass: masses.perMass ? masses.perMass.rg : null,
    radiusSI: surface.radiusSI,
  };
  const radial = readRadial(ctx, layout.radial, point, needsPoint);
  const angle = readAngle(ctx, layout.angle, point);

  const axes = reportAxes(req.axes, layout, radial.report, angle.report, spinCharge, masses.values);
  const { grid, scales, bodies } = assembleGrid(layout, spinCharge, surface, masses, radial.param, angle.param);
  const domain = checkDomain(grid, needsPoint, layout.radial);

  const echo = echoBody(base.presetBody, base.preset, masses.first, at0(grid.a), at0(grid.q), surface.radiusSI);
  const horizonNote = needsPoint && layout.radial !== undefined && surface.radiusSI === null;
  const notes = sweepNotes(echo, horizonNote);
  return { body: echo, quantities, axes, shape, n, grid, scales, bodies, domain: needsPoint ? domain : null, notes };
}

/** The requested quantities from the catalogue, in request order; each known, sweepable and listed once (400). */
function readQuantities(names: readonly string[]): QuantityInfo[] {
  const quantities: QuantityInfo[] = [];
  const seen = new Set<string>();
  names.forEach((name, i) => {
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
  return quantities;
}

/** The grid's shape and where each variable is swept (the index of its axis; undefined if not swept). */
interface AxisLayout {
  shape: number[];
  n: number;
  mass: number | undefined;
  spin: number | undefined;
  charge: number | undefined;
  /** The axis over r or altitude. */
  radial: number | undefined;
  /** The axis over theta or latitude. */
  angle: number | undefined;
}

/**
 * The axes' shape and point count, checked against `maxPoints` before any array is allocated (413),
 * then their variables: each at most once, and not both r and altitude nor theta and latitude (400).
 */
function readLayout(axes: Axes, maxPoints: number): AxisLayout {
  const shape = axes.map((a) => a.count);
  const n = shape.reduce((p, c) => p * c, 1);
  if (n > maxPoints) {
    throw new ProblemError(
      'request-too-large',
      `the sweep has ${n} points (${shape.join(' × ')}); the limit is ${maxPoints} points`,
      [{ path: '/axes', message: `at most ${maxPoints} points` }],
    );
  }
  const byVariable = new Map<AxisVariable, number>();
  axes.forEach((a, k) => {
    if (byVariable.has(a.variable)) throw invalid(`/axes/${k}/variable`, `two axes over ${a.variable}`);
    byVariable.set(a.variable, k);
  });
  for (const [x, y] of [['r', 'altitude'], ['theta', 'latitude']] as const) {
    if (byVariable.has(x) && byVariable.has(y)) throw invalid('/axes', `give an axis over ${x} or ${y}, not both`);
  }
  const axisOf = (v: AxisVariable) => byVariable.get(v);
  return {
    shape,
    n,
    mass: axisOf('mass'),
    spin: axisOf('spin'),
    charge: axisOf('charge'),
    radial: axisOf('r') ?? axisOf('altitude'),
    angle: axisOf('theta') ?? axisOf('latitude'),
  };
}

/**
 * The reported axes in request order. The masses are as read (not G·m/G), so that a single request
 * with one of them reproduces its point exactly.
 */
function reportAxes(
  axes: Axes,
  layout: AxisLayout,
  radialReport: PreparedAxis | null,
  angleReport: PreparedAxis | null,
  { spinValues, chargeValues }: SpinCharge,
  massValues: Float64Array | null,
): PreparedAxis[] {
  return axes.map((_, k): PreparedAxis => {
    if (k === layout.radial) return radialReport!;
    if (k === layout.angle) return angleReport!;
    if (k === layout.spin) return { variable: 'spin', unit: '1', values: spinValues! };
    if (k === layout.charge) return { variable: 'charge', unit: '1', values: chargeValues! };
    return { variable: 'mass', unit: 'kg', values: massValues! };
  });
}

/**
 * The grid of every point, the scales per point, and the body parameters over the axes that change
 * the body: one body (no such axis), one per value of the single such axis, or one per point.
 */
function assembleGrid(
  layout: AxisLayout,
  { spinBase, chargeBase, spinValues, chargeValues }: SpinCharge,
  { surfaceBase, surfaceAxis }: Surface,
  { first, perMass }: MassScales,
  r: SweepParam,
  theta: SweepParam,
): { grid: SweepGrid; scales: Scales; bodies: PreparedSweep['bodies'] } {
  const { shape, n, spin: spinAxis, charge: chargeAxis, mass: massAxis } = layout;
  const bodyAxes = [spinAxis, chargeAxis, massAxis].filter((k): k is number => k !== undefined);
  const distinct = new Set(bodyAxes);
  const aAxis = spinValues ?? spinBase;
  const qAxis = chargeValues ?? chargeBase;
  const sAxis = surfaceAxis ?? surfaceBase;
  const scalesAxis: Scales = perMass
    ? { rg: perMass.rg, tg: perMass.tg, massKg: perMass.massKg }
    : { rg: first.rg, tg: first.tg, massKg: first.massKg };
  const onGrid = (v: Float64Array | number, k: number | undefined) => (k === undefined || typeof v === 'number' ? v : expand(v, k, shape));
  const scales: Scales = {
    rg: onGrid(scalesAxis.rg, massAxis),
    tg: onGrid(scalesAxis.tg, massAxis),
    massKg: onGrid(scalesAxis.massKg, massAxis),
  };
  const grid: SweepGrid = { n, a: onGrid(aAxis, spinAxis), q: onGrid(qAxis, chargeAxis), r, theta, surface: onGrid(sAxis, massAxis) };
  let bodies: PreparedSweep['bodies'];
  if (distinct.size === 0) bodies = { n: 1, a: spinBase, q: chargeBase, surface: surfaceBase, scales: scalesAxis, axis: 'none' };
  else if (distinct.size === 1) {
    const k = bodyAxes[0]!;
    bodies = { n: shape[k]!, a: aAxis, q: qAxis, surface: sAxis, scales: scalesAxis, axis: k };
  } else bodies = { n, a: grid.a, q: grid.q, surface: grid.surface, scales, axis: 'all' };
  return { grid, scales, bodies };
}

/** The domain code of every point; the whole grid outside the domain is refused as the single request would be (422). */
function checkDomain(grid: SweepGrid, needsPoint: boolean, radialAxis: number | undefined): Uint8Array {
  const domain = new Uint8Array(grid.n);
  if (sweepDomain(grid, domain, needsPoint) === 0) {
    const table = new ReasonTable();
    const where = needsPoint && radialAxis !== undefined ? `/axes/${radialAxis}` : '/axes';
    throw unphysical(where, `every point of the sweep is outside the physical domain: ${table.texts[domain[0]!]}`);
  }
  return domain;
}

/** The body's notes and the sweep's own; `horizonNote` when swept points may lie inside a black hole's horizon. */
function sweepNotes(echo: Body, horizonNote: boolean): string[] {
  const notes = bodyNotes(echo);
  notes.push(
    'Axes and columns are in SI units (r and altitude in m, angles in rad, mass in kg; r in rg when a mass axis varies GM/c²); the body echo is the body at the first point.',
    'Values are row-major: the last axis varies fastest (flat index i = i₁·count₂ + i₂). null where a quantity does not exist; nullReasons gives each reason with its count and first flat index.',
  );
  if (horizonNote) {
    notes.push('Points at or inside the outer horizon are kept: quantities that do not exist there are null with the reason (the horizon depends on spin and charge).');
  }
  return notes;
}

function familyOf(a: number, q: number): Family {
  if (a === 0) return q === 0 ? 'schwarzschild' : 'reissnerNordstrom';
  return q === 0 ? 'kerr' : 'kerrNewman';
}

const at0 = (p: SweepParam): number => (typeof p === 'number' ? p : p[0]!);

/** The Body of the first grid point (the preset's, with an axis's first spin or charge). */
function echoBody(preset: Body | null, presetName: Body['preset'], s: MassScale, spin: number, charge: number, radius: number | null): Body {
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
