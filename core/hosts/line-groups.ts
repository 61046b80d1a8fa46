/**
 * The emission-line groups zvet fits together: lines close enough to blend share one velocity
 * offset and one width, and doublets whose ratio atomic physics fixes share one flux parameter.
 */
import { restLine } from '../redshift/line-list.js';

export interface GroupLine {
  /** Line id from the rest-frame line list. */
  id: string;
  restWaveAngstrom: number;
  /** When set, this line's flux is `ratio` × the flux of line `parent` (not a free parameter). */
  tied?: { parent: string; ratio: number; source: string };
}

export interface LineGroup {
  name: string;
  lines: GroupLine[];
  /** Rest-frame window (Å) for the local linear continuum and the fit. */
  windowRestAngstrom: [number, number];
  /** The Balmer line of this group, which gets a stellar absorption and may get a broad component. */
  balmer?: string;
}

function line(id: string, tied?: GroupLine['tied']): GroupLine {
  return { id, restWaveAngstrom: restLine(id).waveVacuumAngstrom, ...(tied ? { tied } : {}) };
}

// Transition probabilities of Storey & Zeippen (2000, MNRAS 312, 813) give
// [O III] 5008/4960 = 2.98 and [N II] 6585/6550 ≈ 3.05 (the [N II] value as commonly quoted
// from that work; from memory). [O II] and [S II] ratios depend on density: both free.
export const O3_RATIO = 2.98;
export const N2_RATIO = 3.05;
const SZ2000 = 'Storey & Zeippen (2000, MNRAS 312, 813)';

// Windows are wide enough (≥ ±40 Å rest around the lines) for a linear continuum, and around
// the Balmer lines wide enough (about ±100 Å) to hold the wings of the stellar absorption and
// of a broad component; other emission lines inside a window are masked.
export const LINE_GROUPS: readonly LineGroup[] = [
  { name: '[O II] 3727,3730', lines: [line('[OII]3727'), line('[OII]3730')], windowRestAngstrom: [3680, 3780] },
  { name: 'Hβ', lines: [line('Hbeta')], windowRestAngstrom: [4760, 4950], balmer: 'Hbeta' },
  {
    name: '[O III] 4960,5008',
    lines: [line('[OIII]4960', { parent: '[OIII]5008', ratio: 1 / O3_RATIO, source: SZ2000 }), line('[OIII]5008')],
    windowRestAngstrom: [4920, 5050],
  },
  { name: '[O I] 6302', lines: [line('[OI]6302')], windowRestAngstrom: [6255, 6345] },
  {
    name: '[N II]+Hα',
    lines: [line('[NII]6550', { parent: '[NII]6585', ratio: 1 / N2_RATIO, source: SZ2000 }), line('Halpha'), line('[NII]6585')],
    windowRestAngstrom: [6440, 6690],
    balmer: 'Halpha',
  },
  { name: '[S II] 6718,6733', lines: [line('[SII]6718'), line('[SII]6733')], windowRestAngstrom: [6685, 6775] },
];
