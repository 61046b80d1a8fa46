/**
 * Hα luminosity and star-formation rate: L = 4π D_L² F; SFR = 7.9×10⁻⁴² L(Hα) M☉/yr
 * (Kennicutt 1998, ARA&A 36, 189, eq. 2; Salpeter IMF 0.1–100 M☉) and
 * log SFR = log L(Hα) − 41.27 (Kennicutt & Evans 2012, ARA&A 50, 531, Table 1; Kroupa IMF).
 */
import { KM_PER_MPC } from '../astro/constants.js';
import { parseFluxDensityUnit } from './flux-unit.js';

export const KENNICUTT98_MSUN_YR_PER_ERG_S = 7.9e-42;
export const KE12_LOG_CONSTANT = 41.27;
const CM_PER_MPC = KM_PER_MPC * 1e5;

export function haLuminosityErgS(fluxErgSCm2: number, luminosityDistanceMpc: number): number {
  const d = luminosityDistanceMpc * CM_PER_MPC;
  return 4 * Math.PI * d * d * fluxErgSCm2;
}

export function sfrKennicutt98(lHaErgS: number): number {
  return KENNICUTT98_MSUN_YR_PER_ERG_S * lHaErgS;
}

export function sfrKennicuttEvans12(lHaErgS: number): number {
  return 10 ** (Math.log10(lHaErgS) - KE12_LOG_CONSTANT);
}

export const APERTURE_CAVEAT =
  'The slit or fibre sees only part of the galaxy: these are SFRs inside the aperture, not of the whole galaxy, ' +
  'unless an aperture correction is applied.';

export interface StarFormation {
  /** Hα luminosity used for the SFRs (dust-corrected when the decrement allowed), erg/s. */
  l_halpha_erg_s: number | null;
  l_halpha_err_erg_s: number | null;
  l_halpha_uncorrected_erg_s: number | null;
  dust_corrected: boolean;
  luminosity_distance_mpc: number | null;
  /** The z the distance is at: 'cmb' (as the catalogue's distance columns), another frame, or 'measured' (no frame correction). */
  luminosity_distance_from: string;
  cosmology: string;
  sfr_kennicutt98_msun_yr: number | null;
  sfr_kennicutt98_err_msun_yr: number | null;
  sfr_ke12_msun_yr: number | null;
  sfr_ke12_err_msun_yr: number | null;
  imf: { kennicutt98: string; ke12: string };
  flux_unit: string;
  caveat: string;
  /** True when an AGN contributes to Hα: the SFRs are then upper limits. */
  upper_limit: boolean;
  /** Why a value is missing, or what limits it. */
  note: string | null;
}

export interface StarFormationInput {
  /** Observed narrow Hα flux and error, in the spectrum's flux-density unit × Å; null when not detected. */
  haFlux: { flux: number; err: number } | null;
  haCorrected: { flux: number; err: number } | null;
  fluxUnit: string;
  luminosityDistanceMpc: number;
  luminosityDistanceFrom: string;
  cosmology: string;
  /** Extra caveat (an AGN contributing to Hα), which makes the SFRs upper limits. */
  extraCaveat: string | null;
}

export function starFormation(input: StarFormationInput): StarFormation {
  const unit = parseFluxDensityUnit(input.fluxUnit);
  const base = {
    luminosity_distance_mpc: input.luminosityDistanceMpc,
    luminosity_distance_from: input.luminosityDistanceFrom,
    cosmology: input.cosmology,
    imf: { kennicutt98: 'Salpeter (1955), 0.1–100 M☉', ke12: 'Kroupa (2001), 0.1–100 M☉' },
    flux_unit: input.fluxUnit,
    caveat: [APERTURE_CAVEAT, input.extraCaveat].filter(Boolean).join(' '),
    upper_limit: input.extraCaveat !== null,
  };
  const empty = {
    ...base, l_halpha_erg_s: null, l_halpha_err_erg_s: null, l_halpha_uncorrected_erg_s: null, dust_corrected: false,
    sfr_kennicutt98_msun_yr: null, sfr_kennicutt98_err_msun_yr: null, sfr_ke12_msun_yr: null, sfr_ke12_err_msun_yr: null,
  };
  if (!input.haFlux) return { ...empty, note: 'no SFR: narrow Hα not detected at S/N ≥ 3' };
  if (!unit.ok) return { ...empty, note: unit.reason };
  if (!(input.luminosityDistanceMpc > 0)) return { ...empty, note: 'no luminosity at z ≤ 0' };
  const toL = (f: number) => haLuminosityErgS(f * unit.scale, input.luminosityDistanceMpc);
  const used = input.haCorrected ?? input.haFlux;
  const l = toL(used.flux);
  const lErr = toL(used.err);
  return {
    ...base,
    l_halpha_erg_s: l,
    l_halpha_err_erg_s: lErr,
    l_halpha_uncorrected_erg_s: toL(input.haFlux.flux),
    dust_corrected: input.haCorrected !== null,
    sfr_kennicutt98_msun_yr: sfrKennicutt98(l),
    sfr_kennicutt98_err_msun_yr: sfrKennicutt98(lErr),
    sfr_ke12_msun_yr: sfrKennicuttEvans12(l),
    sfr_ke12_err_msun_yr: (sfrKennicuttEvans12(l) * lErr) / l,
    note: input.haCorrected ? null : 'Hα not corrected for dust (no usable Balmer decrement)',
  };
}

/** Which z a luminosity distance is at, in words for a reader. */
export function distanceBasis(from: string): string {
  const frameZ: Record<string, string> = { cmb: 'z_cmb', barycentric: 'z_bary', heliocentric: 'z_helio' };
  return frameZ[from] ? `at ${frameZ[from]}` : 'at z as measured (no frame correction)';
}
