/**
 * Puts a measured redshift into the frames science needs and says what was done and why:
 * barycentric (from the observation time, target and site) unless the file's wavelengths are
 * already heliocentric or barycentric, never twice; then the CMB frame and, with a cosmology,
 * the distances. The window's derived-quantities panel and `zvet measure` call this.
 */
import type { Site, SpectrumMeta } from '../spectrum/spectrum.js';
import { applyVelocityCorrection, barycentricCorrection } from './barycentric.js';
import { zCmbFromHelio } from './cmb.js';
import { distances, type CosmologyModel, type Distances } from './cosmology.js';
import { distanceErrors, type DistanceErrors } from './distance-errors.js';
import { resolveSite, type ResolvedSite } from './sites.js';
import { isoUtcFromMjd, mjdFromIsoUtc } from './time.js';

export interface FrameInput {
  zObs: number;
  zErr?: number;
  meta: SpectrumMeta;
  /** Site to use when the header names none (from the settings). */
  site?: Site;
  cosmology?: CosmologyModel;
}

export interface FrameResult {
  zObs: number;
  /** Barycentric z, when corrected here or when the file was already barycentric. */
  zBary: number | null;
  /** Heliocentric z, when corrected here or when the file was already heliocentric. */
  zHelio: number | null;
  /** CMB-frame z, from zBary (else zHelio); null without a target position or a corrected z. */
  zCmb: number | null;
  /** 1σ error of the frame z (the input error scaled with 1 + z); null without an input error. */
  zErr: number | null;
  /** What this call did to the redshift. */
  correction: 'barycentric' | 'none';
  /** Frame of the best z here (zBary, zHelio, else zObs). */
  frame: 'barycentric' | 'heliocentric' | 'topocentric';
  /** Barycentric correction applied, km/s (astropy's convention: added to the velocity). */
  vCorrKmS: number | null;
  /** Heliocentric correction, km/s, when the barycentric one was computed. */
  vHelioKmS: number | null;
  /** Mid-exposure time used, ISO 8601 UTC. */
  midExposureUtc: string | null;
  /** Plain-words account of the frame decision and its evidence. */
  reason: string;
  /** Distances at zCmb (else the frame z) when a cosmology was given and that z is ≥ 0. */
  distances?: Distances;
  /** 1σ errors of D_L and the distance modulus, from zErr and a typical peculiar velocity. */
  distanceErrors?: DistanceErrors;
  /** Which z the distances were computed from. */
  distancesFrom?: 'cmb' | 'barycentric' | 'heliocentric' | 'topocentric';
}

function signedKmS(v: number): string {
  return `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(3)} km/s`;
}

/** Mid-exposure UTC MJD from the header times, with a note on how it was found. */
function midExposure(meta: SpectrumMeta): { mjdUtc: number; note: string } | { missing: string } {
  if (Number.isFinite(meta.mjdAvg)) return { mjdUtc: meta.mjdAvg!, note: `mid-exposure from ${meta.avgTimeFrom ?? 'MJD-AVG'} (the header's average time)` };
  let start: number;
  let from: string;
  if (Number.isFinite(meta.mjdObs)) {
    start = meta.mjdObs!;
    from = 'MJD-OBS';
  } else if (meta.dateObsUtc) {
    try {
      start = mjdFromIsoUtc(meta.dateObsUtc);
    } catch (err) {
      return { missing: `unreadable observation time (${(err as Error).message})` };
    }
    from = 'DATE-OBS';
  } else {
    return { missing: meta.obsTimeWarning ? `no observation time: ${meta.obsTimeWarning}` : 'no observation time' };
  }
  from = meta.obsTimeFrom ?? from;
  const warning = meta.obsTimeWarning ? ` (warning: ${meta.obsTimeWarning})` : '';
  if (Number.isFinite(meta.exposureS) && meta.exposureS! >= 0) {
    return { mjdUtc: start + meta.exposureS! / 2 / 86400, note: `mid-exposure from ${from} + EXPTIME/2${warning}` };
  }
  return { mjdUtc: start, note: `start time from ${from} (no exposure time, so not the mid-exposure)${warning}` };
}

function chooseSite(input: FrameInput): { site: ResolvedSite; note: string } | null {
  const fromHeader = resolveSite(input.meta.site);
  if (fromHeader) return { site: fromHeader.site, note: `site ${fromHeader.site.name} from the header (${fromHeader.note})` };
  const fromSettings = resolveSite(input.site);
  if (fromSettings) return { site: fromSettings.site, note: `site ${fromSettings.site.name} from the settings (${fromSettings.note})` };
  return null;
}

type FrameCore = Omit<FrameResult, 'zCmb' | 'zErr' | 'distances' | 'distanceErrors' | 'distancesFrom'>;

function decideFrame(input: FrameInput): FrameCore {
  const { zObs, meta } = input;
  const blank = { zObs, zBary: null, zHelio: null, vCorrKmS: null, vHelioKmS: null, midExposureUtc: null };
  if (meta.velocityFrame === 'heliocentric') {
    return { ...blank, zHelio: zObs, correction: 'none', frame: 'heliocentric', reason: `wavelengths already heliocentric (${meta.velocityFrameReason}); not corrected again` };
  }
  if (meta.velocityFrame === 'barycentric') {
    return { ...blank, zBary: zObs, correction: 'none', frame: 'barycentric', reason: `wavelengths already barycentric (${meta.velocityFrameReason}); not corrected again` };
  }
  const stated = meta.velocityFrame === 'topocentric'
    ? `wavelengths topocentric (${meta.velocityFrameReason})`
    : `frame not stated (${meta.velocityFrameReason}), taken as topocentric`;
  const time = midExposure(meta);
  const hasTarget = Number.isFinite(meta.raDeg) && Number.isFinite(meta.decDeg);
  const site = chooseSite(input);
  const missing = [
    'missing' in time ? time.missing : null,
    hasTarget ? null : meta.positionWarning ? `no target RA/Dec (${meta.positionWarning})` : 'no target RA/Dec',
    site ? null : 'no observing site',
  ].filter((m): m is string => m !== null);
  if ('missing' in time || !hasTarget || !site) {
    return { ...blank, correction: 'none', frame: 'topocentric', reason: `not corrected: ${missing.join(', ')}; ${stated}, so z includes the Earth's motion (up to ±30 km/s)` };
  }
  const bary = barycentricCorrection({ raDeg: meta.raDeg!, decDeg: meta.decDeg!, mjdUtc: time.mjdUtc, site: site.site });
  const midExposureUtc = isoUtcFromMjd(time.mjdUtc);
  return {
    zObs,
    zBary: applyVelocityCorrection(zObs, bary.vCorrKmS),
    zHelio: applyVelocityCorrection(zObs, bary.vHelioKmS),
    vCorrKmS: bary.vCorrKmS,
    vHelioKmS: bary.vHelioKmS,
    midExposureUtc,
    correction: 'barycentric',
    frame: 'barycentric',
    reason: `barycentric correction ${signedKmS(bary.vCorrKmS)} applied: ${stated}; ${time.note} (${midExposureUtc}), target RA/Dec from the header, ${site.note}`,
  };
}

/** Decides and applies the frame correction, the CMB frame and (optionally) the distances. */
export function correctFrames(input: FrameInput): FrameResult {
  if (!Number.isFinite(input.zObs) || input.zObs <= -1) throw new RangeError(`redshift ${input.zObs} is not a number above −1`);
  const core = decideFrame(input);
  const { meta } = input;
  const zFrame = core.zBary ?? core.zHelio ?? core.zObs;
  const hasTarget = Number.isFinite(meta.raDeg) && Number.isFinite(meta.decDeg);
  const corrected = core.zBary !== null || core.zHelio !== null;
  const zCmb = hasTarget && corrected ? zCmbFromHelio(zFrame, meta.raDeg!, meta.decDeg!) : null;
  const zErr = Number.isFinite(input.zErr) ? input.zErr! * ((1 + zFrame) / (1 + core.zObs)) : null;
  let reason = core.reason;
  if (zCmb === null) reason += corrected ? '; no CMB-frame z without the target RA/Dec' : '; no CMB-frame z from an uncorrected z';
  const result: FrameResult = { ...core, zCmb, zErr, reason };
  if (!input.cosmology) return result;
  const distancesFrom = zCmb !== null ? 'cmb' : core.frame;
  const zDist = zCmb ?? zFrame;
  if (zDist < 0) return { ...result, reason: `${reason}; no distances for a negative redshift` };
  const d = distances(zDist, input.cosmology);
  return { ...result, distances: d, distanceErrors: distanceErrors(d, zErr, input.cosmology), distancesFrom };
}

/** correctFrames, or null where the header's values cannot be used (a bad RA/Dec or time). */
export function framesOrNull(input: FrameInput): FrameResult | null {
  try {
    return correctFrames(input);
  } catch {
    return null;
  }
}
