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
  const wave = draft.wave;
  const toAngstrom = draft.waveUnit.toAngstrom;
  const air = medium.medium === 'air';
  for (let i = 0; i < n; i++) {
    const w = wave[i] * toAngstrom;
    if (!Number.isFinite(w) || w <= 0) fail(`wavelength of pixel ${i + 1} is ${wave[i]}, not a positive number`);
    wave[i] = air ? airToVacuum(w) : w;
  }
  const order = wavelengthOrder(wave);
  if (order.kind === 'scrambled') {
    fail(`the wavelengths are not in order (pixel ${order.at + 1} breaks the sequence)`);
  }
  const flipped = order.kind === 'descending';
  const pick = <T extends Float64Array | Uint8Array>(a: T): T => (flipped ? (a.reverse() as T) : a);
  const flux = pick(draft.flux);
  const error = draft.error ? pick(draft.error) : new Float64Array(n).fill(NaN);
  const mask = draft.mask ? pick(draft.mask) : new Uint8Array(n);
  let finite = 0;
  let usable = 0;
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(flux[i])) finite++;
    else mask[i] = 1;
    if (draft.error && !(Number.isFinite(error[i]) && error[i] > 0)) mask[i] = 1;
    if (!mask[i]) usable++;
  }
  if (finite === 0) fail('the flux is NaN or infinite in every pixel');
  if (usable < MIN_USABLE_PIXELS) fail(`only ${usable} usable pixels (at least ${MIN_USABLE_PIXELS} are needed)`);
  return {
    fileName,
    waveAngstrom: flipped ? wave.reverse() : wave,
    flux,
    error,
    mask,
    ...(draft.sky ? { sky: pick(draft.sky) } : {}),
    fluxUnit: draft.fluxUnit,
    meta: draft.meta,
    provenance: {
      format: draft.format,
      hdu: draft.hdu,
      spectrumHdus: draft.spectrumHdus,
      medium: medium.medium,
      mediumReason: medium.reason,
      dispersion: draft.dispersion,
      errorKind: draft.errorKind,
      waveUnitInFile: draft.waveUnit.assumed ? `${draft.waveUnit.name} (assumed from the values)` : draft.waveUnit.name,
      hasMask: draft.mask !== undefined,
      hasSky: draft.sky !== undefined,
      flipped,
      header: draft.header,
    },
  };
}

type Order = { kind: 'ascending' | 'descending' } | { kind: 'scrambled'; at: number };

/** Strictly ascending, strictly descending, or neither (repeated values count as neither). */
export function wavelengthOrder(wave: Float64Array): Order {
  if (wave.length < 2) return { kind: 'ascending' };
  const up = wave[1] > wave[0];
  for (let i = 1; i < wave.length; i++) {
    if (up ? !(wave[i] > wave[i - 1]) : !(wave[i] < wave[i - 1])) return { kind: 'scrambled', at: i };
  }
  return { kind: up ? 'ascending' : 'descending' };
}
