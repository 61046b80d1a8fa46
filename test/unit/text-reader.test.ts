// Plain-text spectra: separators, comments, header rows with units, 2–4 columns.
import { describe, expect, it } from 'vitest';
import { airToVacuum } from '../../core/spectrum/air-vacuum.js';
import { readSpectrum } from '../../core/spectrum/read.js';
import { describeColumn } from '../../core/spectrum/text-reader.js';

const enc = (s: string) => new TextEncoder().encode(s);
const rows = (n: number, f: (i: number) => string) => Array.from({ length: n }, (_, i) => f(i)).join('\n');

describe('text spectra', () => {
  it('whitespace columns without a header: wavelength, flux, error, mask; air assumed', () => {
    const s = readSpectrum(enc(`# a comment\n${rows(12, (i) => `${5000 + i}  ${1 + i}  0.1  ${i === 3 ? 1 : 0}`)}\n`), 'a.txt');
    expect(s.provenance.format).toBe('text');
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(5000), 9);
    expect(s.flux[11]).toBe(12);
    expect(s.error[0]).toBe(0.1);
    expect(s.mask[3]).toBe(1);
    expect(s.provenance.mediumReason).toMatch(/^assumed air/);
  });
  it('CSV with a header row naming units: wave_A, flux, err', () => {
    const s = readSpectrum(enc(`wave_A,flux,err\n${rows(12, (i) => `${6000 + 2 * i},${i},0.5`)}\n`), 'a.csv');
    expect(s.provenance.format).toBe('text (named columns)');
    expect(s.provenance.waveUnitInFile).toBe('Å');
    expect(s.error[4]).toBe(0.5);
  });
  it('semicolon-separated, as spreadsheets write where the decimal mark is a comma: 6563,25 is 6563.25', () => {
    const comma = readSpectrum(enc(`# AIRORVAC = vac\nwave;flux;err\n${rows(12, (i) => `${6000 + i},25;${i},5;1,5e-1`)}\n`), 'a.csv');
    expect(comma.waveAngstrom[1]).toBe(6001.25);
    expect(comma.flux[3]).toBe(3.5);
    expect(comma.error[0]).toBe(0.15);
    const point = readSpectrum(enc(`# AIRORVAC = vac\n${rows(12, (i) => `${6000 + i}.25 ; ${i}.5`)}\n`), 'b.csv');
    expect([point.waveAngstrom[1], point.flux[3]]).toEqual([6001.25, 3.5]);
  });
  it('TSV with wavelength[nm], ivar column, and KEY = value comments as header cards', () => {
    const text = `# OBJECT = KRT-26-0017\n# AIRORVAC = vac\n# RA = 150.1\n# DEC = 2.2\nwavelength[nm]\tflux\tivar\n${rows(12, (i) => `${400 + i}\t${i + 1}\t4`)}\n`;
    const s = readSpectrum(enc(text), 'a.tsv');
    expect(s.waveAngstrom[0]).toBe(4000);
    expect(s.error[0]).toBe(0.5);
    expect(s.provenance.errorKind).toBe('ivar');
    expect(s.meta.object).toBe('KRT-26-0017');
    expect(s.meta).toMatchObject({ raDeg: 150.1, decDeg: 2.2 });
    expect(s.provenance.medium).toBe('vacuum');
  });
  it('an S/N column, named in a commented or a plain header row, gives σ = |flux| / (S/N), not σ = S/N', () => {
    // A pipeline's S/N per pixel is flux/σ (common practice, no source); S/N ≤ 0 says nothing of σ.
    const data = rows(12, (i) => `${5000 + i} ${i - 3} ${i === 5 ? 0 : 20}`);
    for (const text of [`# wave flux snr\n${data}`, `wave flux S/N\n${data}`]) {
      const s = readSpectrum(enc(text), 'a.txt');
      expect(s.provenance.errorKind).toBe('snr');
      expect(s.error[0]).toBeCloseTo(3 / 20, 12);
      expect(s.error[10]).toBeCloseTo(7 / 20, 12);
      expect([s.mask[5], s.mask[3], s.mask[4]]).toEqual([1, 1, 0]);
    }
  });
  it('a loglam column is log10 of Å (as SDSS writes it), commented header or not', () => {
    const data = rows(12, (i) => `${(3.6 + 1e-4 * i).toFixed(4)},${i + 1},4`);
    for (const text of [`loglam,flux,ivar\n${data}`, `# loglam,flux,ivar\n${data}`]) {
      const s = readSpectrum(enc(`# AIRORVAC = vac\n${text}`), 'l.csv');
      expect(s.waveAngstrom[3]).toBeCloseTo(10 ** 3.6003, 8);
      expect(s.provenance.waveUnitInFile).toBe('Å');
      expect(s.provenance.dispersion).toBe('log10');
      expect(s.error[0]).toBe(0.5);
    }
  });
  it('a commented header naming a column zvet does not know leaves it unread, not taken as the error', () => {
    const s = readSpectrum(enc(`# wave flux continuum\n${rows(12, (i) => `${5000 + i} ${i + 1} 4`)}`), 'a.txt');
    expect(s.provenance.format).toBe('text (named columns)');
    expect(s.provenance.errorKind).toBe('none');
  });
  it('more than four columns are read when a header names them, the unknown ones left unread; refused by position', () => {
    const data = rows(12, (i) => `${5000 + i} ${i + 1} 0.5 ${i === 2 ? 1 : 0} 3 9`);
    const s = readSpectrum(enc(`wave flux err mask sky model\n${data}`), 'six.txt');
    expect([s.flux[4], s.error[4], s.mask[2], s.sky?.[0]]).toEqual([5, 0.5, 1, 3]);
    expect(readSpectrum(enc(`# wave flux err mask sky model\n${data}`), 'six.txt').sky?.[0]).toBe(3);
    expect(() => readSpectrum(enc(data), 'six.txt')).toThrow(/line 1 has 6 columns; without a header row naming them zvet reads 2 to 4/);
  });
  it('a commented header row just above the data names the columns; CRLF line ends', () => {
    const s = readSpectrum(enc(`# flux wave\r\n${rows(12, (i) => `${i + 1} ${7000 + i}`).replace(/\n/g, '\r\n')}`), 'a.dat');
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(7000), 9);
    expect(s.flux[0]).toBe(1);
  });
  it('wavelengths in µm are recognised from their size when unlabelled', () => {
    const s = readSpectrum(enc(rows(12, (i) => `${1.1 + i * 0.01} 1`)), 'ir.txt');
    expect(s.provenance.waveUnitInFile).toBe('µm (assumed from the values)');
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(11000), 6);
    // 3.58–3.96 is an L-band range in µm or log10 λ of an optical spectrum in Å: said.
    expect(readSpectrum(enc(rows(12, (i) => `${3.58 + i * 0.0345} 1`)), 'log.txt').provenance.waveUnitInFile).toMatch(/^µm \(assumed from the values; .* look like log10 of Å too/);
  });
  it('unlabelled wavelengths below 1000 are nm (in Å they would be extreme ultraviolet); 1000–2500 from above 900 stay Å; the doubt is said', () => {
    const s = readSpectrum(enc(rows(12, (i) => `${650 + i} 1`)), 'nm.txt');
    expect(s.provenance.waveUnitInFile).toBe('nm (assumed from the values; the wavelengths (650 – 661) are taken as nm; if they are Å, name the unit in the file, as in wavelength[A])');
    expect(s.waveAngstrom[0]).toBeCloseTo(airToVacuum(6500), 6);
    // An optical-to-infrared range in nm (300–2280 nm) reaches past 1000 from below 900.
    expect(readSpectrum(enc(rows(12, (i) => `${300 + 180 * i} 1`)), 'x.txt').provenance.waveUnitInFile).toMatch(/^nm /);
    // A far-ultraviolet range in Å (1150–1700 Å).
    const uv = readSpectrum(enc(rows(12, (i) => `${1150 + 50 * i} 1`)), 'uv.txt');
    expect(uv.provenance.waveUnitInFile).toBe('Å (assumed from the values; the wavelengths (1150 – 1700) are taken as Å; if they are nm, name the unit in the file, as in wavelength[nm])');
    expect(readSpectrum(enc(rows(12, (i) => `${6500 + i} 1`)), 'a.txt').provenance.waveUnitInFile).toBe('Å (assumed from the values)');
    expect(readSpectrum(enc(`wavelength[nm] flux\n${rows(12, (i) => `${650 + i} 1`)}`), 'n.txt').provenance.waveUnitInFile).toBe('nm');
  });
  it('a column named wave_vac says vacuum; NaN flux pixels are masked', () => {
    const s = readSpectrum(enc(`wave_vac flux\n${rows(12, (i) => `${5000 + i} ${i === 2 ? 'nan' : 1}`)}`), 'v.txt');
    expect(s.provenance.medium).toBe('vacuum');
    expect(s.mask[2]).toBe(1);
  });
});

describe('comments in text spectra', () => {
  it('several KEY: value pairs on one line, units after numbers dropped; FRAME is the velocity frame', () => {
    const text = `# OBJECT: KRT-26-0018\n# RA: 161.158357 deg  DEC: -1.870000 deg\n# DATE-OBS: 2026-03-14T05:48:00.000 UTC  EXPTIME: 2400 s\n# OBSERVAT: Kestrel Ridge  frame: topocentric\n${rows(12, (i) => `${5000 + i},1,0.1`)}`;
    const s = readSpectrum(enc(text), 'k.csv');
    expect(s.meta).toMatchObject({ object: 'KRT-26-0018', raDeg: 161.158357, decDeg: -1.87, dateObsUtc: '2026-03-14T05:48:00.000Z', exposureS: 2400, velocityFrame: 'topocentric' });
    expect(s.meta.site?.name).toBe('Kestrel Ridge');
  });
  it('a free-text comment stating the medium decides it', () => {
    const vac = readSpectrum(enc(`# re-reduced; wavelengths converted from air to VACUUM\n${rows(12, (i) => `${5000 + i} 1`)}`), 'v.txt');
    expect(vac.provenance.medium).toBe('vacuum');
    expect(vac.provenance.mediumReason).toMatch(/^a comment says 're-reduced; wavelengths converted from air to VACUUM'$/);
    const air = readSpectrum(enc(`# air wavelengths\n${rows(12, (i) => `${5000 + i} 1`)}`), 'a.txt');
    expect(air.provenance.mediumReason).toMatch(/^a comment says/);
  });
});

describe('describeColumn', () => {
  it('splits name and unit', () => {
    expect(describeColumn('wavelength[nm]')).toMatchObject({ role: 'wave', unit: 'nm' });
    expect(describeColumn('lambda (um)')).toMatchObject({ role: 'wave', unit: 'um' });
    expect(describeColumn('wave_A')).toMatchObject({ role: 'wave', unit: 'A' });
    expect(describeColumn('flux_err')).toMatchObject({ role: 'sigma' });
    expect(describeColumn('colour').role).toBeUndefined();
  });
});
