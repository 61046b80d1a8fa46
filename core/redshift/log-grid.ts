/**
 * Uniform ln λ grids. Pixel i of a grid has ln(λ/Å) = (start + i)·step, so grids with the
 * same step share one absolute pixel numbering and a redshift is a whole-pixel shift:
 * z = exp(lag·step) − 1 (Tonry & Davis 1979, AJ 84, 1511).
 */
import { selectInPlace } from './continuum.js';

/** SDSS's native step, Δlog10 λ = 1e-4 (69 km/s per pixel). */
export const SDSS_LN_STEP = Math.LN10 * 1e-4;

export interface LogGrid {
  /** Δ ln λ per pixel (dimensionless). */
  step: number;
  /** Absolute index of the first pixel. */
  start: number;
  length: number;
}

/**
 * The step for a spectrum: its median native Δ ln λ, snapped to the ladder
 * SDSS_LN_STEP·2^(k/4) so that spectra of one instrument share cached templates.
 */
export function gridStepFor(waveAngstrom: Float64Array): number {
  const n = waveAngstrom.length;
  const d = new Float64Array(n - 1);
  // The median of the ratios λ[i]/λ[i−1], then its log: one log instead of one per pixel.
  let positive = true;
  for (let i = 1; i < n; i++) {
    d[i - 1] = waveAngstrom[i] / waveAngstrom[i - 1];
    if (!(d[i - 1] > 0)) positive = false;
  }
  if (!positive) for (let i = 1; i < n; i++) d[i - 1] = Math.log(waveAngstrom[i] / waveAngstrom[i - 1]);
  const mid = selectInPlace(d, d.length, (d.length - 1) >> 1);
  const median = positive ? Math.log(mid) : mid;
  const k = Math.round(4 * Math.log2(median / SDSS_LN_STEP));
  return SDSS_LN_STEP * Math.pow(2, k / 4);
}

export function gridWave(grid: LogGrid): Float64Array {
  const w = new Float64Array(grid.length);
  for (let i = 0; i < grid.length; i++) w[i] = Math.exp((grid.start + i) * grid.step);
  return w;
}

/** Edges (Å) of native pixels: midpoints between centres, the outer two mirrored. */
export function pixelEdges(waveAngstrom: Float64Array): Float64Array {
  const n = waveAngstrom.length;
  const e = new Float64Array(n + 1);
  for (let i = 1; i < n; i++) e[i] = 0.5 * (waveAngstrom[i - 1] + waveAngstrom[i]);
  e[0] = n > 1 ? waveAngstrom[0] - (e[1] - waveAngstrom[0]) : waveAngstrom[0] * 0.9999;
  e[n] = n > 1 ? waveAngstrom[n - 1] + (waveAngstrom[n - 1] - e[n - 1]) : waveAngstrom[0] * 1.0001;
  return e;
}

export interface Rebinned {
  flux: Float64Array;
  variance: Float64Array;
  /** 1 = at least half the bin is covered by good input pixels. */
  good: Uint8Array;
}

/**
 * Flux-conserving rebinning: each output bin gets the overlap-weighted mean flux density of
 * the good input pixels it covers, so Σ f·Δλ is kept; variances add with the squared weights
 * (common practice, e.g. Carnall 2017, arXiv:1705.05165, "SpectRes").
 */
export function rebinFluxConserving(waveAngstrom: Float64Array, flux: Float64Array, variance: Float64Array, good: Uint8Array, grid: LogGrid): Rebinned {
  const inEdges = pixelEdges(waveAngstrom);
  const m = grid.length;
  const outFlux = new Float64Array(m);
  const outVar = new Float64Array(m);
  const outGood = new Uint8Array(m);
  const n = waveAngstrom.length;
  const outEdges = new Float64Array(m + 1);
  for (let j = 0; j <= m; j++) outEdges[j] = Math.exp((grid.start + j - 0.5) * grid.step);
  let i = 0;
  for (let j = 0; j < m; j++) {
    const lo = outEdges[j], hi = outEdges[j + 1];
    while (i < n && inEdges[i + 1] <= lo) i++;
    let fsum = 0, vsum = 0, cov = 0;
    for (let k = i; k < n && inEdges[k] < hi; k++) {
      if (!good[k]) continue;
      const ov = Math.min(hi, inEdges[k + 1]) - Math.max(lo, inEdges[k]);
      if (ov <= 0) continue;
      fsum += flux[k] * ov;
      vsum += variance[k] * ov * ov;
      cov += ov;
    }
    if (cov >= 0.5 * (hi - lo)) {
      outFlux[j] = fsum / cov;
      outVar[j] = vsum / (cov * cov);
      outGood[j] = 1;
    }
  }
  return { flux: outFlux, variance: outVar, good: outGood };
}
