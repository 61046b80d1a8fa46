/**
 * The targets of the demo night and their model spectra (in the file's own frame, before the
 * atmosphere). Line ratios are typical textbook values, from memory unless a line says so:
 * star-forming hosts near solar metallicity (Hα/Hβ = 3.4, i.e. some dust over the case-B 2.86),
 * a low-metallicity dwarf, a Seyfert 2 well above the Kewley et al. (2001) line, a broad-line
 * QSO, passive hosts with a 4000 Å break, and a K-type star.
 */
import { restLine } from '../../core/redshift/line-list.js';
import {
  addEmission, applyAbsorption, applyBreak, blackbody, powerLaw, restVacuum,
  type AbsorptionLine, type EmissionLine,
} from './physics.js';

export type HostClass = 'star-forming' | 'passive' | 'agn' | 'qso' | 'star';
export type Layout = 'multispec' | 'multispec-gz' | 'image-1d+error' | 'table' | 'csv' | 'truncated';

export interface Target {
  /** Survey number: OBJECT = KRT-26-00NN. */
  number: number;
  hostClass: HostClass;
  /** Redshift in the file's frame (topocentric, vacuum wavelengths). */
  z: number;
  /** Continuum at 6500 Å observed (file flux units). */
  continuum: number;
  /** Hβ flux (file flux units × Å) for emission-line objects. */
  hbetaFlux?: number;
  /** Line-ratio set for emission-line objects. */
  lines?: 'solar' | 'dwarf' | 'seyfert2';
  targetSn: number;
  exptimeS: number;
  decDeg: number;
  /** Hour angle at mid-exposure, hours. */
  hourAngleH: number;
  layout: Layout;
  notes: string;
}

/** [O III] 5008/4960 = 2.98 (Storey & Zeippen 2000, MNRAS 312, 813); [N II] 6585/6550 ≈ 3.05. */
const OIII_RATIO = 2.98;
const NII_RATIO = 3.05;

/** Emission lines relative to Hβ = 1: [O II] pair, [Ne III], Balmer, [O III], [O I], [N II], [S II]. */
const RATIOS: Record<NonNullable<Target['lines']>, { sigmaKmS: number; rel: Record<string, number> }> = {
  solar: {
    sigmaKmS: 60,
    rel: { '[OII]3727': 1.1, '[OII]3730': 1.4, '[NeIII]3870': 0.15, Hdelta: 0.26, Hgamma: 0.47, Hbeta: 1, '[OIII]5008': 0.5, HeI5877: 0.1, '[OI]6302': 0.05, Halpha: 3.4, '[NII]6585': 1.0, '[SII]6718': 0.55, '[SII]6733': 0.4 },
  },
  dwarf: {
    sigmaKmS: 40,
    rel: { '[OII]3727': 0.7, '[OII]3730': 0.9, '[NeIII]3870': 0.4, Hdelta: 0.26, Hgamma: 0.47, '[OIII]4364': 0.05, Hbeta: 1, '[OIII]5008': 4.5, HeI5877: 0.11, Halpha: 2.9, '[NII]6585': 0.15, '[SII]6718': 0.18, '[SII]6733': 0.13 },
  },
  seyfert2: {
    sigmaKmS: 220,
    rel: { '[NeV]3427': 0.5, '[OII]3727': 1.6, '[OII]3730': 1.9, '[NeIII]3870': 1.1, Hgamma: 0.47, HeII4687: 0.25, Hbeta: 1, '[OIII]5008': 10, HeI5877: 0.12, '[OI]6302': 0.5, '[OI]6366': 0.16, Halpha: 3.1, '[NII]6585': 3.4, '[SII]6718': 1.0, '[SII]6733': 0.9 },
  },
};

function emissionLines(set: NonNullable<Target['lines']>, hbeta: number): EmissionLine[] {
  const { sigmaKmS, rel } = RATIOS[set];
  const lines = Object.entries(rel).map(([id, r]) => ({ id, flux: r * hbeta, sigmaKmS }));
  if (rel['[OIII]5008']) lines.push({ id: '[OIII]4960', flux: (rel['[OIII]5008'] * hbeta) / OIII_RATIO, sigmaKmS });
  if (rel['[NII]6585']) lines.push({ id: '[NII]6550', flux: (rel['[NII]6585'] * hbeta) / NII_RATIO, sigmaKmS });
  return lines;
}

/**
 * Stellar absorption (rest EW, Å) of old populations, K stars and young populations. The Balmer
 * lines of an old population are wider than its 220 km/s dispersion: the stars' own line wings
 * spread them over about ±15 Å (the Lick Hβ central band is 28.75 Å wide, Worthey et al. 1994,
 * ApJS 94, 687; from memory), taken here as σ = 500 km/s (8 Å at Hβ).
 */
const OLD_BALMER_SIGMA_KM_S = 500;
const OLD_STARS: AbsorptionLine[] = [
  { id: 'CaK', ewRestAngstrom: 9, sigmaKmS: 220 }, { id: 'CaH', ewRestAngstrom: 8, sigmaKmS: 220 },
  { id: 'Hdelta', ewRestAngstrom: 1.2, sigmaKmS: OLD_BALMER_SIGMA_KM_S }, { id: 'Gband', ewRestAngstrom: 5, sigmaKmS: 600 },
  { id: 'Hgamma', ewRestAngstrom: 1.5, sigmaKmS: OLD_BALMER_SIGMA_KM_S }, { id: 'Hbeta', ewRestAngstrom: 1.5, sigmaKmS: OLD_BALMER_SIGMA_KM_S },
  { id: 'Mgb5169', ewRestAngstrom: 1.5, sigmaKmS: 220 }, { id: 'Mgb5174', ewRestAngstrom: 1.8, sigmaKmS: 220 },
  { id: 'Mgb5185', ewRestAngstrom: 1.7, sigmaKmS: 220 }, { id: 'NaD2', ewRestAngstrom: 2.0, sigmaKmS: 220 },
  { id: 'NaD1', ewRestAngstrom: 1.6, sigmaKmS: 220 }, { id: 'Halpha', ewRestAngstrom: 1.0, sigmaKmS: OLD_BALMER_SIGMA_KM_S },
  { id: 'CaT8500', ewRestAngstrom: 1.0, sigmaKmS: 220 }, { id: 'CaT8544', ewRestAngstrom: 2.8, sigmaKmS: 220 },
  { id: 'CaT8665', ewRestAngstrom: 2.4, sigmaKmS: 220 },
];
const K_STAR: AbsorptionLine[] = [
  { id: 'CaK', ewRestAngstrom: 14, sigmaKmS: 150 }, { id: 'CaH', ewRestAngstrom: 11, sigmaKmS: 150 },
  { id: 'Hdelta', ewRestAngstrom: 2, sigmaKmS: 300 }, { id: 'Gband', ewRestAngstrom: 6, sigmaKmS: 500 },
  { id: 'Hgamma', ewRestAngstrom: 2.5, sigmaKmS: 300 }, { id: 'Hbeta', ewRestAngstrom: 3, sigmaKmS: 300 },
  { id: 'Mgb5169', ewRestAngstrom: 2, sigmaKmS: 30 }, { id: 'Mgb5174', ewRestAngstrom: 2.5, sigmaKmS: 30 },
  { id: 'Mgb5185', ewRestAngstrom: 2.5, sigmaKmS: 30 }, { id: 'NaD2', ewRestAngstrom: 2.5, sigmaKmS: 30 },
  { id: 'NaD1', ewRestAngstrom: 2.0, sigmaKmS: 30 }, { id: 'Halpha', ewRestAngstrom: 2.8, sigmaKmS: 300 },
  { id: 'CaT8500', ewRestAngstrom: 1.2, sigmaKmS: 30 }, { id: 'CaT8544', ewRestAngstrom: 3.2, sigmaKmS: 30 },
  { id: 'CaT8665', ewRestAngstrom: 2.8, sigmaKmS: 30 },
];
const YOUNG_STARS: AbsorptionLine[] = [
  { id: 'CaK', ewRestAngstrom: 1.5, sigmaKmS: 100 }, { id: 'CaH', ewRestAngstrom: 1.0, sigmaKmS: 100 },
  { id: 'Hdelta', ewRestAngstrom: 2.5, sigmaKmS: 600 }, { id: 'Hgamma', ewRestAngstrom: 2, sigmaKmS: 600 },
  { id: 'Hbeta', ewRestAngstrom: 2, sigmaKmS: 600 }, { id: 'Halpha', ewRestAngstrom: 1.5, sigmaKmS: 600 },
];

/**
 * Broad QSO lines: rest EW (Å) and FWHM (km/s), typical of the composite of Vanden Berk et al.
 * (2001, AJ 122, 549), from memory.
 */
const QSO_LINES: { id: string; ewRestAngstrom: number; fwhmKmS: number }[] = [
  { id: 'CIV', ewRestAngstrom: 30, fwhmKmS: 5000 }, { id: 'HeII1640', ewRestAngstrom: 2, fwhmKmS: 3000 },
  { id: 'CIII]', ewRestAngstrom: 18, fwhmKmS: 5500 }, { id: 'MgII', ewRestAngstrom: 32, fwhmKmS: 4000 },
  { id: '[NeV]3427', ewRestAngstrom: 1, fwhmKmS: 600 },
];
const FWHM_TO_SIGMA = 1 / (2 * Math.sqrt(2 * Math.LN2));
const NORM_PIXEL = 1450; // 6500 Å on the instrument grid

function scaled(shape: Float64Array, continuumAt6500: number): Float64Array {
  const k = continuumAt6500 / shape[NORM_PIXEL];
  return shape.map((v) => v * k);
}

/** The target's spectrum on the air grid, in the file's flux units, before the atmosphere. */
export function modelSpectrum(t: Target, grid: Float64Array): Float64Array {
  const rest = restVacuum(grid, t.z);
  let flux: Float64Array;
  switch (t.hostClass) {
    case 'star-forming': {
      flux = blackbody(rest, 9000);
      applyBreak(flux, rest, 3900, 80, 1.25);
      flux = scaled(flux, t.continuum);
      applyAbsorption(flux, grid, t.z, YOUNG_STARS);
      break;
    }
    case 'passive': {
      flux = blackbody(rest, 4300);
      applyBreak(flux, rest, 4000, 25, 1.9);
      flux = scaled(flux, t.continuum);
      applyAbsorption(flux, grid, t.z, OLD_STARS);
      break;
    }
    case 'agn': {
      const host = blackbody(rest, 4800);
      applyBreak(host, rest, 4000, 25, 1.5);
      const nucleus = powerLaw(rest, -1.0);
      flux = scaled(host.map((h, i) => 0.8 * h + 0.2 * nucleus[i]), t.continuum);
      applyAbsorption(flux, grid, t.z, OLD_STARS);
      break;
    }
    case 'qso': {
      flux = scaled(powerLaw(rest, -1.5), t.continuum);
      const continuumAt = (restAngstrom: number) => t.continuum * (restAngstrom / rest[NORM_PIXEL]) ** -1.5;
      for (const line of QSO_LINES) {
        const restWave = restLine(line.id).waveVacuumAngstrom;
        const lineFlux = line.ewRestAngstrom * (1 + t.z) * continuumAt(restWave);
        addEmission(flux, grid, t.z, [{ id: line.id, flux: lineFlux, sigmaKmS: line.fwhmKmS * FWHM_TO_SIGMA }]);
      }
      break;
    }
    case 'star': {
      flux = blackbody(rest, 5200);
      applyBreak(flux, rest, 3950, 40, 1.4);
      flux = scaled(flux, t.continuum);
      applyAbsorption(flux, grid, t.z, K_STAR);
      break;
    }
  }
  if (t.lines && t.hbetaFlux) addEmission(flux, grid, t.z, emissionLines(t.lines, t.hbetaFlux));
  return flux;
}
