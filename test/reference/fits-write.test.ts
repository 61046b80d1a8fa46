// The FITS writer checked against the standard (fitsverify, Debian's cfitsio-based checker) and
// against an independent reader (Debian's python3-astropy 5.2, astropy.io.fits).
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { real, writeFits } from '../../core/fits/write.js';
import { formatCard, formatReal } from '../../core/fits/write-cards.js';
import { astropyJson, fitsverify } from '../support/tools.js';

const dir = mkdtempSync(join(tmpdir(), 'zvet-fits-write-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function save(name: string, bytes: Uint8Array): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

// astropy 5.2 cuts a CONTINUE piece short at a doubled quote followed by a blank ('x'''' y'),
// so the quotes here are not followed by blanks; the writer still escapes them per §4.2.1.1.
const LONG = "A long note that runs past one card: the observer's remark 'quoted', and more text, ending here.";

describe('header cards (FITS Standard 4.0 §4)', () => {
  it('writes fixed-format values in the columns the standard gives', () => {
    // §4.2.2: logical T in column 30; §4.2.3/4.2.4: numbers right-justified to column 30.
    expect(formatCard({ key: 'SIMPLE', value: true })[0]).toBe(`SIMPLE  = ${'T'.padStart(20)}`.padEnd(80));
    expect(formatCard({ key: 'NAXIS1', value: 2901 })[0].slice(10, 30)).toBe('2901'.padStart(20));
    expect(formatCard({ key: 'CRVAL1', value: real(3600) })[0].slice(10, 30)).toBe('3600.0'.padStart(20));
    // §4.2.1.1: strings start in column 11, at least 8 characters, ' doubled.
    expect(formatCard({ key: 'OBJECT', value: "O'Neil" })[0].slice(10, 22)).toBe("'O''Neil '  ");
  });

  it('writes reals that read back to the same double, within 20 columns', () => {
    for (const x of [1e-17, -1.2345678901234567e-300, 6564.61, 0.1 + 0.2, 1e21, -0]) {
      const s = formatReal(x);
      expect(s.length).toBeLessThanOrEqual(20);
      expect(s).toMatch(/\./);
      expect(Number(s)).toBeCloseTo(x, 12);
    }
    expect(Number(formatReal(0.1 + 0.2))).toBe(0.1 + 0.2);
  });

  it('splits long strings over CONTINUE cards without cutting a doubled quote', () => {
    const images = formatCard({ key: 'NOTE', value: LONG, comment: 'free text' });
    expect(images.length).toBeGreaterThan(1);
    for (const im of images) expect(im.length).toBe(80);
    expect(images.slice(1).every((im) => im.startsWith('CONTINUE  '))).toBe(true);
  });

  it('refuses what FITS cannot hold', () => {
    expect(() => formatCard({ key: 'TOOLONGKEY', value: 1 })).toThrow(/keyword/);
    expect(() => formatCard({ key: 'OBJECT', value: 'Hα' })).toThrow(/ASCII/);
    expect(() => formatCard({ key: 'X', value: NaN })).toThrow(/non-finite/);
    expect(() => writeFits([{ type: 'image', axes: [2], data: [1, 2], cards: [{ key: 'NAXIS1', value: 3 }] }])).toThrow(/written by the writer/);
  });
});

describe('FITS files', () => {
  const cube = Float32Array.from({ length: 5 * 1 * 3 }, (_, i) => i * 0.5 - 1);
  const bytes = writeFits([
    {
      type: 'image',
      bitpix: -32,
      axes: [5, 1, 3],
      data: cube,
      cards: [
        { key: 'OBJECT', value: 'KRT-26-0099' },
        { key: 'CTYPE1', value: 'AWAV' },
        { key: 'CRPIX1', value: real(1) },
        { key: 'CRVAL1', value: real(3600), comment: 'Angstrom' },
        { key: 'CDELT1', value: real(2) },
        { key: 'NOTE', value: LONG },
        { key: 'COMMENT', comment: 'written by the zvet FITS writer test' },
      ],
    },
    { type: 'image', bitpix: -64, axes: [4], data: [1.5, -2.25, 1e-300, 6564.61], cards: [{ key: 'EXTNAME', value: 'ERROR' }] },
    {
      type: 'bintable',
      cards: [{ key: 'EXTNAME', value: 'CATALOGUE' }],
      columns: [
        { name: 'z', format: 'D', disp: 'F9.6', values: [0.1234567, null, 2.5] },
        { name: 'flux', format: 'E', unit: '1e-17 erg/(s cm2 Angstrom)', values: [1.5, 2.5, -3] },
        { name: 'n', format: 'J', values: [1, null, -7] },
        { name: 'big', format: 'K', values: [2 ** 40, -3, null] },
        { name: 'ok', format: 'L', values: [true, false, null] },
        { name: 'status', format: 'A', values: ['accepted', "it's", null] },
      ],
    },
  ]);
  const path = save('mixed.fits', bytes);

  it('is whole 2880-byte blocks and is deterministic', () => {
    expect(bytes.length % 2880).toBe(0);
    expect(writeFits([{ type: 'image', axes: [2], data: [1, 2] }])).toEqual(writeFits([{ type: 'image', axes: [2], data: [1, 2] }]));
  });

  it('passes fitsverify with no warnings or errors', () => {
    const { status, report } = fitsverify(path);
    expect(report, report).toMatch(/^verification OK/);
    expect(status).toBe(0);
  });

  it('reads back in astropy with the same values, header and units', () => {
    const got = astropyJson<{
      shape: number[];
      cube: number[][][];
      object: string;
      crval1: number;
      note: string;
      err: number[];
      errName: string;
      cols: { name: string; unit: string | null; format: string }[];
      z: (number | null)[];
      flux: number[];
      n: (number | null)[];
      big: (number | null)[];
      ok: (boolean | null)[];
      status: string[];
    }>(
      `
import sys, json, math
import numpy as np
from astropy.io import fits
with fits.open(sys.argv[1]) as h:
    p, e, t = h[0], h[1], h[2]
    d = t.data
    def num(v):
        v = float(v)
        return None if math.isnan(v) else v
    n = np.ma.masked_equal(d['n'], t.columns['n'].null)
    big = np.ma.masked_equal(d['big'], t.columns['big'].null)
    print(json.dumps(dict(
        shape=list(p.data.shape), cube=p.data.tolist(), object=p.header['OBJECT'], crval1=p.header['CRVAL1'],
        note=p.header['NOTE'], err=e.data.tolist(), errName=e.name,
        cols=[dict(name=c.name, unit=c.unit, format=c.format) for c in t.columns],
        z=[num(v) for v in d['z']], flux=[float(v) for v in d['flux']],
        n=[None if m else int(v) for v, m in zip(n.data, np.ma.getmaskarray(n))],
        big=[None if m else int(v) for v, m in zip(big.data, np.ma.getmaskarray(big))],
        ok=[bool(v) for v in d['ok']], status=[str(s) for s in d['status']])))
`,
      [path],
    );
    // numpy order is (NAXIS3, NAXIS2, NAXIS1).
    expect(got.shape).toEqual([3, 1, 5]);
    expect(got.cube.flat(2)).toEqual(Array.from(cube));
    expect(got.object).toBe('KRT-26-0099');
    expect(got.crval1).toBe(3600);
    expect(got.note).toBe(LONG);
    expect(got.err).toEqual([1.5, -2.25, 1e-300, 6564.61]);
    expect(got.errName).toBe('ERROR');
    expect(got.cols.map((c) => c.name)).toEqual(['z', 'flux', 'n', 'big', 'ok', 'status']);
    expect(got.cols[1].unit).toBe('1e-17 erg/(s cm2 Angstrom)');
    expect(got.cols.map((c) => c.format)).toEqual(['D', 'E', 'J', 'K', 'L', '8A']);
    expect(got.z).toEqual([0.1234567, null, 2.5]);
    expect(got.flux).toEqual([1.5, 2.5, -3]);
    expect(got.n).toEqual([1, null, -7]);
    expect(got.big).toEqual([2 ** 40, -3, null]);
    // astropy shows an undefined logical (byte 0) as False.
    expect(got.ok).toEqual([true, false, false]);
    expect(got.status).toEqual(['accepted', "it's", '']);
  });
});
