/**
 * From a Spectrum to what the correlation needs: masks, a flux-conserving rebin onto a uniform
 * ln λ grid, robust continuum removal, spike clipping, error weights, cosine-bell apodisation
 * and zero mean (Tonry & Davis 1979, AJ 84, 1511, §II, for the recipe).
 */
import type { Spectrum } from '../spectrum/spectrum.js';
import { continuumBlocks, median, medianInPlace, robustContinuumOf, type ContinuumBlocks } from './continuum.js';
import { gridStepFor, rebinFluxConserving, type LogGrid } from './log-grid.js';
import { applyObservedMasks } from './observed-masks.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';

/** Continuum block width, km/s (common practice, no source: wide next to broad QSO lines). */
export const CONTINUUM_BLOCK_KMS = 20000;
/** Fraction of the spectrum tapered at each end by the cosine bell (Tonry & Davis 1979 use 5%). */
export const APODISE_FRACTION = 0.05;
/** Weights are capped at this multiple of their median, so a few pixels cannot dominate. */
const MAX_WEIGHT_OVER_MEDIAN = 10;

export interface NativePixels {
  waveAngstrom: Float64Array;
  flux: Float64Array;
  /** 1σ in flux units (estimated from the scatter when the file gives none). */
  sigma: Float64Array;
  good: Uint8Array;
}

export interface PreparedSpectrum {
  grid: LogGrid;
  /** Rebinned flux on the grid. */
  flux: Float64Array;
  /** Continuum-subtracted flux, zero weighted mean, on the grid. */
  resid: Float64Array;
  /** Weights (∝ 1/σ², capped, apodised); 0 on bad pixels. */
  weight: Float64Array;
  good: Uint8Array;
  continuum: Float64Array;
  /** The flux's continuum blocks, sorted over the pixels good before spike clipping. */
  continuumBlocks: ContinuumBlocks;
  native: NativePixels;
  /** Whether σ came from the file. */
  hasErrors: boolean;
  nGood: number;
}

export interface PreprocessOptions {
  maskTelluric: boolean;
  maskSky: boolean;
}

/** Thrown when too little of a spectrum is usable; the message is one line. */
export class UnusableSpectrumError extends Error {}

export function nativePixels(spectrum: Spectrum, opts: PreprocessOptions): { native: NativePixels; hasErrors: boolean } {
  const { waveAngstrom, flux, error, mask } = spectrum;
  const n = waveAngstrom.length;
  const good = new Uint8Array(n);
  let nWithError = 0;
  for (let i = 0; i < n; i++) if (Number.isFinite(error[i]) && error[i] > 0) nWithError++;
  const hasErrors = nWithError > 0;
  for (let i = 0; i < n; i++) {
    const ok = mask[i] === 0 && Number.isFinite(flux[i]) && Number.isFinite(waveAngstrom[i]);
    good[i] = ok && (!hasErrors || (Number.isFinite(error[i]) && error[i] > 0)) ? 1 : 0;
  }
  applyObservedMasks(waveAngstrom, good, { telluric: opts.maskTelluric, sky: opts.maskSky });
  const sigma = new Float64Array(n);
  if (hasErrors) for (let i = 0; i < n; i++) sigma[i] = good[i] ? error[i] : Infinity;
  else sigma.fill(scatterSigma(flux, good));
  return { native: { waveAngstrom, flux, sigma, good }, hasErrors };
}

/** Noise from pixel-to-pixel differences: 1.4826·MAD(Δf)/√2 (robust; common practice). */
function scatterSigma(flux: Float64Array, good: Uint8Array): number {
  const d: number[] = [];
  for (let i = 1; i < flux.length; i++) if (good[i] && good[i - 1]) d.push(Math.abs(flux[i] - flux[i - 1]));
  const s = (1.4826 * median(d)) / Math.SQRT2;
  return s > 0 ? s : 1;
}

export function continuumBlockPixels(step: number, length: number): number {
  return Math.max(16, Math.min(Math.round(Math.log(1 + CONTINUUM_BLOCK_KMS / SPEED_OF_LIGHT_KMS) / step), Math.floor(length / 4)));
}

export function preprocess(spectrum: Spectrum, opts: PreprocessOptions): PreparedSpectrum {
  const { native, hasErrors } = nativePixels(spectrum, opts);
  const { waveAngstrom, flux, sigma, good } = native;
  let first = -1, last = -1, nGoodNative = 0;
  for (let i = 0; i < good.length; i++) if (good[i]) { if (first < 0) first = i; last = i; nGoodNative++; }
  if (nGoodNative < 20) throw new UnusableSpectrumError(`only ${nGoodNative} usable ${nGoodNative === 1 ? 'pixel' : 'pixels'} outside the masks (the redshift search needs at least 20)`);
  if (!(waveAngstrom[first] > 0)) throw new UnusableSpectrumError('wavelengths must be positive');
  let fluxMin = Infinity, fluxMax = -Infinity;
  for (let i = first; i <= last; i++) if (good[i]) { fluxMin = Math.min(fluxMin, flux[i]); fluxMax = Math.max(fluxMax, flux[i]); }
  if (fluxMin === fluxMax) throw new UnusableSpectrumError(`the flux is ${fluxMin} at every usable pixel: there is no feature to measure a redshift from`);
  const step = gridStepFor(waveAngstrom.subarray(first, last + 1));
  const start = Math.ceil(Math.log(waveAngstrom[first]) / step);
  const grid: LogGrid = { step, start, length: Math.floor(Math.log(waveAngstrom[last]) / step) - start + 1 };
  if (grid.length < 20) throw new UnusableSpectrumError('wavelength range too short');
  const variance = new Float64Array(sigma.length);
  for (let i = 0; i < sigma.length; i++) variance[i] = sigma[i] * sigma[i];
  const rb = rebinFluxConserving(waveAngstrom, flux, variance, good, grid);
  const m = grid.length;
  // Sorted once here; the refits with lines masked (native-residual.ts) reuse the blocks.
  const blocks = continuumBlocks(rb.flux, rb.good, continuumBlockPixels(step, m));
  const continuum = robustContinuumOf(blocks, rb.good);
  const resid = new Float64Array(m);
  for (let i = 0; i < m; i++) resid[i] = rb.good[i] ? rb.flux[i] - continuum[i] : 0;
  clipSpikes(resid, rb.variance, rb.good);
  limitStrongFeatures(resid, rb.variance, rb.good);
  const weight = weightsFrom(rb.variance, rb.good);
  apodise(weight);
  let sw = 0, s = 0, nGood = 0;
  for (let i = 0; i < m; i++) { sw += weight[i]; s += weight[i] * resid[i]; nGood += rb.good[i]; }
  const mean = sw > 0 ? s / sw : 0;
  for (let i = 0; i < m; i++) resid[i] = rb.good[i] ? resid[i] - mean : 0;
  return { grid, flux: rb.flux, resid, weight, good: rb.good, continuum, continuumBlocks: blocks, native, hasErrors, nGood };
}

/**
 * Single-pixel spikes (cosmic rays, hot pixels): more than 5σ off and more than three times
 * either neighbour. Real lines are resolved over several pixels, so they survive.
 */
function clipSpikes(resid: Float64Array, variance: Float64Array, good: Uint8Array): void {
  const n = resid.length;
  for (let i = 1; i < n - 1; i++) {
    if (!good[i]) continue;
    const v = Math.abs(resid[i]);
    if (v > 5 * Math.sqrt(variance[i]) && v > 3 * Math.abs(resid[i - 1]) && v > 3 * Math.abs(resid[i + 1])) {
      good[i] = 0;
      resid[i] = 0;
    }
  }
}

/** Residuals beyond this many σ are limited to it (common practice, no source). */
const FEATURE_LIMIT_SIGMA = 10;

/** Limits very strong lines so that the line pattern, not one line, sets the correlation. */
function limitStrongFeatures(resid: Float64Array, variance: Float64Array, good: Uint8Array): void {
  for (let i = 0; i < resid.length; i++) {
    if (!good[i]) continue;
    const lim = FEATURE_LIMIT_SIGMA * Math.sqrt(variance[i]);
    if (resid[i] > lim) resid[i] = lim;
    else if (resid[i] < -lim) resid[i] = -lim;
  }
}

function weightsFrom(variance: Float64Array, good: Uint8Array): Float64Array {
  const n = variance.length;
  const w = new Float64Array(n);
  const inv = new Float64Array(n);
  let m = 0;
  for (let i = 0; i < n; i++) if (good[i] && variance[i] > 0 && Number.isFinite(variance[i])) inv[m++] = 1 / variance[i];
  const med = medianInPlace(inv, m);
  const scale = med > 0 ? 1 / med : 1;
  for (let i = 0; i < n; i++) {
    if (!good[i]) continue;
    const x = variance[i] > 0 && Number.isFinite(variance[i]) ? scale / variance[i] : 0;
    w[i] = Math.min(x, MAX_WEIGHT_OVER_MEDIAN);
  }
  return w;
}

/** Cosine bell over APODISE_FRACTION of the length at each end (Tonry & Davis 1979, §II). */
export function apodise(values: Float64Array, fraction = APODISE_FRACTION): void {
  const n = values.length;
  const k = Math.max(1, Math.floor(fraction * n));
  for (let i = 0; i < k; i++) {
    const f = 0.5 * (1 - Math.cos((Math.PI * (i + 0.5)) / k));
    values[i] *= f;
    values[n - 1 - i] *= f;
  }
}
