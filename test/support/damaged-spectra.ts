// Ways a spectrum file gets damaged on a real night (copy interrupted, disk full, wrong file
// renamed, a gzip that never finished), each made from the bytes of a good file, with the words
// the one-line reason must contain. Used by the batch-resilience test.
import { gunzipSync, gzipSync } from 'node:zlib';

export interface Damage {
  name: string;
  /** File ending to give the damaged file. */
  ending: string;
  make(good: Buffer, random: () => number): Buffer;
  /** What the reason must say. */
  reason: RegExp;
  /** The demo file this damage needs (one with an extension HDU), when any image will not do. */
  demoSource?: string;
}

/** C0 controls and DEL: nothing a one-line reason may carry (a terminal or a CSV cell shows it as is). */
export const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/;

const FITS_BLOCK = 2880;
const BINARY = /^not a spectrum: binary data that is neither FITS nor gzip$/;

function randomBytes(n: number, random: () => number): Buffer {
  const b = Buffer.alloc(n);
  for (let i = 0; i < n; i++) b[i] = Math.floor(random() * 256);
  return b;
}

function isGzip(b: Buffer): boolean {
  return b[0] === 0x1f && b[1] === 0x8b;
}

/** The FITS bytes of a good file (the gzipped demo file is unpacked first). */
function fitsBytes(good: Buffer): Buffer {
  return isGzip(good) ? gunzipSync(good) : good;
}

/** Byte offset of the first card of the primary header with this keyword (80-byte cards, FITS 4.0 §4.1). */
function cardAt(fits: Buffer, keyword: string): number {
  for (let at = 0; at + 80 <= fits.length; at += 80) {
    const key = fits.toString('latin1', at, at + 8).trimEnd();
    if (key === keyword) return at;
    if (key === 'END') break;
  }
  throw new Error(`the primary header has no ${keyword} card`);
}

/** Length of the primary header: up to its END card, padded to whole 2880-byte blocks (FITS 4.0 §3.3.1). */
function primaryHeaderBytes(fits: Buffer): number {
  return Math.ceil((cardAt(fits, 'END') + 80) / FITS_BLOCK) * FITS_BLOCK;
}

function cardValue(fits: Buffer, keyword: string): number {
  const at = cardAt(fits, keyword);
  return Number(fits.toString('latin1', at + 10, at + 30).trim());
}

/** Bytes of the primary data array: |BITPIX|/8 × NAXIS1 × … × NAXISn (FITS 4.0 §4.4.1.1). */
function primaryDataBytes(fits: Buffer): number {
  let n = Math.abs(cardValue(fits, 'BITPIX')) / 8;
  for (let axis = 1; axis <= cardValue(fits, 'NAXIS'); axis++) n *= cardValue(fits, `NAXIS${axis}`);
  return n;
}

/** Replaces the value of one card of the primary header. */
function withCard(fits: Buffer, keyword: string, value: string): Buffer {
  const out = Buffer.from(fits);
  out.write(`${keyword.padEnd(8)}= ${value.padStart(20)}`.padEnd(80), cardAt(out, keyword), 'latin1');
  return out;
}

/** Damage to FITS files; the good file must be a 1-D FITS image (primary HDU data), plain or gzipped. */
export const FITS_DAMAGE: Damage[] = [
  {
    name: 'truncated in the data',
    ending: '.fits',
    make: (good, random) => {
      const f = fitsBytes(good);
      // Inside the data array itself: a file short only of its final padding still holds all data.
      return f.subarray(0, primaryHeaderBytes(f) + 1 + Math.floor(random() * (primaryDataBytes(f) - 1)));
    },
    reason: /^truncated: HDU 0 header claims \d+ bytes of data but the file holds only \d+ more$/,
  },
  { name: 'truncated in the header', ending: '.fits', make: (good) => fitsBytes(good).subarray(0, 1000), reason: /^truncated: the header of HDU 0 has no END card$/ },
  { name: 'zero bytes', ending: '.fits', make: () => Buffer.alloc(0), reason: /^the file is empty$/ },
  { name: 'random bytes named .fits', ending: '.fits', make: (_good, random) => randomBytes(20_000, random), reason: BINARY },
  {
    // The first six cards (SIMPLE, BITPIX, NAXIS …) overwritten with printable junk.
    name: 'header garbage',
    ending: '.fits',
    make: (good, random) => {
      const f = Buffer.from(fitsBytes(good));
      for (let i = 0; i < 480; i++) f[i] = 0x20 + Math.floor(random() * 95);
      return f;
    },
    reason: BINARY,
  },
  {
    // Cut inside the header of the ERROR extension, with less than one 2880-byte block of it left.
    name: 'truncated in an extension header',
    ending: '_1d.fits',
    demoSource: 'KRT-26-0015_1d.fits',
    make: (good) => {
      const f = fitsBytes(good);
      const extension = f.indexOf('XTENSION', primaryHeaderBytes(f), 'latin1');
      if (extension < 0 || extension % FITS_BLOCK !== 0) throw new Error('the file has no extension HDU to cut');
      return f.subarray(0, extension + 1000);
    },
    reason: /^truncated: the header of HDU 1 has no END card$/,
  },
  { name: 'impossible BITPIX', ending: '.fits', make: (good) => withCard(fitsBytes(good), 'BITPIX', '7'), reason: /^HDU 0: BITPIX 7 is not valid$/ },
  { name: 'absurd NAXIS1', ending: '.fits', make: (good) => withCard(fitsBytes(good), 'NAXIS1', '999999999'), reason: /^truncated: HDU 0 header claims \d+ bytes of data but the file holds only \d+ more$/ },
  { name: 'named .gz, not gzip', ending: '.fits.gz', make: (_good, random) => randomBytes(5000, random), reason: BINARY },
  {
    name: 'gzip magic, corrupt stream',
    ending: '.fits.gz',
    make: (_good, random) => Buffer.concat([Buffer.from([0x1f, 0x8b, 0x08, 0x00, 0, 0, 0, 0, 0x00, 0x03]), randomBytes(5000, random)]),
    reason: /^(truncated or )?corrupt gzip data/,
  },
  { name: 'gzip cut short', ending: '.fits.gz', make: (good) => { const z = gzipSync(fitsBytes(good)); return z.subarray(0, Math.floor(z.length / 2)); }, reason: /^(truncated or )?corrupt gzip data/ },
  { name: 'gzip of garbage', ending: '.fits.gz', make: (_good, random) => gzipSync(randomBytes(8000, random)), reason: BINARY },
];

/** Damage to text spectra. */
export const TEXT_DAMAGE: Damage[] = [
  { name: 'text with 3 rows', ending: '.csv', make: () => Buffer.from('wavelength,flux\n5000,1.0\n5001,1.1\n5002,0.9\n'), reason: /^only 3 usable pixels \(at least 10 are needed\)$/ },
  { name: 'zero-byte text', ending: '.csv', make: () => Buffer.alloc(0), reason: /^the file is empty$/ },
  {
    name: 'text that is prose',
    ending: '.txt',
    make: () => Buffer.from('Observing log, night of 2026-03-14\nclouds until 22:10, then clear\nseeing 1.1 arcsec\n'.repeat(4)),
    reason: /^line 2: 'clouds until 22:10, then clear' is neither a header row nor numbers$/,
  },
];

export const ALL_DAMAGE: Damage[] = [...FITS_DAMAGE, ...TEXT_DAMAGE];
