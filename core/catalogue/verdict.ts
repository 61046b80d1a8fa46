/** The astronomer's decision on one spectrum (vocabulary of DESIGN.md). */

export const VERDICT_STATUSES = ['accepted', 'revised', 'no-redshift', 'pending'] as const;
export type VerdictStatus = (typeof VERDICT_STATUSES)[number];

export const CONFIDENCES = ['secure', 'likely', 'tentative'] as const;
export type Confidence = (typeof CONFIDENCES)[number];

export const OBJECT_CLASSES = ['galaxy', 'agn', 'qso', 'star', 'unknown'] as const;
export type ObjectClass = (typeof OBJECT_CLASSES)[number];

export interface Verdict {
  /** Path of the spectrum file relative to the worklist folder, '/'-separated. */
  spectrum: string;
  /** HDU the verdict is about (null for text files). */
  hdu: number | null;
  status: VerdictStatus;
  /** Observed-frame redshift as measured on the file's wavelengths; null for no-redshift/pending. */
  z: number | null;
  zErr: number | null;
  confidence: Confidence | null;
  objectClass: ObjectClass;
  /** Template of the chosen candidate, if one was chosen. */
  template: string | null;
  note: string;
  /** When the decision was made, UTC ISO 8601. */
  time: string;
  user: string;
}
