/**
 * Rest-frame vacuum wavelengths (Å) of the lines zvet draws, fits and correlates against.
 *
 * Source, unless a line says otherwise: the SDSS spectroscopic pipeline's vacuum line table
 * (as published with the SDSS data releases, e.g. DR7 "Spectroscopic line list"), values from
 * memory of that table; each agrees with the NIST Atomic Spectra Database vacuum wavelength to
 * better than 0.1 Å where NIST lists the transition. Check values from DESIGN.md: Hα 6564.61,
 * [O III] 5008.24, Hβ 4862.68 (vacuum).
 */

/** 'both': seen in emission (nebular, AGN) and in absorption (stellar atmospheres). */
export type LineKind = 'emission' | 'absorption' | 'both';

export interface RestLine {
  /** Stable identifier, ASCII: used in files and on the command line. */
  id: string;
  /** Label shown to people. */
  label: string;
  waveVacuumAngstrom: number;
  kind: LineKind;
  /** Where the wavelength comes from, when not the table named above. */
  source?: string;
}

export const REST_LINES: readonly RestLine[] = [
  { id: 'OVI', label: 'O VI', waveVacuumAngstrom: 1033.82, kind: 'emission', source: 'mean of the O VI 1031.93/1037.62 Å doublet, NIST ASD vacuum (from memory)' },
  { id: 'Lyb', label: 'Lyβ', waveVacuumAngstrom: 1025.72, kind: 'emission' },
  { id: 'Lya', label: 'Lyα', waveVacuumAngstrom: 1215.67, kind: 'emission' },
  { id: 'NV', label: 'N V', waveVacuumAngstrom: 1240.81, kind: 'emission' },
  { id: 'OI1305', label: 'O I', waveVacuumAngstrom: 1305.53, kind: 'emission' },
  { id: 'CII1335', label: 'C II', waveVacuumAngstrom: 1335.31, kind: 'emission' },
  { id: 'SiIV', label: 'Si IV+O IV]', waveVacuumAngstrom: 1399.8, kind: 'emission' },
  { id: 'CIV', label: 'C IV', waveVacuumAngstrom: 1549.48, kind: 'emission' },
  { id: 'HeII1640', label: 'He II', waveVacuumAngstrom: 1640.4, kind: 'emission' },
  { id: 'CIII]', label: 'C III]', waveVacuumAngstrom: 1908.73, kind: 'emission' },
  { id: 'CII]2326', label: 'C II]', waveVacuumAngstrom: 2326.0, kind: 'emission' },
  { id: 'MgII', label: 'Mg II', waveVacuumAngstrom: 2799.12, kind: 'emission' },
  { id: '[NeV]3427', label: '[Ne V]', waveVacuumAngstrom: 3426.85, kind: 'emission' },
  { id: '[OII]3727', label: '[O II]', waveVacuumAngstrom: 3727.09, kind: 'emission' },
  { id: '[OII]3730', label: '[O II]', waveVacuumAngstrom: 3729.88, kind: 'emission' },
  { id: 'H10', label: 'H10', waveVacuumAngstrom: 3798.98, kind: 'both', source: 'NIST ASD H I 3797.90 Å air, converted to vacuum (from memory)' },
  { id: 'H9', label: 'H9', waveVacuumAngstrom: 3836.47, kind: 'both', source: 'NIST ASD H I 3835.38 Å air, converted to vacuum (from memory)' },
  { id: '[NeIII]3870', label: '[Ne III]', waveVacuumAngstrom: 3869.85, kind: 'emission' },
  { id: 'H8', label: 'H8', waveVacuumAngstrom: 3890.15, kind: 'both', source: 'NIST ASD H I 3889.05 Å air, converted to vacuum (from memory)' },
  { id: 'CaK', label: 'Ca II K', waveVacuumAngstrom: 3934.78, kind: 'absorption' },
  { id: 'CaH', label: 'Ca II H', waveVacuumAngstrom: 3969.59, kind: 'absorption' },
  { id: 'Heps', label: 'Hε', waveVacuumAngstrom: 3971.2, kind: 'both' },
  { id: 'Hdelta', label: 'Hδ', waveVacuumAngstrom: 4102.89, kind: 'both' },
  { id: 'Gband', label: 'G band', waveVacuumAngstrom: 4305.61, kind: 'absorption' },
  { id: 'Hgamma', label: 'Hγ', waveVacuumAngstrom: 4341.68, kind: 'both' },
  { id: '[OIII]4364', label: '[O III]', waveVacuumAngstrom: 4364.44, kind: 'emission' },
  { id: 'HeII4687', label: 'He II', waveVacuumAngstrom: 4687.02, kind: 'emission' },
  { id: 'Hbeta', label: 'Hβ', waveVacuumAngstrom: 4862.68, kind: 'both' },
  { id: '[OIII]4960', label: '[O III]', waveVacuumAngstrom: 4960.3, kind: 'emission' },
  { id: '[OIII]5008', label: '[O III]', waveVacuumAngstrom: 5008.24, kind: 'emission' },
  { id: 'Mgb5169', label: 'Mg b', waveVacuumAngstrom: 5168.76, kind: 'absorption', source: 'NIST ASD Mg I 5167.32 Å air, converted to vacuum (from memory)' },
  { id: 'Mgb5174', label: 'Mg b', waveVacuumAngstrom: 5174.13, kind: 'absorption', source: 'NIST ASD Mg I 5172.68 Å air, converted to vacuum (from memory)' },
  { id: 'Mgb5185', label: 'Mg b', waveVacuumAngstrom: 5185.05, kind: 'absorption', source: 'NIST ASD Mg I 5183.60 Å air, converted to vacuum (from memory)' },
  { id: 'Fe5270', label: 'Fe I', waveVacuumAngstrom: 5270.99, kind: 'absorption', source: 'NIST ASD Fe I 5269.54 Å air (centre of the Lick Fe5270 feature), converted to vacuum (from memory)' },
  { id: 'HeI5877', label: 'He I', waveVacuumAngstrom: 5877.29, kind: 'emission' },
  { id: 'NaD2', label: 'Na D', waveVacuumAngstrom: 5891.58, kind: 'absorption', source: 'NIST ASD Na I D2 5889.95 Å air, converted to vacuum (from memory)' },
  { id: 'NaD1', label: 'Na D', waveVacuumAngstrom: 5897.56, kind: 'absorption', source: 'NIST ASD Na I D1 5895.92 Å air, converted to vacuum (from memory)' },
  { id: '[OI]6302', label: '[O I]', waveVacuumAngstrom: 6302.05, kind: 'emission' },
  { id: '[OI]6366', label: '[O I]', waveVacuumAngstrom: 6365.54, kind: 'emission' },
  { id: '[NII]6550', label: '[N II]', waveVacuumAngstrom: 6549.86, kind: 'emission' },
  { id: 'Halpha', label: 'Hα', waveVacuumAngstrom: 6564.61, kind: 'both' },
  { id: '[NII]6585', label: '[N II]', waveVacuumAngstrom: 6585.27, kind: 'emission' },
  { id: '[SII]6718', label: '[S II]', waveVacuumAngstrom: 6718.29, kind: 'emission' },
  { id: '[SII]6733', label: '[S II]', waveVacuumAngstrom: 6732.67, kind: 'emission' },
  { id: '[ArIII]7138', label: '[Ar III]', waveVacuumAngstrom: 7137.77, kind: 'emission', source: 'NIST ASD [Ar III] 7135.79 Å air, converted to vacuum (from memory)' },
  { id: 'CaT8500', label: 'Ca II', waveVacuumAngstrom: 8500.36, kind: 'absorption' },
  { id: 'CaT8544', label: 'Ca II', waveVacuumAngstrom: 8544.44, kind: 'absorption' },
  { id: 'CaT8665', label: 'Ca II', waveVacuumAngstrom: 8664.52, kind: 'absorption' },
  { id: '[SIII]9071', label: '[S III]', waveVacuumAngstrom: 9071.1, kind: 'emission', source: 'NIST ASD [S III] 9068.6 Å air, converted to vacuum (from memory)' },
  { id: '[SIII]9533', label: '[S III]', waveVacuumAngstrom: 9533.2, kind: 'emission', source: 'NIST ASD [S III] 9530.6 Å air, converted to vacuum (from memory)' },
];

const byId = new Map(REST_LINES.map((l) => [l.id, l]));

/** Hydrogen's Lyman and Balmer lines: one ion, H I, whatever their labels. */
const HYDROGEN = new Set(['Lyb', 'Lya', 'H10', 'H9', 'H8', 'Heps', 'Hdelta', 'Hgamma', 'Hbeta', 'Halpha']);

/**
 * The ion a line comes from ('H I', '[O III]', 'He II', …; a line of a user's list that is not in
 * this table is an ion of its own). Lines of one ion come from the same gas and share its
 * velocity; lines of different ions may not.
 */
export function lineIon(id: string): string {
  return HYDROGEN.has(id) ? 'H I' : (byId.get(id)?.label ?? id);
}

/** The line with this id; throws for an unknown id (a programming error). */
export function restLine(id: string): RestLine {
  const line = byId.get(id);
  if (!line) throw new Error(`unknown line id ${id}`);
  return line;
}
