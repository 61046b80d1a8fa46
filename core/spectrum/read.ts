/**
 * readSpectrum: bytes in, Spectrum out. Sniffs the content (gzip magic → inflate; 'SIMPLE  ='
 * → FITS; otherwise text), reads the spectrum and puts it on zvet's footing (finish.ts).
 * Bad input always ends as a SpectrumReadError with the file name and a one-line reason.
 */
import { looksLikeFits, parseFits } from '../fits/parse.js';
import { finishSpectrum } from './finish.js';
import { readFitsSpectrum } from './fits/read-fits-spectrum.js';
import { gunzip, isGzip } from './gunzip.js';
import { userMedium } from './medium.js';
import { SpectrumReadError, type Spectrum } from './spectrum.js';
import { readTextSpectrum } from './text-reader.js';

export interface ReadOptions {
  /** HDU to read (0 = primary); default: the first HDU that holds a spectrum. */
  hdu?: number;
  /** Medium of the file's wavelengths, overriding what the file says. */
  medium?: 'air' | 'vacuum';
}

export function readSpectrum(bytes: Uint8Array, fileName: string, options: ReadOptions = {}): Spectrum {
  try {
    if (bytes.length === 0) throw new SpectrumReadError(fileName, 'the file is empty');
    const data = isGzip(bytes) ? gunzip(bytes, fileName) : bytes;
    if (data.length === 0) throw new SpectrumReadError(fileName, 'the file is empty once decompressed');
    const override = options.medium ? userMedium(options.medium) : undefined;
    if (looksLikeFits(data)) {
      const draft = readFitsSpectrum(parseFits(data, fileName), options.hdu);
      return finishSpectrum(gz(draft, data !== bytes), fileName, override);
    }
    if (options.hdu !== undefined && options.hdu !== 0) {
      throw new SpectrumReadError(fileName, 'is a text file; --hdu applies to FITS files only');
    }
    return finishSpectrum(gz(readTextSpectrum(data, fileName), data !== bytes), fileName, override);
  } catch (err) {
    if (err instanceof SpectrumReadError) throw err;
    // Anything else is a reader bug or a malformed file we did not foresee: still one line.
    const why = err instanceof RangeError ? 'data ends or points outside the file' : err instanceof Error ? err.message : String(err);
    throw new SpectrumReadError(fileName, `unreadable (${why.split('\n')[0]})`);
  }
}

function gz<T extends { format: string }>(draft: T, compressed: boolean): T {
  return compressed ? { ...draft, format: `${draft.format} (gzip)` } : draft;
}
