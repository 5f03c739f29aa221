/**
 * Sweeps of the local (point) quantities over typed arrays, geometric units (G = c = M = 1).
 *
 * A sweep evaluates one quantity at n points in one pass: no object per point, no unit parsing per
 * point. Each input (spin a, charge Q, Boyer–Lindquist r, polar angle θ, surface radius R, and the
 * multiplier that turns the geometric value into the caller's unit) is either one number for every
 * point or a Float64Array with one value per point. The output is a Float64Array (NaN where the
 * quantity does not exist) and a Uint8Array of reason codes, each an index into a ReasonTable whose
 * texts are those of physics/local.ts, so a sweep says exactly what a single point says.
 *
 * Exactness: the loop evaluates the same expressions as pointFunctions and the scalar functions of
 * spacetime.ts, operation for operation and in the same order (IEEE 754 arithmetic and the engine's
 * Math.sin, Math.cos and Math.sqrt are deterministic), so every value is bit-for-bit the value of the
 * single-point path; test/physics/sweep.test.ts holds them equal with Object.is. The allocation-free
 * inline form is used because pointFunctions returns an object per point; sin θ, cos θ and the
 * horizons are recomputed only when θ or (a, Q) change from the previous point.
 */
import { kretschmannScalar, ricciSquared } from './curvature.js';
import { REASONS, type LocalQuantity } from './local.js';

/** One value for every point, or one per point. */
export type SweepParam = number | Float64Array;

/** The points of a sweep (n of them); a Float64Array parameter must have length n. */
export interface SweepGrid {
  n: number;
  /** Spin a/M. */
  a: SweepParam;
  /** Charge Q/M (geometrized). */
  q: SweepParam;
  /** Boyer–Lindquist r, units of M. */
  r: SweepParam;
  /** Polar angle θ, rad. */
  theta: SweepParam;
  /** Equatorial radius of a body with a surface (units of M), or NaN for a black hole. */
  surface: SweepParam;
}

/** Texts of the reasons a point is outside the domain that a single-point request would refuse (422). */
export const DOMAIN_REASONS = {
  belowSurface:
    'the point lies below the body\'s surface: the vacuum exterior does not apply inside a body',
  nakedSingularity:
    'spin² + charge² > 1 for a body without a surface: a black hole cannot have this spin and charge (it would be a naked singularity)',
  thetaOutOfRange: 'theta is the polar angle from the spin axis and must lie in [0, π] (latitude in [−90°, 90°])',
  radiusInsideHorizon: 'the body\'s radius lies inside its outer horizon: such a body would be a black hole',
  radiusInsideErgosurface:
    'the body\'s radius lies inside its own ergosurface: the vacuum exterior cannot describe such a body',
} as const;

/** Text of toQuantity (units/convert.ts) for a finite geometric value whose SI value overflows. */
export const SI_NOT_FINITE = 'the value is not finite in double precision here';

/** The fixed reasons, in code order; code 0 means "the value exists". */
const FIXED_REASONS = [
  '',
  REASONS.insideHorizon,
  REASONS.onHorizon,
  REASONS.ergoregion,
  REASONS.noFlow,
  REASONS.noCausalRegion,
  REASONS.escapeInside,
  REASONS.notFinite,
  SI_NOT_FINITE,
  DOMAIN_REASONS.belowSurface,
  DOMAIN_REASONS.nakedSingularity,
  DOMAIN_REASONS.thetaOutOfRange,
  DOMAIN_REASONS.radiusInsideHorizon,
  DOMAIN_REASONS.radiusInsideErgosurface,
  REASONS.underflow,
] as const;

/** Reason codes of the fixed reasons (index into ReasonTable.texts). */
export const REASON = {
  none: 0,
  insideHorizon: 1,
  onHorizon: 2,
  ergoregion: 3,
  noFlow: 4,
  noCausalRegion: 5,
  escapeInside: 6,
  notFinite: 7,
  siNotFinite: 8,
  belowSurface: 9,
  nakedSingularity: 10,
  thetaOutOfRange: 11,
  radiusInsideHorizon: 12,
  radiusInsideErgosurface: 13,
  underflow: 14,
} as const;

/** Largest number of reasons a table holds (codes are bytes). */
export const MAX_REASONS = 256;

/**
 * The texts that reason codes index: the fixed reasons first, then texts interned by the body-quantity
 * sweep (which may carry a body-specific number). One table per sweep.
 */
export class ReasonTable {
  readonly texts: string[] = [...FIXED_REASONS];
  private readonly index = new Map<string, number>(FIXED_REASONS.map((t, i) => [t, i]));

  /** The code of `text`, adding it if new; `fallback` (a fixed text) when the table is full. */
  intern(text: string, fallback: string): number {
    const hit = this.index.get(text);
    if (hit !== undefined) return hit;
    if (this.texts.length >= MAX_REASONS) return this.intern(fallback, REASONS.notFinite);
    const code = this.texts.length;
    this.texts.push(text);
    this.index.set(text, code);
    return code;
  }
}

/** A parameter as (array, stride): stride 0 broadcasts one value. */
function unpack(p: SweepParam): [Float64Array, number] {
  return typeof p === 'number' ? [Float64Array.of(p), 0] : [p, 1];
}

/**
 * The domain code of a body (spin a, charge Q, surface radius R or NaN): naked singularity without a
 * surface, or a surface radius on or inside the outer horizon or the equatorial ergosurface; the same
 * checks, in the same arithmetic, as normalizeBody in api/inputs.ts. 0 when the body is admissible.
 */
export function bodyDomainCode(a: number, q: number, R: number): number {
  const k = a * a + q * q;
  if (R !== R) return k > 1 ? REASON.nakedSingularity : REASON.none;
  if (k <= 1 && R <= 1 + Math.sqrt(1 - k)) return REASON.radiusInsideHorizon;
  // Equatorial ergosurface 1 + √(1 − Q² − a² cos²(π/2)), as ergosurfaceRadius computes it.
  const c = Math.cos(Math.PI / 2);
  const e = 1 - q * q - a * a * c * c;
  if (e >= 0 && R <= 1 + Math.sqrt(e)) return REASON.radiusInsideErgosurface;
  return REASON.none;
}

/**
 * Domain codes of every point: the body check (bodyDomainCode), then θ in [0, π], then r ≥ R for a
 * body with a surface (and r > 0). Writes 0 where a single-point request would be accepted; returns
 * how many points are admissible. With `pointToo` false only the body is checked (body-only quantities).
 */
export function sweepDomain(grid: SweepGrid, codes: Uint8Array, pointToo = true): number {
  const [aA, aS] = unpack(grid.a);
  const [qA, qS] = unpack(grid.q);
  const [rA, rS] = unpack(grid.r);
  const [tA, tS] = unpack(grid.theta);
  const [sA, sS] = unpack(grid.surface);
  let ok = 0;
  let lastA = Number.NaN;
  let lastQ = Number.NaN;
  let lastR = Number.NaN;
  let lastCode = 0;
  for (let i = 0; i < grid.n; i++) {
    const a = aA[i * aS]!;
    const q = qA[i * qS]!;
    const R = sA[i * sS]!;
    let code: number;
    if (a === lastA && q === lastQ && (R === lastR || (R !== R && lastR !== lastR))) {
      code = lastCode;
    } else {
      code = bodyDomainCode(a, q, R);
      lastA = a;
      lastQ = q;
      lastR = R;
      lastCode = code;
    }
    if (code === 0 && pointToo) {
      const theta = tA[i * tS]!;
      const r = rA[i * rS]!;
      if (!(theta >= 0 && theta <= Math.PI)) code = REASON.thetaOutOfRange;
      else if (!(r > 0) || r < R) code = REASON.belowSurface;
    }
    codes[i] = code;
    if (code === 0) ok++;
  }
  return ok;
}

/** Numeric ids of the local quantities, for the switch in the loop. */
const LOCAL_ID: Record<LocalQuantity, number> = {
  flowSpeed: 0,
  escapeSpeed: 1,
  staticClockRate: 2,
  staticClockOffset: 3,
  zamoClockRate: 4,
  zamoClockOffset: 5,
  redshiftToInfinity: 6,
  hoverAcceleration: 7,
  frameDragRate: 8,
  kretschmannScalar: 9,
  ricciSquared: 10,
};

// Region codes (as region() in spacetime.ts names them).
const OUTSIDE = 0;
const ERGO = 1;
const OUTER_HORIZON = 2;
const INSIDE = 3; // betweenHorizons, innerHorizon, insideInnerHorizon, singularity

/**
 * Evaluates local quantity `quantity` at every point of `grid`, writing value × factor (NaN where it
 * does not exist) into `out` and the reason code into `codes`. Points with a nonzero `domain` code
 * (from sweepDomain) are NaN with that code. The values and reasons are those of evaluateLocal
 * (physics/local.ts) followed by toQuantity (units/convert.ts): a finite geometric value whose product
 * with the factor overflows is NaN with the SI_NOT_FINITE reason.
 */
export function sweepLocal(
  quantity: LocalQuantity,
  grid: SweepGrid,
  domain: Uint8Array,
  factor: SweepParam,
  out: Float64Array,
  codes: Uint8Array,
): void {
  const id = LOCAL_ID[quantity];
  const needsRegion = id !== 0 && id < 9;
  const [aA, aS] = unpack(grid.a);
  const [qA, qS] = unpack(grid.q);
  const [rA, rS] = unpack(grid.r);
  const [tA, tS] = unpack(grid.theta);
  const [fA, fS] = unpack(factor);
  let lastTheta = Number.NaN;
  let sn = 0;
  let cs = 0;
  let lastA = Number.NaN;
  let lastQ = Number.NaN;
  let hasH = false;
  let outer = 0;
  let inner = 0;
  const n = grid.n;
  for (let i = 0; i < n; i++) {
    const d = domain[i]!;
    if (d !== 0) {
      out[i] = Number.NaN;
      codes[i] = d;
      continue;
    }
    const a = aA[i * aS]!;
    const q = qA[i * qS]!;
    const r = rA[i * rS]!;
    const theta = tA[i * tS]!;
    if (theta !== lastTheta) {
      sn = Math.sin(theta);
      cs = Math.cos(theta);
      lastTheta = theta;
    }
    // pointFunctions, inline.
    const sin2 = sn * sn;
    const cos2 = cs * cs;
    const a2 = a * a;
    const q2 = q * q;
    const rho2 = r * r + a2;
    const sigma = r * r + a2 * cos2;
    const mu = 2 * r - q2;
    const delta = rho2 - mu;
    const bigA = rho2 * sigma + a2 * mu * sin2;

    // region(), inline (the surface was checked by the domain pass).
    let region = OUTSIDE;
    if (needsRegion) {
      if (a !== lastA || q !== lastQ) {
        const k = a * a + q * q;
        hasH = k <= 1;
        if (hasH) {
          outer = 1 + Math.sqrt(1 - k);
          inner = k / outer;
        }
        lastA = a;
        lastQ = q;
      }
      if (r === 0 && (a === 0 || cs === 0 || Math.abs(cs) < 1e-16)) region = INSIDE;
      else if (hasH && r < inner) region = INSIDE;
      else if (hasH && r === inner && inner > 0 && inner < outer) region = INSIDE;
      else if (hasH && r < outer) region = INSIDE;
      else if (hasH && r === outer) region = OUTER_HORIZON;
      else if (r * r - 2 * r + q * q + a * a * cs * cs <= 0) region = ERGO;
    }
    const farAway = region === INSIDE ? REASON.insideHorizon : region === OUTER_HORIZON ? REASON.onHorizon : 0;
    const flowReason = mu < 0 ? REASON.noFlow : REASON.noCausalRegion;

    let v = Number.NaN;
    let code = 0;
    switch (id) {
      case 0: // flowSpeed
      case 1: {
        // escapeSpeed
        if (id === 1 && farAway !== 0) {
          code = REASON.escapeInside;
          break;
        }
        v = mu < 0 || !(bigA > 0) ? Number.NaN : Math.sqrt((rho2 * mu) / bigA);
        if (v !== v) code = flowReason;
        break;
      }
      case 2: // staticClockRate
      case 3: // staticClockOffset
      case 6: // redshiftToInfinity
      case 7: {
        // hoverAcceleration
        if (farAway !== 0) {
          code = farAway;
          break;
        }
        if (region === ERGO) {
          code = REASON.ergoregion;
          break;
        }
        const x = mu / sigma;
        if (!(x < 1)) break;
        if (id === 2) v = Math.sqrt(1 - x);
        else if (id === 3) v = x / (1 + Math.sqrt(1 - x));
        else if (id === 6) v = x / (1 + Math.sqrt(1 - x)) / Math.sqrt(1 - x);
        else if (delta > 0) {
          const sigma2 = sigma * sigma;
          const dxdr = (2 * sigma - 2 * r * mu) / sigma2;
          const dxdth = (2 * a * a * mu * (sn * cs)) / sigma2;
          const oneMinusX = 1 - x;
          const ar = (-0.5 * dxdr) / oneMinusX;
          const ath = (-0.5 * dxdth) / oneMinusX;
          v = Math.sqrt((delta / sigma) * ar * ar + (ath * ath) / sigma);
        }
        break;
      }
      case 4: // zamoClockRate
      case 5: {
        // zamoClockOffset
        if (farAway !== 0) {
          code = farAway;
          break;
        }
        const v2 = !(bigA > 0) ? Number.NaN : (rho2 * mu) / bigA;
        if (v2 < 1) v = id === 4 ? Math.sqrt(1 - v2) : v2 / (1 + Math.sqrt(1 - v2));
        if (v !== v) code = flowReason;
        break;
      }
      case 9: // kretschmannScalar
      case 10: {
        // ricciSquared: the functions of physics/local.ts, same arguments (NaN: underflow).
        v = id === 9 ? kretschmannScalar(a, q, r, cs) : ricciSquared(a, q, r, cs);
        if (v !== v) code = REASON.underflow;
        break;
      }
      default: {
        // frameDragRate: kept on the outer horizon (it equals Ω_H there).
        if (farAway === REASON.insideHorizon) {
          code = farAway;
          break;
        }
        v = !(bigA > 0) ? Number.NaN : (a * mu) / bigA;
        if (v !== v && farAway === 0) code = REASON.noCausalRegion;
      }
    }
    if (code === 0 && !(v - v === 0)) code = REASON.notFinite;
    if (code !== 0) {
      out[i] = Number.NaN;
      codes[i] = code;
      continue;
    }
    const si = v * fA[i * fS]!;
    if (si - si === 0) {
      out[i] = si;
      codes[i] = 0;
    } else {
      out[i] = Number.NaN;
      codes[i] = REASON.siNotFinite;
    }
  }
}
