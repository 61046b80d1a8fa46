// `zvet export` (built program) with the columns derived from each vetted z, read back by
// Debian's astropy: units from the ECSV header (APE 6) and from TUNITn (io.fits), the cosmology
// and the caveats in the metadata (ECSV meta, FITS keywords and COMMENT cards), values equal to
// correctFrames/analyseHost at the verdict z, distances equal to astropy's LambdaCDM
// (Tcmb0 = 0, ≤ 1e-6 relative), pending and no-redshift rows empty; fitsverify passes.
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { COSMOLOGY_PRESETS } from '../../core/astro/cosmology.js';
import { correctFrames } from '../../core/astro/frames.js';
import { analyseHost } from '../../core/hosts/analyse.js';
import { readSpectrumFile } from '../../core/node/read-spectrum-file.js';
import { DEMO_WORKLIST, ZVET_BIN } from '../support/paths.js';
import { astropyJson, fitsverify } from '../support/tools.js';
import { readTableWithAstropy } from './astropy-table.js';

const base = mkdtempSync(join(tmpdir(), 'zvet-export-derived-'));
const night = join(base, 'kestrel-2026-03-14');
cpSync(DEMO_WORKLIST, night, { recursive: true, filter: (src) => !src.endsWith('.verdicts.jsonl') });
afterAll(() => rmSync(base, { recursive: true, force: true }));

const verdict = (spectrum: string, status: string, z: number | null, objectClass: string) =>
  JSON.stringify({ v: 1, kind: 'verdict', verdict: { spectrum, hdu: 0, status, z, zErr: z === null ? null : 0.0001, confidence: z === null ? null : 'secure', objectClass, template: null, note: '', time: '2026-03-14T09:00:00.000Z', user: 'observer' } });
writeFileSync(join(night, 'kestrel-2026-03-14.verdicts.jsonl'), `${[
  verdict('KRT-26-0014.fits', 'revised', 0.08762, 'agn'),
  verdict('KRT-26-0019.fits.gz', 'accepted', 0.02968, 'galaxy'),
  verdict('KRT-26-0016.fits', 'accepted', 0.00012, 'star'),
  verdict('KRT-26-0021.fits', 'no-redshift', null, 'unknown'),
].join('\n')}\n`);

const UNITS = {
  v_corr_kms: 'km / s', comoving_dist_mpc: 'Mpc', lum_dist_mpc: 'Mpc', lum_dist_err_mpc: 'Mpc', ang_dist_mpc: 'Mpc', dist_mod_mag: 'mag', dist_mod_err_mag: 'mag', lookback_gyr: 'Gyr',
  kpc_per_arcsec: 'kpc / arcsec', halpha_flux: 'erg / (cm2 s)', halpha_flux_err: 'erg / (cm2 s)', ebv_mag: 'mag', ebv_err_mag: 'mag', sfr_k98_msun_yr: 'solMass / yr', sfr_k98_err_msun_yr: 'solMass / yr', sfr_ke12_msun_yr: 'solMass / yr', sfr_ke12_err_msun_yr: 'solMass / yr',
};
const DERIVED = ['z_bary', 'z_helio', 'z_cmb', 'v_corr_kms', 'frame_correction', 'lum_dist_mpc', 'dist_mod_mag', 'bpt_class', 'halpha_flux', 'ebv_mag', 'sfr_k98_msun_yr'];

describe.each(['ecsv', 'fits'] as const)('zvet export %s with derived columns', (format) => {
  const out = join(base, `night.${format}`);
  const run = spawnSync(process.execPath, [ZVET_BIN, 'export', night, '--out', out], { encoding: 'utf8' });
  const table = readTableWithAstropy(out, format === 'ecsv' ? 'ascii.ecsv' : 'fits');
  const by = Object.fromEntries(table.rows.map((r) => [r.spectrum, r]));

  it('writes the file, and astropy reads the units of every derived number', () => {
    // Exit 1: the demo's truncated file cannot be read; its row is written all the same.
    expect(run.status, run.stderr).toBe(1);
    expect(run.stderr).toContain('KRT-26-0023_truncated.fits could not be read');
    expect(table.rows).toHaveLength(13);
    for (const [name, unit] of Object.entries(UNITS)) expect(table.units[name], name).toBe(unit);
    if (format === 'fits') expect(fitsverify(out).report).toMatch(/^verification OK/);
  });

  it('states the cosmology, that pending rows are unvetted, and the SFR aperture caveat in the metadata', () => {
    const meta = Object.fromEntries(Object.entries(table.meta).map(([k, v]) => [k.toLowerCase(), v]));
    expect(meta.cosmolog).toBe('planck18: H0 = 67.66 km/s/Mpc, Om = 0.3111, OL = 0.6889');
    expect(meta.cosmosrc).toMatch(/Planck 2018 results VI/);
    // ECSV: meta['comments'] is the list of sentences; FITS: the COMMENT cards, one line each.
    const comments = meta.comments.replace(/', '/g, ' ');
    expect(comments).toMatch(/status pending are not vetted: they hold no redshift and nothing derived/);
    expect(comments).toMatch(/slit or fibre sees only part of the galaxy/);
  });

  it('carries the frame-corrected z and distances of the vetted z, equal to correctFrames and astropy', async () => {
    const agn = by['KRT-26-0014.fits'];
    const lib = correctFrames({ zObs: 0.08762, zErr: 0.0001, meta: (await readSpectrumFile(join(night, 'KRT-26-0014.fits'))).meta, cosmology: COSMOLOGY_PRESETS.planck18 });
    expect(agn).toMatchObject({ frame_correction: 'barycentric', z_corr_frame: 'barycentric', z_bary: lib.zBary, z_helio: lib.zHelio, z_cmb: lib.zCmb, v_corr_kms: lib.vCorrKmS, dist_from: 'cmb' });
    expect(agn.lum_dist_mpc).toBe(lib.distances!.luminosityMpc);
    const ref = astropyJson<number[]>(
      `
import json, sys
import astropy.units as u
from astropy.cosmology import LambdaCDM
c = LambdaCDM(H0=67.66, Om0=0.3111, Ode0=1 - 0.3111, Tcmb0=0)
z = float(sys.argv[1])
print(json.dumps([c.comoving_distance(z).to_value(u.Mpc), c.luminosity_distance(z).to_value(u.Mpc), c.angular_diameter_distance(z).to_value(u.Mpc), c.lookback_time(z).to_value(u.Gyr)]))
`,
      [String(agn.z_cmb)],
    );
    const ours = [agn.comoving_dist_mpc, agn.lum_dist_mpc, agn.ang_dist_mpc, agn.lookback_gyr] as number[];
    ours.forEach((v, i) => expect(Math.abs(v / ref[i] - 1)).toBeLessThan(1e-6));
  });

  it('carries the host diagnostics for a vetted galaxy or AGN, equal to analyseHost in erg/s/cm2', async () => {
    for (const [name, z] of [['KRT-26-0014.fits', 0.08762], ['KRT-26-0019.fits.gz', 0.02968]] as const) {
      const spectrum = await readSpectrumFile(join(night, name));
      // The catalogue's SFR takes the luminosity distance of its own distance columns (at z_cmb).
      const frames = correctFrames({ zObs: z, zErr: 0.0001, meta: spectrum.meta, cosmology: COSMOLOGY_PRESETS.planck18 });
      const lib = analyseHost(spectrum, z, { cosmology: COSMOLOGY_PRESETS.planck18, frames });
      expect(lib.sfr.luminosity_distance_from).toBe('cmb');
      expect(Math.abs((by[name].lum_dist_mpc as number) / lib.sfr.luminosity_distance_mpc! - 1)).toBeLessThan(1e-12);
      const ha = lib.lines.find((l) => l.name === 'Halpha' && l.component === 'narrow')!;
      // 1e-17 erg/s/cm2/Angstrom × Å in the demo files.
      expect(spectrum.fluxUnit).toBe('1e-17 erg/s/cm2/Angstrom');
      expect(Math.abs((by[name].halpha_flux as number) / (ha.flux * 1e-17) - 1)).toBeLessThan(1e-12);
      expect(by[name]).toMatchObject({ bpt_class: lib.classification.bpt, agn_type: lib.classification.agn_type, ebv_mag: lib.balmer.ebv, sfr_k98_msun_yr: lib.sfr.sfr_kennicutt98_msun_yr });
    }
    expect(by['KRT-26-0014.fits']).toMatchObject({ bpt_class: 'agn', agn_type: 'seyfert' });
    expect(by['KRT-26-0019.fits.gz'].bpt_class).toBe('star-forming');
  });

  it('leaves pending and no-redshift rows empty, and gives a star its frames but no distances or host lines', () => {
    for (const name of ['KRT-26-0011.fits', 'KRT-26-0021.fits', 'KRT-26-0023_truncated.fits']) {
      for (const key of [...DERIVED, 'frame_reason', 'host_problem']) expect(by[name][key], `${name} ${key}`).toBeNull();
    }
    const star = by['KRT-26-0016.fits'];
    expect(star.frame_correction).toBe('barycentric');
    expect(star.z_bary).not.toBeNull();
    for (const key of ['lum_dist_mpc', 'dist_mod_mag', 'bpt_class', 'halpha_flux', 'sfr_k98_msun_yr']) expect(star[key], key).toBeNull();
  });
});
