/**
 * What was read, as one flat record with units in its keys: the `zvet inspect --json` output
 * and anything else that shows a spectrum's provenance (snake_case keys, null when unknown).
 */
import type { Spectrum } from './spectrum.js';
import { toJsonNumbers } from '../util/json-numbers.js';

export interface SiteSummary {
  name: string | null;
  latitude_deg: number | null;
  longitude_deg: number | null;
  height_m: number | null;
}

export interface SpectrumSummary {
  file: string;
  format: string;
  hdu: number | null;
  spectrum_hdus: number[];
  n_pixels: number;
  wave_min_angstrom: number;
  wave_max_angstrom: number;
  /** Medium of the wavelengths in the file; zvet's own are always vacuum. */
  medium_in_file: 'air' | 'vacuum';
  medium_reason: string;
  medium_source: 'file' | 'assumed' | 'user';
  dispersion: string;
  wave_unit_in_file: string;
  wave_flipped: boolean;
  flux_unit: string;
  error_kind: string;
  has_mask: boolean;
  n_masked: number;
  has_sky: boolean;
  object: string | null;
  ra_deg: number | null;
  dec_deg: number | null;
  /** Position keywords present but not a sky position: which, and that they were ignored. */
  position_warning: string | null;
  date_obs_utc: string | null;
  mjd_obs: number | null;
  /** Header keyword(s) the observation time came from. */
  obs_time_from: string | null;
  /** When the header's times disagree: by how much, and which was used. */
  obs_time_warning: string | null;
  exposure_s: number | null;
  site: SiteSummary | null;
  velocity_frame: string;
  velocity_frame_reason: string;
}

export interface PixelTable {
  /** Vacuum wavelength, Å. */
  wave: Array<number | null>;
  flux: Array<number | null>;
  /** 1σ error in flux units. */
  error: Array<number | null>;
  /** 1 = bad pixel. */
  mask: number[];
}

export function summariseSpectrum(s: Spectrum): SpectrumSummary {
  const { provenance: p, meta: m } = s;
  let masked = 0;
  for (const v of s.mask) masked += v;
  const site = m.site
    ? {
        name: m.site.name ?? null,
        latitude_deg: m.site.latitudeDeg ?? null,
        longitude_deg: m.site.longitudeDeg ?? null,
        height_m: m.site.heightM ?? null,
      }
    : null;
  return {
    file: s.fileName,
    format: p.format,
    hdu: p.hdu,
    spectrum_hdus: p.spectrumHdus,
    n_pixels: s.waveAngstrom.length,
    wave_min_angstrom: s.waveAngstrom[0],
    wave_max_angstrom: s.waveAngstrom[s.waveAngstrom.length - 1],
    medium_in_file: p.medium,
    medium_reason: p.mediumReason,
    medium_source: p.mediumSource,
    dispersion: p.dispersion,
    wave_unit_in_file: p.waveUnitInFile,
    wave_flipped: p.flipped,
    flux_unit: s.fluxUnit,
    error_kind: p.errorKind,
    has_mask: p.hasMask,
    n_masked: masked,
    has_sky: p.hasSky,
    object: m.object ?? null,
    ra_deg: m.raDeg ?? null,
    dec_deg: m.decDeg ?? null,
    position_warning: m.positionWarning ?? null,
    date_obs_utc: m.dateObsUtc ?? null,
    mjd_obs: m.mjdObs ?? null,
    obs_time_from: m.obsTimeFrom ?? null,
    obs_time_warning: m.obsTimeWarning ?? null,
    exposure_s: m.exposureS ?? null,
    site,
    velocity_frame: m.velocityFrame,
    velocity_frame_reason: m.velocityFrameReason,
  };
}

/** Every pixel; non-finite numbers become null (JSON has no NaN). */
export function pixelTable(s: Spectrum): PixelTable {
  return { wave: toJsonNumbers(s.waveAngstrom), flux: toJsonNumbers(s.flux), error: toJsonNumbers(s.error), mask: Array.from(s.mask) };
}
