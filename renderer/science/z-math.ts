/**
 * Redshift arithmetic the window does by itself: z from a clicked feature, and small velocity
 * nudges. Wavelengths are vacuum Å, as everywhere inside zvet.
 */

import { SPEED_OF_LIGHT_KMS } from '../../core/astro/constants.js';

/** Observed wavelength of a rest line at redshift z: λ_obs = λ_rest·(1+z). */
export function observedWave(restWaveAngstrom: number, z: number): number {
  return restWaveAngstrom * (1 + z);
}

/** Redshift that puts a rest line at the observed wavelength: z = λ_obs/λ_rest − 1. */
export function zFromFeature(observedWaveAngstrom: number, restWaveAngstrom: number): number {
  return observedWaveAngstrom / restWaveAngstrom - 1;
}

/**
 * z after shifting the object by a velocity step: (1+z') = (1+z)(1+v/c).
 * Redshifts compose by multiplying (1+z) factors, so the step stays the same number of km/s in
 * the object's frame at any z (adding v/c to z would shrink it by 1+z). The step itself uses the
 * first-order Doppler factor 1+v/c: for |v| ≤ 100 km/s it differs from the relativistic
 * √((1+β)/(1−β)) by β²/2 ≈ 6e-8, far below any redshift error.
 */
export function nudgeZ(z: number, velocityKmS: number): number {
  return (1 + z) * (1 + velocityKmS / SPEED_OF_LIGHT_KMS) - 1;
}

/** The change of z one velocity step makes at this z: Δz = (1+z)·v/c. */
export function zStepFor(z: number, velocityKmS: number): number {
  return (1 + z) * (velocityKmS / SPEED_OF_LIGHT_KMS);
}

/** Velocity separation of two redshifts in the frame of the first, first order: c·(z2−z1)/(1+z1). */
export function velocityBetweenKmS(z1: number, z2: number): number {
  return (SPEED_OF_LIGHT_KMS * (z2 - z1)) / (1 + z1);
}
