/**
 * Robust continuum: medians of blocks of pixels, iteratively sigma-clipped, joined by linear
 * interpolation (a running-median continuum evaluated on block centres; common practice, no
 * single source). Emission and absorption lines narrower than a block barely move it.
 */

/** Continuum of `flux` where good[i] = 1; blockPixels wide blocks, `iterations` clipping passes. */
export function robustContinuum(flux: Float64Array, good: Uint8Array, blockPixels: number, iterations = 3, clipSigma = 2.5): Float64Array {
  return clippedContinuum(BlockMedians.sortedOver(flux, good, blockPixels), good, iterations, clipSigma);
}

/** A flux array's blocks sorted once, for several continua over subsets of its good pixels. */
export type ContinuumBlocks = BlockMedians;

export function continuumBlocks(flux: Float64Array, good: Uint8Array, blockPixels: number): ContinuumBlocks {
  return BlockMedians.sortedOver(flux, good, blockPixels);
}

/**
 * robustContinuum of the blocks' flux where good[i] = 1, from blocks sorted once over a superset
 * of `good`: the pixels left out are taken out of a copy instead of sorting again. Same result.
 */
export function robustContinuumOf(blocks: ContinuumBlocks, good: Uint8Array, iterations = 3, clipSigma = 2.5): Float64Array {
  return clippedContinuum(blocks.without(good), good, iterations, clipSigma);
}

/** The iterative clipping on blocks holding exactly the pixels of `good` (the blocks are used up). */
function clippedContinuum(blocks: BlockMedians, good: Uint8Array, iterations: number, clipSigma: number): Float64Array {
  const { flux } = blocks;
  const n = flux.length;
  const use = Uint8Array.from(good);
  const scratch = new Float64Array(n);
  const cont = new Float64Array(n);
  blocks.interpolate(cont);
  for (let it = 0; it < iterations; it++) {
    let k = 0;
    for (let i = 0; i < n; i++) if (use[i]) scratch[k++] = Math.abs(flux[i] - cont[i]);
    if (k < 10) break;
    const sigma = 1.4826 * medianInPlace(scratch, k);
    if (!(sigma > 0)) break;
    const limit = clipSigma * sigma;
    let changed = false;
    for (let b = 0; b < blocks.count; b++) {
      let hit = false;
      for (let i = blocks.lo(b), end = blocks.lo(b + 1); i < end; i++) {
        if (use[i] && Math.abs(flux[i] - cont[i]) > limit) {
          use[i] = 0;
          blocks.remove(b, i);
          hit = true;
        }
      }
      // Only the blocks that lost pixels get a new median.
      if (hit) blocks.refresh(b);
      changed ||= hit;
    }
    if (!changed) break;
    blocks.interpolate(cont);
  }
  return cont;
}

/** What a continuum fit changes in its blocks. */
interface BlockState {
  /** Mean pixel position and median of each block, and 1 where the block has enough pixels to count. */
  x: Float64Array;
  y: Float64Array;
  valid: Uint8Array;
  /** Flag per sorted value, values left and Σ of their pixel indices (exact in doubles) per block. */
  removed: Uint8Array;
  left: Int32Array;
  xsum: Float64Array;
}

/**
 * Medians of equal blocks of pixels. Each block's usable values are sorted once; clipping then
 * only marks values as removed, and a block's new median is read off by counting.
 */
class BlockMedians {
  private constructor(
    readonly flux: Float64Array,
    readonly count: number,
    /** The pixels the blocks were sorted over. */
    private readonly base: Uint8Array,
    /** Block b's values ascending in sorted[lo(b) … lo(b) + size[b]). */
    private readonly sorted: Float64Array,
    private readonly size: Int32Array,
    private readonly s: BlockState,
  ) {}

  static sortedOver(flux: Float64Array, use: Uint8Array, blockPixels: number): BlockMedians {
    const n = flux.length, count = Math.max(1, Math.round(n / blockPixels));
    const state: BlockState = { x: new Float64Array(count), y: new Float64Array(count), valid: new Uint8Array(count), removed: new Uint8Array(n), left: new Int32Array(count), xsum: new Float64Array(count) };
    const blocks = new BlockMedians(flux, count, Uint8Array.from(use), new Float64Array(n), new Int32Array(count), state);
    for (let b = 0; b < count; b++) {
      const lo = blocks.lo(b), hi = blocks.lo(b + 1);
      let k = 0, xsum = 0;
      for (let i = lo; i < hi; i++) if (use[i]) { blocks.sorted[lo + k++] = flux[i]; xsum += i; }
      blocks.sorted.subarray(lo, lo + k).sort();
      blocks.size[b] = state.left[b] = k;
      state.xsum[b] = xsum;
      blocks.refresh(b);
    }
    return blocks;
  }

  /** A copy holding only the pixels of `use`; sorted afresh when `use` has pixels these blocks were not sorted over. */
  without(use: Uint8Array): BlockMedians {
    const n = this.flux.length;
    for (let i = 0; i < n; i++) if (use[i] && !this.base[i]) return BlockMedians.sortedOver(this.flux, use, n / this.count);
    const { x, y, valid, removed, left, xsum } = this.s;
    const copy = new BlockMedians(this.flux, this.count, this.base, this.sorted, this.size, { x: x.slice(), y: y.slice(), valid: valid.slice(), removed: removed.slice(), left: left.slice(), xsum: xsum.slice() });
    for (let b = 0; b < this.count; b++) {
      let hit = false;
      for (let i = this.lo(b), end = this.lo(b + 1); i < end; i++) {
        if (this.base[i] && !use[i]) {
          copy.remove(b, i);
          hit = true;
        }
      }
      if (hit) copy.refresh(b);
    }
    return copy;
  }

  /** First pixel of block b (b = count gives n). */
  lo(b: number): number {
    return Math.floor((b * this.flux.length) / this.count);
  }

  /** Takes pixel i out of block b. */
  remove(b: number, i: number): void {
    const value = this.flux[i], { removed } = this.s;
    let lo = this.lo(b), hi = lo + this.size[b];
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.sorted[mid] < value) lo = mid + 1;
      else hi = mid;
    }
    while (removed[lo]) lo++;
    removed[lo] = 1;
    this.s.left[b]--;
    this.s.xsum[b] -= i;
  }

  /** Block b's median and mean pixel position from the values still in it. */
  refresh(b: number): void {
    const { s } = this;
    const lo = this.lo(b), m = s.left[b];
    s.valid[b] = m >= Math.max(3, 0.2 * (this.lo(b + 1) - lo)) ? 1 : 0;
    if (!s.valid[b]) return;
    // The values of ranks m/2 − 1 and m/2 (for odd m, (m − 1)/2 alone).
    const upper = m >> 1;
    let rank = 0, below = NaN;
    for (let j = lo; ; j++) {
      if (s.removed[j]) continue;
      if (rank === upper) {
        s.y[b] = m % 2 ? this.sorted[j] : 0.5 * (below + this.sorted[j]);
        break;
      }
      below = this.sorted[j];
      rank++;
    }
    s.x[b] = s.xsum[b] / m;
  }

  /** The block medians joined by straight lines into cont, flat beyond the outer ones (NaN when no block counts). */
  interpolate(cont: Float64Array): void {
    const { x, y, valid } = this.s;
    const xs = new Float64Array(this.count), ys = new Float64Array(this.count);
    let m = 0;
    for (let b = 0; b < this.count; b++) if (valid[b]) { xs[m] = x[b]; ys[m] = y[b]; m++; }
    const n = this.flux.length;
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
