/**
 * A generic FITS file parser (FITS Standard 4.0): splits the file into HDUs and parses their
 * headers, but decodes no data until asked (see image.ts, bintable.ts, ascii-table.ts).
 * Every failure is a SpectrumReadError naming the file and the problem in one line.
 */
import { SpectrumReadError } from '../spectrum/spectrum.js';
import { BLOCK_LENGTH, CARD_LENGTH, FitsHeader, printableText } from './header.js';

export type HduKind = 'empty' | 'image' | 'bintable' | 'ascii-table' | 'unsupported';

export interface FitsHdu {
  /** 0 = primary. */
  index: number;
  header: FitsHeader;
  kind: HduKind;
  /** EXTNAME, trimmed; undefined when absent. */
  extname?: string;
  bitpix: number;
  /** NAXIS1..NAXISn. */
  axes: number[];
  /** Byte offset of the data in the file and its length (main data plus heap), unpadded. */
  dataStart: number;
  dataLength: number;
  /** The whole file (data is read lazily from it). */
  bytes: Uint8Array;
  fileName: string;
}

export interface FitsFile {
  fileName: string;
  hdus: FitsHdu[];
}

/** Most elements (pixels or table cells) zvet decodes from one HDU. */
export const MAX_ELEMENTS = 50_000_000;

const VALID_BITPIX = new Set([8, 16, 32, 64, -32, -64]);

/** True when the bytes begin like a FITS file ("SIMPLE  =" in the first card). */
export function looksLikeFits(bytes: Uint8Array): boolean {
  return bytes.length >= 10 && ascii(bytes, 0, 10) === 'SIMPLE  = ';
}

export function parseFits(bytes: Uint8Array, fileName: string): FitsFile {
  const fail = (reason: string): never => {
    throw new SpectrumReadError(fileName, reason);
  };
  if (bytes.length === 0) fail('the file is empty');
  if (!looksLikeFits(bytes)) fail('not a FITS file (it does not begin with SIMPLE =)');
  const hdus: FitsHdu[] = [];
  let offset = 0;
  while (offset < bytes.length) {
    const index = hdus.length;
    // Bytes after the last HDU that do not begin an extension are ignored (FITS 4.0 §3.5, special
    // records); an extension header cut to less than a block is a truncated file, not trailing bytes.
    if (index > 0 && (bytes.length - offset < 8 || ascii(bytes, offset, 8) !== 'XTENSION')) break;
    const { header, end } = readHeader(bytes, offset, index, fail);
    const hdu = describeHdu(header, index, end, bytes, fileName, fail);
    const remaining = bytes.length - end;
    if (hdu.dataLength > remaining) {
      fail(
        `truncated: HDU ${index} header claims ${hdu.dataLength} bytes of data but the file holds only ${Math.max(0, remaining)} more`,
      );
    }
    hdus.push(hdu);
    offset = end + Math.ceil(hdu.dataLength / BLOCK_LENGTH) * BLOCK_LENGTH;
  }
  return { fileName, hdus };
}

function readHeader(
  bytes: Uint8Array,
  start: number,
  index: number,
  fail: (reason: string) => never,
): { header: FitsHeader; end: number } {
  for (let pos = start; ; pos += CARD_LENGTH) {
    if (pos + CARD_LENGTH > bytes.length) {
      fail(`truncated: the header of HDU ${index} has no END card`);
    }
    if (isEndCard(bytes, pos)) {
      const end = start + Math.ceil((pos + CARD_LENGTH - start) / BLOCK_LENGTH) * BLOCK_LENGTH;
      return { header: FitsHeader.fromBytes(bytes.subarray(start, pos)), end: Math.min(end, bytes.length) };
    }
  }
}

/** 'END' followed by blanks (bytes outside printable ASCII count as blanks, as in ascii()). */
function isEndCard(bytes: Uint8Array, pos: number): boolean {
  if (bytes[pos] !== 0x45 || bytes[pos + 1] !== 0x4e || bytes[pos + 2] !== 0x44) return false;
  for (let i = pos + 3; i < pos + CARD_LENGTH; i++) {
    const b = bytes[i];
    if (b > 0x20 && b <= 0x7e) return false;
  }
  return true;
}

function describeHdu(
  header: FitsHeader,
  index: number,
  dataStart: number,
  bytes: Uint8Array,
  fileName: string,
  fail: (reason: string) => never,
): FitsHdu {
  const where = `HDU ${index}`;
  const bitpix = header.integer('BITPIX');
  if (bitpix === undefined || !VALID_BITPIX.has(bitpix)) fail(`${where}: BITPIX ${String(header.value('BITPIX'))} is not valid`);
  const naxis = header.integer('NAXIS');
  if (naxis === undefined || naxis < 0 || naxis > 999) fail(`${where}: NAXIS ${String(header.value('NAXIS'))} is not valid`);
  const axes: number[] = [];
  for (let i = 1; i <= naxis!; i++) {
    const n = header.integer(`NAXIS${i}`);
    if (n === undefined || n < 0) fail(`${where}: NAXIS${i} is missing or negative`);
    axes.push(n!);
  }
  const xtension = index === 0 ? undefined : header.string('XTENSION')?.trim().toUpperCase();
  const pcount = index === 0 ? 0 : (header.integer('PCOUNT') ?? 0);
  const gcount = index === 0 ? 1 : (header.integer('GCOUNT') ?? 1);
  if (pcount < 0 || gcount < 0) fail(`${where}: PCOUNT/GCOUNT must not be negative`);
  const groups = index === 0 && header.bool('GROUPS') === true && axes[0] === 0;
  const elements = axes.length === 0 ? 0 : axes.slice(groups ? 1 : 0).reduce((a, b) => a * b, 1);
  // FITS 4.0 eq. 1-2: Nbits = |BITPIX| × GCOUNT × (PCOUNT + NAXIS1 × … × NAXISm).
  const dataLength = axes.length === 0 ? 0 : (Math.abs(bitpix!) / 8) * gcount * (pcount + elements);
  let kind: HduKind;
  if (groups) kind = 'unsupported';
  else if (index === 0 || xtension === 'IMAGE') kind = elements > 0 ? 'image' : 'empty';
  else if (xtension === 'BINTABLE') kind = 'bintable';
  else if (xtension === 'TABLE') kind = 'ascii-table';
  else kind = 'unsupported';
  const extname = header.string('EXTNAME')?.trim() || undefined;
  return { index, header, kind, extname, bitpix: bitpix!, axes, dataStart, dataLength, bytes, fileName };
}

/** Bytes as ASCII text; bytes outside printable ASCII read as blanks. */
function ascii(bytes: Uint8Array, start: number, length: number): string {
  return printableText(String.fromCharCode(...bytes.subarray(start, start + length)));
}

/** Throws the typed read error for an HDU. */
export function hduError(hdu: FitsHdu, reason: string): never {
  throw new SpectrumReadError(hdu.fileName, `HDU ${hdu.index}: ${reason}`);
}

/** Refuses to decode more than MAX_ELEMENTS values (checked before allocating). */
export function checkElementCount(hdu: FitsHdu, count: number, what: string): void {
  if (count > MAX_ELEMENTS) {
    hduError(hdu, `${what} has ${count} elements, more than zvet reads (${MAX_ELEMENTS})`);
  }
}
