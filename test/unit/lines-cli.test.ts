// `zvet lines` end to end on the built program: JSON keys of issue 6, readable table, bad input.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { OPEN_SPECTRA, ZVET_BIN } from '../support/paths.js';

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

  it('ends bad input with one line and exit code 2', () => {
    const bad = run('lines', SF, '--z', 'abc');
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    const missing = run('lines', join(OPEN_SPECTRA, 'no-such-file.fits'), '--z', '0.1');
    expect(missing.status).toBe(2);
    expect(missing.stderr).toMatch(/no-such-file\.fits/);
  });
});
