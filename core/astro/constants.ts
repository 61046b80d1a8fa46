/**
 * Physical and astronomical constants used by the frame and distance code, with units in the
 * names. Exact values by definition unless stated.
 */

/** Speed of light, km/s (SI definition, exact). */
export const SPEED_OF_LIGHT_KMS = 299792.458;

/** Astronomical unit, km (IAU 2012 Resolution B2, exact). */
export const KM_PER_AU = 149597870.7;

/** Parsec = au · 648000/π (IAU 2015 Resolution B2), so one Mpc in km. */
export const KM_PER_MPC = KM_PER_AU * (648000 / Math.PI) * 1e6;

/** Julian year of 365.25 days of 86400 s (IAU), so one Gyr in seconds. */
export const SECONDS_PER_GYR = 365.25 * 86400 * 1e9;

/** Radians per arcsecond. */
export const RAD_PER_ARCSEC = Math.PI / 648000;

/** Degrees ↔ radians. */
export const RAD_PER_DEG = Math.PI / 180;
