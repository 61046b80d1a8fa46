/**
 * The main host-galaxy diagnostics of one spectrum, boiled down from a full HostAnalysis to
 * what a table row holds (small enough to post from a worker), and their table fields. Line
 * fluxes are narrow components; a line below S/N 3 has no flux here but its 3σ upper limit in
 * `upperLimits`.
 */
import type { HostAnalysis } from '../hosts/analyse.js';
import { parseFluxDensityUnit } from '../hosts/flux-unit.js';
import type { Field } from './frame-fields.js';

/** The lines a row reports, by line id, with the field-name stem used for them. */
const ROW_LINES = [
  { id: 'Halpha', stem: 'halpha', label: 'Halpha' },
  { id: 'Hbeta', stem: 'hbeta', label: 'Hbeta' },
  { id: '[OIII]5008', stem: 'oiii5008', label: '[O III] 5008' },
  { id: '[NII]6585', stem: 'nii6585', label: '[N II] 6585' },
] as const;

type Stem = (typeof ROW_LINES)[number]['stem'];

export interface HostSummary {
  z: number;
  /** Detected narrow-line fluxes and errors in the file's flux-density unit × Å; null when not detected. */
  flux: Record<Stem, number | null>;
  fluxErr: Record<Stem, number | null>;
  /** Lines below S/N 3, as "stem < limit" in the same unit. */
  upperLimits: string[];
  /** The file's flux-density unit (line fluxes are this × Å). */
  fluxDensityUnit: string;
  /** erg s⁻¹ cm⁻² per line-flux unit of the file, or null when the unit is not recognised. */
  cgsPerFluxUnit: number | null;
  bpt: string;
  agnType: string | null;
  balmerDecrement: number | null;
  balmerDecrementErr: number | null;
  ebvMag: number | null;
  ebvErrMag: number | null;
  sfrK98MsunYr: number | null;
  sfrK98ErrMsunYr: number | null;
  sfrKe12MsunYr: number | null;
  sfrKe12ErrMsunYr: number | null;
  /** True when an AGN contributes to Hα, so the SFRs are upper limits. */
  sfrUpperLimit: boolean;
  sfrCaveat: string;
}

export function summariseHost(h: HostAnalysis): HostSummary {
  const flux = {} as Record<Stem, number | null>;
  const fluxErr = {} as Record<Stem, number | null>;
  const upperLimits: string[] = [];
  for (const { id, stem } of ROW_LINES) {
    const line = h.lines.find((l) => l.name === id && l.component === 'narrow');
    const detected = !!line && !line.limit;
    flux[stem] = detected ? line.flux : null;
    fluxErr[stem] = detected ? line.flux_err : null;
    if (line?.limit) upperLimits.push(`${stem} < ${Number(line.flux.toPrecision(3))}`);
  }
  const unit = parseFluxDensityUnit(h.measurement.flux_unit);
  return {
    z: h.z,
    flux,
    fluxErr,
    upperLimits,
    fluxDensityUnit: h.measurement.flux_unit,
    cgsPerFluxUnit: unit.ok ? unit.scale : null,
    bpt: h.classification.bpt,
    agnType: h.classification.agn_type,
    balmerDecrement: h.balmer.decrement,
    balmerDecrementErr: h.balmer.decrement_err,
    ebvMag: h.balmer.ebv,
    ebvErrMag: h.balmer.ebv_err,
    sfrK98MsunYr: h.sfr.sfr_kennicutt98_msun_yr,
    sfrK98ErrMsunYr: h.sfr.sfr_kennicutt98_err_msun_yr,
    sfrKe12MsunYr: h.sfr.sfr_ke12_msun_yr,
    sfrKe12ErrMsunYr: h.sfr.sfr_ke12_err_msun_yr,
    sfrUpperLimit: h.sfr.upper_limit,
    sfrCaveat: h.sfr.caveat,
  };
}

const BPT_DESCRIPTION = '[N II] BPT class: star-forming (below Kauffmann et al. 2003), composite, agn (above Kewley et al. 2001) or insufficient (a line with S/N < 3)';
const AGN_TYPE_DESCRIPTION = 'seyfert or liner from the [S II]/[O I] diagrams (Kewley et al. 2006); empty otherwise';
const SFR_K98 = 'star-formation rate inside the aperture from dust-corrected Halpha, Kennicutt (1998), Salpeter IMF';
const SFR_ERR = (column: string) => `1-sigma error of ${column} (Halpha flux and E(B-V) errors; not the distance, the calibration or the aperture)`;
const SFR_KE12 = 'star-formation rate inside the aperture from dust-corrected Halpha, Kennicutt & Evans (2012), Kroupa IMF';

/** The diagnostic-diagram classes. */
export const HOST_CLASS_FIELDS: readonly Field<HostSummary>[] = [
  { name: 'bpt_class', unit: null, type: 'string', description: BPT_DESCRIPTION, pick: (h) => h.bpt },
  { name: 'agn_type', unit: null, type: 'string', description: AGN_TYPE_DESCRIPTION, pick: (h) => h.agnType },
];

/** Dust and star formation (no fluxes: their unit differs between the tables). */
export const HOST_DUST_SFR_FIELDS: readonly Field<HostSummary>[] = [
  { name: 'balmer_decrement', unit: null, type: 'float64', description: 'observed narrow F(Halpha)/F(Hbeta); intrinsic 2.86 (case B)', pick: (h) => h.balmerDecrement },
  { name: 'balmer_decrement_err', unit: null, type: 'float64', description: '1-sigma error of balmer_decrement (from the two fluxes)', pick: (h) => h.balmerDecrementErr },
  { name: 'ebv_mag', unit: 'mag', type: 'float64', description: 'E(B-V) of the gas from the Balmer decrement (Calzetti et al. 2000 curve)', pick: (h) => h.ebvMag },
  { name: 'ebv_err_mag', unit: 'mag', type: 'float64', description: '1-sigma error of ebv_mag', pick: (h) => h.ebvErrMag },
  { name: 'sfr_k98_msun_yr', unit: 'solMass/yr', type: 'float64', description: SFR_K98, pick: (h) => h.sfrK98MsunYr },
  { name: 'sfr_k98_err_msun_yr', unit: 'solMass/yr', type: 'float64', description: SFR_ERR('sfr_k98_msun_yr'), pick: (h) => h.sfrK98ErrMsunYr },
  { name: 'sfr_ke12_msun_yr', unit: 'solMass/yr', type: 'float64', description: SFR_KE12, pick: (h) => h.sfrKe12MsunYr },
  { name: 'sfr_ke12_err_msun_yr', unit: 'solMass/yr', type: 'float64', description: SFR_ERR('sfr_ke12_msun_yr'), pick: (h) => h.sfrKe12ErrMsunYr },
  { name: 'sfr_upper_limit', unit: null, type: 'bool', description: 'true when an AGN contributes to Halpha (BPT agn or composite, or broad Balmer lines): the SFRs are upper limits', pick: (h) => (h.sfrK98MsunYr === null ? null : h.sfrUpperLimit) },
];

/** Each row line's flux and its 1σ error, in the file's own unit. */
const fileFluxFields = ({ stem, label }: (typeof ROW_LINES)[number]): Field<HostSummary>[] => [
  { name: `${stem}_flux`, unit: null, type: 'float64', description: `narrow ${label} flux, unit in flux_unit`, pick: (h) => h.flux[stem] },
  { name: `${stem}_flux_err`, unit: null, type: 'float64', description: `1-sigma error of ${stem}_flux`, pick: (h) => h.fluxErr[stem] },
];

/** Line fluxes in the file's own unit (the `zvet measure` rows, with a flux_unit column). */
export const HOST_FILE_FLUX_FIELDS: readonly Field<HostSummary>[] = [
  ...ROW_LINES.flatMap(fileFluxFields),
  { name: 'flux_unit', unit: null, type: 'string', description: 'unit of the line fluxes: the file flux-density unit times Angstrom', pick: (h) => `${h.fluxDensityUnit} * Angstrom` },
  { name: 'flux_upper_limits_3sigma', unit: null, type: 'string', description: 'lines of these four below S/N 3, with their 3-sigma upper limits in flux_unit', pick: (h) => h.upperLimits.join('; ') || null },
];

const cgs = (h: HostSummary, x: number | null): number | null => (x === null || h.cgsPerFluxUnit === null ? null : x * h.cgsPerFluxUnit);

/** Hα flux in erg s⁻¹ cm⁻² (the catalogue: one unit per column, empty when the file's unit is not recognised). */
export const HOST_CGS_FLUX_FIELDS: readonly Field<HostSummary>[] = [
  { name: 'halpha_flux', unit: 'erg/(s cm2)', type: 'float64', description: 'narrow Halpha flux (stellar absorption fitted), empty when not detected at S/N 3 or the file flux unit is not recognised', pick: (h) => cgs(h, h.flux.halpha) },
  { name: 'halpha_flux_err', unit: 'erg/(s cm2)', type: 'float64', description: '1-sigma error of halpha_flux', pick: (h) => cgs(h, h.fluxErr.halpha) },
];
