// `zvet lines` end to end on the built program: JSON keys of issue 6, readable table, bad input.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { DEMO_WORKLIST, OPEN_SPECTRA, ZVET_BIN } from '../support/paths.js';

const run = (...args: string[]) => spawnSync(process.execPath, [ZVET_BIN, ...args], { encoding: 'utf8' });
const SF = join(OPEN_SPECTRA, 'sdss', 'spec-0395-51783-0525.fits');

describe('zvet lines', () => {
  it('prints the JSON record with the documented keys', () => {
    const r = run('lines', SF, '--z', '0.0178204', '--json');
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out.lines[0])).toEqual(expect.arrayContaining(['name', 'rest_wave', 'flux', 'flux_err', 'ew_rest', 'sn', 'fwhm_kms', 'limit']));
    expect(out.classification.bpt).toBe('star-forming');
    expect(out.classification.agn_type).toBeNull();
    expect(out.balmer.intrinsic).toBe(2.86);
    expect(out.sfr.sfr_kennicutt98_msun_yr).toBeGreaterThan(0);
    expect(out.sfr.caveat).toMatch(/slit or fibre/);
  });

  it('prints a readable table with units', () => {
    const r = run('lines', SF, '--z', '0.0178204', '--preset', 'round70');
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/rest λ vac Å/);
    expect(r.stdout).toMatch(/M☉\/yr/);
    expect(r.stdout).toMatch(/Halpha/);
  });

  it('reads the wavelengths as --air says: the vacuum SDSS spectrum taken as air puts Hα 83 km/s redder (Morton 1991: 6562.80 Å air is 6564.61 Å vacuum)', () => {
    const halpha = (...flags: string[]) => JSON.parse(run('lines', SF, '--z', '0.0178204', '--json', ...flags).stdout).lines.find((l: { name: string }) => l.name === 'Halpha');
    const shift = halpha('--air').velocity_offset_kms - halpha().velocity_offset_kms;
    expect(shift).toBeCloseTo((6564.61 / 6562.8 - 1) * 299792.458, 0);
    expect(run('lines', SF, '--z', '0.0178204', '--air', '--vacuum').stderr).toBe('zvet: --air and --vacuum exclude each other\n');
  });

  it('ends bad input with one line and exit code 2', () => {
    const bad = run('lines', SF, '--z', 'abc');
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    const missing = run('lines', join(OPEN_SPECTRA, 'no-such-file.fits'), '--z', '0.1');
    expect(missing.status).toBe(2);
    expect(missing.stderr).toMatch(/no-such-file\.fits/);
  });

  it('refuses an instrumental FWHM wider than the fit windows (1000 Å made lines 1000 Å wide, EW limits negative)', () => {
    const wide = run('lines', SF, '--z', '0.0178204', '--instrumental-fwhm', '1000');
    expect(wide.status).toBe(2);
    expect(wide.stderr).toBe('zvet: --instrumental-fwhm: 1000 Å is wider than the line fit can work with at z = 0.0178204 (at most 30.5 Å, a third of the narrowest fit window: [O I] 6302, 90 Å rest)\n');
    expect(run('lines', SF, '--z', '0.0178204', '--instrumental-fwhm', '3', '--json').status).toBe(0);
  });

  it('prints an AGN host\'s SFR as an upper limit', () => {
    const r = run('lines', join(DEMO_WORKLIST, 'KRT-26-0014.fits'), '--z', '0.08762');
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/SFR < [\d.]+ M☉\/yr \(upper limit: an AGN contributes to Hα\) \(Kennicutt 1998/);
    expect(r.stdout).not.toMatch(/SFR = /);
  });
});
