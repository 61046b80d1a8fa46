// HDU structure, image decoding and refusals of the FITS parser (FITS Standard 4.0 §3–§5).
import { describe, expect, it } from 'vitest';
import { readImage } from '../../core/fits/image.js';
import { MAX_ELEMENTS, parseFits } from '../../core/fits/parse.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { EMPTY_PRIMARY, beBytes, card, fitsBytes, imageCards } from './fits-fixtures.js';

function reason(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(SpectrumReadError);
    return (e as SpectrumReadError).reason;
  }
  throw new Error('expected a SpectrumReadError');
}

describe('parseFits', () => {
  it('splits primary and extensions and keeps EXTNAME', () => {
    const bytes = fitsBytes([
      EMPTY_PRIMARY,
      { cards: imageCards(-32, [5], [card('EXTNAME', 'FLUX')], true), data: beBytes('f32', [1, 2, 3, 4, 5]) },
      { cards: imageCards(16, [2, 3], [card('EXTNAME', 'ERR')], true), data: beBytes('i16', [1, 2, 3, 4, 5, 6]) },
    ]);
    const f = parseFits(bytes, 'a.fits');
    expect(f.hdus.map((h) => [h.index, h.kind, h.extname, h.axes])).toEqual([
      [0, 'empty', undefined, []],
      [1, 'image', 'FLUX', [5]],
      [2, 'image', 'ERR', [2, 3]],
    ]);
    expect(Array.from(readImage(f.hdus[1]).values)).toEqual([1, 2, 3, 4, 5]);
  });
  it('accepts a last HDU whose data is not padded to a whole block', () => {
    const bytes = fitsBytes([{ cards: imageCards(-64, [3]), data: beBytes('f64', [1.5, 2.5, 3.5]) }], { unpaddedLast: true });
    expect(Array.from(readImage(parseFits(bytes, 'a.fits').hdus[0]).values)).toEqual([1.5, 2.5, 3.5]);
  });
  it('refuses a header claiming more data than the file holds', () => {
    const bytes = fitsBytes([{ cards: imageCards(-32, [100000]), data: beBytes('f32', [1, 2, 3]) }]);
    expect(reason(() => parseFits(bytes, 'a.fits'))).toMatch(/^truncated: HDU 0 header claims 400000 bytes of data but the file holds only 2880 more$/);
  });
  it('refuses a header without END, a bad BITPIX, a negative NAXISn and a non-FITS start', () => {
    const noEnd = new TextEncoder().encode(imageCards(8, [0]).join(''));
    expect(reason(() => parseFits(noEnd, 'a.fits'))).toMatch(/no END card/);
    expect(reason(() => parseFits(fitsBytes([{ cards: imageCards(12, [4]) }]), 'a.fits'))).toMatch(/BITPIX 12 is not valid/);
    expect(reason(() => parseFits(fitsBytes([{ cards: imageCards(8, [-4]) }]), 'a.fits'))).toMatch(/NAXIS1 is missing or negative/);
    expect(reason(() => parseFits(new TextEncoder().encode('hello'), 'a.fits'))).toMatch(/not a FITS file/);
    expect(reason(() => parseFits(new Uint8Array(0), 'a.fits'))).toBe('the file is empty');
  });
  it('stops at bytes after the last HDU that are not an extension', () => {
    const bytes = fitsBytes([{ cards: imageCards(8, [4]), data: beBytes('u8', [1, 2, 3, 4]) }]);
    const withJunk = new Uint8Array(bytes.length + 2880).fill(7);
    withJunk.set(bytes);
    expect(parseFits(withJunk, 'a.fits').hdus).toHaveLength(1);
  });
});

describe('readImage: every BITPIX with BSCALE, BZERO and BLANK (FITS 4.0 §4.4.2.5, §5.2)', () => {
  const scaling = [card('BSCALE', 0.5), card('BZERO', 100), card('BLANK', -7)];
  const cases: Array<[number, 'u8' | 'i16' | 'i32' | 'i64' | 'f32' | 'f64', number[]]> = [
    [8, 'u8', [0, 255, 3]],
    [16, 'i16', [-32768, 32767, -7]],
    [32, 'i32', [-2147483648, 2147483647, -7]],
    [64, 'i64', [-(2 ** 53), 2 ** 53, -7]],
  ];
  for (const [bitpix, kind, raw] of cases) {
    it(`BITPIX ${bitpix}: physical = BZERO + BSCALE × stored; BLANK → NaN`, () => {
      const blank = bitpix === 8 ? [card('BSCALE', 0.5), card('BZERO', 100), card('BLANK', 3)] : scaling;
      const f = parseFits(fitsBytes([{ cards: imageCards(bitpix, [3], blank), data: beBytes(kind, raw) }]), 'a.fits');
      const v = Array.from(readImage(f.hdus[0]).values);
      expect(v.slice(0, 2)).toEqual([100 + 0.5 * raw[0], 100 + 0.5 * raw[1]]);
      expect(v[2]).toBeNaN();
    });
  }
  it('BITPIX 16 with BZERO 32768 reads unsigned 16-bit values (FITS 4.0 Table 11)', () => {
    const f = parseFits(fitsBytes([{ cards: imageCards(16, [2], [card('BZERO', 32768)]), data: beBytes('i16', [-32768, 32767]) }]), 'a.fits');
    expect(Array.from(readImage(f.hdus[0]).values)).toEqual([0, 65535]);
  });
  for (const [bitpix, kind] of [[-32, 'f32'], [-64, 'f64']] as const) {
    it(`BITPIX ${bitpix}: IEEE values, NaN kept, BLANK ignored for floats`, () => {
      const f = parseFits(fitsBytes([{ cards: imageCards(bitpix, [3], [card('BSCALE', 2), card('BZERO', 1), card('BLANK', 3)]), data: beBytes(kind, [1.5, NaN, 3]) }]), 'a.fits');
      const v = Array.from(readImage(f.hdus[0]).values);
      expect(v[0]).toBe(4);
      expect(v[1]).toBeNaN();
      expect(v[2]).toBe(7);
    });
  }
  it(`refuses an image of more than ${MAX_ELEMENTS} pixels before allocating it`, () => {
    const n = MAX_ELEMENTS + 1;
    const bytes = fitsBytes([{ cards: imageCards(8, [n]), data: new Uint8Array(n) }]);
    const f = parseFits(bytes, 'big.fits');
    expect(reason(() => readImage(f.hdus[0]))).toBe(`HDU 0: the image has ${n} elements, more than zvet reads (${MAX_ELEMENTS})`);
  });
});
