/**
 * Body presets with the published standard values, each named.
 */
import {
  EARTH_MOI_FACTOR,
  G,
  GM_EARTH,
  GM_SUN,
  OMEGA_EARTH,
  R_EARTH_WGS84,
  R_SUN,
} from './constants.js';

export interface Preset {
  name: 'sun' | 'earth';
  /** GM, m^3 s^-2. */
  gm: number;
  /** Equatorial radius, m. */
  radius: number;
  /** Angular momentum J, kg m^2 s^-1. */
  angularMomentum: number;
  /** Rotation rate of the surface, rad s^-1, where one rate describes it (null for the Sun's differential rotation). */
  rotationRate: number | null;
  sources: string[];
}

/**
 * Angular momentum of the Sun, kg m^2 s^-1: (1.92 ± 0.02)e41 from helioseismic rotation
 * (Pijpers 1998, MNRAS 297, L76; Komm et al. 2003, ApJ 586, 650 give 1.91e41) — value from memory.
 */
const J_SUN = 1.92e41;

/** Earth's angular momentum C ω, with C = (C/Ma²) M a² (Groten 2004 factor; IERS 2010 ω and GM). */
const J_EARTH = (EARTH_MOI_FACTOR * (GM_EARTH / G) * R_EARTH_WGS84 * R_EARTH_WGS84) * OMEGA_EARTH;

export const PRESETS: Record<Preset['name'], Preset> = {
  sun: {
    name: 'sun',
    gm: GM_SUN,
    radius: R_SUN,
    angularMomentum: J_SUN,
    rotationRate: null,
    sources: ['GM 1.3271244e20 m^3/s^2 and R 6.957e8 m (IAU 2015 B3 nominal)', 'J 1.92e41 kg m^2/s (helioseismology, Pijpers 1998)'],
  },
  earth: {
    name: 'earth',
    gm: GM_EARTH,
    radius: R_EARTH_WGS84,
    angularMomentum: J_EARTH,
    rotationRate: OMEGA_EARTH,
    sources: ['GM 3.986004418e14 m^3/s^2 (IERS 2010)', 'R 6378137 m (WGS84)', 'J = Cω, C/(Ma²) 0.3307007 (Groten 2004), ω 7.292115e-5 rad/s (IERS 2010)'],
  },
};
