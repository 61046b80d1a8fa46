/**
 * Host-galaxy diagnostics of one spectrum at a given redshift: line measurements, diagnostic-
 * diagram classes, the Balmer decrement and the Hα star-formation rate. Pure and fast enough
 * to rerun whenever the redshift changes.
 */
import { COSMOLOGY_PRESETS, distances, type CosmologyModel } from '../astro/cosmology.js';
import type { FrameResult } from '../astro/frames.js';
import type { Spectrum } from '../spectrum/spectrum.js';
import type { AttenuationCurve } from './attenuation.js';
import { balmerDecrement, type BalmerDecrement } from './balmer.js';
import { classify, type Classification } from './classify.js';
import { measureLines, STELLAR_ABSORPTION_METHOD, type LineMeasurement, type LineMeasurementSet } from './measure-lines.js';
import { starFormation, type StarFormation } from './sfr.js';

export type { LineMeasurement } from './measure-lines.js';

export interface HostAnalysisOptions {
  /** Cosmology for the luminosity distance; Planck 2018 by default. */
  cosmology?: CosmologyModel;
  attenuation?: AttenuationCurve;
  /** Instrumental FWHM, observed Å, removed from the line widths. */
  instrumentalFwhmAngstrom?: number;
  /**
   * The frame correction of z (made with the same cosmology): the SFR then takes its luminosity
   * distance, at z_cmb where known, as the distance columns do; without it, D_L at z as measured.
   */
  frames?: FrameResult | null;
}

export interface HostAnalysis {
  /** Redshift the lines were measured at. */
  z: number;
  lines: LineMeasurement[];
  classification: Classification;
  balmer: BalmerDecrement;
  sfr: StarFormation;
  measurement: Omit<LineMeasurementSet, 'lines'> & { stellar_absorption_method: string; flux_unit: string };
}

function luminosityDistance(z: number, cosmology: CosmologyModel, frames: FrameResult | null | undefined): { luminosityDistanceMpc: number; luminosityDistanceFrom: string } {
  if (frames?.distances && frames.distancesFrom) return { luminosityDistanceMpc: frames.distances.luminosityMpc, luminosityDistanceFrom: frames.distancesFrom };
  return { luminosityDistanceMpc: z > 0 ? distances(z, cosmology).luminosityMpc : 0, luminosityDistanceFrom: 'measured' };
}

export function analyseHost(spectrum: Spectrum, z: number, options: HostAnalysisOptions = {}): HostAnalysis {
  const cosmology = options.cosmology ?? COSMOLOGY_PRESETS.planck18;
  const measured = measureLines(spectrum, z, { instrumentalFwhmAngstrom: options.instrumentalFwhmAngstrom });
  const { lines, ...rest } = measured;
  const classification = classify(lines);
  const balmer = balmerDecrement(lines, options.attenuation ?? 'calzetti2000');
  const ha = lines.find((l) => l.name === 'Halpha' && l.component === 'narrow');
  const agnCaveat =
    classification.bpt === 'agn' || classification.bpt === 'composite' || classification.broad_balmer
      ? `The lines classify as ${classification.broad_balmer ? 'a broad-line AGN' : classification.bpt}: an AGN contributes to Hα, so the SFR is an upper limit.`
      : null;
  const sfr = starFormation({
    haFlux: ha && !ha.limit ? { flux: ha.flux, err: ha.flux_err } : null,
    haCorrected: balmer.halpha_flux_corrected !== null ? { flux: balmer.halpha_flux_corrected, err: balmer.halpha_flux_corrected_err! } : null,
    fluxUnit: spectrum.fluxUnit,
    ...luminosityDistance(z, cosmology, options.frames),
    cosmology: `${cosmology.name}: ${cosmology.source}`,
    extraCaveat: agnCaveat,
  });
  return {
    z,
    lines,
    classification,
    balmer,
    sfr,
    measurement: { ...rest, stellar_absorption_method: STELLAR_ABSORPTION_METHOD, flux_unit: spectrum.fluxUnit },
  };
}
