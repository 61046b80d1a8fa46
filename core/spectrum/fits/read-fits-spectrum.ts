/**
 * Finds the spectra in a FITS file and reads one: every HDU is offered to the layout readers
 * (images with a wavelength row, banded images, 1-D images, tables); the first HDU holding a spectrum is read unless the
 * caller picks another (`--hdu`).
 */
import type { FitsFile } from '../../fits/parse.js';
import type { SpectrumDraft } from '../draft.js';
import { SpectrumReadError } from '../spectrum.js';
import { matchBandedImage } from './banded-image.js';
import { matchImage1d } from './image-spectrum.js';
import { hduContext, type LayoutMatch, type LayoutVerdict, type HduContext } from './layout.js';
import { matchTable } from './table-spectrum.js';
import { matchWavelengthRowImage } from './row-image.js';

const LAYOUTS: Array<(ctx: HduContext) => LayoutVerdict> = [matchWavelengthRowImage, matchBandedImage, matchImage1d, matchTable];

interface HduVerdict {
  index: number;
  name: string;
  match?: LayoutMatch;
  why?: string;
}

export function readFitsSpectrum(file: FitsFile, hdu?: number): SpectrumDraft {
  const verdicts = file.hdus.map((h): HduVerdict => {
    const ctx = hduContext(file, h);
    const name = h.extname ? `HDU ${h.index} (${h.extname})` : `HDU ${h.index}`;
    for (const layout of LAYOUTS) {
      const v = layout(ctx);
      if (typeof v === 'string') return { index: h.index, name, why: v };
      if (v) return { index: h.index, name, match: v };
    }
    return { index: h.index, name, why: h.kind === 'empty' ? 'no data' : `${h.kind} HDU` };
  });
  const spectrumHdus = verdicts.filter((v) => v.match).map((v) => v.index);
  const fail = (reason: string): never => {
    throw new SpectrumReadError(file.fileName, reason);
  };
  if (spectrumHdus.length === 0) {
    const reasons = verdicts.filter((v) => v.why !== 'no data').map((v) => `${v.name}: ${v.why}`);
    fail(`not a spectrum: no HDU holds one${reasons.length ? ` (${reasons.slice(0, 3).join('; ')}${reasons.length > 3 ? '; …' : ''})` : ''}`);
  }
  const chosen = hdu ?? spectrumHdus[0];
  const verdict = verdicts[chosen];
  if (!verdict) fail(`there is no HDU ${chosen} (the file has HDUs 0–${file.hdus.length - 1})`);
  if (!verdict.match) fail(`${verdict.name} holds no spectrum (${verdict.why}); spectrum HDUs: ${spectrumHdus.join(', ')}`);
  return { ...verdict.match!.read(), hdu: chosen, spectrumHdus };
}
