/**
 * Gzip-compressed files (RFC 1952), inflated in pure JavaScript with fflate, in chunks so that
 * a file that would inflate past MAX_INFLATED_BYTES (a "gzip bomb") is refused early.
 */
import { Gunzip } from 'fflate';
import { concatArrays } from '../util/concat-arrays.js';
import { SpectrumReadError } from './spectrum.js';

/** Largest inflated size accepted: room for 50 million 4-byte pixels plus headers. */
export const MAX_INFLATED_BYTES = 256 * 1024 * 1024;

const CHUNK = 64 * 1024;

/**
 * Past this many inflated bytes, data that inflates more than MAX_RATIO times its compressed
 * size is taken for a bomb and refused at once. Spectra (floating-point samples with noise)
 * compress a few times at most; only constant filler reaches ratios of hundreds (common
 * practice, no source).
 */
const RATIO_CHECK_AFTER_BYTES = 16 * 1024 * 1024;
const MAX_RATIO = 100;

export function isGzip(bytes: Uint8Array): boolean {
  return bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b;
}

export function gunzip(bytes: Uint8Array, fileName: string, maxBytes = MAX_INFLATED_BYTES): Uint8Array {
  const parts: Uint8Array[] = [];
  let total = 0;
  let consumed = 0;
  let done = false;
  const inflater = new Gunzip((chunk, final) => {
    total += chunk.length;
    if (total > maxBytes) throw new SpectrumReadError(fileName, `gzip data inflates to more than ${maxBytes} bytes; refused`);
    if (total > RATIO_CHECK_AFTER_BYTES && total > MAX_RATIO * consumed) {
      throw new SpectrumReadError(fileName, `gzip data inflates more than ${MAX_RATIO} times its size (a decompression bomb?); refused`);
    }
    parts.push(chunk);
    if (final) done = true;
  });
  try {
    for (let at = 0; at < bytes.length; at += CHUNK) {
      consumed = Math.min(at + CHUNK, bytes.length);
      inflater.push(bytes.subarray(at, Math.min(at + CHUNK, bytes.length)), at + CHUNK >= bytes.length);
    }
  } catch (err) {
    if (err instanceof SpectrumReadError) throw err;
    throw new SpectrumReadError(fileName, `corrupt gzip data (${err instanceof Error ? err.message : String(err)})`);
  }
  // RFC 1952 §2.3.1: the member ends with ISIZE, the inflated size mod 2^32 (little-endian).
  const n = bytes.length;
  const isize = n >= 18 ? (bytes[n - 4] | (bytes[n - 3] << 8) | (bytes[n - 2] << 16) | (bytes[n - 1] << 24)) >>> 0 : -1;
  if (!done || isize !== total % 2 ** 32) throw new SpectrumReadError(fileName, 'truncated or corrupt gzip data (its size does not match the gzip trailer)');
  return concatArrays((n) => new Uint8Array(n), parts);
}
