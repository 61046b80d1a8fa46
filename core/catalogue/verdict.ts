/** The astronomer's decision on one spectrum (vocabulary of DESIGN.md). */

export const VERDICT_STATUSES = ['accepted', 'revised', 'no-redshift', 'pending'] as const;
export type VerdictStatus = (typeof VERDICT_STATUSES)[number];

export const CONFIDENCES = ['secure', 'likely', 'tentative'] as const;
export type Confidence = (typeof CONFIDENCES)[number];

export const OBJECT_CLASSES = ['galaxy', 'agn', 'qso', 'star', 'unknown'] as const;
export type ObjectClass = (typeof OBJECT_CLASSES)[number];

/** What a user can say the file's wavelengths are, whatever the file says. */
export const WAVELENGTH_MEDIA = ['air', 'vacuum'] as const;

export interface Verdict {
  /** Path of the spectrum file relative to the worklist folder, '/'-separated. */
  spectrum: string;
  /** HDU the verdict is about (null for text files). */
  hdu: number | null;
  status: VerdictStatus;
  /** Observed-frame redshift as measured on the file's wavelengths (in vacuum); null for no-redshift/pending. */
  z: number | null;
  zErr: number | null;
  confidence: Confidence | null;
  objectClass: ObjectClass;
  /** Template of the chosen candidate, if one was chosen. */
  template: string | null;
  note: string;
  /** The medium the user set for the file's wavelengths, when it was not the file's own (or zvet's assumption): the z holds for that reading. */
  medium?: (typeof WAVELENGTH_MEDIA)[number];
  /** When the decision was made, UTC ISO 8601. */
  time: string;
  user: string;
}
