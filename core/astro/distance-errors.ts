/**
 * 1σ errors of the luminosity distance and the distance modulus at a redshift, from the
 * redshift's own error and from the galaxy's unknown peculiar velocity, which moves its
 * redshift by (1+z)·v/c (1 + z_obs = (1 + z_cosmological)(1 + v/c)); first-order propagation,
 * σ_DL = (dD_L/dz)·σ_z. At low z the peculiar velocity rules: at z = 0.01 (cz = 3000 km/s) a
 * 300 km/s velocity alone is a 10 % distance error.
 */
import { SPEED_OF_LIGHT_KMS } from './constants.js';
import { luminosityDistanceSlopeMpc, type CosmologyModel, type Distances } from './cosmology.js';

/**
 * Line-of-sight peculiar velocity assumed for a galaxy, km/s: a typical field value (common
 * practice, no single source; supernova-cosmology analyses use 250–300 km/s, from memory).
 */
export const PECULIAR_VELOCITY_KMS = 300;

export interface DistanceErrors {
  /** The redshift error used: the measured one (when given) and the peculiar velocity's, in quadrature. */
  zErr: number;
  /** Peculiar velocity assumed, km/s. */
  peculiarVelocityKmS: number;
  luminosityMpc: number;
  distanceModulusMag: number;
}

export function distanceErrors(d: Distances, zErr: number | null, model: CosmologyModel, peculiarVelocityKmS = PECULIAR_VELOCITY_KMS): DistanceErrors {
  const total = Math.hypot(zErr ?? 0, ((1 + d.z) * peculiarVelocityKmS) / SPEED_OF_LIGHT_KMS);
  // |slope|: in a strongly closed model D_L can fall as z grows.
  const luminosityMpc = Math.abs(luminosityDistanceSlopeMpc(d, model)) * total;
  // μ = 5 log10(D_L / 10 pc), so σ_μ = (5 / ln 10)·σ_DL / D_L.
  return { zErr: total, peculiarVelocityKmS, luminosityMpc, distanceModulusMag: ((5 / Math.LN10) * luminosityMpc) / Math.abs(d.luminosityMpc) };
}
