/**
 * The built-in line templates, one per object class, as data: which lines of line-list.ts each
 * uses, with a typical relative strength (positive = emission flux, negative = absorption depth,
 * any common scale per template) and a Gaussian width. Strengths are typical values meant for
 * finding a redshift, not for physics; each group names its source.
 */
import type { TemplateClass } from './types.js';

export interface TemplateLine {
  id: string;
  strength: number;
  /** Gaussian σ of this line, km/s, when it differs from the template's. */
  sigmaKmS?: number;
}

export interface LineTemplateSpec {
  name: string;
  templateClass: TemplateClass;
  /** Default redshift range searched. */
  zMin: number;
  zMax: number;
  /** Gaussian σ of the lines, km/s (intrinsic; the instrument's width is added in quadrature). */
  sigmaKmS: number;
  lines: TemplateLine[];
}

/** [O III] 5008/4960 = 2.98 (Storey & Zeippen 2000, MNRAS 312, 813; from memory). */
export const OIII_DOUBLET_RATIO = 2.98;
/** [N II] 6585/6550 = 2.94 (Storey & Zeippen 2000, MNRAS 312, 813; from memory). */
export const NII_DOUBLET_RATIO = 2.94;
/** [O I] 6302/6366 ≈ 3.1 (Storey & Zeippen 2000; from memory). */
export const OI_DOUBLET_RATIO = 3.1;

/** Case B Balmer ratios relative to Hβ at 10⁴ K (Osterbrock & Ferland 2006, Table 4.2; from memory). */
const BALMER_CASE_B: Record<string, number> = {
  Halpha: 2.86, Hbeta: 1, Hgamma: 0.468, Hdelta: 0.259, Heps: 0.159, H8: 0.105, H9: 0.0731, H10: 0.0530,
};

function balmer(scale: number, ids = Object.keys(BALMER_CASE_B)): TemplateLine[] {
  return ids.map((id) => ({ id, strength: scale * BALMER_CASE_B[id] }));
}

function doublets(o3: number, n2: number, o1: number): TemplateLine[] {
  return [
    { id: '[OIII]5008', strength: o3 },
    { id: '[OIII]4960', strength: o3 / OIII_DOUBLET_RATIO },
    { id: '[NII]6585', strength: n2 },
    { id: '[NII]6550', strength: n2 / NII_DOUBLET_RATIO },
    { id: '[OI]6302', strength: o1 },
    { id: '[OI]6366', strength: o1 / OI_DOUBLET_RATIO },
  ];
}

export const LINE_TEMPLATES: readonly LineTemplateSpec[] = [
  {
    // Typical H II-region ratios relative to Hβ (common practice, no single source; from memory).
    name: 'star-forming',
    templateClass: 'star-forming',
    zMin: 0,
    zMax: 1.5,
    sigmaKmS: 60,
    lines: [
      ...balmer(1),
      ...doublets(1.0, 0.85, 0.05),
      { id: '[OII]3727', strength: 1.1 },
      { id: '[OII]3730', strength: 1.4 },
      { id: '[NeIII]3870', strength: 0.15 },
      { id: 'HeI5877', strength: 0.1 },
      { id: '[SII]6718', strength: 0.3 },
      { id: '[SII]6733', strength: 0.22 },
      { id: '[ArIII]7138', strength: 0.05 },
      { id: '[SIII]9071', strength: 0.1 },
      { id: '[SIII]9533', strength: 0.25 },
    ],
  },
  {
    // Seyfert 2 narrow-line ratios relative to Hβ (typical values; from memory of standard
    // narrow-line AGN spectra, e.g. Osterbrock & Ferland 2006, ch. 13).
    name: 'agn-narrow',
    templateClass: 'agn',
    zMin: 0,
    zMax: 1.5,
    sigmaKmS: 200,
    lines: [
      ...balmer(1, ['Halpha', 'Hbeta', 'Hgamma', 'Hdelta']).map((l) => (l.id === 'Halpha' ? { ...l, strength: 3.1 } : l)),
      ...doublets(10, 3.0, 0.6),
      { id: '[OII]3727', strength: 1.5 },
      { id: '[OII]3730', strength: 1.7 },
      { id: '[NeIII]3870', strength: 1.2 },
      { id: '[NeV]3427', strength: 1.0 },
      { id: 'HeII4687', strength: 0.3 },
      { id: '[SII]6718', strength: 1.0 },
      { id: '[SII]6733', strength: 0.9 },
      { id: 'MgII', strength: 1.5 },
    ],
  },
  {
    // Absorption depths of an old stellar population, relative to Ca II K (typical values of
    // early-type galaxy spectra; common practice, no single source; from memory).
    name: 'passive',
    templateClass: 'passive',
    zMin: 0,
    zMax: 1.5,
    sigmaKmS: 250,
    lines: [
      { id: 'CaK', strength: -1.0, sigmaKmS: 400 },
      { id: 'CaH', strength: -0.9, sigmaKmS: 400 },
      { id: 'Gband', strength: -0.5, sigmaKmS: 500 },
      { id: 'Hdelta', strength: -0.25 },
      { id: 'Hgamma', strength: -0.25 },
      { id: 'Hbeta', strength: -0.25 },
      { id: 'Mgb5169', strength: -0.3 },
      { id: 'Mgb5174', strength: -0.3 },
      { id: 'Mgb5185', strength: -0.3 },
      { id: 'Fe5270', strength: -0.2 },
      { id: 'NaD2', strength: -0.25 },
      { id: 'NaD1', strength: -0.25 },
      { id: 'CaT8500', strength: -0.15 },
      { id: 'CaT8544', strength: -0.25 },
      { id: 'CaT8665', strength: -0.2 },
    ],
  },
  {
    // Broad-line quasar: integrated fluxes relative to Lyα = 100 from the SDSS composite
    // (Vanden Berk et al. 2001, AJ 122, 549, Table 2; from memory), broad σ ≈ 2000 km/s, with
    // narrow [O III] and [O II] on top.
    name: 'qso',
    templateClass: 'qso',
    zMin: 0,
    zMax: 5,
    sigmaKmS: 2000,
    lines: [
      { id: 'OVI', strength: 9 },
      { id: 'Lya', strength: 100, sigmaKmS: 2500 },
      { id: 'NV', strength: 2.5 },
      { id: 'SiIV', strength: 8.9, sigmaKmS: 2500 },
      { id: 'CIV', strength: 25, sigmaKmS: 2500 },
      { id: 'CIII]', strength: 16, sigmaKmS: 2500 },
      { id: 'MgII', strength: 15, sigmaKmS: 2000 },
      { id: 'Hgamma', strength: 4 },
      { id: 'Hbeta', strength: 8.6 },
      { id: 'Halpha', strength: 31 },
      { id: '[OIII]5008', strength: 3.6, sigmaKmS: 250 },
      { id: '[OIII]4960', strength: 3.6 / OIII_DOUBLET_RATIO, sigmaKmS: 250 },
      { id: '[OII]3727', strength: 0.5, sigmaKmS: 250 },
      { id: '[OII]3730', strength: 0.5, sigmaKmS: 250 },
    ],
  },
  {
    // A generic F–K star: absorption depths relative to Hβ (typical values; from memory).
    name: 'star',
    templateClass: 'star',
    zMin: -0.005,
    zMax: 0.005,
    sigmaKmS: 40,
    lines: [
      { id: 'Halpha', strength: -1.0, sigmaKmS: 150 },
      { id: 'Hbeta', strength: -1.0, sigmaKmS: 150 },
      { id: 'Hgamma', strength: -0.9, sigmaKmS: 150 },
      { id: 'Hdelta', strength: -0.8, sigmaKmS: 150 },
      { id: 'Heps', strength: -0.6, sigmaKmS: 150 },
      { id: 'H8', strength: -0.5, sigmaKmS: 150 },
      { id: 'CaK', strength: -1.0, sigmaKmS: 150 },
      { id: 'CaH', strength: -0.7, sigmaKmS: 150 },
      { id: 'Gband', strength: -0.3, sigmaKmS: 300 },
      { id: 'Mgb5169', strength: -0.4 },
      { id: 'Mgb5174', strength: -0.4 },
      { id: 'Mgb5185', strength: -0.4 },
      { id: 'Fe5270', strength: -0.2 },
      { id: 'NaD2', strength: -0.4 },
      { id: 'NaD1', strength: -0.35 },
      { id: 'CaT8500', strength: -0.3 },
      { id: 'CaT8544', strength: -0.5 },
      { id: 'CaT8665', strength: -0.4 },
    ],
  },
];

/** Lines whose strength atomic physics ties to a partner: strength = ratio × partner's. */
export const TIED_LINES: Readonly<Record<string, { partner: string; ratio: number }>> = {
  '[OIII]4960': { partner: '[OIII]5008', ratio: 1 / OIII_DOUBLET_RATIO },
  '[NII]6550': { partner: '[NII]6585', ratio: 1 / NII_DOUBLET_RATIO },
  '[OI]6366': { partner: '[OI]6302', ratio: 1 / OI_DOUBLET_RATIO },
};
