/**
 * Smoothing for display only (the measurement never sees it). Masked and missing pixels get no
 * weight; each output pixel is the weighted mean of its good neighbours, or null if it has none.
 */

export type SmoothingKernel = 'boxcar' | 'gaussian';

export interface SmoothingSetting {
  kernel: SmoothingKernel;
  /** Boxcar: full width in pixels (odd, 1 = none). Gaussian: FWHM in pixels (≤ 1 = none). */
  widthPx: number;
}

/** Weights of the kernel from its centre outwards: w[0] at offset 0, w[k] at ±k. */
export function kernelWeights(s: SmoothingSetting): number[] {
  if (s.kernel === 'boxcar') {
    const half = Math.max(0, Math.floor(s.widthPx / 2));
    return Array.from({ length: half + 1 }, () => 1);
  }
  if (s.widthPx <= 1) return [1];
  // FWHM = 2√(2 ln 2)·σ (the Gaussian's defining relation); cut at 3σ.
  const sigma = s.widthPx / (2 * Math.sqrt(2 * Math.LN2));
  const half = Math.ceil(3 * sigma);
  return Array.from({ length: half + 1 }, (_, k) => Math.exp(-0.5 * (k / sigma) ** 2));
}

/**
 * The kernel-weighted combination of good neighbours, (Σ (w·v)^p)^(1/p) / Σ w: p = 1 is the
 * weighted mean of the values; p = 2 with 1σ errors as values is the standard propagation of
 * independent errors through that mean, σ_s = √(Σ w²σ²) / Σ w.
 */
function weighted(values: readonly (number | null)[], mask: readonly number[], s: SmoothingSetting, p: 1 | 2): (number | null)[] {
  const w = kernelWeights(s);
  const n = values.length;
  const out: (number | null)[] = new Array(n);
  for (let i = 0; i < n; i++) {
    let sum = 0;
    let wsum = 0;
    for (let k = -(w.length - 1); k < w.length; k++) {
      const j = i + k;
      const v = values[j];
      if (j < 0 || j >= n || v === null || !Number.isFinite(v) || mask[j]) continue;
      const wk = w[Math.abs(k)];
      sum += p === 1 ? wk * v : (wk * v) ** 2;
      wsum += wk;
    }
    out[i] = wsum > 0 && !(mask[i] || values[i] === null) ? (p === 1 ? sum : Math.sqrt(sum)) / wsum : null;
  }
  return out;
}

export function smooth(values: readonly (number | null)[], mask: readonly number[], s: SmoothingSetting): (number | null)[] {
  return weighted(values, mask, s, 1);
}

/** 1σ error of the smoothed flux, propagated through the same weights. */
export function smoothError(errors: readonly (number | null)[], mask: readonly number[], s: SmoothingSetting): (number | null)[] {
  return weighted(errors, mask, s, 2);
}

/** Next width up or down, in the steps a person wants: 1, 3, 5, 7, 9, 13, 17, 25 px. */
export const SMOOTHING_STEPS_PX = [1, 3, 5, 7, 9, 13, 17, 25] as const;

export function stepSmoothing(widthPx: number, direction: 1 | -1): number {
  const i = SMOOTHING_STEPS_PX.findIndex((w) => w >= widthPx);
  const at = i < 0 ? SMOOTHING_STEPS_PX.length - 1 : i;
  const next = Math.min(SMOOTHING_STEPS_PX.length - 1, Math.max(0, at + direction));
  return SMOOTHING_STEPS_PX[next];
}

