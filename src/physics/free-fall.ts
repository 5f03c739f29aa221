/**
 * Radial free fall: proper, river and far-away time between two radii, in geometric units
 * G = c = M = 1 (times in GM/c³, radii in GM/c², Boyer–Lindquist r).
 *
 * Free fall with zero angular momentum (L = 0) is computed where it stays in one plane of motion:
 * any θ when a = 0 (Schwarzschild, Reissner–Nordström), the rotation axis (θ = 0 or π) and the
 * equator (θ = π/2) when a ≠ 0. With E = −u_t the energy per unit mass (Carter 1968, Phys. Rev. 174,
 * 1559; Misner, Thorne & Wheeler 1973, Gravitation, ch. 33):
 *   axis, or a = 0 (ρ² = r² + a² on the axis, r² when a = 0):
 *     (dr/dτ)² = W = E² − Δ/ρ²,  dt/dτ = E ρ²/Δ,
 *   equator:  (r² dr/dτ)² = R = E²(r² + a²)² − Δ(r² + a²E²),  dt/dτ = E A/(Δ r²).
 * Rearranged, ρ²W = (E² − 1)ρ² + μ (axis) and R = (E² − 1)A + μρ² (equator) — the "polynomial form",
 * exact where E = 1 — and, with ε = E² − α₁² (α₁ the ZAMO lapse at the start r₁),
 *   ρ²W = ε ρ² + (r₁ − r)[2 r r₁ − 2a² − Q²(r + r₁)]/ρ₁²                               (axis; a → 0),
 *   R   = ε A + (r₁ − r)[ρ²ρ₁²(2 r r₁ − Q²(r + r₁)) − a² μ μ₁ (r + r₁)]/A₁               (equator),
 * the "start form", exact at a turning point r₁ (ε = 0) because r₁ − r comes from the quadrature with
 * full precision. Each node uses the form whose terms cancel less. Both were derived by hand and are
 * verified with sympy in test/fixtures/python/proper_time.py.
 *
 * River time T (the Gullstrand–Painlevé / Doran time, dT = dt + √((r² + a²)μ)/Δ dr; Painlevé 1921,
 * C. R. Acad. Sci. 173, 677; Gullstrand 1922, Ark. Mat. Astr. Fys. 16(8); Doran 2000, Phys. Rev. D
 * 61, 067503; bibliographic details from memory) along an inward path, in forms regular across the horizons (derived by multiplying
 * numerator and denominator by the conjugate; verified with sympy in the fixture script):
 *   axis:    dT/dτ = (E² + b²)/(E + b √W),           b² = μ/ρ²,
 *   equator: dT/dτ = (E² A + ρ² μ)/(E A + √(ρ² μ R)).
 * Outward paths (which stay outside the horizon) use the direct forms (E + b√W)ρ²/Δ and
 * (E A + √(ρ²μR))/(r²Δ). Far-away time t diverges at the outer horizon; where the path stays outside
 * it, its simple pole at r₊ (residue (r₊² + a²)/(r₊ − r₋) = 1/(2κ)) is subtracted and integrated in
 * closed form, so a path ending close to the horizon keeps full accuracy.
 *
 * The integrals over r use tanh-sinh quadrature (./quadrature.ts), which copes with the 1/√(r₁ − r)
 * singularity at a turning point. Schwarzschild falls from rest at r₁ (the cycloid, MTW 1973 ch. 31,
 * eq. 31.10) and from rest at infinity (E = 1) have closed forms, used as fast paths
 * (./free-fall-schwarzschild.ts). The request and result types and the reason texts are in
 * ./free-fall-types.ts.
 */
import { tanhSinhVector, type VectorIntegrand } from './quadrature.js';
import { schwarzschildClosedForm } from './free-fall-schwarzschild.js';
import {
  FALL_REASONS,
  type FallGeometry,
  type FallNullReason,
  type FallRefusalReason,
  type FreeFallOptions,
  type FreeFallRefused,
  type FreeFallRequest,
  type FreeFallResult,
} from './free-fall-types.js';
import { horizons, type KerrNewman } from './spacetime.js';

// ---------------------------------------------------------------------------------------------
// b. Radial free fall
// ---------------------------------------------------------------------------------------------

const AXIS_SIN = 1e-12;
const EQUATOR_COS = 1e-12;

function refuse(reason: FallRefusalReason, turningRadius?: number): FreeFallRefused {
  const out: FreeFallRefused = { ok: false, reason, message: FALL_REASONS[reason] };
  if (turningRadius !== undefined) out.turningRadius = turningRadius;
  return out;
}

/** Constants of one path, shared by its potential and integrand. */
interface Path {
  equator: boolean;
  /** a² on the axis or equator, 0 for a = 0. */
  a2: number;
  q2: number;
  r1: number;
  rho1sq: number;
  mu1: number;
  /** A₁ (equator) or ρ₁⁴ (axis). */
  bigA1: number;
  energy: number;
  /** ε = E² − α₁². */
  eps: number;
  /** E² − 1. */
  e2m1: number;
}

/**
 * ρ²W (axis) or R (equator) at r, with d = r₁ − r given with full precision. Both the start form and
 * the polynomial form are evaluated and the one whose terms are smaller in magnitude (less
 * cancellation) is returned: the start form is exact at r₁ and wherever its two terms have one sign;
 * the polynomial form is exact at a second turning point that it has exactly (E = 1 and Q = 0 on the
 * Kerr axis at r = 0, for instance).
 */
function potential(p: Path, r: number, d: number): number {
  const rho2 = r * r + p.a2;
  const mu = 2 * r - p.q2;
  let x: number; // ρ² (axis) or A (equator)
  let y: number; // 1 (axis) or ρ² (equator)
  let k: number; // the bracket of the start form, over ρ₁² or A₁
  if (p.equator) {
    x = rho2 * r * r + p.a2 * mu;
    y = rho2;
    k = (rho2 * p.rho1sq * (2 * r * p.r1 - p.q2 * (r + p.r1)) - p.a2 * mu * p.mu1 * (r + p.r1)) / p.bigA1;
  } else {
    x = rho2;
    y = 1;
    k = (2 * r * p.r1 - 2 * p.a2 - p.q2 * (r + p.r1)) / p.rho1sq;
  }
  const s1 = x * p.eps;
  const s2 = d * k;
  const p1 = p.e2m1 * x;
  const p2 = mu * y;
  return Math.abs(s1) + Math.abs(s2) <= Math.abs(p1) + Math.abs(p2) ? s1 + s2 : p1 + p2;
}

/**
 * Radial free fall with zero angular momentum from r₁ to r₂ (see the module comment): proper time τ,
 * river time T and far-away time t, each ≥ 0, with the quadrature tolerance and error estimates.
 * r₂ < r₁ falls inward (through the horizons down to r = 0 where the path gets there); r₂ > r₁ needs
 * an outward launch from outside the horizon. E from the start: 1 (from rest at infinity), α₁ (from
 * rest: the ZAMO lapse, √(1 − 2/r₁ + Q²/r₁²) when a = 0; E² = ΣΔ/A on the axis and equator), or
 * γα₁ (launched with speed v = √(1 − 1/γ²) measured by the static observer, the ZAMO when a ≠ 0).
 * Refused (typed reason) where the path does not exist: the body turns back before r₂ (inside the
 * inner horizon of a charged hole, or an outward launch below escape speed), a start inside the
 * horizon other than from infinity, or an unsupported plane of motion. T is null where the path
 * enters 2r < Q², t where it reaches the outer horizon.
 */
export function freeFall(s: KerrNewman, req: FreeFallRequest, options: FreeFallOptions = {}): FreeFallResult {
  const { r1, r2, theta, start } = req;
  const tol = options.relativeTolerance ?? 1e-12;
  if (
    !(Number.isFinite(r1) && r1 > 0 && Number.isFinite(r2) && r2 >= 0 && Number.isFinite(theta)) ||
    !(tol >= 1e-15 && tol <= 1e-3) ||
    (start.kind === 'launch' && !(start.speed >= 0 && start.speed < 1))
  ) {
    return refuse('invalidInput');
  }
  let geometry: FallGeometry;
  if (s.a === 0) geometry = 'radial';
  else if (Math.abs(Math.sin(theta)) <= AXIS_SIN) geometry = 'axis';
  else if (Math.abs(Math.cos(theta)) <= EQUATOR_COS) geometry = 'equator';
  else return refuse('unsupportedGeometry');

  const equator = geometry === 'equator';
  const a2 = geometry === 'radial' ? 0 : s.a * s.a;
  const q2 = s.q * s.q;
  const h = horizons(s);
  const rPlus = h ? h.outer : Number.NEGATIVE_INFINITY;

  const rho1sq = r1 * r1 + a2;
  const mu1 = 2 * r1 - q2;
  const bigA1 = equator ? rho1sq * r1 * r1 + a2 * mu1 : rho1sq * rho1sq;
  // h₁ = 1 − α₁² = ρ₁²μ₁/A₁: the square of the flow speed at r₁ where μ₁ ≥ 0.
  const h1 = (rho1sq * mu1) / bigA1;

  const notes: string[] = [];
  let energy: number;
  let eps: number;
  const onHorizon = r1 === rPlus;
  switch (start.kind) {
    case 'restAtInfinity':
      if (r2 > r1) return refuse('wrongDirection');
      if (h1 < 0) return refuse('startUnreachable');
      energy = 1;
      eps = h1;
      notes.push('E = 1: falling from rest at infinity, the river (Gullstrand–Painlevé / Doran) frame; its proper time is the river time');
      break;
    case 'rest':
      if (h && r1 < rPlus) return refuse('startInsideHorizon');
      energy = onHorizon ? 0 : Math.sqrt(1 - h1);
      eps = 0;
      if (onHorizon) notes.push('released at rest exactly on the outer horizon: E = 0, the limiting fall of longest proper time to the centre');
      break;
    case 'launch': {
      if (h && r1 <= rPlus) return refuse('startInsideHorizon');
      const v = start.speed;
      const dir = r2 > r1 ? 'outward' : 'inward';
      if (v > 0 && r2 !== r1 && dir !== start.direction) return refuse('wrongDirection');
      const lapse2 = 1 - h1;
      eps = (lapse2 * v * v) / (1 - v * v);
      energy = Math.sqrt(lapse2 / (1 - v * v));
      break;
    }
  }
  if (s.a !== 0 && (start.kind === 'rest' || start.kind === 'launch')) {
    notes.push(
      geometry === 'axis'
        ? 'on the rotation axis the static observer and the ZAMO coincide; rest and speed are relative to them'
        : 'with spin, rest and speed at r₁ are relative to the local zero-angular-momentum observer (ZAMO), not the static observer',
    );
  }
  if (equator && s.a !== 0) notes.push('zero angular momentum in the equatorial plane: the body is carried around in φ by frame dragging as it falls');
  if (!(energy >= 0) || !(eps >= 0)) return refuse('startInsideHorizon');

  const base = { geometry, energy, tolerance: tol, notes };
  if (r2 === r1) {
    return {
      ok: true,
      ...base,
      direction: 'none',
      properTime: 0,
      riverTime: 0,
      farAwayTime: 0,
      method: 'closedForm',
      errorEstimate: { properTime: 0, riverTime: 0, farAwayTime: 0 },
      evaluations: 0,
    };
  }
  const inward = r2 < r1;
  const direction = inward ? 'inward' : 'outward';
  const path: Path = { equator, a2, q2, r1, rho1sq, mu1, bigA1, energy, eps, e2m1: eps - h1 };

  // The path exists only where the radial speed² stays ≥ 0 between r₁ and r₂.
  const turning = findTurningPoint(path, r1, r2);
  if (turning !== null) return refuse('turnsBack', turning);

  // Which of T and t exist along the path.
  const lowest = Math.min(r1, r2);
  let riverTimeReason: FallNullReason | undefined;
  let farAwayTimeReason: FallNullReason | undefined;
  if (energy === 0) riverTimeReason = 'startsOnHorizon';
  else if (2 * lowest < q2) riverTimeReason = 'noRiverTime';
  if (energy === 0) farAwayTimeReason = 'startsOnHorizon';
  else if (h && lowest <= rPlus) farAwayTimeReason = 'reachesHorizon';

  if (options.method !== 'quadrature' && s.a === 0 && s.q === 0 && inward) {
    const closed = schwarzschildClosedForm(start.kind, r1, r2, energy);
    if (closed) {
      return {
        ok: true,
        ...base,
        direction,
        properTime: closed.tau,
        riverTime: riverTimeReason ? null : closed.river,
        ...(riverTimeReason ? { riverTimeReason } : {}),
        farAwayTime: farAwayTimeReason ? null : closed.far,
        ...(farAwayTimeReason ? { farAwayTimeReason } : {}),
        method: 'closedForm',
        errorEstimate: { properTime: 0, riverTime: riverTimeReason ? null : 0, farAwayTime: farAwayTimeReason ? null : 0 },
        evaluations: 0,
      };
    }
  }

  const wantRiver = riverTimeReason === undefined;
  const wantFar = farAwayTimeReason === undefined;
  // Pole of dt/dr at r₊ (simple unless extremal): subtract C/(r − r₊), C = (r₊² + a²)/(r₊ − r₋).
  const subtractPole = wantFar && h !== null && h.outer > h.inner;
  const rMinus = h ? h.inner : 0;
  const residue = subtractPole ? (rPlus * rPlus + a2) / (rPlus - rMinus) : 0;
  const lo = Math.min(r1, r2);
  const hi = Math.max(r1, r2);
  const loMinusRPlus = lo - rPlus;
  const f = integrand(path, inward, wantRiver, wantFar, subtractPole, residue, rPlus, rMinus, loMinusRPlus, h !== null);
  // t = (remainder) + C ln((hi − r₊)/(lo − r₊)): the remainder needs accuracy relative to t, not to itself.
  const logPart = subtractPole ? residue * Math.log((hi - rPlus) / loMinusRPlus) : 0;
  const q = tanhSinhVector(f, lo, hi, 3, {
    relativeTolerance: tol,
    maxLevel: options.maxLevel ?? 12,
    absoluteTolerances: [0, 0, tol * Math.abs(logPart)],
  });
  if (!q.convergedEach[0]) return refuse('notConverged');
  let far: number | null = null;
  if (wantFar) {
    if (q.convergedEach[2]) {
      far = (q.values[2] as number) + logPart;
    } else farAwayTimeReason = 'notConverged';
  }
  let river: number | null = null;
  if (wantRiver) {
    if (q.convergedEach[1]) river = q.values[1] as number;
    else riverTimeReason = 'notConverged';
  }
  return {
    ok: true,
    ...base,
    direction,
    properTime: q.values[0] as number,
    riverTime: river,
    ...(riverTimeReason ? { riverTimeReason } : {}),
    farAwayTime: far,
    ...(farAwayTimeReason ? { farAwayTimeReason } : {}),
    method: 'quadrature',
    errorEstimate: {
      properTime: q.errorEstimates[0] as number,
      riverTime: river === null ? null : (q.errorEstimates[1] as number),
      farAwayTime: far === null ? null : (q.errorEstimates[2] as number),
    },
    evaluations: q.evaluations,
  };
}

/**
 * The integrand [dτ/dr, dT/dr, dt/dr − C/(r − r₊)] over r ∈ [lo, hi] (all ≥ 0). The quadrature
 * passes the distances to both ends; r₁ − r is taken from the one at r₁.
 */
function integrand(
  p: Path,
  inward: boolean,
  wantRiver: boolean,
  wantFar: boolean,
  subtractPole: boolean,
  residue: number,
  rPlus: number,
  rMinus: number,
  loMinusRPlus: number,
  hasHorizon: boolean,
): VectorIntegrand {
  const { equator, a2, q2, energy } = p;
  const e2 = energy * energy;
  return (r, toLower, toUpper, out) => {
    // Signed d = r₁ − r from the distance to the end at r₁ (upper end when inward).
    const d = inward ? toUpper : -toLower;
    const pot = potential(p, r, d);
    if (!(pot > 0)) {
      // Only within rounding of an end that is a turning point (the path was checked beforehand):
      // the node's weight there is negligible.
      out[0] = 0;
      out[1] = 0;
      out[2] = 0;
      return;
    }
    const rho2 = r * r + a2;
    const mu = 2 * r - q2;
    // Δ = (r − r₊)(r − r₋), with r − r₊ from the distance to the lower end when it is outside r₊.
    const delta = hasHorizon
      ? (wantFar ? toLower + loMinusRPlus : r - rPlus) * (r - rMinus)
      : rho2 - mu;
    let dtau: number;
    let dTdtau = 0;
    let dtdtau = 0;
    if (equator) {
      const bigA = rho2 * r * r + a2 * mu;
      const sqR = Math.sqrt(pot);
      dtau = (r * r) / sqR;
      if (wantRiver) {
        const flux = Math.sqrt(rho2 * mu) * sqR;
        dTdtau = inward ? (e2 * bigA + rho2 * mu) / (energy * bigA + flux) : (energy * bigA + flux) / (r * r * delta);
      }
      if (wantFar) dtdtau = (energy * bigA) / (delta * r * r);
    } else {
      const sqP = Math.sqrt(pot);
      const rho = Math.sqrt(rho2);
      dtau = rho / sqP;
      if (wantRiver) {
        const b = Math.sqrt(mu / rho2);
        const sqW = sqP / rho;
        dTdtau = inward ? (e2 + mu / rho2) / (energy + b * sqW) : ((energy + b * sqW) * rho2) / delta;
      }
      if (wantFar) dtdtau = (energy * rho2) / delta;
    }
    out[0] = dtau;
    out[1] = dTdtau * dtau;
    out[2] = wantFar ? dtdtau * dtau - (subtractPole ? residue / (toLower + loMinusRPlus) : 0) : 0;
  };
}

/**
 * The radius where the radial speed first falls to zero on the way from r₁ to r₂, or null if it
 * stays real all the way (sampled at 128 intervals, then bisected). A value at r₂ that is negative
 * only by rounding (an end exactly at a turning point, such as E = 1 on the Kerr axis at r = 0)
 * counts as reaching it.
 */
function findTurningPoint(p: Path, r1: number, r2: number): number | null {
  const n = 128;
  const span = r2 - r1;
  const value = (r: number) => potential(p, r, r1 - r);
  // Size of the terms that make up the potential: its rounding error is a few ulp of this.
  const scale = (r: number) => {
    const rho2 = r * r + p.a2;
    const mu = Math.abs(2 * r - p.q2) + p.q2;
    return p.equator ? Math.abs(p.e2m1) * (rho2 * r * r + p.a2 * mu) + mu * rho2 : Math.abs(p.e2m1) * rho2 + mu;
  };
  let prev = r1;
  for (let i = 1; i <= n; i++) {
    const r = i === n ? r2 : r1 + (span * i) / n;
    const v = value(r);
    if (v >= -64 * Number.EPSILON * scale(r)) {
      prev = r;
      continue;
    }
    // Bisect between prev (speed² ≥ 0 up to rounding) and r (speed² < 0).
    let good = prev;
    let bad = r;
    for (let k = 0; k < 200; k++) {
      const m = (good + bad) / 2;
      if (m === good || m === bad) break;
      if (value(m) >= 0) good = m;
      else bad = m;
    }
    return good;
  }
  return null;
}
