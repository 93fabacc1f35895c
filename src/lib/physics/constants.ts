/**
 * Physical constants used by the physics core. SI units throughout.
 */

/**
 * Standard acceleration of gravity [m/s²].
 * Source: 3rd CGPM (1901), adopted unchanged in ISO 80000-3 and NIST SP 330 (exact by definition).
 */
export const G0 = 9.80665;

/**
 * Earth constants.
 * - `mu`: geocentric gravitational constant GM including the atmosphere [m³/s²],
 *   IERS Conventions (2010), IERS Technical Note 36, Table 1.1 (TT-compatible value 3.986004418e14).
 * - `radius`: equatorial radius a [m], WGS 84 defining parameter (NGA.STND.0036, Table 3.1): 6378137 m.
 * - `rotationRate`: nominal mean angular velocity ω [rad/s], WGS 84 defining parameter
 *   (NGA.STND.0036, Table 3.1) and IERS Conventions (2010) Table 1.1: 7.292115e-5 rad/s.
 */
export const EARTH = Object.freeze({
  mu: 3.986004418e14,
  radius: 6378137,
  rotationRate: 7.292115e-5
});

/** Degrees → radians. */
export const DEG = Math.PI / 180;
