// IRAF multispec wavelengths (CTYPE1 = 'MULTISPE', WAT2 'spec1' strings) read by zvet against
// Debian's python3-specutils 1.9 (its IRAF reader, _read_non_linear_iraf_wcs), on files astropy
// writes: Chebyshev and Legendre dispersions (ftype 1, 2; specutils evaluates them with
// astropy.modeling on the domain [pmin, pmax]) with a Doppler factor z, in a 1-D image and in a
// 3-D image with bands. specutils ignores the weight and zeropoint fields (it takes 1 and 0),
// so two blocks of weights 1 and 3 are checked against (λ₁ + 3λ₂)/4 of specutils' λ for each
// block alone (the weighted mean of IRAF's wfmspec.x). A linear spec1 (dtype 0) is checked
// against the formula of the IRAF specwcs document evaluated in Python. specutils evaluates no
// splines: a linear spline must pass through its knots, and a cubic one must reproduce the
// straight line its coefficients lie on (6 times, IRAF's basis being unnormalised); a table
// dispersion is refused.
// Air wavelengths go to vacuum by Morton (1991) eq. 3 in Python, as zvet does.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read.js';
import { astropyJson, PYTHON_VAC_FROM_AIR } from '../support/tools.js';

interface Case {
  file: string;
  wave: number[] | null;
  flux: number[];
  format: string;
}

const SCRIPT = String.raw`
import sys, json, os, warnings
import numpy as np
from astropy.io import fits
from specutils.io.default_loaders.wcs_fits import _read_non_linear_iraf_wcs

out_dir = sys.argv[1]
n = 300
rng = np.random.default_rng(3)
cases = []
${PYTHON_VAC_FROM_AIR}

def wat_cards(header, axis, text):
    # IRAF splits the string over cards of 68 characters, blanks included.
    for i in range(0, len(text), 68):
        header['WAT%d_%03d' % (axis, i // 68 + 1)] = text[i:i + 68]

def multispec(shape, spec1, bands=None):
    data = rng.normal(50, 3, shape).astype('>f4')
    h = fits.PrimaryHDU(data)
    h.header['WCSDIM'] = 2
    h.header['CTYPE1'] = 'MULTISPE'
    h.header['CTYPE2'] = 'MULTISPE'
    h.header['CRVAL1'] = 1.0
    h.header['CDELT1'] = 1.0
    h.header['WAT0_001'] = 'system=multispec'
    h.header['WAT1_001'] = 'wtype=multispec label=Wavelength units=angstroms'
    wat_cards(h.header, 2, 'wtype=multispec spec1 = "%s"' % spec1)
    for i, label in enumerate(bands or []):
        h.header['BANDID%d' % (i + 1)] = label
    return h

def add(name, h, fmt, wave):
    h.writeto(os.path.join(out_dir, name))
    back = fits.open(os.path.join(out_dir, name))[0]
    flux = back.data.reshape(-1, back.data.shape[-1])[0].astype(float)
    cases.append({'file': name, 'wave': None if wave is None else [float(x) for x in vac_from_air(wave)], 'flux': [float(x) for x in flux], 'format': fmt})
    return back.header

def specutils_wave(header):
    with warnings.catch_warnings():
        warnings.simplefilter('ignore')
        return _read_non_linear_iraf_wcs(header, 2)[0]

# Chebyshev, order 4, over pixels 1..n, z = 0.
cheb = '1 1 2 5200.5 1.9 %d 0. 12.25 22.75 1. 0. 1 4 1. %d. 5485.3 284.6 -3.1 0.42' % (n, n)
h = multispec((n,), cheb)
h.writeto(os.path.join(out_dir, 'cheb.fits'))
add('cheb-1d.fits', h, 'fits-image-1d', specutils_wave(fits.getheader(os.path.join(out_dir, 'cheb.fits'))))

# Legendre, order 3, over pixels 5..n-10, with a Doppler factor z = 1.2e-4 (IRAF divides by 1 + z).
leg = '1 1 2 4100. 2.1 %d 0.00012 3. 9. 1. 0. 2 3 5. %d. 4415.8 311.7 1.8' % (n, n - 10)
h = multispec((n,), leg)
h.writeto(os.path.join(out_dir, 'leg.fits'))
add('legendre-1d.fits', h, 'fits-image-1d', specutils_wave(fits.getheader(os.path.join(out_dir, 'leg.fits'))))

# 3-D image with bands (IRAF apall 'extras'), the same Chebyshev solution.
labels = ['spectrum - background fit, weights variance, clean no', 'raw - background fit, weights none, clean no',
          'background - background fit', 'sigma - background fit, weights variance, clean no']
h = multispec((4, 1, n), cheb, labels)
h.header['WCSDIM'] = 3
h.header['CTYPE3'] = 'LINEAR'
add('cheb-bands.fits', h, 'fits-multispec', specutils_wave(fits.getheader(os.path.join(out_dir, 'cheb.fits'))))

# The Chebyshev aperture padded by 20 pixels past nw (as IRAF pads shorter apertures): only the
# first nw pixels have wavelengths, those of the unpadded file.
padded = multispec((n,), cheb.replace(' %d 0. 12.25' % n, ' %d 0. 12.25' % (n - 20)))
padded.data[n - 20:] = 0
lam = specutils_wave(fits.getheader(os.path.join(out_dir, 'cheb.fits')))[:n - 20]
add('padded-1d.fits', padded, 'fits-image-1d', lam)
cases[-1]['flux'] = cases[-1]['flux'][:n - 20]

# Linear spec1 (dtype 0): lambda = (w1 + dw (p - 1)) / (1 + z).
h = multispec((n,), '1 1 0 3900. 2.5 %d 0.0002 10. 20.' % n)
add('linear-1d.fits', h, 'fits-image-1d', (3900. + 2.5 * np.arange(n)) / 1.0002)

# Two Chebyshev blocks of weights 1 and 3 (zvet) against specutils' lambda of each alone.
cheb2 = '1 1 2 5200.5 1.9 %d 0. 12.25 22.75 1. 0. 1 2 1. %d. 5400.0 290.0' % (n, n)
both = cheb + ' 3. 0. 1 2 1. %d. 5400.0 290.0' % n
one_a = multispec((n,), cheb); one_b = multispec((n,), cheb2)
for name, hh in [('a.fits', one_a), ('b.fits', one_b)]:
    hh.writeto(os.path.join(out_dir, name))
lam_a = specutils_wave(fits.getheader(os.path.join(out_dir, 'a.fits')))
lam_b = specutils_wave(fits.getheader(os.path.join(out_dir, 'b.fits')))
add('weighted-1d.fits', multispec((n,), both), 'fits-image-1d', (lam_a + 3 * lam_b) / 4)

# Linear spline (ftype 4) of 3 pieces over pixels 1..n with n = 301: knots at pixels 1, 101, 201, 301.
m = 301
h = multispec((m,), '1 1 2 4000. 2. %d 0. 1. 2. 1. 0. 4 3 1. %d. 4000. 4210. 4405. 4610.' % (m, m))
knot = np.interp(np.arange(m), [0, 100, 200, 300], [4000., 4210., 4405., 4610.])
add('lspline-1d.fits', h, 'fits-image-1d', knot)

# Cubic spline (ftype 3), 2 pieces, coefficients 700 + 50 k: a uniform cubic B-spline reproduces
# a straight line (de Boor, A Practical Guide to Splines), and IRAF's basis is 6 times the
# normalised one, so lambda = 6 (700 + 50 (x + 1)) with x = 2 (p - 1) / (n - 1).
h = multispec((n,), '1 1 2 4000. 2. %d 0. 1. 2. 1. 0. 3 2 1. %d. 700. 750. 800. 850. 900.' % (n, n))
x = 2 * np.arange(n) / (n - 1)
add('cspline-1d.fits', h, 'fits-image-1d', 6 * (700 + 50 * (x + 1)))

# A pixel-table dispersion (ftype 5), which zvet does not evaluate.
h = multispec((n,), '1 1 2 4000. 2. %d 0. 1. 2. 1. 0. 5 3 4000. 4300. 4600.' % n)
add('table-1d.fits', h, 'refused', None)
print(json.dumps(cases))
`;

const dir = mkdtempSync(join(tmpdir(), 'zvet-multispec-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const cases = astropyJson<Case[]>(SCRIPT, [dir]);
const read = (file: string) => readSpectrum(new Uint8Array(readFileSync(join(dir, file))), file);

describe('IRAF multispec wavelengths, against specutils', () => {
  it('specutils and astropy wrote every case', () => {
    expect(cases.map((c) => c.file)).toEqual(['cheb-1d.fits', 'legendre-1d.fits', 'cheb-bands.fits', 'padded-1d.fits', 'linear-1d.fits', 'weighted-1d.fits', 'lspline-1d.fits', 'cspline-1d.fits', 'table-1d.fits']);
  });
  for (const c of cases.filter((x) => x.wave)) {
    it(`${c.file}: wavelengths within 1e-9 relative, the flux of aperture 1`, () => {
      const s = read(c.file);
      expect(s.provenance.format).toBe(c.format);
      expect(s.provenance.medium).toBe('air');
      expect(s.waveAngstrom.length).toBe(c.wave!.length);
      for (let i = 0; i < c.wave!.length; i++) {
        expect(Math.abs(s.waveAngstrom[i] / c.wave![i] - 1), `${c.file}[${i}]: ${s.waveAngstrom[i]} vs ${c.wave![i]}`).toBeLessThan(1e-9);
      }
      expect(Array.from(s.flux)).toEqual(c.flux.map((v) => Math.fround(v)));
    });
  }
  it('refuses a table dispersion by name, in one line, instead of reading pixel numbers as wavelengths', () => {
    expect(() => read('table-1d.fits')).toThrow(/dispersion function type 5 \(a pixel or sampled table\) is not read/);
  });
});
