/**
 * Observed-frame regions that carry no information about the object: the telluric O₂ bands and
 * the brightest night-sky emission lines, whose subtraction residuals masquerade as lines.
 */
import { lowerBound } from './templates.js';

/** Telluric O₂ A (≈7590–7700 Å) and B (≈6860–6960 Å) bands (DESIGN.md; common practice). */
export const TELLURIC_BANDS_ANGSTROM: readonly [number, number][] = [
  [6860, 6960],
  [7590, 7700],
];

/**
 * Bright night-sky lines, vacuum Å: [O I] 5577.34, Na I D 5889.95/5895.92 and [O I]
 * 6300.30/6363.78 (air values, e.g. Osterbrock et al. 1996, PASP 108, 277; from memory),
 * converted to vacuum.
 */
export const SKY_LINES_VACUUM_ANGSTROM: readonly number[] = [5578.89, 5891.58, 5897.56, 6302.05, 6365.54];

/** Half-width of the mask around a sky line, Å (common practice, no source). */
const SKY_HALF_WIDTH_ANGSTROM = 5;

/** Sets good[i] = 0 for pixels in the masked regions (wavelengths ascending, as every reader gives them). */
export function applyObservedMasks(waveAngstrom: Float64Array, good: Uint8Array, opts: { telluric: boolean; sky: boolean }): void {
  const regions: (readonly [number, number])[] = [];
  if (opts.telluric) regions.push(...TELLURIC_BANDS_ANGSTROM);
  if (opts.sky) for (const c of SKY_LINES_VACUUM_ANGSTROM) regions.push([c - SKY_HALF_WIDTH_ANGSTROM, c + SKY_HALF_WIDTH_ANGSTROM]);
  for (const [lo, hi] of regions) for (let i = lowerBound(waveAngstrom, lo); i < waveAngstrom.length && waveAngstrom[i] <= hi; i++) good[i] = 0;
}
