/**
 * Decodes an image HDU's data array (FITS 4.0 §5): big-endian BITPIX 8 (unsigned), 16, 32, 64
 * (signed), −32, −64 (IEEE), physical value = BZERO + BSCALE × stored (§4.4.2.5), and BLANK
 * (integer images only) → NaN.
 */
import { checkElementCount, hduError, type FitsHdu } from './parse.js';

export interface FitsImage {
  /** NAXIS1 varies fastest. */
  values: Float64Array;
  axes: number[];
}

export function readImage(hdu: FitsHdu): FitsImage {
  if (hdu.kind !== 'image') hduError(hdu, 'holds no image data');
  const count = hdu.axes.reduce((a, b) => a * b, 1);
  checkElementCount(hdu, count, 'the image');
  const view = new DataView(hdu.bytes.buffer, hdu.bytes.byteOffset + hdu.dataStart, hdu.dataLength);
  const bscale = hdu.header.number('BSCALE') ?? 1;
  const bzero = hdu.header.number('BZERO') ?? 0;
  const blank = hdu.bitpix > 0 ? hdu.header.number('BLANK') : undefined;
  const out = new Float64Array(count);
  const read = elementReader(hdu.bitpix);
  const size = Math.abs(hdu.bitpix) / 8;
  const scaled = bscale !== 1 || bzero !== 0;
  for (let i = 0; i < count; i++) {
    const raw = read(view, i * size);
    if (blank !== undefined && raw === blank) out[i] = NaN;
    else out[i] = scaled ? bzero + bscale * raw : raw;
  }
  return { values: out, axes: hdu.axes.slice() };
}

type Reader = (view: DataView, offset: number) => number;

function elementReader(bitpix: number): Reader {
  switch (bitpix) {
    case 8:
      return (v, o) => v.getUint8(o);
    case 16:
      return (v, o) => v.getInt16(o);
    case 32:
      return (v, o) => v.getInt32(o);
    case 64:
      return (v, o) => Number(v.getBigInt64(o));
    case -32:
      return (v, o) => v.getFloat32(o);
    default:
      return (v, o) => v.getFloat64(o);
  }
}
