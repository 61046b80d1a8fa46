/**
 * The checks and conversions every reader shares: equal lengths, wavelengths in Å and in
 * vacuum (air → vacuum by Morton 1991, air-vacuum.ts), ascending order (reversed spectra are
 * flipped, scrambled ones refused), non-finite pixels masked, and enough usable pixels.
 */
import { airToVacuum } from './air-vacuum.js';
import type { MediumDecision, SpectrumDraft } from './draft.js';
import { SpectrumReadError, type Spectrum } from './spectrum.js';

/** Fewest usable pixels a spectrum must have. */
export const MIN_USABLE_PIXELS = 10;

export function finishSpectrum(draft: SpectrumDraft, fileName: string, override?: MediumDecision): Spectrum {
  const fail = (reason: string): never => {
    throw new SpectrumReadError(fileName, reason);
  };
  const n = draft.wave.length;
  const lengths: Array<[string, number | undefined]> = [
    ['flux', draft.flux.length],
    ['error', draft.error?.length],
    ['mask', draft.mask?.length],
    ['sky', draft.sky?.length],
  ];
  for (const [name, len] of lengths) {
    if (len !== undefined && len !== n) fail(`the ${name} has ${len} values but the wavelengths have ${n}`);
  }
  if (n === 0) fail('the spectrum has no pixels');
  const medium = override ?? draft.medium;
  // The draft's arrays are its own (every reader makes them fresh): converted in place, kept, not copied.
  const { wave, flux } = draft;
  const error = draft.error ?? new Float64Array(n).fill(NaN);
  const mask = draft.mask ?? new Uint8Array(n);
  const hasError = draft.error !== undefined;
  const toAngstrom = draft.waveUnit.toAngstrom;
  const air = medium.medium === 'air';
  // One pass over the pixels; the first failure of each kind is kept and reported in this order:
  // a wavelength that is not a positive number, wavelengths out of order, no finite flux, too few usable pixels.
  let badWave = -1;
  let badWaveValue = 0;
  let outOfOrder = -1;
  let up = true;
  let finite = 0;
  let usable = 0;
  for (let i = 0; i < n; i++) {
    const w = wave[i] * toAngstrom;
    if (badWave < 0 && !(Number.isFinite(w) && w > 0)) {
      badWave = i;
      badWaveValue = wave[i];
    }
    wave[i] = air ? airToVacuum(w) : w;
    // Strictly ascending or strictly descending, by the first two pixels (repeated values break both).
    if (i === 1) up = wave[1] > wave[0];
    if (i > 0 && outOfOrder < 0 && (up ? !(wave[i] > wave[i - 1]) : !(wave[i] < wave[i - 1]))) outOfOrder = i;
    if (Number.isFinite(flux[i])) finite++;
    else mask[i] = 1;
    if (hasError && !(Number.isFinite(error[i]) && error[i] > 0)) mask[i] = 1;
    if (!mask[i]) usable++;
  }
  if (badWave >= 0) fail(`wavelength of pixel ${badWave + 1} is ${badWaveValue}, not a positive number`);
  if (outOfOrder >= 0) fail(`the wavelengths are not in order (pixel ${outOfOrder + 1} breaks the sequence)`);
  if (finite === 0) fail('the flux is NaN or infinite in every pixel');
  if (usable < MIN_USABLE_PIXELS) fail(`only ${usable} usable ${usable === 1 ? 'pixel' : 'pixels'} (at least ${MIN_USABLE_PIXELS} are needed)`);
  const flipped = !up;
  const pick = <T extends Float64Array | Uint8Array>(a: T): T => (flipped ? (a.reverse() as T) : a);
  return {
    fileName,
    waveAngstrom: pick(wave),
    flux: pick(flux),
    error: pick(error),
    mask: pick(mask),
    ...(draft.sky ? { sky: pick(draft.sky) } : {}),
    fluxUnit: draft.fluxUnit,
    meta: draft.meta,
    provenance: {
      format: draft.format,
      hdu: draft.hdu,
      spectrumHdus: draft.spectrumHdus,
      medium: medium.medium,
      mediumReason: medium.reason,
      mediumSource: medium.source ?? 'file',
      dispersion: draft.dispersion,
      errorKind: draft.errorKind,
      waveUnitInFile: draft.waveUnit.assumed ? `${draft.waveUnit.name} (assumed from the values${draft.waveUnit.doubt ? `; ${draft.waveUnit.doubt}` : ''})` : draft.waveUnit.name,
      waveUnitDoubt: draft.waveUnit.doubt ?? null,
      hasMask: draft.mask !== undefined,
      hasSky: draft.sky !== undefined,
      flipped,
      header: draft.header,
    },
  };
}
