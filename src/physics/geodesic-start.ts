/**
 * The start of a geodesic: the kinds of initial data (a launch measured by an observer, or the constants
 * of motion with the signs of the radial and polar motion), their conversion into the covariant momenta
 * (p_r, p_θ) of ingoing Kerr coordinates with the constants E, L (see ./geodesic-equations.ts and
 * ./tetrads.ts), the refusals of initial data that are not a valid state, and the root finder that the
 * driver (./geodesic.ts) uses to locate events on the dense output.
 *
 * Geometric units G = c = M = 1. From constants: p_θ = ±√Θ, Θ = K − cos²θ (a²(κ − E²) + L²/sin²θ)
 * (Carter 1968, Phys. Rev. 174, 1559), and p_r from the mass shell Δ p_r² − 2P p_r + X = 0,
 * X = p_θ² + (L − aE sin²θ)²/sin²θ + κΣ, with dr/dλ = (Δ p_r − P)/Σ = ±√R/Σ, R = P² − ΔX:
 * p_r = (P ± √R)/Δ, or its conjugate X/(P ∓ √R) where that form has no cancellation (and on a horizon).
 */
import type { MotionConstants } from './geodesic-equations.js';
import type { KerrNewman } from './spacetime.js';
import { launchMomentum, observerTetrad, TETRAD_REASONS, type LaunchObserver, type TetradAbsenceReason } from './tetrads.js';

export type ParticleKind = 'timelike' | 'null';

export type GeodesicStart =
  | {
      kind: 'observer';
      observer: LaunchObserver;
      r: number;
      theta: number;
      phi: number;
      /** Speed measured by the observer, units of c, in [0, 1); ignored for light. */
      speed: number;
      /** Angle from the outward radial direction, rad. */
      psi: number;
      /** Angle around the radial direction from e_φ̂ towards the north, rad. */
      chi: number;
    }
  | {
      kind: 'constants';
      r: number;
      theta: number;
      phi: number;
      E: number;
      L: number;
      /** Carter constant K. */
      carter: number;
      radialSign: 1 | -1;
      polarSign: 1 | -1;
    };

export type GeodesicRefusalReason = 'invalidInput' | 'noObserver' | 'speed' | 'forbiddenStart' | 'singularStart' | 'beyondEscape';

export interface GeodesicRefused {
  ok: false;
  reason: GeodesicRefusalReason;
  /** Which part of the request: 'start', 'speed', 'escapeRadius', ... */
  field: string;
  message: string;
}

export function refuse(reason: GeodesicRefusalReason, field: string, message: string): GeodesicRefused {
  return { ok: false, reason, field, message };
}

const OBSERVER_NAMES: Record<Exclude<LaunchObserver, 'river'>, string> = {
  static: 'static observer',
  zamo: 'zero-angular-momentum observer (ZAMO)',
};

/** Initial (p_r, p_θ) and constants from the request, or a refusal. */
export function initialMomentum(
  s: KerrNewman,
  particle: ParticleKind,
  st: GeodesicStart,
): { c: MotionConstants; pr: number; pth: number } | GeodesicRefused {
  const kappa = particle === 'timelike' ? 1 : 0;
  if (st.kind === 'observer') {
    if (particle === 'timelike' && !(st.speed >= 0 && st.speed < 1)) return refuse('speed', 'speed', 'the speed of a massive particle must lie in [0, c)');
    const tr = observerTetrad(s, st.observer, st.r, st.theta);
    if (!tr.ok) {
      const reason: TetradAbsenceReason = tr.reason;
      if (reason === 'onAxis' || reason === 'singular') return refuse('singularStart', reason === 'onAxis' ? 'theta' : 'observer', TETRAD_REASONS[reason]);
      if (st.observer === 'river') return refuse('noObserver', 'observer', TETRAD_REASONS[reason]);
      return refuse('noObserver', 'observer', `no ${OBSERVER_NAMES[st.observer]} can launch here: ${TETRAD_REASONS[reason]}`);
    }
    const p = launchMomentum(tr.tetrad, particle, st.speed, st.psi, st.chi);
    return { c: { E: -p[0]!, L: p[3]!, kappa }, pr: p[1]!, pth: p[2]! };
  }
  const { r, theta, E, L, carter } = st;
  const sn = Math.sin(theta);
  if (!(Math.abs(sn) > 1e-9)) return refuse('singularStart', 'theta', TETRAD_REASONS.onAxis);
  const c: MotionConstants = { E, L, kappa };
  const cs = Math.cos(theta);
  const a = s.a;
  const polar = cs * cs * (a * a * (kappa - E * E) + (L * L) / (sn * sn));
  let bigTheta = carter - polar;
  // A start exactly at a polar turning point (e.g. the equator with K = 0) is a rounding error from 0.
  // The scale is that of the terms of Θ before the factor cos²θ (which is ~1e−33, not 0, at θ = π/2 in doubles).
  if (bigTheta < 0 && bigTheta >= -1e-12 * (Math.abs(carter) + a * a * Math.abs(kappa - E * E) + L * L)) bigTheta = 0;
  if (bigTheta < 0) {
    return refuse('forbiddenStart', 'carter', `these constants cannot reach θ = ${theta}: p_θ² = K − cos²θ(a²(κ − E²) + L²/sin²θ) = ${bigTheta} < 0`);
  }
  const pth = st.polarSign * Math.sqrt(bigTheta);
  const rho2 = r * r + a * a;
  const delta = rho2 - (2 * r - s.q * s.q);
  const sigma = r * r + a * a * cs * cs;
  const P = E * rho2 - a * L;
  const w0 = L - a * E * sn * sn;
  const X = pth * pth + (w0 * w0) / (sn * sn) + kappa * sigma;
  // Δ p_r² − 2P p_r + X = 0 with dr/dλ = (Δ p_r − P)/Σ = ±√R/Σ, R = P² − ΔX.
  let bigR = P * P - delta * X;
  // A start exactly at a turning point (R = 0) computes R as a rounding error either side of 0.
  if (bigR < 0 && bigR >= -1e-12 * Math.max(P * P, Math.abs(delta * X))) bigR = 0;
  if (bigR < 0) return refuse('forbiddenStart', 'energy', `these constants cannot reach r = ${r}: the radial potential R = P² − ΔX = ${bigR} < 0`);
  const root = Math.sqrt(bigR);
  // p_r = (P + σ√R)/Δ, or the conjugate X/(P − σ√R) where that has no cancellation (and on a horizon).
  const sign = st.radialSign;
  let pr: number;
  if (sign * P <= 0 || delta === 0) pr = X / (P - sign * root);
  else pr = (P + sign * root) / delta;
  if (!Number.isFinite(pr)) return refuse('forbiddenStart', 'start', 'the momentum is not finite here (a turning point on the horizon)');
  return { c, pr, pth };
}

/** Illinois regula falsi for a sign change of g on [lo, hi] (g(lo)·g(hi) < 0): returns the root. */
export function locate(g: (l: number) => number, lo: number, hi: number, glo: number, ghi: number): number {
  let side = 0;
  for (let i = 0; i < 100; i++) {
    const m = (lo * ghi - hi * glo) / (ghi - glo);
    if (!(m > Math.min(lo, hi) && m < Math.max(lo, hi)) || Math.abs(hi - lo) <= 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi))) {
      return Number.isFinite(m) && m >= Math.min(lo, hi) && m <= Math.max(lo, hi) ? m : 0.5 * (lo + hi);
    }
    const gm = g(m);
    if (gm === 0) return m;
    if (gm * ghi < 0) {
      lo = hi;
      glo = ghi;
      hi = m;
      ghi = gm;
      if (side === -1) glo *= 0.5;
      side = -1;
    } else {
      hi = m;
      ghi = gm;
      glo *= 0.5;
      if (side === 1) glo *= 0.5;
      side = 1;
    }
  }
  return hi;
}
