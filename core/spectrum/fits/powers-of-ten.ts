/**
 * 10^x: wavelengths from log10 wavelengths (SDSS loglam). 10 ** x costs about 65 ns, as much
 * as the rest of reading a pixel; survey files store a few thousand distinct loglam values
 * (float32 on one fixed grid), so results are kept per value in a small direct-mapped table.
 * A hit requires the very same x, so every result is exactly 10 ** x.
 */
const SLOT_BITS = 14;
const exponents = new Float64Array(1 << SLOT_BITS).fill(NaN); // NaN equals nothing: an empty slot
const powers = new Float64Array(1 << SLOT_BITS);
const single = new Float32Array(1);
const singleBits = new Uint32Array(single.buffer);

export function powerOfTen(x: number): number {
  single[0] = x;
  // Fibonacci hashing of the float32 bits (Knuth, TAOCP vol. 3, §6.4).
  const slot = Math.imul(singleBits[0], 0x9e3779b1) >>> (32 - SLOT_BITS);
  if (exponents[slot] !== x) {
    exponents[slot] = x;
    powers[slot] = 10 ** x;
  }
  return powers[slot];
}
