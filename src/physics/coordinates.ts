/**
 * Events, vectors and covectors between three charts of a Kerr–Newman spacetime, in geometric units
 * G = c = M = 1 (times and lengths in M, angles in rad):
 *   - Boyer–Lindquist (t, r, θ, φ) — the chart of spacetime.ts; t and φ are singular on the horizons;
 *   - river (T, r, θ, Φ) — Doran (2000, Phys. Rev. D 61, 067503), Gullstrand–Painlevé when a = 0 — the
 *     chart of spacetime.ts's river metric, regular across the horizons, defined where 2r ≥ Q²;
 *   - Kerr–Schild Cartesian (t̄, x, y, z) — ingoing Kerr–Schild (Kerr 1963; Kerr & Schild 1965), with
 *       x + i y = (r + i a) sinθ e^{iφ̄},  z = r cosθ,
 *     regular across the horizons, metric g = η + f k ⊗ k with f = (2r − Q²) r²/(r⁴ + a² z²) = μ/Σ and
 *     k = (1, (r x + a y)/(r² + a²), (r y − a x)/(r² + a²), z/r) (covariant; checked in
 *     test/fixtures/python/transform.py against the Boyer–Lindquist metric).
 * The radial relations between the time and azimuth coordinates, and their additive constants, are in
 * coordinate-integrals.ts. All three charts are built on the spherical ingoing Kerr chart
 * (t̄, r, θ, φ̄) (the "hub"): each chart maps to it and back, and Jacobians are products through it.
 *
 * The inverse of the Cartesian map is the root r ≥ 0 of r⁴ − (x² + y² + z² − a²) r² − a² z² = 0
 * (oblate spheroidal coordinates). Only the r ≥ 0 sheet is used: an event on the disk r = 0
 * (z = 0, x² + y² < a²) is given its upper face (θ ≤ π/2); the ring x² + y² = a², z = 0 (Σ = 0) and,
 * for a = 0, the centre are the curvature singularity and are refused. On the polar axis (sinθ = 0)
 * φ̄ is undefined and 0 is returned, and the Jacobians to and from the angular charts are singular.
 *
 * Jacobians, metric components and the transformation of vectors and covectors are in
 * coordinate-jacobians.ts.
 */
import { deltaFunction, kerrSchildAzimuthShift, kerrSchildTimeShift, riverShift } from './coordinate-integrals.js';
import { horizons, type KerrNewman } from './spacetime.js';

export type CoordinateSystem = 'boyerLindquist' | 'river' | 'kerrSchild';
export const COORDINATE_SYSTEMS: readonly CoordinateSystem[] = ['boyerLindquist', 'river', 'kerrSchild'];

/** Four numbers: an event's coordinates, or a vector's or covector's components. */
export type Vec4 = [number, number, number, number];

export type TransformReason = 'onHorizon' | 'noRiverChart' | 'singularity' | 'notConverged' | 'negativeRadius' | 'axis';

export const TRANSFORM_REASONS: Record<TransformReason, string> = {
  onHorizon: 'on a horizon the Boyer–Lindquist t and φ are infinite (the chart does not reach it); use the river or Kerr–Schild chart',
  noRiverChart: 'river coordinates do not exist where 2GM r/c² < Q² (very close to the centre of a charged mass no observer falls there from rest at infinity)',
  singularity: 'the event is on the curvature singularity (Σ = r² + a² cos²θ = 0)',
  notConverged: 'the quadrature of the river coordinates did not reach its tolerance here',
  negativeRadius: 'r < 0 (the sheet beyond the disk) is not covered; r ≥ 0 only',
  axis: 'on the polar axis (sinθ = 0) the angular charts are singular, so this Jacobian does not exist',
};

export type Outcome<T> = { ok: true; value: T } | { ok: false; reason: TransformReason };

const refuse = <T>(reason: TransformReason): Outcome<T> => ({ ok: false, reason });
const accept = <T>(value: T): Outcome<T> => ({ ok: true, value });

const TWO_PI = 2 * Math.PI;
/** An angle reduced to (−π, π]. */
function reduceAngle(x: number): number {
  let y = x - TWO_PI * Math.round(x / TWO_PI);
  if (y <= -Math.PI) y += TWO_PI;
  return y;
}

/** Whether (r, θ) is the curvature singularity (Σ = 0: r = 0 with a = 0, or the ring r = 0, θ = π/2). */
export function isSingular(s: KerrNewman, r: number, theta: number): boolean {
  return r === 0 && (s.a === 0 || Math.abs(Math.cos(theta)) < 1e-16);
}

// ---- charts to and from the hub (t̄, r, θ, φ̄) ----------------------------------------------------

/**
 * Whether r is a horizon: Δ(r) = 0 in the closed form, or r equal to a horizon radius as horizons()
 * rounds it (the classification region() uses), so that the service calls one point a horizon everywhere.
 */
export function onHorizon(s: KerrNewman, r: number): boolean {
  const h = horizons(s);
  return h !== null && (r === h.outer || r === h.inner || deltaFunction(s, r) === 0);
}

/** Boyer–Lindquist → hub: t̄ = t + (t̄ − t)(r), φ̄ = φ + (φ̄ − φ)(r). Refused on a horizon. */
export function blToHub(s: KerrNewman, e: Vec4): Outcome<Vec4> {
  const [t, r, theta, phi] = e;
  if (r < 0) return refuse('negativeRadius');
  if (isSingular(s, r, theta)) return refuse('singularity');
  if (onHorizon(s, r)) return refuse('onHorizon');
  const dt = kerrSchildTimeShift(s, r);
  const dphi = kerrSchildAzimuthShift(s, r);
  if (!Number.isFinite(dt) || !Number.isFinite(dphi)) return refuse('onHorizon');
  return accept([t + dt, r, theta, phi + dphi]);
}

/** Hub → Boyer–Lindquist. Refused on a horizon. */
export function hubToBl(s: KerrNewman, h: Vec4): Outcome<Vec4> {
  const [tb, r, theta, phib] = h;
  if (onHorizon(s, r)) return refuse('onHorizon');
  const dt = kerrSchildTimeShift(s, r);
  const dphi = kerrSchildAzimuthShift(s, r);
  if (!Number.isFinite(dt) || !Number.isFinite(dphi)) return refuse('onHorizon');
  return accept([tb - dt, r, theta, phib - dphi]);
}

/** River → hub: t̄ = T − (T − t̄)(r), φ̄ = Φ − (Φ − φ̄)(r). Refused where 2r < Q². */
export function riverToHub(s: KerrNewman, e: Vec4): Outcome<Vec4> {
  const [T, r, theta, Phi] = e;
  if (r < 0) return refuse('negativeRadius');
  if (isSingular(s, r, theta)) return refuse('singularity');
  const sh = riverShift(s, r);
  if (!sh.converged) return refuse('notConverged');
  if (!Number.isFinite(sh.time)) return refuse('noRiverChart');
  return accept([T - sh.time, r, theta, Phi - sh.azimuth]);
}

/** Hub → river. Refused where 2r < Q². */
export function hubToRiver(s: KerrNewman, h: Vec4): Outcome<Vec4> {
  const [tb, r, theta, phib] = h;
  const sh = riverShift(s, r);
  if (!sh.converged) return refuse('notConverged');
  if (!Number.isFinite(sh.time)) return refuse('noRiverChart');
  return accept([tb + sh.time, r, theta, phib + sh.azimuth]);
}

/** Hub → Kerr–Schild Cartesian: x + i y = (r + i a) sinθ e^{iφ̄}, z = r cosθ. */
export function hubToCartesian(s: KerrNewman, h: Vec4): Vec4 {
  const [tb, r, theta, phib] = h;
  const sn = Math.sin(theta);
  const cp = Math.cos(phib);
  const sp = Math.sin(phib);
  return [tb, (r * cp - s.a * sp) * sn, (r * sp + s.a * cp) * sn, r * Math.cos(theta)];
}

/**
 * The Kerr–Schild radius r ≥ 0 of a Cartesian point: the non-negative root of
 * r⁴ − (R² − a²) r² − a² z² = 0, R² = x² + y² + z², as r² = (w + √(w² + 4a²z²))/2 for w = R² − a² ≥ 0
 * and r² = 2a²z²/(√(w² + 4a²z²) − w) otherwise (no cancellation in either). a ≥ 0.
 */
export function kerrSchildRadius(a: number, x: number, y: number, z: number): number {
  if (a === 0) return Math.hypot(x, y, z);
  // w = R² − a² as (ρ − a)(ρ + a) + z² with ρ = |x + i y|: next to the ring (ρ ≈ a, z ≈ 0) the
  // difference ρ − a is exact (Sterbenz) rather than a cancellation of squares.
  const planar = Math.hypot(x, y);
  const w = (planar - a) * (planar + a) + z * z;
  const disc = Math.hypot(w, 2 * a * z);
  const r2 = w >= 0 ? (w + disc) / 2 : (2 * a * a * z * z) / (disc - w);
  return Math.sqrt(r2);
}

/** Kerr–Schild Cartesian → hub (r ≥ 0 sheet; the disk r = 0 gets its upper face). */
export function cartesianToHub(s: KerrNewman, e: Vec4): Outcome<Vec4> {
  const [tb, x, y, z] = e;
  const r = kerrSchildRadius(s.a, x, y, z);
  const planar = Math.hypot(x, y);
  let theta: number;
  if (planar === 0) {
    theta = z >= 0 ? 0 : Math.PI; // on the axis
  } else if (r === 0) {
    if (s.a === 0) return refuse('singularity');
    // On the disk: sinθ = |x + iy|/a; the upper face has cosθ ≥ 0.
    const sn = Math.min(1, planar / s.a);
    theta = Math.asin(sn);
  } else {
    // sinθ = |x + i y|/√(r² + a²), cosθ = z/r (each up to rounding; atan2 needs only their ratio).
    theta = Math.atan2(planar / Math.hypot(r, s.a), z / r);
  }
  if (isSingular(s, r, theta)) return refuse('singularity');
  const phib = planar === 0 ? 0 : reduceAngle(Math.atan2(y, x) - Math.atan2(s.a, r));
  return accept([tb, r, theta, phib]);
}

// ---- one event -----------------------------------------------------------------------------------

export function toHub(system: CoordinateSystem, s: KerrNewman, e: Vec4): Outcome<Vec4> {
  if (system === 'boyerLindquist') return blToHub(s, e);
  if (system === 'river') return riverToHub(s, e);
  return cartesianToHub(s, e);
}

export function fromHub(system: CoordinateSystem, s: KerrNewman, h: Vec4): Outcome<Vec4> {
  if (system === 'boyerLindquist') return hubToBl(s, h);
  if (system === 'river') return hubToRiver(s, h);
  return accept(hubToCartesian(s, h));
}

/** The Kerr–Schild Cartesian event of a Boyer–Lindquist event (t, r, θ, φ); null on a horizon or the singularity. */
export function blToKerrSchild(s: KerrNewman, e: Vec4): Vec4 | null {
  const h = blToHub(s, e);
  return h.ok ? hubToCartesian(s, h.value) : null;
}

/** The Boyer–Lindquist event of a Kerr–Schild Cartesian event (t̄, x, y, z); null on a horizon or the singularity. */
export function kerrSchildToBl(s: KerrNewman, e: Vec4): Vec4 | null {
  const h = cartesianToHub(s, e);
  if (!h.ok) return null;
  const b = hubToBl(s, h.value);
  return b.ok ? b.value : null;
}

/** The river event (T, r, θ, Φ) of a Boyer–Lindquist event; null where either chart does not exist. */
export function blToRiver(s: KerrNewman, e: Vec4): Vec4 | null {
  const h = blToHub(s, e);
  if (!h.ok) return null;
  const v = hubToRiver(s, h.value);
  return v.ok ? v.value : null;
}

/** The Boyer–Lindquist event of a river event; null where either chart does not exist. */
export function riverToBl(s: KerrNewman, e: Vec4): Vec4 | null {
  const h = riverToHub(s, e);
  if (!h.ok) return null;
  const b = hubToBl(s, h.value);
  return b.ok ? b.value : null;
}

/** The Kerr–Schild Cartesian event of a river event; null where the river chart does not exist. */
export function riverToKerrSchild(s: KerrNewman, e: Vec4): Vec4 | null {
  const h = riverToHub(s, e);
  return h.ok ? hubToCartesian(s, h.value) : null;
}

/** The river event of a Kerr–Schild Cartesian event; null where the river chart does not exist. */
export function kerrSchildToRiver(s: KerrNewman, e: Vec4): Vec4 | null {
  const h = cartesianToHub(s, e);
  if (!h.ok) return null;
  const v = hubToRiver(s, h.value);
  return v.ok ? v.value : null;
}
