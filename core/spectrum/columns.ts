/**
 * Which table column (FITS table or text header) plays which part, by common names, compared
 * without regard to case. Shared by the FITS table readers and the text reader.
 */

import type { ErrorKind } from './spectrum.js';

export type ColumnRole = 'wave' | 'loglam' | 'flux' | 'sigma' | 'ivar' | 'variance' | 'snr' | 'mask' | 'sky' | 'contam' | 'sensitivity';

/**
 * Names per role, in order of preference (common practice, no single source). PypeIt's spec1d
 * tables name them OPT_… (optimal extraction) and BOX_… (boxcar), fluxed (FLAM) or in counts
 * (PypeIt data model, SpecObj); the lists keep each extraction's columns in the same order, so
 * that a flux and its inverse variance come from one extraction.
 */
export const COLUMN_NAMES: Record<ColumnRole, string[]> = {
  wave: ['wave', 'wavelength', 'lambda', 'lam', 'wl', 'awav', 'wave_air', 'wave_vac', 'wavelength_air', 'wavelength_vac', 'vacuum_wavelength', 'air_wavelength', 'lambda_air', 'lambda_vac', 'wav', 'opt_wave', 'box_wave'],
  loglam: ['loglam', 'log_lambda', 'log_wave', 'logwave', 'loglambda'],
  flux: ['flux', 'flux_density', 'flam', 'f_lambda', 'flambda', 'fluxdensity', 'spec', 'spectrum', 'intensity', 'counts', 'data', 'opt_flam', 'box_flam', 'opt_counts', 'box_counts'],
  sigma: ['error', 'err', 'sigma', 'noise', 'flux_err', 'flux_error', 'fluxerr', 'e_flux', 'err_flux', 'error_flux', 'uncertainty', 'unc', 'flux_unc', 'stddev', 'std', 'dflux', 'sig'],
  ivar: ['ivar', 'inverse_variance', 'invvar', 'flux_ivar', 'inv_var', 'opt_flam_ivar', 'box_flam_ivar', 'opt_counts_ivar', 'box_counts_ivar'],
  variance: ['variance', 'var', 'flux_var', 'flux_variance'],
  snr: ['snr', 's/n', 's2n', 'sn_ratio', 'signal_to_noise', 'sig_to_noise'],
  mask: ['and_mask', 'mask', 'badpix', 'bad', 'flag', 'flags', 'quality', 'qual', 'dq', 'pixel_mask', 'opt_mask', 'box_mask'],
  sky: ['sky', 'sky_flux', 'skyflux', 'background', 'bkg'],
  contam: ['contam', 'contamination'],
  sensitivity: ['sensitivity', 'sens'],
};

/** The first name of the role's list that `has` accepts. */
export function findByRole<T>(role: ColumnRole, lookup: (name: string) => T | undefined): T | undefined {
  for (const name of COLUMN_NAMES[role]) {
    const hit = lookup(name);
    if (hit !== undefined) return hit;
  }
  return undefined;
}

/** Roles whose column gives an uncertainty, in order of preference. */
export const ERROR_ROLES = ['sigma', 'ivar', 'variance', 'snr'] as const;
export type ErrorRole = (typeof ERROR_ROLES)[number];

/**
 * 1σ errors from the file's uncertainty column: σ as is, σ = 1/√ivar (ivar ≤ 0 or non-finite:
 * bad pixel, σ = NaN), σ = √variance, σ = |flux|/(S/N) (S/N ≤ 0 or flux 0: bad pixel, as S/N
 * then says nothing of σ). Marks bad pixels in `mask`. `out` may be `values` itself.
 */
export function sigmaFrom(role: ErrorRole, values: Float64Array, mask: Uint8Array, flux: Float64Array, out: Float64Array = new Float64Array(values.length)): Float64Array {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    const s = role === 'sigma' ? v : role === 'ivar' ? (v > 0 ? 1 / Math.sqrt(v) : NaN) : role === 'variance' ? (v >= 0 ? Math.sqrt(v) : NaN) : v > 0 ? Math.abs(flux[i]) / v : NaN;
    out[i] = s;
    if (!(Number.isFinite(s) && s > 0)) mask[i] = 1;
  }
  return out;
}

export const ERROR_KIND: Record<ErrorRole, ErrorKind> = { sigma: 'sigma', ivar: 'ivar', variance: 'variance', snr: 'snr' };

/** Good-pixel flags (PypeIt: 1 or True = good, OneSpec and SpecObj data models): zero is bad. */
export function goodPixelMaskFrom(values: Float64Array, mask: Uint8Array): void {
  for (let i = 0; i < values.length; i++) if (!(values[i] !== 0 && Number.isFinite(values[i]))) mask[i] = 1;
}

/** Bad-pixel flags from a mask column: any non-zero (or non-finite) value is bad. */
export function maskFrom(values: Float64Array, mask: Uint8Array): void {
  for (let i = 0; i < values.length; i++) if (values[i] !== 0) mask[i] = 1;
}

/**
 * SDSS and_mask / spSpec mask: only the per-pixel "bad data" bits of SPPIXMASK mark a pixel bad
 * (FULLREJECT 18, NOSKY 22, BRIGHTSKY 23, NODATA 24, COMBINEREJ 25, BADFLUXFACTOR 26,
 * BADSKYCHI 27; SDSS bitmask documentation, bit numbers from memory). Bits 0–15 flag the whole
 * fibre (BADFLAT is often set on every pixel) and LOWFLAT, NEARBADPIXEL, PARTIALREJECT,
 * SCATTEREDLIGHT and CROSSTALK are warnings; the pipeline already sets ivar = 0 where the data
 * are unusable.
 */
export const SDSS_BAD_PIXEL_BITS = (1 << 18) | (1 << 22) | (1 << 23) | (1 << 24) | (1 << 25) | (1 << 26) | (1 << 27);

export function sdssMaskFrom(values: Float64Array, mask: Uint8Array): void {
  for (let i = 0; i < values.length; i++) if (!Number.isFinite(values[i]) || (values[i] & SDSS_BAD_PIXEL_BITS) !== 0) mask[i] = 1;
}
