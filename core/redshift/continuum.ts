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
  let cont = blockMedianContinuum(flux, use, blockPixels, scratch);
  for (let it = 0; it < iterations; it++) {
    let k = 0;
    for (let i = 0; i < n; i++) if (use[i]) scratch[k++] = Math.abs(flux[i] - cont[i]);
    if (k < 10) break;
    const sigma = 1.4826 * medianInPlace(scratch, k);
    if (!(sigma > 0)) break;
    let changed = false;
    for (let i = 0; i < n; i++) {
      if (use[i] && Math.abs(flux[i] - cont[i]) > clipSigma * sigma) {
        use[i] = 0;
        changed = true;
      }
    }
    if (!changed) break;
    cont = blockMedianContinuum(flux, use, blockPixels, scratch);
  }
  return cont;
}

function blockMedianContinuum(flux: Float64Array, use: Uint8Array, blockPixels: number, scratch: Float64Array): Float64Array {
  const n = flux.length;
  const nBlocks = Math.max(1, Math.round(n / blockPixels));
  const xs: number[] = [];
  const ys: number[] = [];
  for (let b = 0; b < nBlocks; b++) {
    const lo = Math.floor((b * n) / nBlocks), hi = Math.floor(((b + 1) * n) / nBlocks);
    let k = 0, xsum = 0;
    for (let i = lo; i < hi; i++) if (use[i]) { scratch[k++] = flux[i]; xsum += i; }
    if (k < Math.max(3, 0.2 * (hi - lo))) continue;
    ys.push(medianInPlace(scratch, k));
    xs.push(xsum / k);
  }
  const cont = new Float64Array(n);
  if (ys.length === 0) return cont.fill(NaN);
  let s = 0;
  for (let i = 0; i < n; i++) {
    while (s < xs.length - 2 && i > xs[s + 1]) s++;
    if (ys.length === 1 || i <= xs[0]) cont[i] = ys[0];
    else if (i >= xs[xs.length - 1]) cont[i] = ys[ys.length - 1];
    else {
      const t = (i - xs[s]) / (xs[s + 1] - xs[s]);
      cont[i] = ys[s] + t * (ys[s + 1] - ys[s]);
    }
  }
  return cont;
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

/** The k-th smallest of a[0…n−1]; afterwards a[0…k−1] ≤ a[k] ≤ a[k+1…n−1]. */
export function selectInPlace(a: Float64Array, n: number, k: number): number {
  let left = 0, right = n - 1;
  while (right > left) {
    const mid = (left + right) >> 1;
    // Median of three as the pivot.
    if (a[mid] < a[left]) swap(a, mid, left);
    if (a[right] < a[left]) swap(a, right, left);
    if (a[right] < a[mid]) swap(a, right, mid);
    const pivot = a[mid];
    let i = left, j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}
