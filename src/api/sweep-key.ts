/**
 * The canonical input of a sweep's cache key: what prepareSweep reads, as exact doubles, without
 * building the grid.
 */
import { canonicalBody } from '../cache/key.js';
import { needsBodyScale, toLength } from '../units/quantity.js';
import { normalizeBody, readLength, readQuantity } from './inputs.js';
import { readMass, readSpinChargePlain } from './sweep-prepare.js';
import type { AxisVariable, SweepRequest } from './sweep.js';

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
