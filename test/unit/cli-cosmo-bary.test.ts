// `zvet cosmo` and `zvet bary` through the built program (npm test builds first): the JSON keys
// promised to users, values equal to the library's, usage mistakes as one line with exit 2.
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { barycentricCorrection } from '../../core/astro/barycentric.js';
import { COSMOLOGY_PRESETS, distances } from '../../core/astro/cosmology.js';
import { findSite } from '../../core/astro/sites.js';
import { mjdFromIsoUtc } from '../../core/astro/time.js';
import { ZVET_BIN } from '../support/paths.js';

function zvet(...args: string[]) {
  const r = spawnSync(process.execPath, [ZVET_BIN, ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('zvet cosmo', () => {
  it('--json prints one object per z with exactly the documented keys', () => {
    const r = zvet('cosmo', '0.5', '2', '--json');
    expect(r.status).toBe(0);
    const rows = JSON.parse(r.stdout);
    expect(rows).toHaveLength(2);
    expect(Object.keys(rows[0]).sort()).toEqual(
      ['z', 'comoving_mpc', 'transverse_mpc', 'luminosity_mpc', 'angular_mpc', 'distance_modulus', 'lookback_gyr', 'age_gyr', 'kpc_per_arcsec', 'model'].sort(),
    );
    const d = distances(0.5, COSMOLOGY_PRESETS.planck18);
    expect(rows[0]).toMatchObject({ z: 0.5, luminosity_mpc: d.luminosityMpc, distance_modulus: d.distanceModulusMag, age_gyr: d.ageGyr });
    expect(rows[0].model).toMatchObject({ name: 'planck18', h0: 67.66, om: 0.3111 });
    expect(rows[0].model.source).toMatch(/Planck 2018/);
  });

  it('takes user values, flat by default when only Ωm is given', () => {
    const [row] = JSON.parse(zvet('cosmo', '1', '--h0', '70', '--om', '0.3', '--json').stdout);
    expect(row.model).toMatchObject({ name: 'custom', h0: 70, om: 0.3, ol: 0.7 });
    expect(row.comoving_mpc).toBe(distances(1, { name: 'x', h0: 70, omegaM: 0.3, omegaL: 0.7, source: '' }).comovingMpc);
    const [curved] = JSON.parse(zvet('cosmo', '1', '--preset', 'round70', '--ol', '0.5', '--json').stdout);
    expect(curved.model).toMatchObject({ om: 0.3, ol: 0.5 });
    expect(curved.transverse_mpc).toBeGreaterThan(curved.comoving_mpc);
  });

  it('prints a table with units without --json', () => {
    const r = zvet('cosmo', '0.1');
    expect(r.stdout).toMatch(/D_L \(Mpc\)/);
    expect(r.stdout).toMatch(/lookback \(Gyr\)/);
    expect(r.stdout).toMatch(/source: Planck 2018/);
    // ΩΛ = 1 − 0.3111 printed as the number it is, not its binary rounding (0.6889000000000001).
    expect(r.stdout.split('\n')[0]).toBe('model planck18: H0 = 67.66 km/s/Mpc, Ωm = 0.3111, ΩΛ = 0.6889, Ωk = 0');
    expect(JSON.parse(zvet('cosmo', '0.1', '--json').stdout)[0].model.ol).toBe(0.6889);
  });

  it('takes redshifts written in decimal only', () => {
    for (const bad of ['0x10', '0b1', 'Infinity', '']) {
      const r = zvet('cosmo', bad);
      expect(r.status, bad).toBe(2);
      expect(r.stderr).toContain('is not a number');
    }
    expect(JSON.parse(zvet('cosmo', '1e-1', '--json').stdout)[0].z).toBe(0.1);
  });
});

describe('zvet bary', () => {
  it('--json gives the corrections of the library for a named site and sexagesimal input', () => {
    const r = zvet('bary', '--ra', '14:03:36', '--dec', '-54:18:00', '--utc', '2026-03-14T05:12:33', '--site', 'Kestrel Ridge', '--json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    for (const key of ['v_corr_kms', 'v_helio_kms', 'mjd_utc', 'mjd_tdb', 'ra_deg', 'dec_deg', 'site']) expect(out).toHaveProperty(key);
    expect(out.ra_deg).toBeCloseTo(210.9, 10);
    expect(out.dec_deg).toBeCloseTo(-54.3, 10);
    const lib = barycentricCorrection({ raDeg: out.ra_deg, decDeg: out.dec_deg, mjdUtc: mjdFromIsoUtc('2026-03-14T05:12:33'), site: findSite('kestrel-ridge')! });
    expect(out.v_corr_kms).toBe(lib.vCorrKmS);
    expect(out.v_helio_kms).toBe(lib.vHelioKmS);
    expect(out.site).toMatchObject({ name: 'Kestrel Ridge', latitude_deg: 36.1843, longitude_deg: -105.721, height_m: 2840 });
  });

  it('takes --lat/--lon/--height, and a negative declination in degrees', () => {
    const out = JSON.parse(zvet('bary', '--ra', '10.5', '--dec', '-5.1', '--utc', '2010-05-01T03:00:00Z', '--lat', '-24.6', '--lon', '-70.4', '--height', '2600', '--json').stdout);
    expect(out.site).toMatchObject({ latitude_deg: -24.6, longitude_deg: -70.4, height_m: 2600 });
    expect(Math.abs(out.v_corr_kms)).toBeLessThan(31);
  });

  it.each([
    [['--ra', '25:00:00', '--dec', '1', '--utc', '2026-03-14T05:00:00', '--site', 'kestrel-ridge'], /--ra: right ascension "25:00:00" is outside/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14', '--site', 'kestrel-ridge'], /--utc: .*not an ISO 8601/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14T05:00:00'], /site is missing/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14T05:00:00', '--site', 'atlantis'], /--site: no site "atlantis"/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14T05:00:00', '--site', 'kestrel-ridge', '--lat', '3'], /either --site or --lat/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14T05:00:00', '--lat', 'north', '--lon', '3'], /--lat: "north" is not a number/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14T05:12:60', '--site', 'kestrel-ridge'], /--utc: .*second 60 exists only/],
    [['--ra', '1', '--dec', '1', '--utc', '2026-03-14T05:00:00', '--lat', '0x10', '--lon', '3'], /--lat: "0x10" is not a number/],
  ])('usage mistake %j → one line, exit 2', (args, message) => {
    const r = zvet('bary', ...args);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });

  it('cosmo usage mistakes are one line with exit 2 too', () => {
    for (const [args, message] of [[['-0.1'], /below 0/], [['1', '--preset', 'foo'], /no model "foo"/], [['x'], /"x" is not a number/]] as const) {
      const r = zvet('cosmo', ...args);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(message);
    }
  });
});
