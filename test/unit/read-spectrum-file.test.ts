// readSpectrumFile and `zvet inspect` on real files: file-system failures and unreadable files
// end as one line naming the file; --json gives the documented keys.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readSpectrumFile } from '../../core/node/read-spectrum-file.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { OPEN_SPECTRA, ZVET_BIN } from '../support/paths.js';

const dir = mkdtempSync(join(tmpdir(), 'zvet-read-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const zvet = (...args: string[]) => spawnSync(process.execPath, [ZVET_BIN, ...args], { encoding: 'utf8' });

describe('readSpectrumFile', () => {
  it('turns a missing file and a folder into SpectrumReadError with a plain reason', async () => {
    await expect(readSpectrumFile(join(dir, 'none.fits'))).rejects.toThrow(new SpectrumReadError('none.fits', 'no such file'));
    await expect(readSpectrumFile(dir)).rejects.toMatchObject({ reason: 'is a folder, not a file' });
  });
  it('reads a file under its base name', async () => {
    const s = await readSpectrumFile(join(OPEN_SPECTRA, 'sdss/spec-0266-51602-0001.fits'));
    expect(s.fileName).toBe('spec-0266-51602-0001.fits');
  });
});

describe('zvet inspect', () => {
  const sdss = join(OPEN_SPECTRA, 'sdss/spec-0266-51602-0001.fits');
  it('--json prints one object with units in the keys', () => {
    const r = zvet('inspect', '--json', sdss);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j).toMatchObject({
      format: 'fits-table-rows', hdu: 1, spectrum_hdus: [1], n_pixels: 3835, medium_in_file: 'vacuum', dispersion: 'log10',
      error_kind: 'ivar', has_mask: true, has_sky: true, velocity_frame: 'heliocentric', exposure_s: 3600,
    });
    // PLUG_RA/PLUG_DEC of the header (the fibre position, not the boresight RA/DEC).
    expect([j.ra_deg, j.dec_deg]).toEqual([146.71421, -1.0413043]);
    expect(j.wave_min_angstrom).toBeCloseTo(10 ** Math.fround(3.5805), 2);
    for (const key of ['file', 'wave_max_angstrom', 'medium_reason', 'flux_unit', 'n_masked', 'object', 'date_obs_utc', 'mjd_obs', 'site', 'velocity_frame_reason']) {
      expect(j).toHaveProperty(key);
    }
    expect(j.pixels).toBeUndefined();
  });
  it('--pixels adds wave, flux, error and mask with null for NaN', () => {
    // This eBOSS spectrum has ivar = 0 pixels, whose σ is undefined.
    const j = JSON.parse(zvet('inspect', '--json', '--pixels', join(OPEN_SPECTRA, 'sdss/spec-10000-57346-0003.fits')).stdout);
    expect(j.pixels.wave).toHaveLength(4606);
    const masked = j.pixels.mask.indexOf(1);
    expect(masked).toBeGreaterThanOrEqual(0);
    expect(j.pixels.error.some((e: number | null) => e === null)).toBe(true);
  });
  it('the readable summary has aligned labels with units', () => {
    const out = zvet('inspect', sdss).stdout;
    expect(out).toMatch(/^wavelength \(vacuum\)\s+3806\.\d\d – 9202\.\d\d Å$/m);
    expect(out).toMatch(/^exposure\s+3600\.0 s$/m);
  });
  it('a bad file gives one line on stderr and exit code 2', () => {
    const bad = join(dir, 'bad.fits');
    writeFileSync(bad, 'SIMPLE  = T\n');
    const r = zvet('inspect', bad);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^zvet: bad\.fits: truncated: the header of HDU 0 has no END card\n$/);
    const notSpectrum = zvet('inspect', join(OPEN_SPECTRA, 'other/dr6.0.fits'));
    expect(notSpectrum.status).toBe(2);
    expect(notSpectrum.stderr.trim().split('\n')).toHaveLength(1);
    expect(zvet('inspect', '--air', '--vacuum', sdss).stderr).toBe('zvet: --air and --vacuum exclude each other\n');
  });
  it('--vacuum/--air override and --hdu choose', () => {
    const air = JSON.parse(zvet('inspect', '--json', '--air', sdss).stdout);
    expect(air.medium_reason).toBe('set by the user, whatever the file says');
    const galah = JSON.parse(zvet('inspect', '--json', '--hdu', '1', join(OPEN_SPECTRA, 'other/2101150001010011.fits')).stdout);
    expect(galah).toMatchObject({ hdu: 1, spectrum_hdus: [0, 1], flux_unit: 'normalised (continuum = 1)' });
  });
});
