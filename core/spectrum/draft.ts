/**
 * What a layout reader hands over before the common checks and conversions of finish.ts:
 * wavelengths still in the file's unit and medium, errors already as 1σ. Its arrays belong to
 * it alone (finish.ts keeps and may reverse them), never views shared with anything else.
 */
import type { Dispersion, ErrorKind, HeaderCard, SpectrumMeta, WavelengthMedium } from './spectrum.js';
import type { WaveUnit } from './units.js';

export interface MediumDecision {
  medium: WavelengthMedium;
  reason: string;
  /** Who decided, when not the file: zvet's assumption, or the user. */
  source?: 'assumed' | 'user';
}

export interface SpectrumDraft {
  format: string;
  hdu: number | null;
  spectrumHdus: number[];
  /** Wavelengths in the file's unit and medium, in the file's order. */
  wave: Float64Array;
  waveUnit: WaveUnit;
  dispersion: Dispersion;
  flux: Float64Array;
  /** 1σ error in flux units (NaN where unknown); undefined when the file gives none. */
  error?: Float64Array;
  errorKind: ErrorKind;
  /** 1 = bad pixel, from the file's own flags (zero ivar, mask columns). */
  mask?: Uint8Array;
  sky?: Float64Array;
  fluxUnit: string;
  medium: MediumDecision;
  meta: SpectrumMeta;
  header: HeaderCard[];
}
