/**
 * The CMB rest frame from the Sun's dipole velocity, Planck 2018 results I (A&A 641, A1,
 * 2020), Table 3: 369.82 km/s toward l = 264.021°, b = 48.253° (Galactic).
 */
import { SPEED_OF_LIGHT_KMS } from './constants.js';
import { dot, unitVector } from './coords.js';
import { icrsVectorFromGalactic } from './galactic.js';

export const CMB_DIPOLE = { speedKmS: 369.82, lDeg: 264.021, bDeg: 48.253, source: 'Planck 2018 results I (A&A 641, A1), Table 3' } as const;

const APEX_ICRS = icrsVectorFromGalactic(CMB_DIPOLE.lDeg, CMB_DIPOLE.bDeg);

/**
 * The Sun's CMB-frame velocity projected on the direction of a target (ICRS degrees), km/s:
 * positive when the target lies in the apex hemisphere. To first order this is what to add to
 * a heliocentric cz to get the CMB-frame one.
 */
export function cmbVelocityTowardKmS(raDeg: number, decDeg: number): number {
  return CMB_DIPOLE.speedKmS * dot(APEX_ICRS, unitVector(raDeg, decDeg));
}

/**
 * CMB-frame redshift from a heliocentric (or barycentric) one: (1 + z_cmb) = (1 + z_helio) /
 * (1 + z_sun), with z_sun = −v·n̂/c the Doppler shift of the Sun's motion toward the target
 * (the multiplicative form, as in Davis et al. 2011, ApJ 741, 67; from memory). The heliocentric and barycentric frames
 * differ by ~0.01 km/s here, far below the dipole's size.
 */
export function zCmbFromHelio(zHelio: number, raDeg: number, decDeg: number): number {
  const zSun = -cmbVelocityTowardKmS(raDeg, decDeg) / SPEED_OF_LIGHT_KMS;
  return (1 + zHelio) / (1 + zSun) - 1;
}
