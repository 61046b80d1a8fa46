/**
 * The one footing every reader puts a spectrum on: vacuum wavelengths in Å (ascending),
 * flux in the file's unit, 1σ error, a bad-pixel mask, optional sky, and the metadata that
 * later steps (frames, distances, the window) need.
 */

/** How the file gave its uncertainties, before conversion to 1σ. */
export type ErrorKind = 'sigma' | 'ivar' | 'variance' | 'snr' | 'none';

/** Medium of the wavelengths as stored in the file (internally everything is vacuum). */
export type WavelengthMedium = 'air' | 'vacuum';

/** How the wavelength axis was sampled in the file. */
export type Dispersion = 'linear' | 'log10' | 'ln' | 'tabulated';

/** Frame the file's wavelengths are already in, when the header says so. */
export type VelocityFrame = 'topocentric' | 'heliocentric' | 'barycentric' | 'unknown';

export interface Site {
  name?: string;
  latitudeDeg?: number;
  /** East-positive longitude. */
  longitudeDeg?: number;
  heightM?: number;
}

/** One header card as read, kept for display. */
export interface HeaderCard {
  key: string;
  value: string | number | boolean | null;
  comment?: string;
}

export interface SpectrumMeta {
  object?: string;
  raDeg?: number;
  decDeg?: number;
  /** Set when the header has position keywords that are not a sky position (and none that is). */
  positionWarning?: string;
  /** Start of the observation, UTC, ISO 8601. */
  dateObsUtc?: string;
  /** Start of the observation as MJD (UTC). */
  mjdObs?: number;
  /** The header keyword(s) the observation time came from. */
  obsTimeFrom?: string;
  /** Set when the header's times disagree (DATE-OBS against MJD-OBS), saying which was used. */
  obsTimeWarning?: string;
  /** The header's own mid-time (MJD-AVG or DATE-AVG) as MJD (UTC), and the keyword. */
  mjdAvg?: number;
  avgTimeFrom?: string;
  exposureS?: number;
  site?: Site;
  /** Frame of the stored wavelengths and the header evidence for it. */
  velocityFrame: VelocityFrame;
  velocityFrameReason: string;
}

export interface SpectrumProvenance {
  /** e.g. 'fits-image-1d', 'fits-multispec', 'fits-survey-image', 'fits-table-rows',
   * 'fits-table-arrays', 'fits-grism-table', 'text'. */
  format: string;
  /** HDU index read (0 = primary); null for text files. */
  hdu: number | null;
  /** Number of HDUs in the file that hold a spectrum (for --hdu). */
  spectrumHdus: number[];
  medium: WavelengthMedium;
  mediumReason: string;
  /** Whether the file said (or zvet assumed, or the user set) the medium. */
  mediumSource: 'file' | 'assumed' | 'user';
  dispersion: Dispersion;
  errorKind: ErrorKind;
  /** Unit of the wavelengths in the file before conversion to Å. */
  waveUnitInFile: string;
  /** Why the unit, guessed from the values, may be wrong; null when the file names it or the values leave no doubt. */
  waveUnitDoubt: string | null;
  hasMask: boolean;
  hasSky: boolean;
  /** Pixels in the file with wavelengths in reverse order were flipped. */
  flipped: boolean;
  /** Raw header cards of the HDU read (empty for text). */
  header: HeaderCard[];
}

export interface Spectrum {
  /** Source file name (for messages and display). */
  fileName: string;
  /** Vacuum wavelength of each pixel centre, Å, strictly ascending. */
  waveAngstrom: Float64Array;
  flux: Float64Array;
  /** 1σ error in flux units; NaN where the file gives none. */
  error: Float64Array;
  /** 1 = bad pixel (non-finite, zero ivar, flagged), 0 = good. */
  mask: Uint8Array;
  sky?: Float64Array;
  fluxUnit: string;
  meta: SpectrumMeta;
  provenance: SpectrumProvenance;
}

/** A file that is not a readable spectrum; the message is one line naming file and reason. */
export class SpectrumReadError extends Error {
  readonly fileName: string;
  readonly reason: string;
  constructor(fileName: string, reason: string) {
    super(`${fileName}: ${reason}`);
    this.name = 'SpectrumReadError';
    this.fileName = fileName;
    this.reason = reason;
  }
}
