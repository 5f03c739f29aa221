/**
 * Proper-time intervals of stationary clocks and circular orbits, in geometric units G = c = M = 1
 * (times in GM/c³). Radial free fall is in ./free-fall.ts.
 */
import { stationaryObserver, type Observer, type ObserverAbsent, type OrbitDirection } from './observers.js';
import type { KerrNewman } from './spacetime.js';

// ---------------------------------------------------------------------------------------------
// a. Stationary observers
// ---------------------------------------------------------------------------------------------

/** A stretch of a stationary observer's worldline. */
export interface StationaryInterval {
  /** Proper time τ on the observer's clock. */
  properTime: number;
  /** Far-away (Boyer–Lindquist) time t. */
  farAwayTime: number;
  /** t − τ, the time the observer's clock loses against a far-away clock (offset · t, no cancellation). */
  lag: number;
}

/** τ = (dτ/dt) t for a stationary observer over far-away time t (any sign); lag t − τ = offset · t. */
export function stationaryProperTime(o: Observer, farAwayTime: number): StationaryInterval {
  return { properTime: o.rate * farAwayTime, farAwayTime, lag: o.offset * farAwayTime };
}

/** The inverse: far-away time t = τ/(dτ/dt) for proper time τ; lag t − τ = τ · offset/rate. */
export function stationaryFarAwayTime(o: Observer, properTime: number): StationaryInterval {
  return { properTime, farAwayTime: properTime / o.rate, lag: (properTime * o.offset) / o.rate };
}

// ---------------------------------------------------------------------------------------------
// c. Circular orbits
// ---------------------------------------------------------------------------------------------

export interface OrbitRevolutions extends StationaryInterval {
  observer: Observer;
}

/**
 * N revolutions of a circular equatorial geodesic orbit: far-away time t = 2πN/|Ω| and proper time
 * τ = (dτ/dt) t (the orbiting clock; see ./observers.ts for Ω and the rate). N > 0. Returns the
 * observer's absence (with its reason) where no such orbit exists.
 */
export function circularOrbitRevolutions(
  s: KerrNewman,
  r: number,
  direction: OrbitDirection,
  revolutions: number,
): OrbitRevolutions | ObserverAbsent {
  const o = stationaryObserver(s, { kind: 'circular', r, direction });
  if (!o.exists) return o;
  if (!(Number.isFinite(revolutions) && revolutions > 0)) {
    return { exists: false, kind: 'circular', reason: 'invalidInput', message: 'the number of revolutions must be a finite positive number' };
  }
  const t = (2 * Math.PI * revolutions) / Math.abs(o.angularVelocity);
  return { ...stationaryProperTime(o, t), observer: o };
}
