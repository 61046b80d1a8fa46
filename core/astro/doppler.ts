/**
 * A star's redshift as a line-of-sight velocity: the special-relativistic Doppler shift for
 * purely radial motion, 1 + z = √((1 + β)/(1 − β)) (Rybicki & Lightman 1979, §4.1, at θ = 0; section from memory),
 * solved for β = v/c. Not meant for cosmological redshifts, which are not velocities.
 */
import { SPEED_OF_LIGHT_KMS } from './constants.js';

export function radialVelocityKmS(z: number): number {
  const q = (1 + z) * (1 + z);
  return (SPEED_OF_LIGHT_KMS * (q - 1)) / (q + 1);
}

/** 1σ of that velocity from σz, by the derivative dv/dz = 4c(1 + z)/((1 + z)² + 1)². */
export function radialVelocityErrKmS(z: number, zErr: number): number {
  const q = (1 + z) * (1 + z);
  return (4 * SPEED_OF_LIGHT_KMS * (1 + z) * zErr) / ((q + 1) * (q + 1));
}
