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
  /** When set, this line's flux is r × the flux of `parent`, r free within [min, max]. */
  bounded?: { parent: string; min: number; max: number; start: number; source: string };
}

export interface LineGroup {
  name: string;
  lines: GroupLine[];
  /** Rest-frame window (Å) for the local linear continuum and the fit. */
  windowRestAngstrom: [number, number];
  /** The Balmer line of this group, which gets a stellar absorption and may get a broad component. */
  balmer?: string;
}

function line(id: string, link?: Pick<GroupLine, 'tied' | 'bounded'>): GroupLine {
  return { id, restWaveAngstrom: restLine(id).waveVacuumAngstrom, ...link };
}

/** Parent line of a tied or bounded line, or undefined for a free one. */
export function parentOf(l: GroupLine): string | undefined {
  return l.tied?.parent ?? l.bounded?.parent;
}

// Transition probabilities of Storey & Zeippen (2000, MNRAS 312, 813) give
// [O III] 5008/4960 = 2.98 and [N II] 6585/6550 ≈ 3.05 (the [N II] value as commonly quoted
// from that work; from memory). [O II] and [S II] ratios depend on density: both free.
export const O3_RATIO = 2.98;
export const N2_RATIO = 3.05;
const SZ2000 = 'Storey & Zeippen (2000, MNRAS 312, 813)';
// The density-sensitive doublets stay between their low- and high-density limits:
// [O II] 3730/3727 from 1.5 down to 0.35 and [S II] 6718/6733 from 1.45 down to 0.44
// (Osterbrock & Ferland 2006, Fig. 5.8; from memory). This keeps a blended [O II] pair from
// trading flux between its lines without bound.
const OF2006 = 'Osterbrock & Ferland (2006), low/high-density limits (from memory)';

// Windows are wide enough (≥ ±40 Å rest around the lines) for a linear continuum, and around
// the Balmer lines wide enough (about ±100 Å) to hold the wings of the stellar absorption and
// of a broad component; other emission lines inside a window are masked.
export const LINE_GROUPS: readonly LineGroup[] = [
  { name: '[O II] 3727,3730', lines: [line('[OII]3727'), line('[OII]3730', { bounded: { parent: '[OII]3727', min: 0.35, max: 1.5, start: 1.2, source: OF2006 } })], windowRestAngstrom: [3680, 3780] },
  { name: 'Hβ', lines: [line('Hbeta')], windowRestAngstrom: [4760, 4950], balmer: 'Hbeta' },
  {
    name: '[O III] 4960,5008',
    lines: [line('[OIII]4960', { tied: { parent: '[OIII]5008', ratio: 1 / O3_RATIO, source: SZ2000 } }), line('[OIII]5008')],
    windowRestAngstrom: [4920, 5050],
  },
  { name: '[O I] 6302', lines: [line('[OI]6302')], windowRestAngstrom: [6255, 6345] },
  {
    name: '[N II]+Hα',
    lines: [line('[NII]6550', { tied: { parent: '[NII]6585', ratio: 1 / N2_RATIO, source: SZ2000 } }), line('Halpha'), line('[NII]6585')],
    windowRestAngstrom: [6440, 6690],
    balmer: 'Halpha',
  },
  { name: '[S II] 6718,6733', lines: [line('[SII]6718'), line('[SII]6733', { bounded: { parent: '[SII]6718', min: 1 / 1.45, max: 1 / 0.44, start: 0.75, source: OF2006 } })], windowRestAngstrom: [6685, 6775] },
];
