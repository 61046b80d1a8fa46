// Hand-built FITS files for the unit tests (FITS Standard 4.0 layout: 80-character cards,
// 2880-byte blocks, big-endian data).

import { concatArrays } from '../../core/util/concat-arrays.js';

const BLOCK = 2880;

/** One card image; strings are quoted, booleans T/F, numbers as written. */
export function card(key: string, value?: string | number | boolean, comment?: string): string {
  let v = '';
  if (typeof value === 'string') v = `'${value.replace(/'/g, "''").padEnd(8)}'`;
  else if (typeof value === 'boolean') v = (value ? 'T' : 'F').padStart(20);
  else if (typeof value === 'number') v = String(value).toUpperCase().padStart(20);
  const body = value === undefined ? key.padEnd(8) + (comment ?? '') : `${key.padEnd(8)}= ${v}${comment ? ` / ${comment}` : ''}`;
  return body.padEnd(80).slice(0, 80);
}

export interface HduSpec {
  cards: string[];
  data?: Uint8Array;
}

/** Header cards (END added) and data, each padded to whole blocks unless `unpadded`. */
export function fitsBytes(hdus: HduSpec[], opts: { unpaddedLast?: boolean } = {}): Uint8Array {
  const parts: Uint8Array[] = [];
  hdus.forEach((h, i) => {
    const text = [...h.cards, 'END'.padEnd(80)].join('');
    parts.push(pad(new TextEncoder().encode(text), 0x20));
    if (h.data && h.data.length) {
      const last = i === hdus.length - 1;
      parts.push(last && opts.unpaddedLast ? h.data : pad(h.data, 0));
    }
  });
  return concatArrays((n) => new Uint8Array(n), parts);
}

function pad(bytes: Uint8Array, fill: number): Uint8Array {
  const out = new Uint8Array(Math.ceil(bytes.length / BLOCK) * BLOCK).fill(fill);
  out.set(bytes);
  return out;
}

type Kind = 'u8' | 'i16' | 'i32' | 'i64' | 'f32' | 'f64';
const SIZE: Record<Kind, number> = { u8: 1, i16: 2, i32: 4, i64: 8, f32: 4, f64: 8 };

/** Big-endian encoding of numbers. */
export function beBytes(kind: Kind, values: number[]): Uint8Array {
  const out = new Uint8Array(values.length * SIZE[kind]);
  const v = new DataView(out.buffer);
  values.forEach((x, i) => {
    const o = i * SIZE[kind];
    if (kind === 'u8') v.setUint8(o, x);
    else if (kind === 'i16') v.setInt16(o, x);
    else if (kind === 'i32') v.setInt32(o, x);
    else if (kind === 'i64') v.setBigInt64(o, BigInt(x));
    else if (kind === 'f32') v.setFloat32(o, x);
    else v.setFloat64(o, x);
  });
  return out;
}

export function concat(...parts: Uint8Array[]): Uint8Array {
  return concatArrays((n) => new Uint8Array(n), parts);
}

/** Primary header cards for an image of the given axes. */
export function imageCards(bitpix: number, axes: number[], extra: string[] = [], extension = false): string[] {
  return [
    extension ? card('XTENSION', 'IMAGE') : card('SIMPLE', true),
    card('BITPIX', bitpix),
    card('NAXIS', axes.length),
    ...axes.map((n, i) => card(`NAXIS${i + 1}`, n)),
    ...(extension ? [card('PCOUNT', 0), card('GCOUNT', 1)] : []),
    ...extra,
  ];
}

/** An empty primary HDU (for files whose spectrum is in an extension). */
export const EMPTY_PRIMARY: HduSpec = { cards: [card('SIMPLE', true), card('BITPIX', 8), card('NAXIS', 0), card('EXTEND', true)] };

/** A binary-table extension from columns given as TFORM and per-row bytes. */
export function binTable(rowBytes: number, rows: number, columns: Array<{ name: string; form: string; unit?: string; extra?: string[] }>, data: Uint8Array, extra: string[] = [], pcount = 0): HduSpec {
  const cards = [
    card('XTENSION', 'BINTABLE'),
    card('BITPIX', 8),
    card('NAXIS', 2),
    card('NAXIS1', rowBytes),
    card('NAXIS2', rows),
    card('PCOUNT', pcount),
    card('GCOUNT', 1),
    card('TFIELDS', columns.length),
  ];
  columns.forEach((c, i) => {
    cards.push(card(`TTYPE${i + 1}`, c.name), card(`TFORM${i + 1}`, c.form));
    if (c.unit) cards.push(card(`TUNIT${i + 1}`, c.unit));
    cards.push(...(c.extra ?? []));
  });
  return { cards: [...cards, ...extra], data };
}

/** A linear wavelength axis: CRVAL1 + CDELT1·(p − 1). */
export function linearWcs(crval: number, cdelt: number, ctype = 'WAVE', cunit = 'Angstrom'): string[] {
  return [card('CTYPE1', ctype), card('CUNIT1', cunit), card('CRVAL1', crval), card('CDELT1', cdelt), card('CRPIX1', 1)];
}

/** n pixels of a smooth positive test flux. */
export function testFlux(n: number): number[] {
  return Array.from({ length: n }, (_, i) => 10 + Math.sin(i / 3));
}
