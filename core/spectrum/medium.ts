/**
 * Whether a file's wavelengths are in air or vacuum, and what said so. FITS WCS Paper III
 * (Greisen et al. 2006, A&A 446, 747, §5 and Table 1): CTYPE 'WAVE' = vacuum, 'AWAV' = air.
 * Older headers use AIRORVAC ('air'/'vac'), VACUUM (T/F, e.g. SDSS) or similar keywords.
 */
import type { MediumDecision } from './draft.js';
import type { Keywords } from './keywords.js';

/** Telescopes above the atmosphere calibrate in vacuum (common practice, no source). */
const SPACE_TELESCOPES = /^(HST|JWST|GALEX|IUE|FUSE|SPITZER|EUCLID|ROMAN)\b/i;

/** The file's own evidence, or undefined when the header says nothing. */
export function mediumFromKeywords(k: Keywords, axis = 1): MediumDecision | undefined {
  const ctype = k.string(`CTYPE${axis}`)?.trim().toUpperCase();
  if (ctype?.startsWith('WAVE')) return { medium: 'vacuum', reason: `CTYPE${axis} = '${ctype}' (FITS WCS Paper III: WAVE is vacuum)` };
  if (ctype?.startsWith('AWAV')) return { medium: 'air', reason: `CTYPE${axis} = '${ctype}' (FITS WCS Paper III: AWAV is air)` };
  for (const key of ['AIRORVAC', 'VAC_AIR', 'AIRVAC', 'WAVEMEDI', 'WAVE_MED', 'WAVETYPE']) {
    const v = k.string(key)?.trim().toLowerCase();
    if (v?.startsWith('vac')) return { medium: 'vacuum', reason: `${key} = '${v}'` };
    if (v?.startsWith('air')) return { medium: 'air', reason: `${key} = '${v}'` };
  }
  const vacuum = k.bool('VACUUM');
  if (vacuum !== undefined) return { medium: vacuum ? 'vacuum' : 'air', reason: `VACUUM = ${vacuum ? 'T' : 'F'}` };
  const air = k.bool('AIR');
  if (air !== undefined) return { medium: air ? 'air' : 'vacuum', reason: `AIR = ${air ? 'T' : 'F'}` };
  const telescope = k.string('TELESCOP')?.trim();
  if (telescope && SPACE_TELESCOPES.test(telescope)) {
    return { medium: 'vacuum', reason: `TELESCOP = '${telescope}' is in space, where wavelengths are vacuum` };
  }
  return undefined;
}

/** Evidence in a column or header-row name such as 'wave_air', 'AWAV' or 'vacuum_wavelength'. */
export function mediumFromName(name: string): MediumDecision | undefined {
  const n = name.toLowerCase();
  if (/(^|[^a-z])(air|awav)([^a-z]|$)|^awav/.test(n)) return { medium: 'air', reason: `the wavelength column is named '${name}'` };
  if (/(^|[^a-z])(vac|vacuum)([^a-z]|$)/.test(n)) return { medium: 'vacuum', reason: `the wavelength column is named '${name}'` };
  return undefined;
}

/**
 * When nothing in the file says: ground-based optical reductions conventionally calibrate in
 * air (common practice, no source), so air is assumed and the reason says so.
 */
export const ASSUMED_AIR: MediumDecision = {
  medium: 'air',
  reason: 'assumed air: nothing in the file says, and ground-based optical spectra are usually calibrated in air (override with --vacuum, or in the window under "measure again")',
  source: 'assumed',
};

export function userMedium(medium: 'air' | 'vacuum'): MediumDecision {
  return { medium, reason: 'set by the user, whatever the file says', source: 'user' };
}
