/**
 * The observation metadata later steps need (frames, distances, display), read from header
 * keywords: object name, target position, start time, exposure, site and velocity frame.
 */
import { firstNumber, firstString, type Keywords } from './keywords.js';
import { averageTime, observationTime } from './observation-time.js';
import { angleDeg } from './sexagesimal.js';
import { siteOf } from './site.js';
import type { SpectrumMeta } from './spectrum.js';
import { velocityFrameOf, type FrameDecision } from './velocity-frame.js';

/**
 * Target position keywords, most specific first: fibre plug position (SDSS), object
 * positions, then the generic RA/DEC (which some observatories use for the pointing).
 */
const POSITION_KEYS: Array<[string, string]> = [
  ['PLUG_RA', 'PLUG_DEC'],
  ['RA_OBJ', 'DEC_OBJ'],
  ['RA_TARG', 'DEC_TARG'],
  ['OBJRA', 'OBJDEC'],
  ['RA_OBS', 'DEC_OBS'],
  ['RA', 'DEC'],
  ['OBJCTRA', 'OBJCTDEC'],
  ['RADEG', 'DECDEG'],
  ['MEANRA', 'MEANDEC'],
];

export function metadataOf(k: Keywords, surveyFrame?: FrameDecision): SpectrumMeta {
  const meta: SpectrumMeta = { ...velocityFrameOf(k, surveyFrame) };
  const object = firstString(k, ['OBJECT', 'OBJNAME', 'OBJ_NAME', 'TARGNAME'])?.value;
  if (object) meta.object = object;
  let refused: string | null = null;
  for (const [raKey, decKey] of POSITION_KEYS) {
    const raValue = k.value(raKey);
    const decValue = k.value(decKey);
    if (raValue === undefined && decValue === undefined) continue;
    // Sexagesimal RA strings count hours; plain numbers are degrees.
    const ra = angleDeg(raValue, true);
    const dec = angleDeg(decValue, false);
    // Exactly (0, 0) is a placeholder (e.g. GALAH solar spectra), not a position.
    if (ra !== undefined && dec !== undefined && ra >= 0 && ra < 360 && Math.abs(dec) <= 90) {
      if (ra === 0 && dec === 0) continue;
      meta.raDeg = ra;
      meta.decDeg = dec;
      break;
    }
    refused ??= `${raKey} = ${JSON.stringify(raValue ?? null)}, ${decKey} = ${JSON.stringify(decValue ?? null)} is not a sky position (RA 0–360° or 0–24 h, Dec −90…+90°): ignored`;
  }
  if (meta.raDeg === undefined && refused) meta.positionWarning = refused;
  const time = observationTime(k);
  if (time) Object.assign(meta, time);
  const average = averageTime(k);
  if (average) Object.assign(meta, average);
  const exposure = firstNumber(k, ['EXPTIME', 'EXPOSURE', 'EXPOSED', 'TEXPTIME', 'ITIME']);
  if (exposure && exposure.value >= 0) meta.exposureS = exposure.value;
  const site = siteOf(k);
  if (site) meta.site = site;
  return meta;
}
