// Property tests (fast-check): whatever bytes arrive — random, cut short, or real survey files
// with one byte changed — readSpectrum returns a Spectrum or throws SpectrumReadError, nothing
// else. A modest slice for `npm test`; heavy fuzzing runs separately.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { gzipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { readSpectrum } from '../../core/spectrum/read.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { OPEN_SPECTRA } from '../support/paths.js';

const REAL = [
  'sdss/spec-0266-51602-0001.fits',
  'sdss/spec-3655-55240-0070.fits',
  'sdss/sample_sdss.fits',
  'other/2101150022012393.fits',
  'other/cosmos-01-G141_20062.1D.fits',
].map((f) => new Uint8Array(readFileSync(join(OPEN_SPECTRA, f))));
const TEXT = new TextEncoder().encode(
  `# OBJECT = KRT-26-0017\nwave_A,flux,err\n${Array.from({ length: 40 }, (_, i) => `${5000 + i},${1 + (i % 3)},0.1`).join('\n')}\n`,
);
const SAMPLES = [...REAL, TEXT, gzipSync(REAL[4])];

/** Reads, and fails the property if anything but SpectrumReadError is thrown. */
function readsOrRefuses(bytes: Uint8Array): boolean {
  try {
    const s = readSpectrum(bytes, 'fuzz.fits');
    // A spectrum that comes back must keep zvet's promises.
    for (let i = 1; i < s.waveAngstrom.length; i++) if (!(s.waveAngstrom[i] > s.waveAngstrom[i - 1])) return false;
    return s.flux.length === s.waveAngstrom.length && s.mask.length === s.flux.length;
  } catch (e) {
    if (e instanceof SpectrumReadError && !e.message.includes('\n')) return true;
    throw e;
  }
}

describe('readSpectrum never throws anything but SpectrumReadError', () => {
  it('on random bytes (some starting like FITS or gzip)', () => {
    const prefix = fc.constantFrom(new Uint8Array(0), new TextEncoder().encode('SIMPLE  = '), new Uint8Array([0x1f, 0x8b]));
    fc.assert(
      fc.property(prefix, fc.uint8Array({ maxLength: 6000 }), (p, body) => readsOrRefuses(new Uint8Array([...p, ...body]))),
      { numRuns: 400 },
    );
  });
  it('on real files cut short anywhere', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: SAMPLES.length - 1 }), fc.double({ min: 0, max: 1, noNaN: true }), (k, frac) =>
        readsOrRefuses(SAMPLES[k].subarray(0, Math.floor(SAMPLES[k].length * frac))),
      ),
      { numRuns: 300 },
    );
  });
  it('on real files with one byte changed (headers mostly, where it matters)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: SAMPLES.length - 1 }), fc.double({ min: 0, max: 1, noNaN: true }), fc.boolean(), fc.integer({ min: 0, max: 255 }), (k, frac, inHeader, byte) => {
        const src = SAMPLES[k];
        const limit = inHeader ? Math.min(src.length, 2880 * 3) : src.length;
        const bytes = src.slice();
        bytes[Math.floor(limit * frac) % bytes.length] = byte;
        return readsOrRefuses(bytes);
      }),
      { numRuns: 600 },
    );
  });
  it('the unmodified samples all read', () => {
    for (const s of SAMPLES) expect(readSpectrum(s, 'x').waveAngstrom.length).toBeGreaterThan(10);
  });
});
