/**
 * The spectrum on its own pixels with the continuum removed, for refinement and overlays. At
 * known redshifts the continuum is re-estimated with the templates' lines masked, so that broad
 * lines do not pull it up; one estimate can mask the lines of several candidates at once.
 */
import { robustContinuumOf } from './continuum.js';
import { perSpectrum } from './per-spectrum.js';
import type { PreparedSpectrum } from './preprocess.js';
import { lowerBound, type ProfileLine, type Template } from './templates.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';

/** Half-width of the mask around each line, in line σ (common practice, no source). */
const LINE_MASK_SIGMAS = 3;

export interface NativeResidual {
  waveAngstrom: Float64Array;
  resid: Float64Array;
  continuum: Float64Array;
  sigma: Float64Array;
  good: Uint8Array;
  /** Width of one native pixel, km/s (taken as the instrument's σ). */
  pixelKmS: number;
  /** false when too few pixels were left between the lines and the unmasked continuum was used. */
  linesMasked: boolean;
}

/** Lines of a template at a redshift, masked from the continuum fit. */
export interface LineMask {
  template: Template;
  z: number;
}

export function nativeResidual(p: PreparedSpectrum, masks: readonly LineMask[]): NativeResidual {
  const { grid } = p;
  const use = p.good.slice();
  for (const { template, z } of masks) {
    for (const l of template.lines) {
      const c = Math.log(l.waveRestAngstrom * (1 + z)) / grid.step - grid.start;
      const half = (LINE_MASK_SIGMAS * Math.hypot(l.sigmaKmS, SPEED_OF_LIGHT_KMS * grid.step)) / (SPEED_OF_LIGHT_KMS * grid.step);
      for (let i = Math.max(0, Math.floor(c - half)); i <= Math.min(grid.length - 1, Math.ceil(c + half)); i++) use[i] = 0;
    }
  }
  let kept = 0;
  for (let i = 0; i < use.length; i++) kept += use[i];
  const linesMasked = masks.length > 0 && kept > 0.3 * p.nGood;
  const gridCont = linesMasked ? robustContinuumOf(p.continuumBlocks, use) : p.continuum;
  const { waveAngstrom, flux, sigma, good } = p.native;
  const n = waveAngstrom.length;
  const { cell, frac } = gridPositions(p);
  const continuum = new Float64Array(n);
  const resid = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = cell[i];
    continuum[i] = gridCont[j] + frac[i] * (gridCont[j + 1] - gridCont[j]);
    resid[i] = flux[i] - continuum[i];
  }
  const pixelKmS = SPEED_OF_LIGHT_KMS * grid.step;
  return { waveAngstrom, resid, continuum, sigma, good, pixelKmS, linesMasked };
}

/** Each native pixel's grid cell and position in it (NaN outside the grid), for interpolating the grid continuum. */
interface GridPositions {
  cell: Int32Array;
  frac: Float64Array;
}

/** Computed once per prepared spectrum: every continuum refit interpolates at the same positions. */
const gridPositions = perSpectrum((p): GridPositions => {
  const { grid } = p;
  const wave = p.native.waveAngstrom;
  const cell = new Int32Array(wave.length), frac = new Float64Array(wave.length);
  for (let i = 0; i < wave.length; i++) {
    const x = Math.log(wave[i]) / grid.step - grid.start;
    const j = Math.min(grid.length - 2, Math.max(0, Math.floor(x)));
    cell[i] = j;
    frac[i] = x < -0.5 || x > grid.length - 0.5 ? NaN : Math.min(1, Math.max(0, x - j));
  }
  return { cell, frac };
});

/**
 * The run of pixels [from, to) within `halfSigmas` line σ of one line at z (the wavelengths
 * ascend, so it is one run), good or not.
 */
export function lineRun(nr: NativeResidual, line: ProfileLine, z: number, halfSigmas: number): [number, number] {
  const wave = nr.waveAngstrom;
  const centre = line.waveRestAngstrom * (1 + z);
  const half = (halfSigmas * centre * Math.hypot(line.sigmaKmS, nr.pixelKmS)) / SPEED_OF_LIGHT_KMS;
  const from = lowerBound(wave, centre - half);
  let to = from;
  while (to < wave.length && wave[to] <= centre + half) to++;
  return [from, to];
}

/** Whether pixel i can enter a fit: flagged good with a finite residual. */
export function usable(nr: NativeResidual, i: number): boolean {
  return nr.good[i] !== 0 && Number.isFinite(nr.resid[i]);
}

/** Indices (ascending, each once) of good pixels within `halfSigmas` line σ of any template line at z. */
export function pixelsNearLines(nr: NativeResidual, template: Template, z: number, halfSigmas: number): number[] {
  const runs = template.lines.map((l) => lineRun(nr, l, z, halfSigmas)).sort((a, b) => a[0] - b[0]);
  const out: number[] = [];
  let next = 0;
  for (const [from, to] of runs) {
    for (let i = Math.max(from, next); i < to; i++) if (usable(nr, i)) out.push(i);
    next = Math.max(next, to);
  }
  return out;
}

/** Wavelength (Å), residual and weight 1/σ² at the pixels idx, for a fit. */
export function pixelArrays(nr: NativeResidual, idx: readonly number[]): { wave: Float64Array; y: Float64Array; w: Float64Array } {
  const n = idx.length;
  const wave = new Float64Array(n), y = new Float64Array(n), w = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const i = idx[k];
    wave[k] = nr.waveAngstrom[i];
    y[k] = nr.resid[i];
    w[k] = 1 / (nr.sigma[i] * nr.sigma[i]);
  }
  return { wave, y, w };
}
