// Files written by Debian's astropy (each BITPIX with BSCALE/BZERO/BLANK, CONTINUE long strings,
// an IRAF-style multispec image with BANDIDn, an AWAV air axis in nm, a WAVE-LOG axis, a
// DC-FLAG log10 axis, a per-pixel table with TUNITn/TSCALn/TZEROn/TNULLn, array tables of one
// row and of two rows (segments), a 2-D image of rows wavelength/flux/error/flag, an ASCII
// table, a 1-D SDSS COEFF0/COEFF1 image and a gzip file), read back by zvet. The expected values are what astropy itself reads from those files;
// wavelengths of WCS axes come from astropy.wcs (FITS WCS Papers I and III), air ones taken to
// vacuum by Morton (1991) eq. 3 in Python.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read.js';
import { astropyJson, PYTHON_VAC_FROM_AIR } from '../support/tools.js';

interface Case {
  file: string;
  wave: number[];
  flux: Array<number | null>;
  error: Array<number | null> | null;
  sky: Array<number | null> | null;
  medium: 'air' | 'vacuum';
  object: string | null;
  format: string;
}

const SCRIPT = String.raw`
import sys, json, os, gzip, shutil
import numpy as np
from astropy.io import fits
from astropy.wcs import WCS

out_dir = sys.argv[1]
cases = []
rng = np.random.default_rng(7)
n = 64
${PYTHON_VAC_FROM_AIR}

def clean(a):
    return None if a is None else [None if not np.isfinite(x) else float(x) for x in np.asarray(a, dtype=float)]

def wcs_wave_m(header):
    # astropy.wcs converts the spectral axis to SI (metres) for WAVE/AWAV types.
    return WCS(header).all_pix2world(np.arange(n), 0)[0]

def add(name, wave, flux, medium, fmt, error=None, sky=None, obj=None):
    cases.append({'file': name, 'wave': [float(x) for x in wave], 'flux': clean(flux), 'error': clean(error),
                  'sky': clean(sky), 'medium': medium, 'object': obj, 'format': fmt})

# Every BITPIX, integer ones scaled by BSCALE/BZERO with BLANK pixels; wavelength axis CTYPE1 WAVE in Angstrom.
for bitpix, dtype in [(8, '>u1'), (16, '>i2'), (32, '>i4'), (64, '>i8'), (-32, '>f4'), (-64, '>f8')]:
    raw = rng.integers(10, 120, n).astype(dtype)  # BLANK = 7 only where set below
    hdu = fits.PrimaryHDU(data=raw)
    if bitpix > 0:
        hdu.header['BSCALE'] = 0.25
        hdu.header['BZERO'] = 1000.5
        hdu.header['BLANK'] = 7
        raw[[3, 10]] = 7
        hdu.data = raw
    hdu.header['CTYPE1'] = 'WAVE'
    hdu.header['CUNIT1'] = 'Angstrom'
    hdu.header['CRVAL1'] = 4000.0
    hdu.header['CDELT1'] = 2.5
    hdu.header['CRPIX1'] = 1.0
    name = 'bitpix%d.fits' % bitpix
    hdu.writeto(os.path.join(out_dir, name))
    back = fits.open(os.path.join(out_dir, name))[0]
    add(name, wcs_wave_m(back.header) * 1e10, back.data.astype(float), 'vacuum', 'fits-image-1d')

# CONTINUE long string (OBJECT), AWAV axis in nm, in an IMAGE extension with an ERROR companion.
obj = 'KRT-26-0017 host galaxy, slit along the major axis, seeing 1.2 arcsec, ' * 3
flux = rng.normal(10, 1, n)
err = np.full(n, 0.5)
prim = fits.PrimaryHDU()
prim.header['OBJECT'] = obj
sci = fits.ImageHDU(data=flux, name='SCI')
for k, v in [('CTYPE1', 'AWAV'), ('CUNIT1', 'nm'), ('CRVAL1', 500.0), ('CDELT1', 0.2), ('CRPIX1', 1.0)]:
    sci.header[k] = v
errh = fits.ImageHDU(data=err, name='ERROR')
fits.HDUList([prim, sci, errh]).writeto(os.path.join(out_dir, 'continue-awav-nm.fits'))
back = fits.open(os.path.join(out_dir, 'continue-awav-nm.fits'))
assert back[0].header['OBJECT'] == obj.rstrip() and 'CONTINUE' in repr(back[0].header)
add('continue-awav-nm.fits', vac_from_air(wcs_wave_m(back[1].header) * 1e10), back[1].data, 'air', 'fits-image-1d', error=back[2].data, obj=obj.rstrip())

# WAVE-LOG axis (WCS Paper III, logarithmic).
flux = rng.normal(5, 1, n)
hdu = fits.PrimaryHDU(data=flux)
for k, v in [('CTYPE1', 'WAVE-LOG'), ('CUNIT1', 'Angstrom'), ('CRVAL1', 5000.0), ('CDELT1', 1.5), ('CRPIX1', 10.0)]:
    hdu.header[k] = v
hdu.writeto(os.path.join(out_dir, 'wave-log.fits'))
add('wave-log.fits', wcs_wave_m(hdu.header) * 1e10, flux, 'vacuum', 'fits-image-1d')

# IRAF DC-FLAG = 1 (log10-linear), air (no keyword says: assumed air).
hdu = fits.PrimaryHDU(data=flux)
for k, v in [('CTYPE1', 'LINEAR'), ('CRVAL1', 3.6), ('CD1_1', 1e-4), ('CRPIX1', 1.0), ('DC-FLAG', 1)]:
    hdu.header[k] = v
hdu.writeto(os.path.join(out_dir, 'dcflag.fits'))
add('dcflag.fits', vac_from_air(10 ** (3.6 + 1e-4 * np.arange(n))), flux, 'air', 'fits-image-1d')

# SDSS 1-D image: lambda = 10^(COEFF0 + COEFF1 i) in vacuum (SDSS data model), IVAR companion.
hdu = fits.PrimaryHDU(data=flux.astype('>f4'))
for k, v in [('TELESCOP', 'SDSS 2.5-M'), ('COEFF0', 3.5791), ('COEFF1', 1e-4)]:
    hdu.header[k] = v
iv = fits.ImageHDU(data=np.full(n, 0.25, dtype='>f4'), name='IVAR')
fits.HDUList([hdu, iv]).writeto(os.path.join(out_dir, 'coeff-1d.fits'))
back = fits.open(os.path.join(out_dir, 'coeff-1d.fits'))
add('coeff-1d.fits', 10 ** (back[0].header['COEFF0'] + back[0].header['COEFF1'] * np.arange(n)), back[0].data.astype(float), 'vacuum', 'fits-image-1d', error=1 / np.sqrt(back[1].data.astype(float)))

# IRAF multispec/equispec 3-D image: bands along axis 3 named by BANDIDn.
spec = rng.normal(20, 2, n); raw = spec + 3; sky = rng.normal(3, 0.1, n); sig = np.full(n, 1.5)
cube = np.stack([spec, raw, sky, sig])[:, None, :]
hdu = fits.PrimaryHDU(data=cube.astype('>f4'))
for k, v in [('WAT0_001', 'system=equispec'), ('WAT1_001', 'wtype=linear label=Wavelength units=angstroms'),
             ('CTYPE1', 'LINEAR'), ('CRVAL1', 3600.0), ('CD1_1', 4.0), ('CRPIX1', 1.0),
             ('BANDID1', 'spectrum - background fit, weights variance, clean no'),
             ('BANDID2', 'raw - background fit, weights none, clean no'),
             ('BANDID3', 'background - background fit'),
             ('BANDID4', 'sigma - background fit, weights variance, clean no')]:
    hdu.header[k] = v
hdu.writeto(os.path.join(out_dir, 'multispec.fits'))
back = fits.open(os.path.join(out_dir, 'multispec.fits'))[0].data.astype(float)
add('multispec.fits', vac_from_air(3600 + 4.0 * np.arange(n)), back[0, 0], 'air', 'fits-multispec', error=back[3, 0], sky=back[2, 0])

# Per-pixel binary table: wavelength in nm (TUNIT), scaled integer flux with TSCAL/TZERO/TNULL, ivar.
wave_nm = 380 + 0.3 * np.arange(n)
stored = rng.integers(0, 30000, n).astype('>i4'); stored[5] = -1
ivar = np.full(n, 4.0); ivar[9] = 0
raw_tab = fits.BinTableHDU.from_columns([fits.Column(name='WAVELENGTH', format='D', unit='nm', array=wave_nm),
                                         fits.Column(name='FLUX', format='J', array=stored),
                                         fits.Column(name='IVAR', format='E', array=ivar)])
# Scaling keywords added after the data, so the stored integers are written as they are.
raw_tab.header['TSCAL2'] = 0.001; raw_tab.header['TZERO2'] = -5.0; raw_tab.header['TNULL2'] = -1
raw_tab.header['TUNIT2'] = '1e-17 erg/s/cm2/Angstrom'; raw_tab.header['AIRORVAC'] = 'vac'
fits.HDUList([fits.PrimaryHDU(), raw_tab]).writeto(os.path.join(out_dir, 'table-rows.fits'))
d = fits.open(os.path.join(out_dir, 'table-rows.fits'))[1].data
# FITS 4.0 7.3.2: physical = TZERO + TSCAL * stored; TNULL cells are undefined (NaN here).
fl = np.where(stored == -1, np.nan, stored * 0.001 - 5.0)
good = stored != -1
assert np.allclose(np.asarray(d['FLUX'], dtype=float)[good], fl[good])
with np.errstate(divide='ignore'):
    e = np.where(d['IVAR'] > 0, 1 / np.sqrt(np.where(d['IVAR'] > 0, d['IVAR'], 1)), np.nan)
add('table-rows.fits', np.asarray(d['WAVELENGTH'], dtype=float) * 10, fl, 'vacuum', 'fits-table-rows', error=e)

# Single-row table with array columns (wave in Angstrom, flux, error).
arr_wave = 6000 + 1.2 * np.arange(n); arr_flux = rng.normal(1, 0.1, n); arr_err = np.full(n, 0.05)
t = fits.BinTableHDU.from_columns([fits.Column(name='wave', format='%dD' % n, unit='Angstrom', array=[arr_wave]),
                                   fits.Column(name='flux', format='%dE' % n, array=[arr_flux]),
                                   fits.Column(name='err', format='%dE' % n, array=[arr_err])])
t.header['SPECSYS'] = 'BARYCENT'
t.header['CTYPE1'] = 'WAVE'
fits.HDUList([fits.PrimaryHDU(), t]).writeto(os.path.join(out_dir, 'table-arrays.fits'))
d = fits.open(os.path.join(out_dir, 'table-arrays.fits'))[1].data
add('table-arrays.fits', d['wave'][0], d['flux'][0], 'vacuum', 'fits-table-arrays', error=d['err'][0])

# Two rows of array columns, the longer-wavelength segment first (as HST x1d files hold their
# segments): joined in wavelength order (numpy's stable argsort).
seg_w = np.array([np.linspace(6000, 6500, n), np.linspace(5400, 5950, n)])
seg_f = rng.normal(2, 0.2, (2, n)); seg_e = np.full((2, n), 0.1)
t2 = fits.BinTableHDU.from_columns([fits.Column(name='WAVELENGTH', format='%dD' % n, unit='Angstrom', array=seg_w),
                                    fits.Column(name='FLUX', format='%dE' % n, array=seg_f),
                                    fits.Column(name='ERROR', format='%dE' % n, array=seg_e)])
t2.header['AIRORVAC'] = 'vac'
fits.HDUList([fits.PrimaryHDU(), t2]).writeto(os.path.join(out_dir, 'table-segments.fits'))
d = fits.open(os.path.join(out_dir, 'table-segments.fits'))[1].data
w_all = np.concatenate(list(d['WAVELENGTH'])); order = np.argsort(w_all, kind='stable')
add('table-segments.fits', w_all[order], np.concatenate(list(d['FLUX']))[order], 'vacuum', 'fits-table-arrays (2 rows joined in wavelength order)', error=np.concatenate(list(d['ERROR']))[order])

# Rows wavelength (um), flux, error, flag in one 2-D image with XUNITS/YUNITS and WAVETYPE (the
# layout of IRTF Spextool spectra).
sw = np.linspace(0.81, 2.45, n); sf = rng.normal(5, 0.3, n); se = np.full(n, 0.2); sq = np.zeros(n); sq[7] = 1
hdu = fits.PrimaryHDU(data=np.stack([sw, sf, se, sq]))
for k, v in [('XUNITS', 'um'), ('YUNITS', 'W m-2 um-1'), ('WAVETYPE', 'vacuum')]:
    hdu.header[k] = v
hdu.writeto(os.path.join(out_dir, 'wave-rows.fits'))
back = fits.open(os.path.join(out_dir, 'wave-rows.fits'))[0].data
add('wave-rows.fits', back[0] * 1e4, back[1], 'vacuum', 'fits-image-rows (wavelength, flux, error)', error=back[2])

# ASCII table (XTENSION = 'TABLE').
at = fits.TableHDU.from_columns([fits.Column(name='lambda', format='F12.4', unit='Angstrom', array=arr_wave),
                                 fits.Column(name='flux', format='E15.7', array=arr_flux)])
at.header['VACUUM'] = True
fits.HDUList([fits.PrimaryHDU(), at]).writeto(os.path.join(out_dir, 'ascii-table.fits'))
d = fits.open(os.path.join(out_dir, 'ascii-table.fits'))[1].data
add('ascii-table.fits', d['lambda'], d['flux'], 'vacuum', 'fits-table-rows')

# gzip-compressed copy of the multispec file.
with open(os.path.join(out_dir, 'multispec.fits'), 'rb') as src, gzip.open(os.path.join(out_dir, 'multispec.fits.gz'), 'wb') as dst:
    shutil.copyfileobj(src, dst)
c = dict([x for x in cases if x['file'] == 'multispec.fits'][0])
c['file'] = 'multispec.fits.gz'; c['format'] = 'fits-multispec (gzip)'
cases.append(c)
print(json.dumps(cases))
`;

const dir = mkdtempSync(join(tmpdir(), 'zvet-astropy-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const cases = astropyJson<Case[]>(SCRIPT, [dir]);

function expectSame(ours: Float64Array | undefined, ref: Array<number | null> | null, relTol: number, what: string) {
  if (ref === null) return;
  expect(ours, what).toBeDefined();
  expect(ours!.length, `${what} length`).toBe(ref.length);
  for (let i = 0; i < ref.length; i++) {
    const r = ref[i];
    if (r === null) expect(Number.isFinite(ours![i]), `${what}[${i}] non-finite`).toBe(false);
    else expect(Math.abs(ours![i] - r), `${what}[${i}]: ${ours![i]} vs ${r}`).toBeLessThanOrEqual(relTol * Math.max(Math.abs(r), 1e-12));
  }
}

describe('files written by astropy read back in zvet', () => {
  it('astropy wrote every case', () => {
    expect(cases.map((c) => c.file)).toEqual([
      'bitpix8.fits', 'bitpix16.fits', 'bitpix32.fits', 'bitpix64.fits', 'bitpix-32.fits', 'bitpix-64.fits',
      'continue-awav-nm.fits', 'wave-log.fits', 'dcflag.fits', 'coeff-1d.fits', 'multispec.fits', 'table-rows.fits',
      'table-arrays.fits', 'table-segments.fits', 'wave-rows.fits', 'ascii-table.fits', 'multispec.fits.gz',
    ]);
  });
  it('the integer images carry BLANK pixels and the long OBJECT needed CONTINUE cards', () => {
    for (const bitpix of [8, 16, 32, 64]) {
      expect(cases.find((c) => c.file === `bitpix${bitpix}.fits`)!.flux.filter((v) => v === null)).toHaveLength(2);
    }
    expect(cases.find((c) => c.file === 'continue-awav-nm.fits')!.object!.length).toBeGreaterThan(68);
  });
  for (const c of cases) {
    it(c.file, () => {
      const s = readSpectrum(new Uint8Array(readFileSync(join(dir, c.file))), c.file);
      expect(s.provenance.format).toBe(c.format);
      expect(s.provenance.medium).toBe(c.medium);
      expectSame(s.waveAngstrom, c.wave, 1e-9, 'wavelength');
      expectSame(s.flux, c.flux, 1e-6, 'flux');
      expectSame(c.error ? s.error : undefined, c.error, 1e-6, 'error');
      expectSame(c.sky ? s.sky : undefined, c.sky, 1e-6, 'sky');
      if (c.object) expect(s.meta.object).toBe(c.object);
    });
  }
  it('reads SPECSYS of the array table as barycentric (WCS Paper III)', () => {
    const s = readSpectrum(new Uint8Array(readFileSync(join(dir, 'table-arrays.fits'))), 'table-arrays.fits');
    expect(s.meta.velocityFrame).toBe('barycentric');
  });
});
