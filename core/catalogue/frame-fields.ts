/**
 * The frame-corrected redshift and the distances of one spectrum as table fields (name with
 * its unit, unit string astropy and FITS read, datatype, description), shared by the rows of
 * `zvet measure` and by the catalogue, so both name and describe them the same way.
 */
import { asDefined, type CosmologyModel } from '../astro/cosmology.js';
import { PECULIAR_VELOCITY_KMS } from '../astro/distance-errors.js';
import type { FrameResult } from '../astro/frames.js';
import type { Cell, ColumnSpec } from './table.js';

export interface Field<T> extends ColumnSpec {
  pick(x: T): Cell;
}

const finite = (x: number | null | undefined): number | null => (x === null || x === undefined || !Number.isFinite(x) ? null : x);

export const FRAME_FIELDS: readonly Field<FrameResult>[] = [
  { name: 'z_bary', unit: null, type: 'float64', description: 'barycentric redshift: (1+z_bary) = (1+z)(1+v_corr/c) (Wright & Eastman 2014), or z itself when the file is already barycentric', pick: (f) => f.zBary },
  { name: 'z_helio', unit: null, type: 'float64', description: 'heliocentric redshift, or z itself when the file is already heliocentric (never corrected twice)', pick: (f) => f.zHelio },
  { name: 'z_corr_frame', unit: null, type: 'string', description: 'frame of the best corrected redshift: barycentric (z_bary), heliocentric (z_helio) or topocentric (not corrected)', pick: (f) => f.frame },
  { name: 'z_cmb', unit: null, type: 'float64', description: 'CMB-frame redshift from the solar dipole (Planck 2018 results I: 369.82 km/s toward l = 264.021, b = 48.253 deg)', pick: (f) => f.zCmb },
  { name: 'v_corr_kms', unit: 'km/s', type: 'float64', description: 'barycentric velocity correction applied (astropy sign convention: added to the measured velocity); empty when none was applied', pick: (f) => f.vCorrKmS },
  { name: 'frame_correction', unit: null, type: 'string', description: 'correction applied here: barycentric or none', pick: (f) => f.correction },
  { name: 'frame_reason', unit: null, type: 'string', description: 'why that correction (header evidence, time, target, site)', pick: (f) => f.reason },
];

const PROPAGATED = (column: string) => `1-sigma error of ${column} from z_err (none where z_err is empty) and a ${PECULIAR_VELOCITY_KMS} km/s line-of-sight peculiar velocity, in quadrature (first order)`;

/** Distances (Hogg 1999) at z_cmb, else the frame-corrected z; empty without distances. */
export const DISTANCE_FIELDS: readonly Field<FrameResult>[] = [
  { name: 'dist_from', unit: null, type: 'string', description: 'redshift the distances are computed from: cmb, barycentric, heliocentric or topocentric', pick: (f) => f.distancesFrom ?? null },
  { name: 'comoving_dist_mpc', unit: 'Mpc', type: 'float64', description: 'line-of-sight comoving distance (Hogg 1999 eq. 15)', pick: (f) => finite(f.distances?.comovingMpc) },
  { name: 'lum_dist_mpc', unit: 'Mpc', type: 'float64', description: 'luminosity distance (Hogg 1999 eq. 21)', pick: (f) => finite(f.distances?.luminosityMpc) },
  { name: 'lum_dist_err_mpc', unit: 'Mpc', type: 'float64', description: PROPAGATED('lum_dist_mpc'), pick: (f) => finite(f.distanceErrors?.luminosityMpc) },
  { name: 'ang_dist_mpc', unit: 'Mpc', type: 'float64', description: 'angular-diameter distance (Hogg 1999 eq. 18)', pick: (f) => finite(f.distances?.angularMpc) },
  { name: 'dist_mod_mag', unit: 'mag', type: 'float64', description: 'distance modulus 5 log10(D_L / 10 pc) (Hogg 1999 eq. 24)', pick: (f) => finite(f.distances?.distanceModulusMag) },
  { name: 'dist_mod_err_mag', unit: 'mag', type: 'float64', description: PROPAGATED('dist_mod_mag'), pick: (f) => finite(f.distanceErrors?.distanceModulusMag) },
  { name: 'lookback_gyr', unit: 'Gyr', type: 'float64', description: 'lookback time (Hogg 1999 eq. 30)', pick: (f) => finite(f.distances?.lookbackGyr) },
  { name: 'kpc_per_arcsec', unit: 'kpc/arcsec', type: 'float64', description: 'proper transverse scale at the redshift', pick: (f) => finite(f.distances?.kpcPerArcsec) },
];

/** The model's name and parameters in one short line, e.g. "planck18: H0 = 67.66 km/s/Mpc, Om = 0.3111, OL = 0.6889". */
export function cosmologyParameters(model: CosmologyModel): string {
  return `${model.name}: H0 = ${model.h0} km/s/Mpc, Om = ${model.omegaM}, OL = ${asDefined(model.omegaL)}`;
}
