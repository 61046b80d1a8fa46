/**
 * The engine works in units of a spectrum's typical 1σ error, so that its results do not depend
 * on the flux unit: a spectrum in erg/s/cm²/Å (values ~1e-17) and the same one in 1e-17 of
 * that give the same redshift. Without this, sums that mix the flux with O(1) weights (the
 * packed transform of w·s and w, FFT roundoff relative to the larger) lose the flux entirely.
 */
import type { Spectrum } from '../spectrum/spectrum.js';
import { median } from './continuum.js';

/** Median 1σ error over the usable pixels; median |flux| where there are no errors; 1 when neither is a positive number. */
export function fluxScale(s: Spectrum): number {
  const errors: number[] = [];
  const fluxes: number[] = [];
  for (let i = 0; i < s.flux.length; i++) {
    if (s.mask[i] !== 0 || !Number.isFinite(s.flux[i])) continue;
    if (Number.isFinite(s.error[i]) && s.error[i] > 0) errors.push(s.error[i]);
    if (s.flux[i] !== 0) fluxes.push(Math.abs(s.flux[i]));
  }
  const scale = errors.length ? median(errors) : fluxes.length ? median(fluxes) : 1;
  return Number.isFinite(scale) && scale > 0 ? scale : 1;
}

/** The spectrum with flux, error and sky divided by its flux scale (a copy; the input is not touched), and the scale. */
export function inUnitsOfNoise(s: Spectrum): { spectrum: Spectrum; scale: number } {
  const scale = fluxScale(s);
  const scaled = (a: Float64Array) => a.map((v) => v / scale);
  return { spectrum: { ...s, flux: scaled(s.flux), error: scaled(s.error), ...(s.sky ? { sky: scaled(s.sky) } : {}) }, scale };
}
