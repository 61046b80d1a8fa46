/**
 * The one typed door to fft.js (its own types are `any`): complex transforms of interleaved
 * [re, im, re, im, …] Float64Arrays of a power-of-two length. Instances are cached per size.
 */
import FFT from 'fft.js';

export class ComplexFft {
  readonly size: number;
  private readonly impl: FFT;

  constructor(size: number) {
    if (size < 2 || (size & (size - 1)) !== 0) throw new Error(`FFT size must be a power of two, got ${size}`);
    this.size = size;
    this.impl = new FFT(size);
  }

  /** A zeroed interleaved complex buffer of this size (2·size numbers). */
  buffer(): Float64Array {
    return new Float64Array(2 * this.size);
  }

  /** out = Σ_n x[n]·exp(−2πi·kn/N). */
  forward(out: Float64Array, input: Float64Array): void {
    this.impl.transform(out, input);
  }

  /** out = (1/N)·Σ_k X[k]·exp(+2πi·kn/N). */
  inverse(out: Float64Array, input: Float64Array): void {
    this.impl.inverseTransform(out, input);
  }
}

const bySize = new Map<number, ComplexFft>();

export function complexFft(size: number): ComplexFft {
  let f = bySize.get(size);
  if (!f) bySize.set(size, (f = new ComplexFft(size)));
  return f;
}

export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/**
 * Transforms two real signals of the same length at once (packed as a + i·b) and returns their
 * spectra unpacked: A[k] = (Z[k] + conj Z[N−k])/2, B[k] = (Z[k] − conj Z[N−k])/(2i)
 * (the standard two-for-one real FFT, e.g. Press et al., Numerical Recipes, §12.3).
 */
export function forwardRealPair(fft: ComplexFft, a: Float64Array, b: Float64Array, outA: Float64Array, outB: Float64Array, scratch: Float64Array): void {
  const n = fft.size;
  for (let i = 0; i < n; i++) {
    scratch[2 * i] = i < a.length ? a[i] : 0;
    scratch[2 * i + 1] = i < b.length ? b[i] : 0;
  }
  forwardPackedPair(fft, scratch, outA, outB);
}

/** As forwardRealPair, with a and b already packed as packed[2i] = a[i], packed[2i+1] = b[i] (packed is overwritten). */
export function forwardPackedPair(fft: ComplexFft, packed: Float64Array, outA: Float64Array, outB: Float64Array): void {
  const n = fft.size;
  fft.forward(outA, packed);
  const z = outA;
  // Unpack in place into outA/outB using a copy of Z held in packed.
  packed.set(z);
  for (let k = 0; k < n; k++) {
    const m = k === 0 ? 0 : n - k;
    const zr = packed[2 * k], zi = packed[2 * k + 1];
    const cr = packed[2 * m], ci = -packed[2 * m + 1];
    outA[2 * k] = 0.5 * (zr + cr);
    outA[2 * k + 1] = 0.5 * (zi + ci);
    // (Z − conj Z[N−k]) / (2i) = (dr + i·di)/(2i) = (di − i·dr)/2
    outB[2 * k] = 0.5 * (zi - ci);
    outB[2 * k + 1] = -0.5 * (zr - cr);
  }
}
