/**
 * Public shapes of the redshift engine. Redshifts are dimensionless (z = λ_obs/λ_rest − 1) in
 * the frame of the spectrum's wavelengths; an automatic redshift is a suggestion until a person
 * vets it.
 */

/** Object classes the built-in templates stand for. */
export type TemplateClass = 'star-forming' | 'passive' | 'agn' | 'qso' | 'star' | 'user';

/** One redshift solution from the cross-correlation. */
export interface Candidate {
  /** Redshift (dimensionless). */
  z: number;
  /** 1σ redshift error (Tonry & Davis 1979 for correlation candidates; fit covariance when refined). */
  zErr: number;
  /** Tonry–Davis r = h/(√2·σ_a) of the correlation peak (dimensionless). */
  r: number;
  /** Name of the template that gave the peak. */
  template: string;
  templateClass: TemplateClass;
  /** Fraction (0–1) of the spectrum's good pixels that the template covers at this z. */
  overlap: number;
  /** Ids of the template's lines (core/redshift/line-list.ts) that fall in the observed range. */
  lines: string[];
}

export type Confidence = 'secure' | 'likely' | 'tentative' | 'none';

export interface Refinement {
  /** 'line-fit': joint Gaussian fit of the lines at one z; 'template-chi2': χ² on a fine z grid. */
  method: 'line-fit' | 'template-chi2' | 'none';
  /** Reduced χ² of the refinement fit (dimensionless), null when not refined. */
  chi2Red: number | null;
  nLinesFitted: number;
}

export interface CorrelationCurve {
  template: string;
  /** Redshift of each lag. */
  z: number[];
  /** Correlation coefficient normalised over the overlap (−1…1). */
  value: number[];
}

export interface Measurement {
  /** Best first, distinct in z. */
  candidates: Candidate[];
  /** The first candidate after refinement (z, zErr refined), or null when there is none. */
  best: Candidate | null;
  refinement: Refinement;
  /** Automatic suggestion in the verdict words; 'none' when nothing is credible. */
  confidence: Confidence;
  /** Lines detected (S/N ≥ 3 with the expected sign) at the best redshift. */
  nLines: number;
  /** Only when asked for; each curve downsampled to at most about 2000 points. */
  correlations?: CorrelationCurve[];
  notes: string[];
}

/** One line of a user line list (rest frame, vacuum). */
export interface UserLine {
  id: string;
  label?: string;
  waveVacuumAngstrom: number;
  kind: 'emission' | 'absorption';
  /** Relative strength (integrated flux or depth, any scale); default 1. */
  strength?: number;
}

/** A user template made from a line list. */
export interface UserLineTemplate {
  name: string;
  /** Gaussian σ of every line, km/s; default 150. */
  sigmaKmS?: number;
  zMin?: number;
  zMax?: number;
  lines: UserLine[];
}

/** A user template given as a rest-frame spectrum (vacuum Å, any flux unit). */
export interface UserSpectrumTemplate {
  name: string;
  waveRestAngstrom: Float64Array;
  flux: Float64Array;
  zMin?: number;
  zMax?: number;
}

export interface MeasureOptions {
  /** Template names to use (built-in or user); default all built-in plus the user ones. */
  templates?: string[];
  /** Override every template's lower z limit. */
  zmin?: number;
  /** Override every template's upper z limit. */
  zmax?: number;
  /** Mask the telluric O₂ A and B bands (observed frame); default true. */
  maskTelluric?: boolean;
  /** Mask bright night-sky line residuals (observed frame); default true. */
  maskSky?: boolean;
  /** Number of distinct candidates to keep; default 5. */
  maxCandidates?: number;
  /** Return the correlation curves (downsampled) too; default false. */
  withCorrelation?: boolean;
  userLineTemplates?: UserLineTemplate[];
  userSpectrumTemplates?: UserSpectrumTemplate[];
}
