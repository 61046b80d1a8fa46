/**
 * Conventions of surveys whose files do not state everything in their headers, each with the
 * documentation that states it.
 */
import type { Keywords } from '../keywords.js';
import type { SurveyDefaults } from './layout.js';

/** SDSS spectra: vacuum wavelengths in the heliocentric frame (SDSS data model for spec and spSpec files). */
export function sdssDefaults(k: Keywords): SurveyDefaults | undefined {
  const telescope = k.string('TELESCOP')?.trim() ?? '';
  if (!/^SDSS/i.test(telescope)) return undefined;
  return {
    medium: { medium: 'vacuum', reason: `TELESCOP = '${telescope}': SDSS spectra are in vacuum (SDSS data model)` },
    frame: {
      velocityFrame: 'heliocentric',
      velocityFrameReason: `TELESCOP = '${telescope}': SDSS spectra are heliocentric (SDSS data model)`,
    },
  };
}

/**
 * GALAH reduced spectra (HDUs 'normalized', 'relative_error', 'sky', …): wavelengths already
 * barycentric (GALAH DR documentation; Kos et al. 2017, MNRAS 464, 1259); the files do not say
 * air or vacuum, and GALAH conventionally uses air wavelengths.
 */
export const GALAH_DEFAULTS: SurveyDefaults = {
  medium: { medium: 'air', reason: 'GALAH layout: the files do not say; GALAH conventionally uses air wavelengths' },
  frame: {
    velocityFrame: 'barycentric',
    velocityFrameReason: 'GALAH layout: GALAH wavelengths are already barycentric (GALAH documentation)',
  },
};

/**
 * Slitless-grism tables with contam and sensitivity columns (3D-HST, HST/WFC3; Brammer et al.
 * 2012): observed from space, so the wavelengths are vacuum.
 */
export const GRISM_DEFAULTS: SurveyDefaults = {
  medium: { medium: 'vacuum', reason: 'slitless-grism table (contam, sensitivity: 3D-HST, HST/WFC3 from space): vacuum wavelengths' },
};

/** PypeIt products (spec1d, coadd1d) carry PYP_SPEC, the spectrograph's name (PypeIt data model). */
export function isPypeIt(k: Keywords): boolean {
  return k.string('PYP_SPEC') !== undefined;
}

/** PypeIt: "All wavelengths are in vacuum" (PypeIt documentation, OneSpec and SpecObj data models). */
export const PYPEIT_DEFAULTS: SurveyDefaults = {
  medium: { medium: 'vacuum', reason: 'PYP_SPEC: PypeIt writes vacuum wavelengths (PypeIt data model)' },
};
