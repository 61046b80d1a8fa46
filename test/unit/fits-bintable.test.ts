// Binary and ASCII tables (FITS Standard 4.0 §7.2, §7.3): every TFORM type, repeat counts,
// TSCALn/TZEROn, TNULLn, TUNITn, case-insensitive names, variable-length arrays in the heap.
import { describe, expect, it } from 'vitest';
import { parseFits } from '../../core/fits/parse.js';
import { openTable } from '../../core/fits/table.js';
import { SpectrumReadError } from '../../core/spectrum/spectrum.js';
import { EMPTY_PRIMARY, beBytes, binTable, card, concat, fitsBytes } from './fits-fixtures.js';

const ascii = (s: string) => new TextEncoder().encode(s);

function tableOf(bytes: Uint8Array) {
  return openTable(parseFits(bytes, 't.fits').hdus[1]);
}

describe('binary table columns', () => {
  // One row: L, 3X, B, I, J, K, 4A, 2E, D  = 1 + 1 + 1 + 2 + 4 + 8 + 4 + 8 + 8 = 37 bytes.
  const row = (l: string, bits: number, b: number, i: number, j: number, k: number, a: string, e: [number, number], d: number) =>
    concat(ascii(l), beBytes('u8', [bits]), beBytes('u8', [b]), beBytes('i16', [i]), beBytes('i32', [j]), beBytes('i64', [k]), ascii(a.padEnd(4, '\0')), beBytes('f32', e), beBytes('f64', [d]));
  const columns = [
    { name: 'flag', form: 'L' },
    { name: 'bits', form: '3X' },
    { name: 'Byte', form: 'B' },
    { name: 'short', form: 'I', extra: [card('TNULL4', -1)] },
    { name: 'INT', form: 'J', extra: [card('TSCAL5', 0.5), card('TZERO5', 10)] },
    { name: 'long', form: 'K' },
    { name: 'name', form: '4A' },
    { name: 'pair', form: '2E', unit: 'nm' },
    { name: 'dbl', form: 'D' },
  ];
  const data = concat(row('T', 0b10100000, 200, 7, 4, 2 ** 40, 'ab', [1.5, 2.5], 3.25), row('F', 0b01000000, 1, -1, -6, -3, 'wxyz', [NaN, 0], -1), row('\0', 0, 0, 0, 0, 0, '', [0, 0], 0));
  const t = tableOf(fitsBytes([EMPTY_PRIMARY, binTable(37, 3, columns, data)]));

  it('lists the columns with repeat counts and units', () => {
    expect(t.rows).toBe(3);
    expect(t.columns.map((c) => [c.name, c.repeat, c.unit ?? null])).toEqual([
      ['flag', 1, null], ['bits', 3, null], ['Byte', 1, null], ['short', 1, null], ['INT', 1, null],
      ['long', 1, null], ['name', 4, null], ['pair', 2, 'nm'], ['dbl', 1, null],
    ]);
  });
  it('finds columns without regard to case', () => {
    expect(t.find('int')?.name).toBe('INT');
    expect(t.find('BYTE')?.name).toBe('Byte');
    expect(t.find('missing')).toBeUndefined();
  });
  it('decodes L (T/F, else NaN), X bits, B, I with TNULL, J with TSCAL/TZERO, K, E, D', () => {
    expect(Array.from(t.values(t.find('flag')!))).toEqual([1, 0, NaN]);
    expect(Array.from(t.values(t.find('bits')!))).toEqual([1, 0, 1, 0, 1, 0, 0, 0, 0]);
    expect(Array.from(t.values(t.find('byte')!))).toEqual([200, 1, 0]);
    expect(Array.from(t.values(t.find('short')!))).toEqual([7, NaN, 0]);
    expect(Array.from(t.values(t.find('int')!))).toEqual([12, 7, 10]);
    expect(Array.from(t.values(t.find('long')!))).toEqual([2 ** 40, -3, 0]);
    expect(Array.from(t.values(t.find('pair')!))).toEqual([1.5, 2.5, NaN, 0, 0, 0]);
    expect(Array.from(t.rowValues(t.find('pair')!, 0))).toEqual([1.5, 2.5]);
    expect(Array.from(t.values(t.find('dbl')!))).toEqual([3.25, -1, 0]);
  });
  it('reads text columns and refuses them as numbers', () => {
    expect(t.strings(t.find('name')!)).toEqual(['ab', 'wxyz', '']);
    expect(() => t.values(t.find('name')!)).toThrow(SpectrumReadError);
  });
  it('refuses columns wider than NAXIS1', () => {
    expect(() => tableOf(fitsBytes([EMPTY_PRIMARY, binTable(36, 3, columns, data)]))).toThrow(/need 37 bytes per row but NAXIS1 is 36/);
  });
});

describe('variable-length arrays (P descriptors, heap at THEAP)', () => {
  // Two rows of a 1PE column; heap after 8 bytes of gap (THEAP = 2 × 8 + 8 = 24).
  const descriptors = concat(beBytes('i32', [3, 0]), beBytes('i32', [2, 12]));
  const heap = beBytes('f32', [1, 2, 3, 4, 5]);
  const data = concat(descriptors, new Uint8Array(8), heap);
  const spec = (theap: number, dataBytes = data) => fitsBytes([EMPTY_PRIMARY, binTable(8, 2, [{ name: 'flux', form: '1PE(3)' }], dataBytes, [card('THEAP', theap)], 8 + 20)]);
  it('reads each row from the heap', () => {
    const t = tableOf(spec(24));
    expect(Array.from(t.rowValues(t.columns[0], 0))).toEqual([1, 2, 3]);
    expect(Array.from(t.rowValues(t.columns[0], 1))).toEqual([4, 5]);
    expect(Array.from(t.values(t.columns[0]))).toEqual([1, 2, 3, 4, 5]);
  });
  it('refuses descriptors pointing outside the heap', () => {
    const bad = concat(beBytes('i32', [3, 0]), beBytes('i32', [2, 4000]), new Uint8Array(8), heap);
    const t = tableOf(spec(24, bad));
    expect(() => t.rowValues(t.columns[0], 1)).toThrow(/row 2 points outside the heap/);
  });
});

describe('ASCII tables', () => {
  it('reads fields by TBCOL with TNULL and TSCAL/TZERO', () => {
    const rows = ['  4000.0  1.5E+00', '  4002.5      NaN', '  4005.0  *******'].join('');
    const hdu = {
      cards: [
        card('XTENSION', 'TABLE'), card('BITPIX', 8), card('NAXIS', 2), card('NAXIS1', 17), card('NAXIS2', 3),
        card('PCOUNT', 0), card('GCOUNT', 1), card('TFIELDS', 2),
        card('TTYPE1', 'WAVE'), card('TFORM1', 'F8.1'), card('TBCOL1', 1), card('TUNIT1', 'Angstrom'),
        card('TTYPE2', 'FLUX'), card('TFORM2', 'E9.2'), card('TBCOL2', 9), card('TNULL2', '*******'), card('TSCAL2', 2),
      ],
      data: ascii(rows),
    };
    const t = tableOf(fitsBytes([EMPTY_PRIMARY, hdu]));
    expect(Array.from(t.values(t.find('wave')!))).toEqual([4000, 4002.5, 4005]);
    expect(Array.from(t.values(t.find('flux')!))).toEqual([3, NaN, NaN]);
    expect(t.find('wave')!.unit).toBe('Angstrom');
  });
});
