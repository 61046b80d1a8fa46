// `zvet measure` (built program) with its frame, distance and host-line columns, on the demo
// night and one open SDSS spectrum: the frame columns equal what correctFrames gives for the
// file's own metadata, the barycentric correction agrees with Debian's astropy
// (SkyCoord.radial_velocity_correction, ≤ 2 m/s, the requirement of issue 5), an SDSS file
// (heliocentric by the SDSS data model) is not corrected again, the distances agree with
// astropy's LambdaCDM (Tcmb0 = 0, ≤ 1e-6 relative), and --lines gives what analyseHost gives.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { COSMOLOGY_PRESETS } from '../../core/astro/cosmology.js';
import { SPEED_OF_LIGHT_KMS } from '../../core/astro/constants.js';
import { correctFrames } from '../../core/astro/frames.js';
import { resolveSite } from '../../core/astro/sites.js';
import { analyseHost } from '../../core/hosts/analyse.js';
import { readSpectrumFile } from '../../core/node/read-spectrum-file.js';
import { DEMO_WORKLIST, OPEN_SPECTRA, ZVET_BIN } from '../support/paths.js';
import { astropyJson } from '../support/tools.js';

type Row = Record<string, unknown> & { file: string; status: string; z: number | null };

const SDSS_FILE = join(OPEN_SPECTRA, 'sdss', 'spec-2580-54092-0470.fits');

function zvet(...args: string[]) {
  return spawnSync(process.execPath, [ZVET_BIN, ...args], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
}

const run = zvet('measure', DEMO_WORKLIST, SDSS_FILE, '--lines', '--jobs', '2', '--format', 'jsonl');
const rows: Row[] = run.stdout.trim().split('\n').map((l) => JSON.parse(l));
const byName = (name: string): Row => {
  const row = rows.find((r) => r.file.endsWith(`/${name}`));
  if (!row) throw new Error(`no row for ${name}`);
  return row;
};
const demoRows = rows.filter((r) => r.file.startsWith(DEMO_WORKLIST) && r.status === 'ok');

describe('zvet measure frame columns', () => {
  it('measured every readable file (the damaged demo file is the one error: exit 1)', () => {
    expect(run.status, run.stderr).toBe(1);
    expect(rows).toHaveLength(14);
    expect(rows.filter((r) => r.status === 'error').map((r) => r.file)).toEqual([join(DEMO_WORKLIST, 'KRT-26-0023_truncated.fits')]);
  });

  it('gives z_bary, z_cmb and v_corr_kms equal to correctFrames on each topocentric demo file', async () => {
    expect(demoRows.length).toBe(12);
    for (const row of demoRows) {
      const spectrum = await readSpectrumFile(row.file);
      expect(spectrum.meta.velocityFrame).toBe('topocentric');
      // The z column is rounded to 8 significant digits while z_bary comes from the unrounded
      // z: take that z back from (1 + z_bary) = (1 + z)(1 + v/c), check that it rounds to the z
      // column, and compare everything correctFrames gives for it.
      const v = row.v_corr_kms as number;
      const zUnrounded = (1 + (row.z_bary as number)) / (1 + v / SPEED_OF_LIGHT_KMS) - 1;
      expect(Number(zUnrounded.toPrecision(8)), row.file).toBe(row.z);
      const lib = correctFrames({ zObs: zUnrounded, meta: spectrum.meta, cosmology: COSMOLOGY_PRESETS.planck18 });
      // The Galactic star gets its frames but no distances (checked on its own below).
      const star = row.template === 'star';
      expect(row).toMatchObject({ frame_correction: 'barycentric', z_corr_frame: 'barycentric', dist_from: star ? null : 'cmb' });
      expect(v).toBe(lib.vCorrKmS);
      expect(Math.abs((row.z_bary as number) - lib.zBary!)).toBeLessThan(1e-14);
      expect(Math.abs((row.z_helio as number) - lib.zHelio!)).toBeLessThan(1e-14);
      expect(Math.abs((row.z_cmb as number) - lib.zCmb!)).toBeLessThan(1e-14);
      expect(row.frame_reason).toMatch(/^barycentric correction .* applied: wavelengths topocentric/);
      if (star) continue;
      expect(Math.abs((row.lum_dist_mpc as number) / lib.distances!.luminosityMpc - 1)).toBeLessThan(1e-12);
      // Propagated from z_err (scaled to the frame) and a 300 km/s peculiar velocity; z_err is
      // rounded to 3 digits in the row (up to 5e-4 of itself); in quadrature with the velocity's
      // (1+z)·1e-3 that moves the demo's errors by at most ~2e-5 (σz is below 0.15 of that term here).
      const withErr = correctFrames({ zObs: zUnrounded, zErr: row.z_err as number, meta: spectrum.meta, cosmology: COSMOLOGY_PRESETS.planck18 });
      expect(Math.abs((row.lum_dist_err_mpc as number) / withErr.distanceErrors!.luminosityMpc - 1), row.file).toBeLessThan(5e-5);
      expect(Math.abs((row.dist_mod_err_mag as number) / withErr.distanceErrors!.distanceModulusMag - 1), row.file).toBeLessThan(5e-5);
      expect(row.cosmology).toMatch(/^planck18: H0 = 67.66 km\/s\/Mpc/);
    }
    expect(byName('KRT-26-0023_truncated.fits')).toMatchObject({ z_bary: null, z_cmb: null, v_corr_kms: null, frame_reason: null, lum_dist_mpc: null });
  }, 60_000);

  it('agrees with astropy’s barycentric correction for KRT-26-0011 within 2 m/s', async () => {
    const row = byName('KRT-26-0011.fits');
    const meta = (await readSpectrumFile(row.file)).meta;
    const site = resolveSite(meta.site)!.site;
    const midMjdUtc = meta.mjdObs! + meta.exposureS! / 2 / 86400;
    const ref = astropyJson<{ bary_kms: number }>(
      `
import json, sys
from astropy.coordinates import SkyCoord, EarthLocation
from astropy.time import Time
import astropy.units as u
ra, dec, mjd, lat, lon, h = map(float, sys.argv[1:7])
t = Time(mjd, format='mjd', scale='utc')
loc = EarthLocation.from_geodetic(lon * u.deg, lat * u.deg, h * u.m)
v = SkyCoord(ra * u.deg, dec * u.deg, frame='icrs').radial_velocity_correction('barycentric', obstime=t, location=loc)
print(json.dumps(dict(bary_kms=v.to_value(u.km / u.s))))
`,
      [meta.raDeg!, meta.decDeg!, midMjdUtc, site.latitudeDeg, site.longitudeDeg, site.heightM].map(String),
    );
    // (1 + z_bary) = (1 + z_obs)(1 + v/c) (Wright & Eastman 2014), so the ratio gives v back;
    // the 8-digit rounding of z adds at most ~0.2 m/s here.
    const vFromRowKmS = ((1 + (row.z_bary as number)) / (1 + row.z!) - 1) * SPEED_OF_LIGHT_KMS;
    expect(Math.abs(vFromRowKmS - ref.bary_kms) * 1000).toBeLessThanOrEqual(2);
    expect(Math.abs((row.v_corr_kms as number) - ref.bary_kms) * 1000).toBeLessThanOrEqual(2);
  });

  it('keeps the SDSS spectrum heliocentric: z_helio = z, nothing applied, and says why', () => {
    const row = byName('spec-2580-54092-0470.fits');
    expect(row.status).toBe('ok');
    expect(row).toMatchObject({ frame_correction: 'none', z_corr_frame: 'heliocentric', z_bary: null, v_corr_kms: null, dist_from: 'cmb' });
    expect(Math.abs((row.z_helio as number) - row.z!)).toBeLessThan(1e-8);
    expect(row.frame_reason).toMatch(/already heliocentric .*SDSS.*not corrected again/);
  });

  it('gives a star (best template star) its frames but no distances, as the catalogue does', () => {
    const star = byName('KRT-26-0016.fits');
    expect(star.template).toBe('star');
    expect(star.z_bary).not.toBeNull();
    for (const key of ['dist_from', 'comoving_dist_mpc', 'lum_dist_mpc', 'lum_dist_err_mpc', 'dist_mod_mag', 'dist_mod_err_mag', 'cosmology']) expect(star[key], key).toBeNull();
  });

  it('gives distances at z_cmb equal to astropy’s LambdaCDM (Tcmb0 = 0) within 1e-6', () => {
    const picked = [byName('KRT-26-0011.fits'), byName('KRT-26-0015_1d.fits'), byName('spec-2580-54092-0470.fits')];
    const ref = astropyJson<{ dl: number[]; mu: number[]; dc: number[]; lb: number[]; scale: number[] }>(
      `
import json, sys
import astropy.units as u
from astropy.cosmology import LambdaCDM
c = LambdaCDM(H0=67.66, Om0=0.3111, Ode0=1 - 0.3111, Tcmb0=0)
zs = json.loads(sys.argv[1])
print(json.dumps(dict(dl=[c.luminosity_distance(z).to_value(u.Mpc) for z in zs], mu=[c.distmod(z).value for z in zs],
  dc=[c.comoving_distance(z).to_value(u.Mpc) for z in zs], lb=[c.lookback_time(z).to_value(u.Gyr) for z in zs],
  scale=[(1 / c.arcsec_per_kpc_proper(z)).to_value(u.kpc / u.arcsec) for z in zs])))
`,
      [JSON.stringify(picked.map((r) => r.z_cmb))],
    );
    const rel = (a: unknown, b: number) => Math.abs((a as number) / b - 1);
    picked.forEach((row, i) => {
      expect(rel(row.lum_dist_mpc, ref.dl[i])).toBeLessThan(1e-6);
      expect(rel(row.comoving_dist_mpc, ref.dc[i])).toBeLessThan(1e-6);
      expect(rel(row.lookback_gyr, ref.lb[i])).toBeLessThan(1e-6);
      expect(rel(row.kpc_per_arcsec, ref.scale[i])).toBeLessThan(1e-6);
      expect(Math.abs((row.dist_mod_mag as number) - ref.mu[i])).toBeLessThan(1e-5);
    });
  });

  it('names the units in the CSV header and refuses an unknown site or model with one line, exit 2', () => {
    const csv = zvet('measure', join(DEMO_WORKLIST, 'KRT-26-0019.fits.gz'), '--jobs', '1', '--preset', 'round70', '--site', 'kestrel-ridge');
    expect(csv.status, csv.stderr).toBe(0);
    const [header, line] = csv.stdout.trim().split('\n');
    expect(header.split(',')).toEqual(expect.arrayContaining(['z_bary', 'z_helio', 'z_corr_frame', 'z_cmb', 'v_corr_kms', 'frame_correction', 'frame_reason', 'lum_dist_mpc', 'dist_mod_mag', 'cosmology']));
    expect(header).not.toMatch(/halpha_flux/);
    expect(line).toMatch(/round70: H0 = 70 km\/s\/Mpc/);

    const badSite = zvet('measure', DEMO_WORKLIST, '--site', 'atlantis');
    expect(badSite.status).toBe(2);
    expect(badSite.stderr).toMatch(/^zvet: --site: no site "atlantis" \(known: kestrel-ridge, .*\)\n$/);
    const badModel = zvet('measure', DEMO_WORKLIST, '--h0', 'abc');
    expect(badModel.status).toBe(2);
    expect(badModel.stderr.trim().split('\n')).toHaveLength(1);
  });
});

describe('zvet measure --lines', () => {
  const FLUX_KEYS = [['Halpha', 'halpha'], ['Hbeta', 'hbeta'], ['[OIII]5008', 'oiii5008'], ['[NII]6585', 'nii6585']] as const;
  const LINE_KEYS = [...FLUX_KEYS.flatMap(([, stem]) => [`${stem}_flux`, `${stem}_flux_err`]), 'bpt_class', 'agn_type', 'balmer_decrement', 'balmer_decrement_err', 'ebv_mag', 'ebv_err_mag', 'sfr_k98_msun_yr', 'sfr_k98_err_msun_yr', 'sfr_ke12_msun_yr', 'sfr_ke12_err_msun_yr', 'flux_unit'];

  it('adds the host diagnostics to every row, blank where there is no redshift', () => {
    for (const row of rows) for (const key of LINE_KEYS) expect(row).toHaveProperty(key);
    const broken = byName('KRT-26-0023_truncated.fits');
    for (const key of LINE_KEYS) expect(broken[key]).toBeNull();
  });

  it('gives what analyseHost gives at the row’s z (same fluxes, same classes)', async () => {
    for (const name of ['KRT-26-0011.fits', 'KRT-26-0014.fits', 'KRT-26-0019.fits.gz', 'KRT-26-0020.fits']) {
      const row = byName(name);
      const lib = analyseHost(await readSpectrumFile(row.file), row.z!, { cosmology: COSMOLOGY_PRESETS.planck18 });
      expect(row.bpt_class, name).toBe(lib.classification.bpt);
      expect(row.agn_type, name).toBe(lib.classification.agn_type);
      for (const [id, stem] of FLUX_KEYS) {
        const line = lib.lines.find((l) => l.name === id && l.component === 'narrow')!;
        if (line.limit) {
          expect(row[`${stem}_flux`], `${name} ${id}`).toBeNull();
          expect(row[`${stem}_flux_err`], `${name} ${id}`).toBeNull();
        } else {
          expect(Math.abs((row[`${stem}_flux`] as number) / line.flux - 1), `${name} ${id}`).toBeLessThan(1e-4);
          expect(Math.abs((row[`${stem}_flux_err`] as number) / line.flux_err - 1), `${name} ${id}`).toBeLessThan(1e-4);
        }
      }
      if (lib.balmer.decrement === null) expect(row.balmer_decrement_err).toBeNull();
      else expect(Math.abs((row.balmer_decrement_err as number) / lib.balmer.decrement_err! - 1), name).toBeLessThan(1e-4);
      // The row's SFR takes D_L from its frame-corrected z, so only the relative error is shared.
      const relErr = (v: unknown, e: unknown) => (e as number) / (v as number);
      if (lib.sfr.sfr_kennicutt98_msun_yr === null) expect(row.sfr_k98_err_msun_yr).toBeNull();
      else {
        expect(Math.abs(relErr(row.sfr_k98_msun_yr, row.sfr_k98_err_msun_yr) / relErr(lib.sfr.sfr_kennicutt98_msun_yr, lib.sfr.sfr_kennicutt98_err_msun_yr) - 1), name).toBeLessThan(1e-4);
        expect(Math.abs(relErr(row.sfr_ke12_msun_yr, row.sfr_ke12_err_msun_yr) / relErr(lib.sfr.sfr_ke12_msun_yr, lib.sfr.sfr_ke12_err_msun_yr) - 1), name).toBeLessThan(1e-4);
      }
      expect(row.flux_unit).toBe(`${lib.measurement.flux_unit} * Angstrom`);
    }
  }, 60_000);

  it('takes the SFR’s luminosity distance from the row’s own lum_dist_mpc (at z_cmb), not from D_L at the measured z', async () => {
    // L = 4π D_L² F (Kennicutt 1998): at one flux the SFRs scale as D_L², so the row's SFR over
    // the SFR at D_L(z as measured) must be (lum_dist_mpc / D_L(z))². The demo hosts lie at
    // z ≈ 0.03–0.1, where the frame correction and the CMB dipole move D_L by ~1 %.
    for (const name of ['KRT-26-0011.fits', 'KRT-26-0019.fits.gz']) {
      const row = byName(name);
      const atMeasuredZ = analyseHost(await readSpectrumFile(row.file), row.z!, { cosmology: COSMOLOGY_PRESETS.planck18 }).sfr;
      expect(atMeasuredZ.luminosity_distance_from).toBe('measured');
      const dlRatio = (row.lum_dist_mpc as number) / atMeasuredZ.luminosity_distance_mpc!;
      expect(Math.abs(dlRatio - 1), name).toBeGreaterThan(1e-3);
      expect(Math.abs((row.sfr_k98_msun_yr as number) / atMeasuredZ.sfr_kennicutt98_msun_yr! / dlRatio ** 2 - 1), name).toBeLessThan(1e-5);
    }
  }, 60_000);

  it('recovers the demo hosts’ Balmer decrements within 2σ (stellar absorption under Hβ fitted, not eaten)', async () => {
    // Demo truth (sample-spectra/demo/targets.ts, invented): Hα/Hβ = 3.4 (solar), 2.9 (dwarf),
    // 3.1 (Seyfert 2, whose old host has 1.5 Å of Hβ absorption).
    for (const [name, truth] of [['KRT-26-0011.fits', 3.4], ['KRT-26-0019.fits.gz', 2.9], ['KRT-26-0014.fits', 3.1]] as const) {
      const row = byName(name);
      const { balmer } = analyseHost(await readSpectrumFile(row.file), row.z!, { cosmology: COSMOLOGY_PRESETS.planck18 });
      expect(Math.abs(balmer.decrement! - truth), `${name}: ${balmer.decrement} ± ${balmer.decrement_err}`).toBeLessThan(2 * balmer.decrement_err!);
    }
  }, 60_000);

  it('classifies the demo hosts: the star-forming ones star-forming, the Seyfert 2 agn/seyfert, the passive host insufficient', () => {
    // Demo truth (sample-spectra/truth.csv): KRT-26-0011 star-forming host, KRT-26-0019
    // low-metallicity star-forming dwarf, KRT-26-0014 Seyfert 2 above Kewley et al. (2001),
    // KRT-26-0020 passive (no emission lines).
    expect(byName('KRT-26-0011.fits')).toMatchObject({ bpt_class: 'star-forming', agn_type: null });
    expect(byName('KRT-26-0019.fits.gz')).toMatchObject({ bpt_class: 'star-forming', agn_type: null });
    expect(byName('KRT-26-0014.fits')).toMatchObject({ bpt_class: 'agn', agn_type: 'seyfert', sfr_upper_limit: true });
    expect(byName('KRT-26-0011.fits').sfr_upper_limit).toBe(false);
    expect(byName('KRT-26-0020.fits').bpt_class).toBe('insufficient');
    const dwarf = byName('KRT-26-0019.fits.gz');
    expect(dwarf.sfr_k98_msun_yr as number).toBeGreaterThan(0);
    expect(dwarf.sfr_caveat).toMatch(/slit or fibre sees only part of the galaxy/);
    expect(byName('KRT-26-0020.fits').flux_upper_limits_3sigma).toMatch(/halpha < /);
  });
});
