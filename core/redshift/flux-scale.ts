/**
 * The engine works in units of a spectrum's typical 1σ error, so that its results do not depend
 * on the flux unit: a spectrum in erg/s/cm²/Å (values ~1e-17) and the same one in 1e-17 of
 * that give the same redshift. Without this, sums that mix the flux with O(1) weights (the
 * packed transform of w·s and w, FFT roundoff relative to the larger) lose the flux entirely.
 */
import type { Spectrum } from '../spectrum/spectrum.js';
import { medianInPlace } from './continuum.js';

/** Median 1σ error over the usable pixels; median |flux| where there are no errors; 1 when neither is a positive number. */
export function fluxScale(s: Spectrum): number {
  const n = s.flux.length;
  const errors = new Float64Array(n), fluxes = new Float64Array(n);
  let ne = 0, nf = 0;
  for (let i = 0; i < n; i++) {
    const f = s.flux[i], e = s.error[i];
    if (s.mask[i] !== 0 || !Number.isFinite(f)) continue;
    if (Number.isFinite(e) && e > 0) errors[ne++] = e;
    if (f !== 0) fluxes[nf++] = Math.abs(f);
  }
  const scale = ne ? medianInPlace(errors, ne) : nf ? medianInPlace(fluxes, nf) : 1;
  return Number.isFinite(scale) && scale > 0 ? scale : 1;
}

function divided(a: Float64Array, scale: number): Float64Array {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = a[i] / scale;
  return out;
}

/** The spectrum with flux, error and sky divided by its flux scale (a copy; the input is not touched), and the scale. */
export function inUnitsOfNoise(s: Spectrum): { spectrum: Spectrum; scale: number } {
  const scale = fluxScale(s);
  return { spectrum: { ...s, flux: divided(s.flux, scale), error: divided(s.error, scale), ...(s.sky ? { sky: divided(s.sky, scale) } : {}) }, scale };
}
