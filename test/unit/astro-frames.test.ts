// The frame decision: correct topocentric wavelengths once, keep heliocentric and barycentric
// ones, and say why. Numbers are checked against the barycentric and CMB functions themselves
// (those are checked against astropy in test/reference/).
import { describe, expect, it } from 'vitest';
import { barycentricCorrection } from '../../core/astro/barycentric.js';
import { zCmbFromHelio } from '../../core/astro/cmb.js';
import { COSMOLOGY_PRESETS, distances } from '../../core/astro/cosmology.js';
import { correctFrames } from '../../core/astro/frames.js';
import { findSite } from '../../core/astro/sites.js';
import { mjdFromIsoUtc } from '../../core/astro/time.js';
import type { SpectrumMeta } from '../../core/spectrum/spectrum.js';

const kestrel = findSite('kestrel-ridge')!;
const C_KMS = 299792.458;
const full: SpectrumMeta = {
  raDeg: 210.9,
  decDeg: 54.3,
  dateObsUtc: '2026-03-14T05:00:00',
  exposureS: 1800,
  site: { name: 'Kestrel Ridge', latitudeDeg: kestrel.latitudeDeg, longitudeDeg: kestrel.longitudeDeg, heightM: kestrel.heightM },
  velocityFrame: 'topocentric',
  velocityFrameReason: 'no VELREF or SPECSYS card',
};

describe('correctFrames', () => {
  it('applies the barycentric correction at mid-exposure for topocentric wavelengths', () => {
    const r = correctFrames({ zObs: 0.05, zErr: 1e-4, meta: full });
    const expected = barycentricCorrection({ raDeg: 210.9, decDeg: 54.3, mjdUtc: mjdFromIsoUtc('2026-03-14T05:15:00'), site: kestrel });
    expect(r.correction).toBe('barycentric');
    expect(r.frame).toBe('barycentric');
    expect(r.vCorrKmS).toBeCloseTo(expected.vCorrKmS, 9);
    expect(r.zBary).toBeCloseTo(1.05 * (1 + expected.vCorrKmS / C_KMS) - 1, 14);
    expect(r.zHelio).toBeCloseTo(1.05 * (1 + expected.vHelioKmS / C_KMS) - 1, 14);
    expect(r.zCmb).toBeCloseTo(zCmbFromHelio(r.zBary!, 210.9, 54.3), 14);
    expect(r.zErr).toBeCloseTo(1e-4 * ((1 + r.zBary!) / 1.05), 15);
    expect(r.midExposureUtc).toBe('2026-03-14T05:15:00.000Z');
    expect(r.reason).toMatch(/barycentric correction [+−]\d+\.\d{3} km\/s applied/);
    expect(r.reason).toMatch(/DATE-OBS \+ EXPTIME\/2/);
    expect(r.reason).toMatch(/site Kestrel Ridge from the header/);
  });
  it('takes the header’s own average time (MJD-AVG) as the mid-exposure when it has one (a coadd of several exposures)', () => {
    const mjdAvg = mjdFromIsoUtc('2026-03-14T07:40:00');
    const r = correctFrames({ zObs: 0.05, meta: { ...full, mjdAvg, avgTimeFrom: 'MJD-AVG' } });
    expect(r.midExposureUtc).toBe('2026-03-14T07:40:00.000Z');
    expect(r.vCorrKmS).toBeCloseTo(barycentricCorrection({ raDeg: 210.9, decDeg: 54.3, mjdUtc: mjdAvg, site: kestrel }).vCorrKmS, 9);
    expect(r.reason).toMatch(/mid-exposure from MJD-AVG \(the header's average time\)/);
  });

  it('never corrects heliocentric wavelengths again, and takes z_cmb from the heliocentric z', () => {
    const r = correctFrames({ zObs: 0.05, meta: { ...full, velocityFrame: 'heliocentric', velocityFrameReason: 'survey file' } });
    expect(r).toMatchObject({ correction: 'none', frame: 'heliocentric', zHelio: 0.05, zBary: null, vCorrKmS: null });
    expect(r.zCmb).toBeCloseTo(zCmbFromHelio(0.05, 210.9, 54.3), 14);
    expect(r.reason).toMatch(/already heliocentric \(survey file\); not corrected again/);
  });

  it('keeps barycentric wavelengths as they are', () => {
    const r = correctFrames({ zObs: 0.05, meta: { ...full, velocityFrame: 'barycentric', velocityFrameReason: 'SPECSYS = BARYCENT' } });
    expect(r).toMatchObject({ correction: 'none', frame: 'barycentric', zBary: 0.05, zHelio: null });
  });

  it('uses the settings site when the header has none, and says the frame was not stated', () => {
    const r = correctFrames({ zObs: 0.1, meta: { ...full, site: undefined, velocityFrame: 'unknown', velocityFrameReason: 'text file' }, site: { name: 'Kestrel Ridge' } });
    expect(r.correction).toBe('barycentric');
    expect(r.reason).toMatch(/frame not stated \(text file\), taken as topocentric/);
    expect(r.reason).toMatch(/site Kestrel Ridge from the settings/);
  });

  it('prefers MJD-OBS and says when there is no exposure time', () => {
    const r = correctFrames({ zObs: 0.1, meta: { ...full, dateObsUtc: undefined, mjdObs: 61113.25, exposureS: undefined } });
    expect(r.midExposureUtc).toBe('2026-03-14T06:00:00.000Z');
    expect(r.reason).toMatch(/start time from MJD-OBS \(no exposure time/);
  });

  it('corrects nothing and says what is missing', () => {
    const r = correctFrames({ zObs: 0.1, meta: { ...full, dateObsUtc: undefined, raDeg: undefined, site: undefined } });
    expect(r).toMatchObject({ correction: 'none', frame: 'topocentric', zBary: null, zHelio: null, zCmb: null, vCorrKmS: null });
    expect(r.reason).toMatch(/not corrected: no observation time, no target RA\/Dec, no observing site/);
    expect(r.reason).toMatch(/no CMB-frame z from an uncorrected z/);
    const bad = correctFrames({ zObs: 0.1, meta: { ...full, dateObsUtc: '14/03/26' } });
    expect(bad.reason).toMatch(/unreadable observation time/);
  });

  it('gives distances at z_cmb with a cosmology, and none for a negative z', () => {
    const model = COSMOLOGY_PRESETS.planck18;
    const r = correctFrames({ zObs: 0.05, meta: full, cosmology: model });
    expect(r.distancesFrom).toBe('cmb');
    expect(r.distances).toEqual(distances(r.zCmb!, model));
    const local = correctFrames({ zObs: -0.001, meta: { ...full, velocityFrame: 'heliocentric', velocityFrameReason: 'survey' }, cosmology: model });
    expect(local.distances).toBeUndefined();
    expect(local.reason).toMatch(/no distances for a negative redshift/);
    expect(() => correctFrames({ zObs: Number.NaN, meta: full })).toThrow(/not a number above −1/);
  });
});
