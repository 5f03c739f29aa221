/**
 * Radial free fall: the request, options and result types of freeFall (./free-fall.ts) and the text
 * of each refusal and null reason, in geometric units G = c = M = 1 (times in GM/c³, radii in GM/c²,
 * Boyer–Lindquist r).
 */

/** How the fall starts at r₁. */
export type FallStart =
  /** Energy E = 1: the river frame (Gullstrand–Painlevé / Doran); inward only. */
  | { kind: 'restAtInfinity' }
  /** Released at rest at r₁ (relative to the local static observer, or the ZAMO when a ≠ 0). */
  | { kind: 'rest' }
  /** Launched at r₁ with `speed` (units of c, in [0, 1)) measured by the local static observer (ZAMO when a ≠ 0). */
  | { kind: 'launch'; speed: number; direction: 'inward' | 'outward' };

export type FallGeometry = 'radial' | 'axis' | 'equator';

export type FallRefusalReason =
  | 'invalidInput'
  | 'unsupportedGeometry'
  | 'startInsideHorizon'
  | 'startUnreachable'
  | 'wrongDirection'
  | 'turnsBack'
  | 'notConverged';

export type FallNullReason = 'reachesHorizon' | 'startsOnHorizon' | 'noRiverTime' | 'notConverged';

export const FALL_REASONS: Record<FallRefusalReason | FallNullReason, string> = {
  invalidInput: 'radii must be finite and ≥ 0 (r₁ > 0), the speed in [0, 1) and the tolerance in [1e−15, 1e−3]',
  unsupportedGeometry:
    'with spin, zero-angular-momentum free fall stays on one line only along the rotation axis (θ = 0 or π) or in the equatorial plane (θ = π/2)',
  startInsideHorizon:
    'the start is inside the outer horizon: no observer can be at rest there or measure a launch speed',
  startUnreachable:
    'a body falling from rest at infinity never reaches this start radius (close to the centre of a charged mass it turns back where 2r = Q²)',
  wrongDirection: 'the end radius lies in the other direction from the start than the motion goes',
  turnsBack: 'the body turns back before it reaches the end radius (its radial speed falls to zero at turningRadius)',
  notConverged: 'the quadrature did not reach the requested tolerance',
  reachesHorizon: 'the path reaches or crosses the outer horizon, where far-away time t diverges',
  startsOnHorizon: 'a fall from rest exactly on the outer horizon has E = 0: its far-away and river times diverge',
  noRiverTime:
    'the path enters the region 2r < Q² close to the centre of a charged mass, where no observer falls from rest at infinity and the river time is not defined',
};

export interface FreeFallRequest {
  r1: number;
  r2: number;
  /** Polar angle; any value when a = 0; 0 or π (axis) or π/2 (equator) when a ≠ 0. */
  theta: number;
  start: FallStart;
}

export interface FreeFallOptions {
  /** Relative tolerance of the quadrature (default 1e−12). */
  relativeTolerance?: number;
  /** 'auto' uses the Schwarzschild closed forms where they apply; 'quadrature' never does. */
  method?: 'auto' | 'quadrature';
  /** Highest quadrature level (default 12). */
  maxLevel?: number;
}

export interface FreeFall {
  ok: true;
  geometry: FallGeometry;
  direction: 'inward' | 'outward' | 'none';
  /** Energy per unit mass E = −u_t. */
  energy: number;
  properTime: number;
  riverTime: number | null;
  riverTimeReason?: FallNullReason;
  farAwayTime: number | null;
  farAwayTimeReason?: FallNullReason;
  method: 'closedForm' | 'quadrature';
  /** The relative tolerance asked of the quadrature. */
  tolerance: number;
  /** Quadrature error estimates (0 for closed forms: rounding only). */
  errorEstimate: { properTime: number; riverTime: number | null; farAwayTime: number | null };
  evaluations: number;
  notes: string[];
}

export interface FreeFallRefused {
  ok: false;
  reason: FallRefusalReason;
  message: string;
  /** Where the radial speed falls to zero, for 'turnsBack'. */
  turningRadius?: number;
}

export type FreeFallResult = FreeFall | FreeFallRefused;
