// Every kind of bad input ends as one SpectrumReadError naming the file and the problem.
import { Gzip, gzipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { MAX_ELEMENTS } from '../../core/fits/parse.js';
import { gunzip, MAX_INFLATED_BYTES } from '../../core/spectrum/gunzip.js';
import { readSpectrum } from '../../core/spectrum/read.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { EMPTY_PRIMARY, beBytes, binTable, concat, fitsBytes, imageCards, linearWcs, testFlux } from './fits-fixtures.js';

const enc = (s: string) => new TextEncoder().encode(s);

function failure(bytes: Uint8Array, name = 'bad.fits'): string {
  try {
    readSpectrum(bytes, name);
  } catch (e) {
    expect(e).toBeInstanceOf(SpectrumReadError);
    const msg = (e as Error).message;
    expect(msg.startsWith(`${name}: `)).toBe(true);
    expect(msg).not.toContain('\n');
    return (e as SpectrumReadError).reason;
  }
  throw new Error('expected the read to fail');
}

const image = (values: number[], wcs = linearWcs(4000, 1)) => fitsBytes([{ cards: imageCards(-64, [values.length], wcs), data: beBytes('f64', values) }]);

describe('bad input', () => {
  it('empty file', () => expect(failure(new Uint8Array(0))).toBe('the file is empty'));
  it('text that is not a spectrum', () => expect(failure(enc('hello world\nthis is a letter\n'), 'a.txt')).toMatch(/neither a header row nor numbers/));
  it('binary junk', () => expect(failure(new Uint8Array([1, 2, 0, 4, 5]), 'a.bin')).toMatch(/binary data/));
  it('FITS file holding no spectrum', () => expect(failure(fitsBytes([EMPTY_PRIMARY]))).toMatch(/^not a spectrum/));
  it('truncated FITS: header cut short, data cut short', () => {
    const whole = image(testFlux(20));
    expect(failure(whole.subarray(0, 400))).toBe('truncated: the header of HDU 0 has no END card');
    expect(failure(whole.subarray(0, 2880 + 100))).toBe('truncated: HDU 0 header claims 160 bytes of data but the file holds only 100 more');
  });
  it('header claiming more data than the file holds', () => {
    const bytes = fitsBytes([{ cards: imageCards(-64, [4000], linearWcs(4000, 1)), data: beBytes('f64', testFlux(20)) }]);
    expect(failure(bytes)).toMatch(/^truncated: HDU 0 header claims 32000 bytes/);
  });
  it(`more than ${MAX_ELEMENTS} pixels`, () => {
    const n = MAX_ELEMENTS + 8;
    const bytes = fitsBytes([{ cards: imageCards(8, [n], linearWcs(4000, 1e-5)), data: new Uint8Array(n) }]);
    expect(failure(bytes)).toMatch(/more than zvet reads/);
  });
  it('all-NaN flux', () => expect(failure(image(new Array(20).fill(NaN)))).toBe('the flux is NaN or infinite in every pixel'));
  it('fewer than 10 usable pixels', () => expect(failure(image([...testFlux(9), ...new Array(11).fill(NaN)]))).toBe('only 9 usable pixels (at least 10 are needed)'));
  it('scrambled wavelengths', () => {
    const text = [5000, 5001, 5003, 5002, 5004, 5005, 5006, 5007, 5008, 5009, 5010, 5011].map((w) => `${w} 1`).join('\n');
    expect(failure(enc(text), 's.txt')).toBe('the wavelengths are not in order (pixel 4 breaks the sequence)');
  });
  it('repeated wavelengths count as scrambled', () => {
    const text = [5000, 5001, 5001, 5002, 5003, 5004, 5005, 5006, 5007, 5008, 5009, 5010].map((w) => `${w} 1`).join('\n');
    expect(failure(enc(text), 's.txt')).toMatch(/not in order \(pixel 3/);
  });
  it('text columns of different lengths', () => {
    expect(failure(enc('5000 1 0.1\n5001 2\n'), 'c.txt')).toBe('line 2 has 2 columns, but earlier lines have 3');
  });
  it('table array columns of different lengths', () => {
    const data = concat(beBytes('f64', Array.from({ length: 20 }, (_, i) => 5000 + i)), beBytes('f64', testFlux(19)));
    const t = binTable(20 * 8 + 19 * 8, 1, [{ name: 'wave', form: '20D' }, { name: 'flux', form: '19D' }], data);
    expect(failure(fitsBytes([EMPTY_PRIMARY, t]))).toBe('the flux has 19 values but the wavelengths have 20');
  });
  it('non-positive wavelengths', () => expect(failure(image(testFlux(20), linearWcs(-5, 1)))).toMatch(/wavelength of pixel 1 is -5, not a positive number/));
  it('a frequency axis is not a wavelength axis', () => expect(failure(image(testFlux(20), linearWcs(1e14, 1e10, 'FREQ', 'Hz')))).toMatch(/'FREQ', not a wavelength/));
  it('--hdu outside the file, and --hdu on a text file', () => {
    expect(() => readSpectrum(image(testFlux(20)), 'a.fits', { hdu: 5 })).toThrow(/there is no HDU 5/);
    expect(() => readSpectrum(enc('1 2\n'), 'a.txt', { hdu: 1 })).toThrow(/--hdu applies to FITS files only/);
  });
  it('corrupt and truncated gzip', () => {
    const gz = gzipSync(image(testFlux(20)));
    expect(failure(gz.subarray(0, gz.length - 12), 'a.fits.gz')).toMatch(/gzip/);
    const corrupt = gz.slice();
    corrupt.fill(0xff, 10, 40);
    expect(failure(corrupt, 'a.fits.gz')).toMatch(/gzip/);
  });
  it('a gzip bomb is refused while inflating, before its full size is allocated', () => {
    // 300 MB of zeros, compressed by streaming so the test itself never holds them.
    const parts: Uint8Array[] = [];
    const z = new Gzip({ level: 9 }, (chunk) => parts.push(chunk));
    const zeros = new Uint8Array(1 << 20);
    for (let i = 0; i < 300; i++) z.push(zeros, i === 299);
    const bomb = concat(...parts);
    expect(bomb.length).toBeLessThan(1_000_000);
    // Refused by the inflation-ratio check or, failing that, by the size cap.
    expect(failure(bomb, 'bomb.fits.gz')).toMatch(/^gzip data inflates (to more than \d+ bytes|more than \d+ times its size)/);
    expect(MAX_INFLATED_BYTES).toBeLessThan(300 * 2 ** 20);
    expect(() => gunzip(gzipSync(new Uint8Array(5000)), 'small.gz', 4096)).toThrow(/more than 4096 bytes/);
  });
});
