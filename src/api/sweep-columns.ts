/**
 * Evaluation of a prepared sweep: every requested quantity over the grid, one pass per quantity over
 * typed arrays (physics/sweep.ts for point quantities, physics/sweep-body.ts for body quantities).
 */
import { siFactor, type BodyScales, type QuantityInfo } from '../catalogue.js';
import type { LocalQuantity } from '../physics/local.js';
import { ReasonTable, sweepDomain, sweepLocal, type SweepParam } from '../physics/sweep.js';
import { sweepBody, type BodyQuantity } from '../physics/sweep-body.js';
import { LOCAL_SET, type PreparedSweep, type Scales, type SweepColumns } from './sweep.js';

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

/** Expands values along axis `axis` (or one value) to the full row-major grid. */
export function expand(values: Float64Array | number, axis: number, shape: number[]): SweepParam {
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
