/**
 * Timelike and null geodesics of Kerr–Newman, followed through the horizons: the initial state (from an
 * observer's launch or from the constants of motion), the integration by DOP853 (./dop853.ts) of the
 * Hamiltonian equations in ingoing Kerr coordinates (./geodesic-equations.ts), events located on the
 * dense output, and samples evenly spaced in proper time (affine parameter for light).
 *
 * Geometric units G = c = M = 1. Clocks are counted from the launch: λ (proper time, or the affine
 * parameter of light scaled as in ./tetrads.ts), v (ingoing Kerr time), T (river / Doran time: the proper
 * time of the free-fallers from rest at infinity, smooth through both horizons) and t (Boyer–Lindquist
 * time: finite only while the path stays outside the outer horizon, t = v − r*(r) + const).
 *
 * Events (located by Illinois regula falsi on the 7th-order dense output, to a few ulps in λ):
 * - outerHorizon / innerHorizon: r crosses r₊ / r₋ (inward: ingoing coordinates cover the black hole,
 *   not the white hole); the proper and river times there are reported. The path stops at the inner
 *   horizon by default (beyond it the continuation is not unique physically), or at the outer one on request.
 * - singularity: Σ = r² + a² cos²θ falls to SINGULARITY_SIGMA (the tidal field diverges as Σ → 0);
 * - surface: r reaches the radius of a body with a surface;
 * - escape: r reaches the escape radius moving outward;
 * - radialTurningPoint / polarTurningPoint: dr/dλ or dθ/dλ changes sign (peri-/apoapsis, latitude extremes).
 * The integration also ends at the maximum length, the maximum number of steps, or when the step size
 * falls below its floor (tolerance not met): each with its status; the path up to there stands.
 */
import { kerrSchildAzimuthShift, kerrSchildTimeShift } from './coordinate-integrals.js';
import { hubToCartesian } from './coordinates.js';
import { Dop853 } from './dop853.js';
import {
  carterConstant,
  geodesicRhs,
  PHI,
  PR,
  PTH,
  R,
  radialVelocity,
  RIVER,
  STATE_SIZE,
  TH,
  twiceHamiltonian,
  V,
  type MotionConstants,
} from './geodesic-equations.js';
import { initialMomentum, locate, refuse, type GeodesicRefused, type GeodesicStart, type ParticleKind } from './geodesic-start.js';
import { horizons, type KerrNewman } from './spacetime.js';

export type { GeodesicRefused, GeodesicRefusalReason, GeodesicStart, ParticleKind } from './geodesic-start.js';

export interface GeodesicRequest {
  particle: ParticleKind;
  start: GeodesicStart;
  /** Largest λ (proper time or affine parameter), > 0. */
  maxLength: number;
  /**
   * Number of samples (≥ 2), evenly spaced in λ over the path: over [0, maxLength], or over [0, λ_end]
   * when an event (horizon, singularity, surface, escape) ends the path earlier. The end point may add one.
   */
  samples: number;
  /**
   * 'path' (default): samples over [0, λ_end] when an event ends the path early (a second pass, see
   * geodesic); 'maxLength': always at the multiples of maxLength/(samples − 1), as in one pass.
   */
  sampleOver?: 'path' | 'maxLength';
  /** Relative tolerance of each step (absolute tolerance rtol·1e−3). Default 1e−10. */
  rtol?: number;
  /** Largest number of accepted steps (each may follow a few rejected tries). Default DEFAULT_MAX_STEPS. */
  maxSteps?: number;
  /** Radius at which an outgoing path counts as escaped. Default max(1000, 10 r₀). */
  escapeRadius?: number;
  /** Where to stop inside the hole. Default 'innerHorizon'. */
  stopAt?: 'outerHorizon' | 'innerHorizon';
  /** Radius of a body with a surface (the path ends there), or undefined for a black hole. */
  surfaceRadius?: number;
}

export const DEFAULT_MAX_STEPS = 100_000;
export const DEFAULT_RTOL = 1e-10;
/** Σ (units of M²) at which the path is stopped as having reached the singularity. */
export const SINGULARITY_SIGMA = 1e-4;
/** |cos θ| below which a sign change of p_θ is rounding noise of equatorial motion, not a turning point. */
const EQUATOR_NOISE = 1e-9;
/** Events kept in the list (all are counted). */
export const MAX_EVENTS = 1000;

export type EventKind = 'outerHorizon' | 'innerHorizon' | 'singularity' | 'surface' | 'escape' | 'radialTurningPoint' | 'polarTurningPoint';

export type Termination = 'escape' | 'outerHorizon' | 'innerHorizon' | 'singularity' | 'surface' | 'maxLength' | 'maxSteps' | 'toleranceNotMet';

export const TERMINATIONS: Record<Termination, string> = {
  escape: 'the path reached the escape radius moving outward',
  outerHorizon: 'the path crossed the outer horizon (stopped there on request, or because the hole is extremal)',
  innerHorizon:
    'the path reached the inner (Cauchy) horizon (stopped at r₋ + 1e−6 (r₊ − r₋), before the coordinates of one of its branches diverge): beyond it the continuation is not determined by the initial data',
  singularity: `the path came within Σ = r² + a² cos²θ ≤ ${SINGULARITY_SIGMA} M² of the singularity, where curvature diverges`,
  surface: "the path reached the body's surface",
  maxLength: 'the path reached the requested maximum length (proper time or affine parameter)',
  maxSteps: 'the integration used its maximum number of steps before reaching the maximum length; the path up to there is accurate',
  toleranceNotMet:
    'the step size fell below its floor (10 ulps of λ) without meeting the tolerance, or the state stopped being finite; the path up to there is accurate, nothing after it is returned',
};

export interface GeodesicEvent {
  kind: EventKind;
  lambda: number;
  v: number;
  /** River time; NaN where undefined. */
  river: number;
  r: number;
  theta: number;
  phi: number;
}

export interface Invariants {
  carter: number;
  /** 2H = g^{μν} p_μ p_ν: −1 for a massive particle, 0 for light. */
  twiceH: number;
  r: number;
  theta: number;
  pr: number;
  ptheta: number;
}

export interface GeodesicSamples {
  count: number;
  lambda: Float64Array;
  v: Float64Array;
  river: Float64Array;
  t: Float64Array;
  r: Float64Array;
  theta: Float64Array;
  phi: Float64Array;
  phiBL: Float64Array;
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
}

export interface Geodesic {
  ok: true;
  constants: MotionConstants;
  start: Invariants;
  end: Invariants;
  termination: Termination;
  /** λ at the end. */
  length: number;
  events: GeodesicEvent[];
  eventCount: number;
  samples: GeodesicSamples;
  steps: { accepted: number; rejected: number; evaluations: number; smallest: number; largest: number };
  rtol: number;
  escapeRadius: number;
  /** Why the river time becomes undefined (null when it stays defined). */
  riverLostAt: number | null;
}

export type GeodesicResult = Geodesic | GeodesicRefused;


function invariants(s: KerrNewman, c: MotionConstants, y: ArrayLike<number>): Invariants {
  return {
    carter: carterConstant(s, c, y[TH]!, y[PTH]!),
    twiceH: twiceHamiltonian(s, c, y[R]!, y[TH]!, y[PR]!, y[PTH]!),
    r: y[R]!,
    theta: y[TH]!,
    pr: y[PR]!,
    ptheta: y[PTH]!,
  };
}

/** Fraction of r₊ − r₋ above the inner horizon at which a path is stopped (see innerStopRadius). */
export const INNER_MARGIN = 1e-6;

/**
 * Where a path is stopped at the inner horizon: r₋ + INNER_MARGIN·(r₊ − r₋). Ingoing coordinates are regular
 * on the branch of the inner horizon that ingoing light crosses at finite v; a co-rotating path with
 * P = E(r² + a²) − aL < 0 there reaches the other branch, where v, φ̃ (and the river time) diverge while
 * its proper time stays finite. Stopping just above r₋ treats both branches alike; the proper time lost is
 * about INNER_MARGIN·(r₊ − r₋)/|dr/dτ|. NaN when there is no inner horizon (r₋ = 0, or no horizon) or the
 * hole is extremal to rounding (r₊ − r₋ ≤ 1e−9).
 */
export function innerStopRadius(s: KerrNewman): number {
  const hz = horizons(s);
  if (!hz || !(hz.inner > 0) || !(hz.outer - hz.inner > 1e-9)) return Number.NaN;
  return hz.inner + INNER_MARGIN * (hz.outer - hz.inner);
}

/**
 * Integrates a geodesic; see the module comment. Inputs are assumed finite (the API checks them).
 * When an event ends the path before maxLength, the samples would cover only the part of [0, maxLength]
 * it lived through (a plunge from 10 M ends after ~20 M of proper time: 3 samples of 500 at the default
 * spacing), so the path is integrated again up to its end, which reproduces the same steps (the
 * integration is deterministic and only the last step is clipped), and sampled evenly over [0, λ_end].
 * Everything but the samples comes from the first pass. A path stopped by its step limit or its
 * tolerance keeps the samples of the first pass (a second pass would double the largest cost).
 */
export function geodesic(s: KerrNewman, req: GeodesicRequest): GeodesicResult {
  const first = integrate(s, req);
  if (req.sampleOver === 'maxLength' || !first.ok || first.termination === 'maxSteps' || first.termination === 'toleranceNotMet') return first;
  if (!(first.length > 0 && first.length < req.maxLength) || first.samples.count >= req.samples) return first;
  const again = integrate(s, { ...req, maxLength: first.length });
  if (!again.ok) return first;
  // The second pass locates the ending event on its own last step, a few ulps from the first pass's
  // λ_end: its end point is replaced by the first pass's, so the samples end exactly where the path does.
  const a = again.samples;
  const f = first.samples;
  const k = a.count - 1;
  const j = f.count - 1;
  for (const col of SAMPLE_COLUMNS) a[col][k] = f[col][j]!;
  return { ...first, samples: a };
}

const SAMPLE_COLUMNS = ['lambda', 'v', 'river', 't', 'r', 'theta', 'phi', 'phiBL', 'x', 'y', 'z'] as const satisfies readonly Exclude<keyof GeodesicSamples, 'count'>[];

/** One pass of the integration: samples evenly spaced over [0, req.maxLength]. */
function integrate(s: KerrNewman, req: GeodesicRequest): GeodesicResult {
  const st = req.start;
  if (![st.r, st.theta, st.phi, req.maxLength].every(Number.isFinite) || !(st.r > 0) || !(req.maxLength > 0) || !(req.samples >= 2)) {
    return refuse('invalidInput', 'start', 'r, θ, φ and the maximum length must be finite, r and the length positive, and samples ≥ 2');
  }
  const sigma0 = st.r * st.r + s.a * s.a * Math.cos(st.theta) ** 2;
  if (!(sigma0 > SINGULARITY_SIGMA)) return refuse('singularStart', 'start', TERMINATIONS.singularity);
  const escapeRadius = req.escapeRadius ?? Math.max(1000, 10 * st.r);
  if (!(escapeRadius > st.r)) return refuse('beyondEscape', 'escapeRadius', 'the escape radius must lie beyond the start');
  const init = initialMomentum(s, req.particle, st);
  if ('ok' in init) return init;
  const { c } = init;
  const rtol = req.rtol ?? DEFAULT_RTOL;
  const maxSteps = req.maxSteps ?? DEFAULT_MAX_STEPS;
  const stopAt = req.stopAt ?? 'innerHorizon';
  const hz = horizons(s);
  const rPlus = hz ? hz.outer : Number.NaN;
  const rMinus = hz && hz.inner > 0 ? hz.inner : Number.NaN;
  const surface = req.surfaceRadius ?? Number.NaN;
  const q2 = s.q * s.q;

  const y0 = new Float64Array(STATE_SIZE);
  y0[R] = st.r;
  y0[TH] = st.theta;
  y0[PR] = init.pr;
  y0[PTH] = init.pth;
  y0[PHI] = st.phi;
  const start = invariants(s, c, y0);
  const sys = { n: STATE_SIZE, rhs: (_l: number, y: Float64Array, d: Float64Array) => geodesicRhs(s, c, y, d) };
  const ode = new Dop853(sys, 0, y0, { rtol, atol: rtol * 1e-3 });

  // Boyer–Lindquist clocks hold while the path stays outside the outer horizon (or there is none).
  const outsideAtStart = !hz || st.r > rPlus;
  // t = v − r*(r) and φ = φ̃ − φ*(r) with r* = r + (t̄ − t)(r), φ* = (φ̄ − φ)(r) (coordinate-integrals.ts;
  // t̄ = v − r): only differences from the start enter, so the clocks read 0 at the launch.
  const rStar = (r: number) => r + kerrSchildTimeShift(s, r);
  const rStar0 = rStar(st.r);
  const phiStar0 = kerrSchildAzimuthShift(s, st.r);
  let blValid = outsideAtStart && Number.isFinite(rStar0);
  let riverValid = 2 * st.r - q2 >= 0;
  let riverLostAt: number | null = riverValid ? null : 0;

  const cap = req.samples + 1;
  const col = () => new Float64Array(cap);
  const samples: GeodesicSamples = {
    count: 0,
    lambda: col(), v: col(), river: col(), t: col(), r: col(), theta: col(), phi: col(), phiBL: col(), x: col(), y: col(), z: col(),
  };
  const spacing = req.maxLength / (req.samples - 1);
  let nextSample = 0;
  const buf = new Float64Array(STATE_SIZE);
  const push = (lambda: number, y: ArrayLike<number>) => {
    const k = samples.count++;
    let th = y[TH]!;
    let ph = y[PHI]!;
    // A path through the axis (L = 0) continues with θ < 0 or > π: report the same point in range.
    if (th < 0 || th > Math.PI) {
      th = th < 0 ? -th : 2 * Math.PI - th;
      ph += Math.PI;
    }
    const r = y[R]!;
    samples.lambda[k] = lambda;
    samples.v[k] = y[V]!;
    samples.river[k] = riverValid ? y[RIVER]! : Number.NaN;
    samples.r[k] = r;
    samples.theta[k] = th;
    samples.phi[k] = ph;
    if (blValid && !(r <= rPlus)) {
      samples.t[k] = y[V]! - (rStar(r) - rStar0);
      samples.phiBL[k] = ph - (kerrSchildAzimuthShift(s, r) - phiStar0);
    } else {
      samples.t[k] = Number.NaN;
      samples.phiBL[k] = Number.NaN;
    }
    const [, x, yy, z] = hubToCartesian(s, [0, r, y[TH]!, y[PHI]!]);
    samples.x[k] = x;
    samples.y[k] = yy;
    samples.z[k] = z;
  };

  const events: GeodesicEvent[] = [];
  let eventCount = 0;
  const record = (kind: EventKind, lambda: number, y: ArrayLike<number>) => {
    eventCount++;
    if (events.length < MAX_EVENTS) {
      events.push({ kind, lambda, v: y[V]!, river: riverValid ? y[RIVER]! : Number.NaN, r: y[R]!, theta: y[TH]!, phi: y[PHI]! });
    }
  };

  // Event functions g(state); an event is a sign change across a step.
  type Detector = { kind: EventKind; terminal: boolean; g: (y: ArrayLike<number>) => number; dir: -1 | 0 | 1 };
  const detectors: Detector[] = [];
  const sigmaOf = (y: ArrayLike<number>) => y[R]! * y[R]! + s.a * s.a * Math.cos(y[TH]!) ** 2;
  // An extremal hole (r₊ = r₋ to rounding) is stopped at its one horizon.
  const outerTerminal = stopAt === 'outerHorizon' || (Number.isFinite(rPlus) && !Number.isFinite(innerStopRadius(s)) && Number.isFinite(rMinus));
  if (Number.isFinite(rPlus)) detectors.push({ kind: 'outerHorizon', terminal: outerTerminal, g: (y) => y[R]! - rPlus, dir: -1 });
  // The inner horizon: a path stops at r₋ + INNER_MARGIN (r₊ − r₋) — see innerStopRadius.
  const innerStop = innerStopRadius(s);
  if (Number.isFinite(innerStop)) detectors.push({ kind: 'innerHorizon', terminal: stopAt === 'innerHorizon', g: (y) => y[R]! - innerStop, dir: -1 });
  detectors.push({ kind: 'singularity', terminal: true, g: (y) => sigmaOf(y) - SINGULARITY_SIGMA, dir: -1 });
  if (Number.isFinite(surface)) detectors.push({ kind: 'surface', terminal: true, g: (y) => y[R]! - surface, dir: -1 });
  detectors.push({ kind: 'escape', terminal: true, g: (y) => y[R]! - escapeRadius, dir: 1 });
  detectors.push({ kind: 'radialTurningPoint', terminal: false, g: (y) => radialVelocity(s, c, y[R]!, y[TH]!, y[PR]!), dir: 0 });
  detectors.push({ kind: 'polarTurningPoint', terminal: false, g: (y) => y[PTH]!, dir: 0 });
  let gOld = detectors.map((d) => d.g(y0));

  push(0, y0);
  nextSample = 1;
  let termination: Termination = 'maxLength';
  let smallest = Number.POSITIVE_INFINITY;
  let largest = 0;
  let endLambda = 0;
  const endState = Float64Array.from(y0);
  for (;;) {
    if (ode.accepted >= maxSteps) {
      termination = 'maxSteps';
      break;
    }
    const status = ode.step(req.maxLength - ode.t);
    if (status !== 'accepted') {
      termination = 'toleranceNotMet';
      break;
    }
    const h = Math.abs(ode.hLast);
    smallest = Math.min(smallest, h);
    largest = Math.max(largest, h);
    const gNew = detectors.map((d) => d.g(ode.y));
    // The events of this step, in order of λ.
    const found: { kind: EventKind; terminal: boolean; lambda: number }[] = [];
    detectors.forEach((d, i) => {
      const a = gOld[i]!;
      const b = gNew[i]!;
      // A start exactly on a surface (g = 0) that moves through it counts as crossing there.
      const crosses = d.dir === 0 ? a * b < 0 : d.dir < 0 ? (a > 0 && b <= 0) || (a === 0 && b < 0) : (a < 0 && b >= 0) || (a === 0 && b > 0);
      if (!crosses) return;
      const lambda =
        b === 0
          ? ode.t
          : locate(
              (l) => {
                ode.interpolate(l, buf);
                return d.g(buf);
              },
              ode.tOld,
              ode.t,
              a,
              b,
            );
      found.push({ kind: d.kind, terminal: d.terminal, lambda });
    });
    found.sort((p, q) => p.lambda - q.lambda);
    const stop = found.find((f) => f.terminal);
    const until = stop ? stop.lambda : ode.t;
    // Samples up to the end of the step (or the terminal event).
    while (nextSample < req.samples && nextSample * spacing <= until) {
      const l = nextSample === req.samples - 1 ? req.maxLength : nextSample * spacing;
      if (l > until) break;
      if (l === ode.t) buf.set(ode.y);
      else ode.interpolate(l, buf);
      if (riverValid && 2 * buf[R]! - q2 < 0) {
        riverValid = false;
        riverLostAt = l;
      }
      push(l, buf);
      nextSample++;
    }
    for (const f of found) {
      if (f.lambda > until) break;
      if (f.lambda === ode.t) buf.set(ode.y);
      else ode.interpolate(f.lambda, buf);
      if (f.kind === 'outerHorizon') blValid = false;
      // On the equator p_θ is rounding noise for equatorial motion: its sign changes are not turning points.
      if (f.kind === 'polarTurningPoint' && Math.abs(Math.cos(buf[TH]!)) < EQUATOR_NOISE) continue;
      record(f.kind, f.lambda, buf);
    }
    if (riverValid && 2 * ode.y[R]! - q2 < 0) {
      riverValid = false;
      riverLostAt = ode.t;
    }
    if (stop) {
      termination = stop.kind === 'radialTurningPoint' || stop.kind === 'polarTurningPoint' ? 'maxLength' : stop.kind;
      if (stop.lambda === ode.t) endState.set(ode.y);
      else ode.interpolate(stop.lambda, endState);
      endLambda = stop.lambda;
      break;
    }
    gOld = gNew;
    endState.set(ode.y);
    endLambda = ode.t;
    if (ode.t >= req.maxLength) break;
  }
  if (samples.lambda[samples.count - 1] !== endLambda) push(endLambda, endState);
  return {
    ok: true,
    constants: c,
    start,
    end: invariants(s, c, endState),
    termination,
    length: endLambda,
    events,
    eventCount,
    samples,
    steps: {
      accepted: ode.accepted,
      rejected: ode.rejected,
      evaluations: ode.evaluations,
      smallest: Number.isFinite(smallest) ? smallest : 0,
      largest,
    },
    rtol,
    escapeRadius,
    riverLostAt,
  };
}
