/**
 * Properties of the outer horizon of a Kerr–Newman black hole (a² + Q² ≤ 1), geometric units M = 1.
 *
 * With r± the horizons and ϖ² = r+² + a² (Bardeen, Carter & Hawking 1973, Commun. Math. Phys. 31:161;
 * Misner, Thorne & Wheeler 1973, Box 33.2):
 *   surface gravity        κ = (r+ − r−) / (2ϖ²)
 *   horizon area           A_H = 4π ϖ²
 *   angular velocity       Ω_H = a / ϖ²
 *   electric potential     Φ_H = Q r+ / ϖ²
 *   irreducible mass       M_irr = √(A_H / 16π) = ϖ / 2      (Christodoulou & Ruffini 1971)
 *   Hawking temperature    T_H = κ / 2π in units of ħc³/(G M k_B)   (Hawking 1975, Commun. Math. Phys. 43:199)
 */
import { horizons, type KerrNewman } from './spacetime.js';

export interface HorizonProperties {
  outer: number;
  inner: number;
  surfaceGravity: number;
  horizonArea: number;
  horizonAngularVelocity: number;
  horizonElectricPotential: number;
  irreducibleMass: number;
  /** κ/2π: the Hawking temperature in units of ħc³/(G M k_B). */
  hawkingTemperature: number;
}

/** Horizon properties, or null for a naked singularity (a² + Q² > 1). */
export function horizonProperties(s: KerrNewman): HorizonProperties | null {
  const h = horizons(s);
  if (!h) return null;
  const w2 = h.outer * h.outer + s.a * s.a;
  const kappa = (h.outer - h.inner) / (2 * w2);
  return {
    outer: h.outer,
    inner: h.inner,
    surfaceGravity: kappa,
    horizonArea: 4 * Math.PI * w2,
    horizonAngularVelocity: s.a / w2,
    horizonElectricPotential: (s.q * h.outer) / w2,
    irreducibleMass: Math.sqrt(w2) / 2,
    hawkingTemperature: kappa / (2 * Math.PI),
  };
}
