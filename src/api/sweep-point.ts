/**
 * The point of every sweep grid point, for prepareSweep: an axis's values from its two ends, the radial
 * coordinate (r or altitude) and the polar angle (theta or latitude), each from its axis or from the
 * request's point template, with the axis as it is reported. 400 for a malformed axis or point.
 */
import { invalid } from '../errors.js';
import type { SweepParam } from '../physics/sweep.js';
import { needsBodyScale } from '../units/quantity.js';
import { readLength, readQuantity, type PointInput } from './inputs.js';
import { expand } from './sweep-columns.js';
import type { PreparedAxis, SweepRequest } from './sweep.js';

type Axis = SweepRequest['axes'][number];

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

/** Reads axis `k`'s two ends with `read` (which validates each) and spaces the values. */
export function readAxisRaw(ax: Axis, k: number, read: (x: number | string, path: string) => number): Float64Array {
  const from = read(ax.from, `/axes/${k}/from`);
  const to = read(ax.to, `/axes/${k}/to`);
  return spaced(from, to, ax.count, ax.spacing, `/axes/${k}/spacing`);
}

/** What the point readers need of the grid and the body. */
export interface PointContext {
  axes: SweepRequest['axes'];
  shape: number[];
  /** Index of the mass axis, if there is one. */
  massAxis: number | undefined;
  /** Scales of the body at the first grid point (GM/c² in m, GM/c³ in s). */
  first: { rg: number; tg: number };
  /** GM/c² (m) per value of the mass axis; null without a mass axis. */
  rgPerMass: Float64Array | null;
  /** The surface radius in m at the first point, or null for a body without a surface. */
  radiusSI: number | null;
}

/** A point coordinate over the grid (geometric) and the axis it is swept on, as reported (or null). */
export interface PointParam {
  param: SweepParam;
  report: PreparedAxis | null;
}

/**
 * The radial coordinate r (geometric, units of GM/c²) over the grid, as normalizePoint computes it: from
 * the axis over r or altitude (index `radialAxis`), else from the template's r or altitude; NaN when
 * neither is given and no quantity needs the point (400 when one does).
 */
export function readRadial(ctx: PointContext, radialAxis: number | undefined, point: PointInput, needsPoint: boolean): PointParam {
  if (radialAxis !== undefined) return readRadialAxis(ctx, radialAxis);
  if (point.r !== undefined || point.altitude !== undefined) return { param: readRadialPoint(ctx, point), report: null };
  if (needsPoint) throw invalid('/point', 'give r or altitude in the point, or sweep r or altitude');
  return { param: Number.NaN, report: null };
}

/**
 * r over the grid from an axis over altitude (reported in m) or r (reported in m, or in rg when a mass
 * axis varies GM/c² and the ends are given in rg). r in metres with a mass axis becomes a per-point array.
 */
function readRadialAxis(ctx: PointContext, k: number): PointParam {
  const { shape, massAxis, first } = ctx;
  const firstScale = { rg: first.rg, tg: first.tg };
  const ax = ctx.axes[k]!;
  const path = `/axes/${k}`;
  if (ax.variable === 'altitude') {
    if (ctx.radiusSI === null) throw invalid(`${path}/variable`, 'altitude needs a body with a surface (a radius); sweep r for a black hole');
    if (massAxis !== undefined) throw invalid(`${path}/variable`, 'an altitude axis cannot be combined with a mass axis; sweep r');
    const alt = readAxisRaw(ax, k, (x, p) => readQuantity(x, 'length', p, firstScale));
    const rg = new Float64Array(alt.length);
    for (let i = 0; i < alt.length; i++) rg[i] = (ctx.radiusSI + alt[i]!) / first.rg;
    return { param: expand(rg, k, shape), report: { variable: 'altitude', unit: 'm', values: alt } };
  }
  const inRg = needsBodyScale(ax.from) || needsBodyScale(ax.to);
  const bothRg = needsBodyScale(ax.from) && needsBodyScale(ax.to);
  if (massAxis !== undefined && inRg && !bothRg) {
    throw invalid(path, 'with a mass axis give both ends of the r axis in rg, or both in metres');
  }
  if (inRg) {
    const g = readAxisRaw(ax, k, (x, p) => readLength(x, p, firstScale).geometric);
    const param = expand(g, k, shape);
    if (massAxis !== undefined) return { param, report: { variable: 'r', unit: 'rg', values: g } };
    return { param, report: { variable: 'r', unit: 'm', values: g.map((x) => x * first.rg) } };
  }
  const si = readAxisRaw(ax, k, (x, p) => readLength(x, p, firstScale).si);
  const report: PreparedAxis = { variable: 'r', unit: 'm', values: si };
  if (massAxis === undefined) return { param: expand(si.map((x) => x / first.rg), k, shape), report };
  const rgPerMass = ctx.rgPerMass!;
  return { param: perPoint(shape, k, massAxis, (i, j) => si[i]! / rgPerMass[j]!), report };
}

/** r from the template's r or altitude (one of them given): one value, or one per mass for r in metres. */
function readRadialPoint(ctx: PointContext, point: PointInput): SweepParam {
  const { shape, massAxis, first } = ctx;
  const firstScale = { rg: first.rg, tg: first.tg };
  if (point.r !== undefined && point.altitude !== undefined) throw invalid('/point', 'give either r or altitude, not both');
  if (point.r !== undefined) {
    const l = readLength(point.r, '/point/r', firstScale);
    if (massAxis === undefined || needsBodyScale(point.r)) return l.geometric;
    return expand(ctx.rgPerMass!.map((rg) => l.si / rg), massAxis, shape);
  }
  if (ctx.radiusSI === null) throw invalid('/point/altitude', 'altitude needs a body with a surface (a radius); give r for a black hole');
  if (massAxis !== undefined) throw invalid('/point/altitude', 'an altitude cannot be combined with a mass axis; give r');
  const alt = readQuantity(point.altitude!, 'length', '/point/altitude', firstScale);
  return (ctx.radiusSI + alt) / first.rg;
}

/**
 * The polar angle θ (rad) over the grid: from the axis over theta or latitude (index `angleAxis`;
 * θ = π/2 − latitude), else from the template's theta or latitude, else the equator (π/2).
 */
export function readAngle(ctx: PointContext, angleAxis: number | undefined, point: PointInput): PointParam {
  if (angleAxis !== undefined) {
    const ax = ctx.axes[angleAxis]!;
    const vals = readAxisRaw(ax, angleAxis, (x, p) => readQuantity(x, 'angle', p));
    const param = expand(ax.variable === 'theta' ? vals : vals.map((l) => Math.PI / 2 - l), angleAxis, ctx.shape);
    return { param, report: { variable: ax.variable, unit: 'rad', values: vals } };
  }
  if (point.theta !== undefined && point.latitude !== undefined) throw invalid('/point', 'give either theta or latitude, not both');
  if (point.theta !== undefined) return { param: readQuantity(point.theta, 'angle', '/point/theta'), report: null };
  if (point.latitude !== undefined) return { param: Math.PI / 2 - readQuantity(point.latitude, 'angle', '/point/latitude'), report: null };
  return { param: Math.PI / 2, report: null };
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
