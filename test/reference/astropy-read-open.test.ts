// Every file of the open survey spectra, read by zvet and by Debian's astropy (the reference),
// which computes the same quantities from each survey's documented layout (the open spectra
// README, "File formats"): SDSS λ = 10^loglam, σ = 1/√ivar; spSpec λ = 10^(COEFF0 + COEFF1·i);
// GALAH λ = CRVAL1 + CDELT1·(i + 1 − CRPIX1) in air, taken to vacuum with Morton (1991) eq. 3
// written out again in Python; 3D-HST flux density = (flux − contam)/sensitivity.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { OPEN_SPECTRA } from '../support/paths.js';
import { astropyJson } from '../support/tools.js';

const files = ['sdss', 'other'].flatMap((d) =>
  readdirSync(join(OPEN_SPECTRA, d))
    .filter((f) => f.endsWith('.fits'))
    .map((f) => join(OPEN_SPECTRA, d, f)),
);

/** Files in the set that hold no spectrum (README: the GALAH table and the 3D-HST p(z) files). */
const NOT_SPECTRA = /dr6\.0\.fits$|\.pz\.fits$/;

interface Reference {
  file: string;
  layout: string;
  wave: number[];
  flux: Array<number | null>;
  error: Array<number | null> | null;
}

const SCRIPT = String.raw`
import sys, json, os
import numpy as np
from astropy.io import fits

def vac_from_air(w):
    # Morton (1991, ApJS 77, 119) eq. 3, inverted by iteration; >= 2000 A only.
    w = np.asarray(w, dtype=float)
    v = w.copy()
    for _ in range(8):
        s2 = (1e4 / v) ** 2
        n = 1 + (6432.8 + 2949810 / (146 - s2) + 25540 / (41 - s2)) * 1e-8
        v = np.where(w >= 2000, w * n, w)
    return v

def clean(a):
    return [None if not np.isfinite(x) else float(x) for x in np.asarray(a, dtype=float)]

out = []
for path in sys.argv[1:]:
    name = os.path.basename(path)
    h = fits.open(path)
    err = None
    if name.startswith('spec-'):
        d = h[1].data  # astropy column look-up ignores case, as the DR16 files need
        wave = 10.0 ** d['loglam'].astype(float)
        flux = d['flux'].astype(float)
        ivar = d['ivar'].astype(float)
        with np.errstate(divide='ignore'):
            err = np.where(ivar > 0, 1 / np.sqrt(np.where(ivar > 0, ivar, 1)), np.nan)
        layout = 'sdss-coadd'
    elif name == 'sample_sdss.fits':
        hd = h[0].header
        n = hd['NAXIS1']
        wave = 10.0 ** (hd['COEFF0'] + hd['COEFF1'] * np.arange(n))
        flux = h[0].data[0].astype(float)
        err = h[0].data[2].astype(float)
        err = np.where(err > 0, err, np.nan)
        layout = 'spspec'
    elif name.endswith('.1D.fits'):
        d = h[1].data
        wave = d['wave'].astype(float)
        with np.errstate(divide='ignore', invalid='ignore'):
            flux = (d['flux'] - d['contam']) / d['sensitivity']
            err = d['error'] / d['sensitivity']
        layout = 'grism'
    else:
        hd = h[0].header
        n = hd['NAXIS1']
        wave = vac_from_air(hd['CRVAL1'] + hd['CDELT1'] * (np.arange(n) + 1 - hd['CRPIX1']))
        flux = h[0].data.astype(float)
        err = h['relative_error'].data.astype(float) * np.abs(flux)
        layout = 'galah'
    out.append({'file': path, 'layout': layout, 'wave': [float(x) for x in wave], 'flux': clean(flux), 'error': clean(err)})
print(json.dumps(out))
`;

const spectrumFiles = files.filter((f) => !NOT_SPECTRA.test(f));
const references = new Map(astropyJson<Reference[]>(SCRIPT, spectrumFiles).map((r) => [r.file, r]));

/** Compares where the reference is finite; where it is not, zvet must hold NaN or mask the pixel. */
function expectClose(ours: Float64Array, ref: Array<number | null>, relTol: number, what: string) {
  expect(ours.length, `${what} length`).toBe(ref.length);
  let worst = 0;
  for (let i = 0; i < ref.length; i++) {
    const r = ref[i];
    if (r === null) {
      expect(Number.isFinite(ours[i]), `${what}[${i}] should be non-finite`).toBe(false);
      continue;
    }
    const scale = Math.max(Math.abs(r), 1e-30);
    worst = Math.max(worst, Math.abs(ours[i] - r) / scale);
  }
  expect(worst, `${what}: worst relative difference`).toBeLessThan(relTol);
}

describe('open survey spectra: zvet agrees with astropy', () => {
  it('finds the expected files', () => {
    // README: 33 SDSS files, 2 grism spectra with 2 p(z) files, 3 GALAH spectra and 1 table.
    expect(files.length).toBe(41);
    expect(spectrumFiles.length).toBe(38);
  });

  for (const file of spectrumFiles) {
    it(file.slice(OPEN_SPECTRA.length + 1), () => {
      const ref = references.get(file)!;
      const s = readSpectrum(new Uint8Array(readFileSync(file)), file);
      // Tolerance: 1e-6 relative on wavelength (brief; float32 loglam agrees far better).
      expectClose(s.waveAngstrom, ref.wave, 1e-6, 'wavelength');
      // Flux: the same float32/float64 numbers, so only rounding may differ.
      expectClose(s.flux, ref.flux, 1e-9, 'flux');
      // Errors: the reference NaN pixels (ivar = 0, σ = 0) must be masked by zvet.
      const refErr = ref.error!;
      for (let i = 0; i < refErr.length; i++) if (refErr[i] === null) expect(s.mask[i], `mask[${i}]`).toBe(1);
      const ours = s.error.map((e, i) => (refErr[i] === null ? NaN : e));
      expectClose(ours, refErr, 1e-6, 'error');
      expect(s.provenance.medium).toBe(ref.layout === 'galah' ? 'air' : 'vacuum');
    });
  }

  for (const file of files.filter((f) => NOT_SPECTRA.test(f))) {
    it(`${file.slice(OPEN_SPECTRA.length + 1)} is refused with one line`, () => {
      let err: unknown;
      try {
        readSpectrum(new Uint8Array(readFileSync(file)), 'x.fits');
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(SpectrumReadError);
      expect((err as Error).message).toMatch(/^x\.fits: not a spectrum/);
      expect((err as Error).message).not.toContain('\n');
    });
  }
});
