/**
 * Robust continuum: medians of blocks of pixels, iteratively sigma-clipped, joined by linear
 * interpolation (a running-median continuum evaluated on block centres; common practice, no
 * single source). Emission and absorption lines narrower than a block barely move it.
 */

/** Continuum of `flux` where good[i] = 1; blockPixels wide blocks, `iterations` clipping passes. */
export function robustContinuum(flux: Float64Array, good: Uint8Array, blockPixels: number, iterations = 3, clipSigma = 2.5): Float64Array {
  const n = flux.length;
  const use = Uint8Array.from(good);
  let cont = blockMedianContinuum(flux, use, blockPixels);
  for (let it = 0; it < iterations; it++) {
    const resid: number[] = [];
    for (let i = 0; i < n; i++) if (use[i]) resid.push(Math.abs(flux[i] - cont[i]));
    if (resid.length < 10) break;
    const sigma = 1.4826 * median(resid);
    if (!(sigma > 0)) break;
    let changed = false;
    for (let i = 0; i < n; i++) {
      if (use[i] && Math.abs(flux[i] - cont[i]) > clipSigma * sigma) {
        use[i] = 0;
        changed = true;
      }
    }
    if (!changed) break;
    cont = blockMedianContinuum(flux, use, blockPixels);
  }
  return cont;
}

function blockMedianContinuum(flux: Float64Array, use: Uint8Array, blockPixels: number): Float64Array {
  const n = flux.length;
  const nBlocks = Math.max(1, Math.round(n / blockPixels));
  const xs: number[] = [];
  const ys: number[] = [];
  const buf = new Float64Array(Math.ceil(n / nBlocks) + 1);
  for (let b = 0; b < nBlocks; b++) {
    const lo = Math.floor((b * n) / nBlocks), hi = Math.floor(((b + 1) * n) / nBlocks);
    let k = 0, xsum = 0;
    for (let i = lo; i < hi; i++) if (use[i]) { buf[k++] = flux[i]; xsum += i; }
    if (k < Math.max(3, 0.2 * (hi - lo))) continue;
    const part = buf.subarray(0, k).sort();
    ys.push(k % 2 ? part[k >> 1] : 0.5 * (part[k / 2 - 1] + part[k / 2]));
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
  const a = Float64Array.from(values).sort();
  const n = a.length;
  if (n === 0) return NaN;
  return n % 2 ? a[n >> 1] : 0.5 * (a[n / 2 - 1] + a[n / 2]);
}
