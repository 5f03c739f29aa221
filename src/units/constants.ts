/**
 * Physical and astronomical constants, SI units, each with its source.
 *
 * Mass parameters are kept as GM (m^3 s^-2), which the standards give far more precisely than G or
 * any mass in kilograms; a mass in kg is GM / G and carries G's relative uncertainty (2.2e-5).
 */

/** Speed of light in vacuum, m s^-1 (exact; SI 2019, CODATA 2018). */
export const C = 299_792_458;
/** c^2, m^2 s^-2. */
export const C2 = C * C;
/** Newtonian constant of gravitation, m^3 kg^-1 s^-2 (CODATA 2018: 6.67430(15)e-11). */
export const G = 6.674_30e-11;
/** Reduced Planck constant, J s (exact: h / 2π with h = 6.626 070 15e-34 J s; CODATA 2018). */
export const HBAR = 6.626_070_15e-34 / (2 * Math.PI);
/** Boltzmann constant, J K^-1 (exact; CODATA 2018). */
export const K_B = 1.380_649e-23;
/** Vacuum electric permittivity, F m^-1 (CODATA 2018: 8.8541878128(13)e-12). */
export const EPSILON_0 = 8.854_187_812_8e-12;
/** Elementary charge, C (exact; CODATA 2018). */
export const E_CHARGE = 1.602_176_634e-19;

/** Nominal solar mass parameter GM_sun, m^3 s^-2 (IAU 2015 Resolution B3). */
export const GM_SUN = 1.327_124_4e20;
/** Nominal solar radius, m (IAU 2015 Resolution B3). */
export const R_SUN = 6.957e8;
/** Nominal terrestrial equatorial radius, m (IAU 2015 Resolution B3); the astronomical unit "Rearth". */
export const R_EARTH_NOMINAL = 6.378_1e6;

/** Geocentric gravitational constant GM_E, m^3 s^-2 (IERS Conventions 2010, Table 1.1; also WGS84). */
export const GM_EARTH = 3.986_004_418e14;
/** Earth's equatorial radius (semi-major axis), m (WGS84, NIMA TR8350.2). */
export const R_EARTH_WGS84 = 6_378_137;
/** Nominal mean angular velocity of the Earth, rad s^-1 (IERS Conventions 2010, Table 1.1; WGS84). */
export const OMEGA_EARTH = 7.292_115e-5;
/**
 * Earth's polar moment of inertia factor C / (M a^2) with a the equatorial radius (Groten 2004,
 * "Fundamental parameters and current best estimates", J. Geodesy 77:724; value from memory: 0.3307007).
 */
export const EARTH_MOI_FACTOR = 0.330_700_7;

/** Astronomical unit, m (exact; IAU 2012 Resolution B2). */
export const AU = 149_597_870_700;
/** Parsec, m: (648000 / π) au (IAU 2015 Resolution B2). */
export const PARSEC = (648_000 / Math.PI) * AU;
/** Julian year, s (365.25 d of 86400 s; IAU). */
export const JULIAN_YEAR = 365.25 * 86_400;
/** Light-year, m: c times one Julian year (IAU). */
export const LIGHT_YEAR = C * JULIAN_YEAR;

/** Solar mass in kg, GM_sun / G. */
export const M_SUN = GM_SUN / G;
/** Earth mass in kg, GM_E / G. */
export const M_EARTH = GM_EARTH / G;

/**
 * Converts a charge in coulombs to the geometrized charge length Q sqrt(G / (4π ε0)) / c^2, in m.
 */
export const CHARGE_TO_LENGTH = Math.sqrt(G / (4 * Math.PI * EPSILON_0)) / C2;
/** Converts a dimensionless geometrized potential to volts: c^2 / sqrt(4π ε0 G). */
export const POTENTIAL_TO_VOLT = C2 / Math.sqrt(4 * Math.PI * EPSILON_0 * G);
