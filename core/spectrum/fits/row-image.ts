/**
 * 2-D images whose first row is the wavelength: rows wavelength, flux, error and an optional
 * flag row (non-zero = bad), with the unit in XUNITS and the flux unit in YUNITS, as the IRTF
 * Spextool writes its spectra (Cushing et al. 2004, PASP 116, 362; the layout from memory).
 * WAVETYPE, when present, says air or vacuum. Taken only when the header has no wavelength axis and row 1 is a positive,
 * strictly monotonic sequence.
 */
import { readImage } from '../../fits/image.js';
import { maskFrom } from '../columns.js';
import { guessWaveUnit, parseWaveUnit } from '../units.js';
import { bunit, headerParts, type HduContext, type LayoutVerdict } from './layout.js';
import { isMultispec } from './multispec-wcs.js';
import { hasCoeffAxis, hasLinearAxis } from './wavelength-axis.js';

export function matchWavelengthRowImage(ctx: HduContext): LayoutVerdict {
  const { hdu, keywords: k } = ctx;
  if (hdu.kind !== 'image' || hdu.axes.length !== 2) return undefined;
  const [n, rows] = hdu.axes;
  if (rows < 2 || rows > 4 || n < 2 || hasLinearAxis(k) || hasCoeffAxis(k) || isMultispec(k)) return undefined;
  const values = readImage(hdu).values;
  if (!isWavelengthRow(values.subarray(0, n))) return undefined;
  return {
    format: 'fits-image-rows (wavelength, flux, error)',
    read: () => {
      const row = (r: number) => values.slice(r * n, (r + 1) * n);
      const wave = row(0);
      const mask = new Uint8Array(n);
      if (rows === 4) maskFrom(row(3), mask);
      const units = k.string('XUNITS')?.trim();
      return {
        format: 'fits-image-rows (wavelength, flux, error)',
        wave,
        waveUnit: (units && parseWaveUnit(units)) || guessWaveUnit(wave),
        dispersion: 'tabulated',
        flux: row(1),
        error: rows >= 3 ? row(2) : undefined,
        errorKind: rows >= 3 ? 'sigma' : 'none',
        mask: rows >= 3 ? mask : undefined,
        fluxUnit: k.string('YUNITS')?.trim() || bunit(k) || 'unknown',
        ...headerParts(ctx),
      };
    },
  };
}

function isWavelengthRow(w: Float64Array): boolean {
  const rising = w[1] > w[0];
  for (let i = 0; i < w.length; i++) {
    if (!(w[i] > 0)) return false;
    if (i > 0 && (rising ? !(w[i] > w[i - 1]) : !(w[i] < w[i - 1]))) return false;
  }
  return true;
}
