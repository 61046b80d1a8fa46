/**
 * Robust continuum: medians of blocks of pixels, iteratively sigma-clipped, joined by linear
 * interpolation (a running-median continuum evaluated on block centres; common practice, no
 * single source). Emission and absorption lines narrower than a block barely move it.
 */
import { WorkBuffer } from '../util/work-buffer.js';

/** Continuum of `flux` where good[i] = 1 (good holds 0 or 1); blockPixels wide blocks, `iterations` clipping passes. */
export function robustContinuum(flux: Float64Array, good: Uint8Array, blockPixels: number, iterations = 3, clipSigma = 2.5): Float64Array {
  return clippedContinuum(BlockMedians.over(flux, good, blockPixels), good, iterations, clipSigma);
}

/** A flux array's block medians, taken once for several continua over subsets of its good pixels. */
export type ContinuumBlocks = BlockMedians;

export function continuumBlocks(flux: Float64Array, good: Uint8Array, blockPixels: number): ContinuumBlocks {
  return BlockMedians.over(flux, good, blockPixels);
}

/**
 * robustContinuum of the blocks' flux where good[i] = 1, from blocks measured over a superset of
 * `good`: only the blocks that lose pixels get a new median. Same result.
 */
export function robustContinuumOf(blocks: ContinuumBlocks, good: Uint8Array, iterations = 3, clipSigma = 2.5): Float64Array {
  return clippedContinuum(blocks.restrictedTo(good), good, iterations, clipSigma);
}

/** Work buffers shared by the calls here: values to select from, and the block centres and medians of an interpolation. */
const selectionBuffer = new WorkBuffer(), centresBuffer = new WorkBuffer(), mediansBuffer = new WorkBuffer();

/** The iterative clipping on blocks holding exactly the pixels of `good` (the blocks are used up). */
function clippedContinuum(blocks: BlockMedians, good: Uint8Array, iterations: number, clipSigma: number): Float64Array {
  const { flux } = blocks;
  const n = flux.length;
  const use = good.slice();
  const scratch = selectionBuffer.take(n);
  const cont = new Float64Array(n);
  blocks.interpolate(cont);
  for (let it = 0; it < iterations; it++) {
    let k = 0;
    // Written at every pixel and kept where used: no branch in the loop.
    for (let i = 0; i < n; i++) {
      scratch[k] = Math.abs(flux[i] - cont[i]);
      k += use[i];
    }
    if (k < 10) break;
    const sigma = 1.4826 * medianInPlace(scratch, k);
    if (!(sigma > 0)) break;
    const limit = clipSigma * sigma;
    let changed = false;
    for (let b = 0; b < blocks.count; b++) {
      let hit = false, m = 0, xsum = 0;
      // The pixels kept are gathered as the others are clipped.
      for (let i = blocks.starts[b], end = blocks.starts[b + 1]; i < end; i++) {
        if (!use[i]) continue;
        if (Math.abs(flux[i] - cont[i]) > limit) {
          use[i] = 0;
          hit = true;
        } else {
          scratch[m++] = flux[i];
          xsum += i;
        }
      }
      // Only the blocks that lost pixels get a new median.
      if (hit) blocks.set(b, scratch, m, xsum);
      changed ||= hit;
    }
    if (!changed) break;
    blocks.interpolate(cont);
  }
  return cont;
}

/** Medians of equal blocks of pixels over a set of them (each by selection, not sorting). */
class BlockMedians {
  private constructor(
    readonly flux: Float64Array,
    /** Block b holds pixels starts[b] … starts[b + 1] − 1. */
    readonly starts: Int32Array,
    /** The pixels the medians were taken over. */
    private readonly base: Uint8Array,
    /** Mean pixel position and median of each block, and 1 where the block has enough pixels to count. */
    private readonly x: Float64Array,
    private readonly y: Float64Array,
    private readonly valid: Uint8Array,
  ) {}

  get count(): number {
    return this.starts.length - 1;
  }

  static over(flux: Float64Array, use: Uint8Array, blockPixels: number): BlockMedians {
    const n = flux.length, count = Math.max(1, Math.round(n / blockPixels));
    const starts = new Int32Array(count + 1);
    for (let b = 0; b <= count; b++) starts[b] = Math.floor((b * n) / count);
    const blocks = new BlockMedians(flux, starts, use.slice(), new Float64Array(count), new Float64Array(count), new Uint8Array(count));
    const scratch = selectionBuffer.take(n);
    for (let b = 0; b < count; b++) blocks.refresh(b, use, scratch);
    return blocks;
  }

  /** A copy holding only the pixels of `use`; measured afresh when `use` has pixels these blocks were not taken over. */
  restrictedTo(use: Uint8Array): BlockMedians {
    const n = this.flux.length;
    for (let i = 0; i < n; i++) if (use[i] && !this.base[i]) return BlockMedians.over(this.flux, use, n / this.count);
    const copy = new BlockMedians(this.flux, this.starts, this.base, this.x.slice(), this.y.slice(), this.valid.slice());
    const scratch = selectionBuffer.take(n);
    for (let b = 0; b < this.count; b++) {
      for (let i = this.starts[b], end = this.starts[b + 1]; i < end; i++) {
        if (this.base[i] && !use[i]) {
          copy.refresh(b, use, scratch);
          break;
        }
      }
    }
    return copy;
  }

  /** Block b's median and mean pixel position over the pixels of `use` in it. */
  refresh(b: number, use: Uint8Array, scratch: Float64Array): void {
    let m = 0, xsum = 0;
    for (let i = this.starts[b], end = this.starts[b + 1]; i < end; i++) if (use[i]) { scratch[m++] = this.flux[i]; xsum += i; }
    this.set(b, scratch, m, xsum);
  }

  /** Block b from the flux of its m pixels (values[0…m−1], reordered) and Σ of their indices. */
  set(b: number, values: Float64Array, m: number, xsum: number): void {
    this.valid[b] = m >= Math.max(3, 0.2 * (this.starts[b + 1] - this.starts[b])) ? 1 : 0;
    if (!this.valid[b]) return;
    this.y[b] = medianInPlace(values, m);
    this.x[b] = xsum / m;
  }

  /** The block medians joined by straight lines into cont, flat beyond the outer ones (NaN when no block counts). */
  interpolate(cont: Float64Array): void {
    const { x, y, valid } = this;
    const xs = centresBuffer.take(this.count), ys = mediansBuffer.take(this.count);
    let m = 0;
    for (let b = 0; b < this.count; b++) if (valid[b]) { xs[m] = x[b]; ys[m] = y[b]; m++; }
    const n = this.flux.length;
    if (m <= 1) {
      cont.fill(m === 1 ? ys[0] : NaN);
      return;
    }
    let i = 0;
    for (; i < n && i <= xs[0]; i++) cont[i] = ys[0];
    // Pixels up to the last one before the last block's centre are interpolated.
    const last = Math.min(n - 1, Math.ceil(xs[m - 1]) - 1);
    for (let s = 0; s < m - 1; s++) {
      const x0 = xs[s], dx = xs[s + 1] - x0, y0 = ys[s], dy = ys[s + 1] - y0;
      for (const end = Math.min(last, Math.floor(xs[s + 1])); i <= end; i++) cont[i] = y0 + ((i - x0) / dx) * dy;
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
 * The k-th smallest of a[0…n−1]; afterwards a[0…k−1] ≤ a[k] ≤ a[k+1…n−1]. Quickselect (Hoare
 * 1961) with a median-of-three pivot and Lomuto's partition done without branches: every element
 * is swapped with the boundary one and the boundary moves by the comparison's 0 or 1, so that no
 * comparison is mispredicted (on real data about twice as fast as Hoare's partition, whose branch
 * per element goes either way at random). A run of poor splits (many equal values) hands the rest
 * to Hoare's partition, which splits ties evenly; short ranges finish by insertion sort.
 */
export function selectInPlace(a: Float64Array, n: number, k: number): number {
  let left = 0, right = n - 1, poorSplits = 0;
  while (right - left > 16) {
    const mid = (left + right) >> 1;
    // The median of three is the pivot, kept at the right end while the rest is split.
    const y = sortThree(a, left, mid, right);
    a[mid] = a[right];
    a[right] = y;
    let store = left;
    for (let i = left; i < right; i++) {
      const v = a[i];
      a[i] = a[store];
      a[store] = v;
      store += +(v < y);
    }
    // a[left…store−1] < y ≤ a[store…right]
    a[right] = a[store];
    a[store] = y;
    if (k === store) return y;
    const before = right - left;
    if (k < store) right = store - 1;
    else left = store + 1;
    if (16 * (right - left) > 15 * before && ++poorSplits > 2) return hoareSelect(a, left, right, k);
  }
  return insertionSelect(a, left, right, k);
}

/** selectInPlace on a[left…right] by Hoare's partition around a median-of-three pivot. */
function hoareSelect(a: Float64Array, left: number, right: number, k: number): number {
  while (right - left > 16) {
    const y = sortThree(a, left, (left + right) >> 1, right);
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
  return insertionSelect(a, left, right, k);
}

/** Puts a[i] ≤ a[j] ≤ a[k] in order; returns the middle one. */
function sortThree(a: Float64Array, i: number, j: number, k: number): number {
  let x = a[i], y = a[j], z = a[k], t;
  if (y < x) { t = x; x = y; y = t; }
  if (z < x) { t = x; x = z; z = t; }
  if (z < y) { t = y; y = z; z = t; }
  a[i] = x;
  a[j] = y;
  a[k] = z;
  return y;
}

/** a[k] after sorting a[left…right] by insertion. */
function insertionSelect(a: Float64Array, left: number, right: number, k: number): number {
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
