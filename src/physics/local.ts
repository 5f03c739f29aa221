/**
 * Every flow and clock quantity at one point, with the reason wherever a quantity does not exist.
 * Geometric units (M = 1); the units layer converts to SI.
 */
import { kretschmannScalar, ricciSquared } from './curvature.js';
import {
  boyerLindquistMetric,
  flowSpeed,
  frameDragRate,
  hoverAcceleration,
  pointFunctions,
  redshiftToInfinity,
  region as regionOf,
  riverMetric,
  staticClockOffset,
  staticClockRate,
  zamoClockOffset,
  zamoClockRate,
  type BoyerLindquistMetric,
  type KerrNewman,
  type PointFunctions,
  type Region,
  type RiverMetric,
} from './spacetime.js';

/** Names of the scalar quantities evaluated at a point; the same names key the API and the catalogue. */
export const LOCAL_QUANTITIES = [
  'flowSpeed',
  'escapeSpeed',
  'staticClockRate',
  'staticClockOffset',
  'zamoClockRate',
  'zamoClockOffset',
  'redshiftToInfinity',
  'hoverAcceleration',
  'frameDragRate',
  'kretschmannScalar',
  'ricciSquared',
] as const;
export type LocalQuantity = (typeof LOCAL_QUANTITIES)[number];

export interface LocalResult {
  region: Region;
  /** Geometric values; NaN where the quantity does not exist (then `reasons` says why). */
  values: Record<LocalQuantity, number>;
  reasons: Partial<Record<LocalQuantity, string>>;
  /** Covariant components (a_r, a_θ) of the hovering observer's acceleration, units 1/M. */
  hoverComponents: { r: number; theta: number };
  boyerLindquist: BoyerLindquistMetric;
  river: RiverMetric | null;
}

export const REASONS = {
  insideHorizon:
    'the point is inside the outer horizon: no observer there can compare clocks with a far-away clock or send light to infinity',
  onHorizon: 'the point is on the outer horizon: only light can stay there, and nothing escapes',
  ergoregion:
    'the point is inside the ergosurface: space is dragged around faster than light can counter-rotate, so no observer can stay at fixed r, θ, φ (no static observers)',
  noFlow:
    'here 2GMr/c² < Q²G/(4πε0c⁴) (2r < Q² in units of M): no observer falling from rest at infinity reaches this point, so the flow has no real speed',
  noCausalRegion:
    'here g_φφ < 0 (the region of closed timelike curves very close to the centre of a spinning, charged mass): the flow and the ZAMOs are not defined',
  escapeInside: 'at or inside the outer horizon nothing escapes to infinity',
  noMarginalEscape:
    'here 2r < Q² (in units of M): a body at rest relative to the ZAMO already has more than its rest energy (the ZAMO clock runs faster than far-away clocks), so no launch has exactly the energy to just reach infinity, which is what the escape speed measures',
  notFinite: 'the value is not finite in double precision at this point',
  underflow:
    'the value is positive but below the range of double precision here (far from the body curvature invariants fall off as 1/r⁶ or faster)',
} as const;

const INSIDE: ReadonlySet<Region> = new Set(['betweenHorizons', 'innerHorizon', 'insideInnerHorizon', 'singularity']);

function flowReason(p: PointFunctions): string {
  return p.mu < 0 ? REASONS.noFlow : REASONS.noCausalRegion;
}

/** Evaluates the spacetime at (r, θ) for a body of optional surface radius (BL r, units of M). */
export function evaluateLocal(
  s: KerrNewman,
  r: number,
  theta: number,
  surfaceRadius?: number,
): LocalResult {
  const p = pointFunctions(s, r, theta);
  const region = regionOf(s, r, theta, surfaceRadius);
  const reasons: Partial<Record<LocalQuantity, string>> = {};
  const hover = hoverAcceleration(s, p);
  const values: Record<LocalQuantity, number> = {
    flowSpeed: flowSpeed(p),
    escapeSpeed: Number.NaN,
    staticClockRate: staticClockRate(p),
    staticClockOffset: staticClockOffset(p),
    zamoClockRate: zamoClockRate(p),
    zamoClockOffset: zamoClockOffset(p),
    redshiftToInfinity: redshiftToInfinity(p),
    hoverAcceleration: hover.magnitude,
    frameDragRate: frameDragRate(s, p),
    kretschmannScalar: kretschmannScalar(s.a, s.q, r, Math.cos(theta)),
    ricciSquared: ricciSquared(s.a, s.q, r, Math.cos(theta)),
  };
  // NaN: the invariant underflows (a non-finite value gets the notFinite reason below).
  for (const n of ['kretschmannScalar', 'ricciSquared'] as const) if (Number.isNaN(values[n])) reasons[n] = REASONS.underflow;
  if (Number.isNaN(values.flowSpeed)) reasons.flowSpeed = flowReason(p);

  const inside = INSIDE.has(region);
  const onHorizon = region === 'outerHorizon';
  const farAwayReason = inside ? REASONS.insideHorizon : onHorizon ? REASONS.onHorizon : undefined;

  if (inside || onHorizon) {
    reasons.escapeSpeed = REASONS.escapeInside;
  } else {
    values.escapeSpeed = values.flowSpeed;
    // Where g_φφ < 0 there is no ZAMO to launch from; where only 2r < Q², no launch is marginal.
    if (reasons.flowSpeed) reasons.escapeSpeed = !(p.bigA > 0) ? REASONS.noCausalRegion : p.mu < 0 ? REASONS.noMarginalEscape : reasons.flowSpeed;
  }

  const staticNames = ['staticClockRate', 'staticClockOffset', 'redshiftToInfinity', 'hoverAcceleration'] as const;
  const zamoNames = ['zamoClockRate', 'zamoClockOffset'] as const;
  if (farAwayReason) {
    for (const n of [...staticNames, ...zamoNames, 'frameDragRate'] as const) {
      // At the horizon ω equals the horizon's angular velocity: keep it; inside, t is not far-away time.
      if (n === 'frameDragRate' && onHorizon) continue;
      values[n] = Number.NaN;
      reasons[n] = farAwayReason;
    }
  } else {
    if (region === 'ergoregion') {
      for (const n of staticNames) {
        values[n] = Number.NaN;
        reasons[n] = REASONS.ergoregion;
      }
    }
    // Outside the horizons the ZAMO is missing only where A ≤ 0 (g_φφ < 0); it needs no flow.
    for (const n of zamoNames) if (Number.isNaN(values[n])) reasons[n] = REASONS.noCausalRegion;
    if (Number.isNaN(values.frameDragRate)) reasons.frameDragRate = REASONS.noCausalRegion;
  }
  for (const n of LOCAL_QUANTITIES) {
    if (!Number.isFinite(values[n]) && !reasons[n]) {
      values[n] = Number.NaN;
      reasons[n] = REASONS.notFinite;
    }
  }
  return {
    region,
    values,
    reasons,
    hoverComponents: { r: hover.r, theta: hover.theta },
    boyerLindquist: boyerLindquistMetric(s, p),
    river: riverMetric(s, p),
  };
}
