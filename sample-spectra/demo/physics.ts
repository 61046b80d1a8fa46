/**
 * The physics of one invented exposure on the Kestrel Ridge low-resolution spectrograph:
 * continua, Gaussian lines at the instrument's resolution, telluric absorption, the night sky,
 * and photon-like noise scaled to a target S/N. Everything is on the instrument's air-wavelength
 * pixel grid; lines are placed at vacuumToAir(λ_rest,vac·(1+z)).
 */
import { airToVacuum, vacuumToAir } from '../../core/spectrum/air-vacuum.js';
import { restLine } from '../../core/redshift/line-list.js';
import type { Random } from './random.js';

export const SPEED_OF_LIGHT_KM_S = 299_792.458;
/** Instrument: linear air-wavelength grid, 3600–9400 Å in 2 Å pixels, 5 Å FWHM resolution. */
export const GRID_START_AIR_ANGSTROM = 3600;
export const GRID_STEP_ANGSTROM = 2;
export const GRID_PIXELS = 2901;
export const INSTRUMENT_FWHM_ANGSTROM = 5;
const FWHM_TO_SIGMA = 1 / (2 * Math.sqrt(2 * Math.LN2));
const INSTRUMENT_SIGMA_ANGSTROM = INSTRUMENT_FWHM_ANGSTROM * FWHM_TO_SIGMA;

/** Air wavelength (Å) of each pixel centre. */
export function airGrid(): Float64Array {
  return Float64Array.from({ length: GRID_PIXELS }, (_, i) => GRID_START_AIR_ANGSTROM + i * GRID_STEP_ANGSTROM);
}

/** erf by Abramowitz & Stegun (1964) 7.1.26, |error| < 1.5e-7. */
function erf(x: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(x));
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
  return x >= 0 ? y : -y;
}

/** Unit-area Gaussian averaged over each pixel (so narrow lines keep their flux). */
export function addGaussian(out: Float64Array, grid: Float64Array, centre: number, sigma: number, area: number): void {
  const s = sigma * Math.SQRT2;
  const half = GRID_STEP_ANGSTROM / 2;
  for (let i = 0; i < grid.length; i++) {
    const d = grid[i] - centre;
    if (Math.abs(d) > 8 * sigma + half) continue;
    out[i] += (area * (erf((d + half) / s) - erf((d - half) / s))) / (2 * GRID_STEP_ANGSTROM);
  }
}

/** Observed σ (Å) of a line: intrinsic velocity σ added in quadrature to the instrument's. */
function observedSigma(centreAngstrom: number, sigmaKmS: number): number {
  const intrinsic = (sigmaKmS / SPEED_OF_LIGHT_KM_S) * centreAngstrom;
  return Math.hypot(intrinsic, INSTRUMENT_SIGMA_ANGSTROM);
}

/** Observed air wavelength of a rest vacuum wavelength at redshift z (file frame). */
export function observedAir(restVacuumAngstrom: number, z: number): number {
  return vacuumToAir(restVacuumAngstrom * (1 + z));
}

/** Rest-frame vacuum wavelength of each air pixel at redshift z. */
export function restVacuum(grid: Float64Array, z: number): Float64Array {
  return grid.map((w) => airToVacuum(w) / (1 + z));
}

/** Planck f_λ shape at temperature T (hc/k = 1.4388e8 Å K), normalised to 1 at 5500 Å. */
export function blackbody(restAngstrom: Float64Array, temperatureK: number): Float64Array {
  const planck = (w: number) => w ** -5 / Math.expm1(1.4388e8 / (w * temperatureK));
  const norm = planck(5500);
  return restAngstrom.map((w) => planck(w) / norm);
}

/** Power law f_λ ∝ λ^index, 1 at 5500 Å. */
export function powerLaw(restAngstrom: Float64Array, index: number): Float64Array {
  return restAngstrom.map((w) => (w / 5500) ** index);
}

/**
 * A step of height `ratio` (red/blue) at `edgeAngstrom`, `widthAngstrom` wide: the 4000 Å
 * break of old stars (D4000 of Bruzual 1983 is about 1.6–2.2 in passive galaxies) or the
 * weaker Balmer break of young ones.
 */
export function applyBreak(flux: Float64Array, restAngstrom: Float64Array, edgeAngstrom: number, widthAngstrom: number, ratio: number): void {
  for (let i = 0; i < flux.length; i++) {
    const step = 0.5 + 0.5 * Math.tanh((restAngstrom[i] - edgeAngstrom) / widthAngstrom);
    flux[i] *= 1 / ratio + (1 - 1 / ratio) * step;
  }
}

/** An emission line: id from the rest line list, flux (file units × Å), velocity σ. */
export interface EmissionLine {
  id: string;
  flux: number;
  sigmaKmS: number;
}

export function addEmission(out: Float64Array, grid: Float64Array, z: number, lines: readonly EmissionLine[]): void {
  for (const line of lines) {
    const centre = observedAir(restLine(line.id).waveVacuumAngstrom, z);
    addGaussian(out, grid, centre, observedSigma(centre, line.sigmaKmS), line.flux);
  }
}

/** An absorption line: id, rest equivalent width (Å), velocity σ (dispersion or line width). */
export interface AbsorptionLine {
  id: string;
  ewRestAngstrom: number;
  sigmaKmS: number;
}

/** Multiplies the continuum by exp(−τ), τ a Gaussian of area EW_obs = EW_rest·(1+z). */
export function applyAbsorption(flux: Float64Array, grid: Float64Array, z: number, lines: readonly AbsorptionLine[]): void {
  const tau = new Float64Array(grid.length);
  for (const line of lines) {
    const centre = observedAir(restLine(line.id).waveVacuumAngstrom, z);
    addGaussian(tau, grid, centre, observedSigma(centre, line.sigmaKmS), line.ewRestAngstrom * (1 + z));
  }
  for (let i = 0; i < flux.length; i++) flux[i] *= Math.exp(-tau[i]);
}

/**
 * Bright night-sky emission lines, air Å, with rough relative strengths: [O I] 5577, Na D,
 * [O I] 6300/6364 and some OH Meinel lines. Wavelengths and strengths from memory of the
 * published sky atlases (Osterbrock et al. 1996, PASP 108, 277); approximate.
 */
const SKY_LINES: readonly [number, number][] = [
  [5577.34, 60], [5889.95, 18], [5895.92, 14], [6300.3, 25], [6363.78, 8],
  [6863.96, 10], [7276.41, 8], [7316.28, 12], [7340.89, 10], [7750.64, 15], [7794.11, 15],
  [7821.5, 18], [7913.71, 20], [7993.33, 25], [8344.6, 40], [8399.17, 30], [8430.17, 30],
  [8827.1, 45], [8885.85, 40], [8919.64, 35], [8988.38, 40], [9375.96, 50],
];

/** Sky in the extraction aperture (file flux units): a smooth continuum plus the lines. */
export interface NightSky {
  total: Float64Array;
  /** Each line's own profile, for imperfect subtraction. */
  lines: Float64Array[];
}

export function nightSky(grid: Float64Array, brightness: number): NightSky {
  const lines = SKY_LINES.map(([wave, strength]) => {
    const profile = new Float64Array(grid.length);
    addGaussian(profile, grid, wave, INSTRUMENT_SIGMA_ANGSTROM, strength * brightness);
    return profile;
  });
  const total = grid.map((w, i) => 0.5 * brightness * (w / 5500) + lines.reduce((s, l) => s + l[i], 0));
  return { total, lines };
}

/**
 * Telluric transmission, air Å: O₂ B (6867–6960) and A (7594–7700) bands with a sharp blue
 * head and a red tail, and weaker H₂O bands; depth grows with airmass as X^0.55 (band shapes
 * and scaling: common practice, no source; the band limits are those DESIGN.md names).
 */
export function telluricTransmission(grid: Float64Array, airmass: number): Float64Array {
  // O₂ bands have a sharp head (1.5 Å); the H₂O bands rise gently (60 Å).
  const bands: { head: number; rise: number; end: number; tail: number; depth: number }[] = [
    { head: 6867, rise: 1.5, end: 6960, tail: 35, depth: 0.35 },
    { head: 7594, rise: 1.5, end: 7700, tail: 40, depth: 0.7 },
    { head: 7165, rise: 60, end: 7340, tail: 90, depth: 0.12 },
    { head: 8130, rise: 60, end: 8350, tail: 110, depth: 0.14 },
    { head: 8950, rise: 60, end: 9400, tail: 250, depth: 0.25 },
  ];
  const scale = airmass ** 0.55;
  return grid.map((w) => {
    let t = 1;
    for (const b of bands) {
      const onset = 0.5 + 0.5 * Math.tanh((w - b.head) / b.rise);
      const fade = 0.5 - 0.5 * Math.tanh((w - b.end) / 4);
      t *= 1 - Math.min(0.95, b.depth * scale) * onset * fade * Math.exp(-Math.max(0, w - b.head) / b.tail);
    }
    return t;
  });
}

/** Relative throughput of telescope + spectrograph + detector: lowest at the ends. */
function throughput(grid: Float64Array): Float64Array {
  return grid.map((w) => Math.exp(-(((w - 6200) / 2800) ** 2)));
}

function median(values: ArrayLike<number>): number {
  const sorted = Array.from(values).filter(Number.isFinite).sort((a, b) => a - b);
  return sorted.length ? sorted[sorted.length >> 1] : NaN;
}

export interface Exposure {
  /** Sky-subtracted flux as the pipeline would write it. */
  flux: Float64Array;
  sigma: Float64Array;
  sky: Float64Array;
  /** Median flux/σ actually reached. */
  snMedian: number;
}

/**
 * Observes a model spectrum (already through the atmosphere): photon-like noise with
 * variance ∝ (object + sky)/throughput, scaled so the median S/N is `targetSn`, plus sky-line
 * residuals left by imperfect sky subtraction (a few per cent of each line, random sign).
 */
export function observe(model: Float64Array, sky: NightSky, grid: Float64Array, targetSn: number, random: Random): Exposure {
  const thr = throughput(grid);
  const shape = model.map((f, i) => Math.sqrt((Math.max(f, 0) + sky.total[i] + 0.2) / thr[i]));
  const scale = median(model.map((f, i) => f / shape[i])) / targetSn;
  const sigma = shape.map((s) => s * scale);
  const flux = model.map((f, i) => f + sigma[i] * random.normal());
  for (const line of sky.lines) {
    const residual = 0.04 * random.normal();
    for (let i = 0; i < flux.length; i++) flux[i] += residual * line[i];
  }
  const snMedian = median(flux.map((f, i) => f / sigma[i]));
  return { flux, sigma, sky: sky.total, snMedian };
}
