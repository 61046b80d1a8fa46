/**
 * Writes FITS files (FITS Standard 4.0): a primary HDU (an image or header only), IMAGE
 * extensions (BITPIX −32/−64, 1-D to 3-D) and BINTABLE extensions with one row per record
 * (§7.3; TFORM D/E/J/K/L/A with TTYPE/TUNIT/TDISP/TNULL). Pure and deterministic: the bytes
 * depend only on the input (no clock: give DATE yourself if you want one).
 */
import { BLOCK_LENGTH, formatCard, formatHeader, type Card } from './write-cards.js';

export { real, type Card, type CardValue } from './write-cards.js';

export interface ImageHdu {
  type: 'image';
  /** Ignored for a header-only HDU (no axes), which is written with BITPIX = 8. */
  bitpix?: -32 | -64;
  /** NAXIS1 first (the fastest-varying axis); [] for a header-only HDU. */
  axes: number[];
  /** Pixel values, NAXIS1 fastest; length = product of axes. */
  data?: ArrayLike<number>;
  cards?: Card[];
}

export type ColumnFormat = 'D' | 'E' | 'J' | 'K' | 'L' | 'A';
export type CellValue = number | string | boolean | null;

export interface TableColumn {
  name: string;
  /** D float64, E float32, J int32, K int64, L logical, A ASCII text. */
  format: ColumnFormat;
  /** Characters per cell for 'A' (default: the longest value, at least 1). */
  width?: number;
  unit?: string;
  /** Display format, e.g. 'F9.6' (TDISPn). */
  disp?: string;
  /** Written as the comment of the TTYPEn card. */
  description?: string;
  /** One value per row. null: NaN for D/E, TNULLn for J/K, undefined logical, blank text. */
  values: ArrayLike<CellValue>;
}

export interface TableHdu {
  type: 'bintable';
  columns: TableColumn[];
  cards?: Card[];
}

export type Hdu = ImageHdu | TableHdu;

const RESERVED = /^(SIMPLE|XTENSION|BITPIX|NAXIS\d*|EXTEND|PCOUNT|GCOUNT|TFIELDS|TTYPE\d+|TFORM\d+|TUNIT\d+|TDISP\d+|TNULL\d+|END)$/;
const BYTES: Record<Exclude<ColumnFormat, 'A'>, number> = { D: 8, E: 4, J: 4, K: 8, L: 1 };
const NULL_J = -2147483648;
const NULL_K = -9223372036854775808n;

/**
 * The caller's cards, checked; preceded by LONGSTRN when a string needs CONTINUE cards
 * (HEASARC long-string convention, which fitsverify asks for).
 */
function userCards(cards: Card[] | undefined): Card[] {
  const given = cards ?? [];
  for (const c of given) {
    if (RESERVED.test(c.key.toUpperCase())) throw new Error(`FITS keyword ${c.key} is written by the writer itself`);
  }
  const continued = given.some((c) => typeof c.value === 'string' && formatCard(c).length > 1);
  return continued ? [{ key: 'LONGSTRN', value: 'OGIP 1.0', comment: 'CONTINUE cards hold long strings' }, ...given] : given;
}

function padToBlock(length: number): number {
  return Math.ceil(length / BLOCK_LENGTH) * BLOCK_LENGTH;
}

function ascii(text: string): Uint8Array {
  const out = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x20 || c > 0x7e) throw new Error(`FITS text must be printable ASCII: ${JSON.stringify(text)}`);
    out[i] = c;
  }
  return out;
}

interface Encoded {
  header: string;
  data: Uint8Array;
}

function encodeImage(hdu: ImageHdu, primary: boolean, extend: boolean): Encoded {
  const pixels = hdu.axes.reduce((a, b) => a * b, hdu.axes.length ? 1 : 0);
  if (hdu.axes.length > 3 || hdu.axes.some((n) => !Number.isInteger(n) || n < 1)) throw new Error(`FITS image axes must be 1 to 3 positive integers: [${hdu.axes}]`);
  const values = hdu.data ?? [];
  if (values.length !== pixels) throw new Error(`FITS image data has ${values.length} values for axes [${hdu.axes}] (${pixels})`);
  const bitpix = hdu.axes.length ? (hdu.bitpix ?? -32) : 8;
  const cards: Card[] = primary
    ? [{ key: 'SIMPLE', value: true, comment: 'conforms to FITS Standard 4.0' }]
    : [{ key: 'XTENSION', value: 'IMAGE', comment: 'image extension' }];
  cards.push({ key: 'BITPIX', value: bitpix }, { key: 'NAXIS', value: hdu.axes.length });
  hdu.axes.forEach((n, i) => cards.push({ key: `NAXIS${i + 1}`, value: n }));
  if (primary && extend) cards.push({ key: 'EXTEND', value: true });
  if (!primary) cards.push({ key: 'PCOUNT', value: 0 }, { key: 'GCOUNT', value: 1 });
  cards.push(...userCards(hdu.cards));

  const size = Math.abs(bitpix) / 8;
  const data = new Uint8Array(padToBlock(pixels * size));
  const view = new DataView(data.buffer);
  for (let i = 0; i < pixels; i++) {
    if (bitpix === -32) view.setFloat32(i * size, values[i], false);
    else view.setFloat64(i * size, values[i], false);
  }
  return { header: formatHeader(cards), data };
}

function columnWidth(col: TableColumn): number {
  if (col.format !== 'A') return BYTES[col.format];
  if (col.width !== undefined) return col.width;
  let longest = 1;
  for (let r = 0; r < col.values.length; r++) {
    const v = col.values[r];
    if (typeof v === 'string') longest = Math.max(longest, v.length);
  }
  return longest;
}

function hasNull(col: TableColumn): boolean {
  for (let r = 0; r < col.values.length; r++) if (col.values[r] === null) return true;
  return false;
}

function writeCell(view: DataView, bytes: Uint8Array, offset: number, col: TableColumn, width: number, v: CellValue, row: number): void {
  const bad = () => new Error(`FITS column ${col.name} row ${row + 1}: ${JSON.stringify(v)} is not a ${col.format} value`);
  switch (col.format) {
    case 'D':
    case 'E': {
      if (v !== null && typeof v !== 'number') throw bad();
      const x = v ?? NaN;
      if (col.format === 'D') view.setFloat64(offset, x, false);
      else view.setFloat32(offset, x, false);
      return;
    }
    case 'J':
      if (v !== null && !(typeof v === 'number' && Number.isInteger(v) && v > NULL_J && v <= 2147483647)) throw bad();
      view.setInt32(offset, v ?? NULL_J, false);
      return;
    case 'K':
      if (v !== null && !(typeof v === 'number' && Number.isSafeInteger(v))) throw bad();
      view.setBigInt64(offset, v === null ? NULL_K : BigInt(v), false);
      return;
    case 'L':
      if (v !== null && typeof v !== 'boolean') throw bad();
      // §7.3.3.1: 'T', 'F', or 0 for an undefined logical.
      bytes[offset] = v === null ? 0 : v ? 0x54 : 0x46;
      return;
    case 'A': {
      if (v !== null && typeof v !== 'string') throw bad();
      const text = ascii(v ?? '');
      if (text.length > width) throw new Error(`FITS column ${col.name} row ${row + 1}: text longer than ${width} characters`);
      // §7.3.3.1: a shorter string ends with an ASCII NUL (the rest of the field is 0 too),
      // so readers do not take padding for text.
      bytes.fill(0, offset, offset + width);
      bytes.set(text, offset);
      return;
    }
  }
}

function encodeTable(hdu: TableHdu): Encoded {
  const rows = hdu.columns.length ? hdu.columns[0].values.length : 0;
  for (const col of hdu.columns) {
    if (col.values.length !== rows) throw new Error(`FITS table column ${col.name} has ${col.values.length} rows, expected ${rows}`);
  }
  const widths = hdu.columns.map(columnWidth);
  const rowBytes = widths.reduce((a, b) => a + b, 0);
  const cards: Card[] = [
    { key: 'XTENSION', value: 'BINTABLE', comment: 'binary table extension' },
    { key: 'BITPIX', value: 8 },
    { key: 'NAXIS', value: 2 },
    { key: 'NAXIS1', value: rowBytes, comment: 'bytes per row' },
    { key: 'NAXIS2', value: rows, comment: 'rows' },
    { key: 'PCOUNT', value: 0 },
    { key: 'GCOUNT', value: 1 },
    { key: 'TFIELDS', value: hdu.columns.length },
  ];
  hdu.columns.forEach((col, i) => {
    const n = i + 1;
    cards.push({ key: `TTYPE${n}`, value: col.name, comment: col.description }, { key: `TFORM${n}`, value: col.format === 'A' ? `${widths[i]}A` : col.format });
    if (col.unit) cards.push({ key: `TUNIT${n}`, value: col.unit });
    if (col.disp) cards.push({ key: `TDISP${n}`, value: col.disp });
    if ((col.format === 'J' || col.format === 'K') && hasNull(col)) {
      cards.push({ key: `TNULL${n}`, value: col.format === 'J' ? NULL_J : NULL_K, comment: 'undefined value' });
    }
  });
  cards.push(...userCards(hdu.cards));

  const data = new Uint8Array(padToBlock(rowBytes * rows));
  const view = new DataView(data.buffer);
  for (let r = 0; r < rows; r++) {
    let offset = r * rowBytes;
    hdu.columns.forEach((col, i) => {
      writeCell(view, data, offset, col, widths[i], col.values[r], r);
      offset += widths[i];
    });
  }
  return { header: formatHeader(cards), data };
}

/**
 * The bytes of a FITS file. hdus[0] is the primary HDU and must be an image (or header only,
 * axes []); the rest are extensions.
 */
export function writeFits(hdus: readonly Hdu[]): Uint8Array {
  if (!hdus.length || hdus[0].type !== 'image') throw new Error('a FITS file starts with a primary image HDU (axes [] for header only)');
  const parts = hdus.map((hdu, i) => (hdu.type === 'image' ? encodeImage(hdu, i === 0, hdus.length > 1) : encodeTable(hdu)));
  const total = parts.reduce((n, p) => n + p.header.length + p.data.length, 0);
  const out = new Uint8Array(total);
  let at = 0;
  for (const p of parts) {
    out.set(ascii(p.header), at);
    at += p.header.length;
    out.set(p.data, at);
    at += p.data.length;
  }
  return out;
}
