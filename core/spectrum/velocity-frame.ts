/**
 * The velocity frame a file's wavelengths are already in. FITS WCS Paper III (Greisen et al.
 * 2006, §7.2, Table 7): SPECSYS = TOPOCENT, GEOCENTR, BARYCENT, HELIOCEN, LSRK, …; older
 * headers use VELFRAME or record an applied correction (HELIO_RV, HELIOCOR, BARYCORR, VHELIO,
 * IRAF's DOPCORnn). Survey layouts that document their frame pass it in as surveyFrame.
 */
import type { Keywords } from './keywords.js';
import type { VelocityFrame } from './spectrum.js';

export interface FrameDecision {
  velocityFrame: VelocityFrame;
  velocityFrameReason: string;
}

const SPECSYS: Record<string, VelocityFrame> = {
  TOPOCENT: 'topocentric',
  BARYCENT: 'barycentric',
  HELIOCEN: 'heliocentric',
};

/** Keywords whose presence records that a correction was applied to the wavelengths. */
const APPLIED_CORRECTIONS: Array<[string, VelocityFrame]> = [
  ['BARYCORR', 'barycentric'],
  ['BARY_RV', 'barycentric'],
  ['HELIO_RV', 'heliocentric'],
  ['HELIOCOR', 'heliocentric'],
  ['VHELIO', 'heliocentric'],
];

export function velocityFrameOf(k: Keywords, surveyFrame?: FrameDecision): FrameDecision {
  // VEL_TYPE: the correction PypeIt applied to its wavelengths ('heliocentric', 'barycentric').
  for (const key of ['SPECSYS', 'VELFRAME', 'SSYSOBS', 'VEL_TYPE']) {
    const v = k.string(key)?.trim().toUpperCase();
    if (!v) continue;
    const frame = SPECSYS[v.slice(0, 8)] ?? (v.startsWith('HELIO') ? 'heliocentric' : v.startsWith('BARY') ? 'barycentric' : v.startsWith('TOPO') ? 'topocentric' : undefined);
    if (frame) return { velocityFrame: frame, velocityFrameReason: `${key} = '${v}'` };
    if (key !== 'SSYSOBS') return { velocityFrame: 'unknown', velocityFrameReason: `${key} = '${v}' is a frame zvet does not use` };
  }
  if (surveyFrame) return surveyFrame;
  for (const [key, frame] of APPLIED_CORRECTIONS) {
    if (k.number(key) !== undefined) {
      return { velocityFrame: frame, velocityFrameReason: `${key} = ${k.number(key)} records a ${frame} correction` };
    }
  }
  return {
    velocityFrame: 'unknown',
    velocityFrameReason: 'no SPECSYS or correction keyword: assume the wavelengths are as observed (topocentric) unless you know otherwise',
  };
}
