/**
 * Robust continuum: medians of blocks of pixels, iteratively sigma-clipped, joined by linear
 * interpolation (a running-median continuum evaluated on block centres; common practice, no
 * single source). Emission and absorption lines narrower than a block barely move it.
 */

/** Continuum of `flux` where good[i] = 1; blockPixels wide blocks, `iterations` clipping passes. */
export function robustContinuum(flux: Float64Array, good: Uint8Array, blockPixels: number, iterations = 3, clipSigma = 2.5): Float64Array {
  const n = flux.length;
  const use = Uint8Array.from(good);
  const scratch = new Float64Array(n);
  const blocks = new BlockMedians(n, blockPixels);
  const cont = new Float64Array(n);
  blocks.update(flux, use, scratch, null);
  blocks.interpolate(cont);
  const touched = new Uint8Array(blocks.count);
  for (let it = 0; it < iterations; it++) {
    let k = 0;
    for (let i = 0; i < n; i++) if (use[i]) scratch[k++] = Math.abs(flux[i] - cont[i]);
    if (k < 10) break;
    const sigma = 1.4826 * medianInPlace(scratch, k);
    if (!(sigma > 0)) break;
    const limit = clipSigma * sigma;
    let changed = false;
    for (let b = 0; b < blocks.count; b++) {
      let hit = 0;
      for (let i = blocks.lo(b), end = blocks.lo(b + 1); i < end; i++) {
        if (use[i] && Math.abs(flux[i] - cont[i]) > limit) {
          use[i] = 0;
          hit = 1;
        }
      }
      touched[b] = hit;
      if (hit) changed = true;
    }
    if (!changed) break;
    // Only the blocks that lost pixels get a new median.
    blocks.update(flux, use, scratch, touched);
    blocks.interpolate(cont);
  }
  return cont;
}

/** Medians of equal blocks of pixels, kept per block so a clipping pass redoes only the blocks it changed. */
class BlockMedians {
  readonly count: number;
  private readonly n: number;
  private readonly x: Float64Array;
  private readonly y: Float64Array;
  /** 1 where the block has enough pixels to count. */
  private readonly valid: Uint8Array;

  constructor(n: number, blockPixels: number) {
    this.n = n;
    this.count = Math.max(1, Math.round(n / blockPixels));
    this.x = new Float64Array(this.count);
    this.y = new Float64Array(this.count);
    this.valid = new Uint8Array(this.count);
  }

  /** First pixel of block b (b = count gives n). */
  lo(b: number): number {
    return Math.floor((b * this.n) / this.count);
  }

  /** Recomputes the blocks flagged in `which` (all when null). */
  update(flux: Float64Array, use: Uint8Array, scratch: Float64Array, which: Uint8Array | null): void {
    for (let b = 0; b < this.count; b++) {
      if (which && !which[b]) continue;
      const lo = this.lo(b), hi = this.lo(b + 1);
      let k = 0, xsum = 0;
      for (let i = lo; i < hi; i++) if (use[i]) { scratch[k++] = flux[i]; xsum += i; }
      this.valid[b] = k >= Math.max(3, 0.2 * (hi - lo)) ? 1 : 0;
      if (!this.valid[b]) continue;
      this.y[b] = medianInPlace(scratch, k);
      this.x[b] = xsum / k;
    }
  }

  /** The block medians joined by straight lines into cont, flat beyond the outer ones (NaN when no block counts). */
  interpolate(cont: Float64Array): void {
    const xs = new Float64Array(this.count), ys = new Float64Array(this.count);
    let m = 0;
    for (let b = 0; b < this.count; b++) if (this.valid[b]) { xs[m] = this.x[b]; ys[m] = this.y[b]; m++; }
    const n = this.n;
    if (m <= 1) {
      cont.fill(m === 1 ? ys[0] : NaN);
      return;
    }
    let i = 0;
    for (; i < n && i <= xs[0]; i++) cont[i] = ys[0];
    for (let s = 0; s < m - 1; s++) {
      const x0 = xs[s], dx = xs[s + 1] - x0, y0 = ys[s], dy = ys[s + 1] - y0;
      for (; i < n && i <= xs[s + 1] && i < xs[m - 1]; i++) cont[i] = y0 + ((i - x0) / dx) * dy;
    }
    for (; i < n; i++) cont[i] = ys[m - 1];
  }
}

export function median(values: ArrayLike<number>): number {
  const a = Float64Array.from(values);
  return medianInPlace(a, a.length);
}

/** Median of a[0…n−1] by quickselect (Hoare 1961, CACM 4, 321); reorders those entries. NaN when n = 0. */
export function medianInPlace(a: Float64Array, n: number): number {
  if (n === 0) return NaN;
  const hi = selectInPlace(a, n, n >> 1);
  if (n % 2) return hi;
  // The lower middle is the largest entry left of the upper one after selection.
  let lo = -Infinity;
  for (let i = 0; i < n >> 1; i++) if (a[i] > lo) lo = a[i];
  return 0.5 * (lo + hi);
}

/**
 * The k-th smallest of a[0…n−1]; afterwards a[0…k−1] ≤ a[k] ≤ a[k+1…n−1]. Quickselect with a
 * median-of-three pivot, finished by insertion sort once the range is short.
 */
export function selectInPlace(a: Float64Array, n: number, k: number): number {
  let left = 0, right = n - 1;
  while (right - left > 16) {
    const mid = (left + right) >> 1;
    let x = a[left], y = a[mid], z = a[right], t;
    if (y < x) { t = x; x = y; y = t; }
    if (z < x) { t = x; x = z; z = t; }
    if (z < y) { t = y; y = z; z = t; }
    a[left] = x;
    a[mid] = y;
    a[right] = z;
    let i = left, j = right;
    while (i <= j) {
      let ai = a[i];
      while (ai < y) ai = a[++i];
      let aj = a[j];
      while (aj > y) aj = a[--j];
      if (i <= j) {
        a[i] = aj;
        a[j] = ai;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return a[k];
  }
  for (let i = left + 1; i <= right; i++) {
    const v = a[i];
    let j = i - 1;
    while (j >= left && a[j] > v) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = v;
  }
  return a[k];
}
