/**
 * Correlation peaks and their Tonry & Davis (1979, AJ 84, 1511) quality:
 *   r = h / (√2·σ_a), σ_a the rms of the antisymmetric part of the correlation about the peak;
 *   σ_lag = (3/8)·w / (1 + r), w the peak's FWHM in lags;  σ_z = (1 + z)·Δlnλ·σ_lag.
 */
import type { CorrelationCurveData } from './correlate.js';

/** σ_a window of tonryDavisR: this many peak widths either side, at least TD_MIN_WINDOW_LAGS native pixels (common practice, no source). */
export const TD_WINDOW_WIDTHS = 10;
export const TD_MIN_WINDOW_LAGS = 100;

export interface Peak {
  /** Sub-lag position (absolute lag). */
  lag: number;
  z: number;
  zErr: number;
  /** Interpolated peak height of ρ. */
  height: number;
  /** √Δχ² at the peak (ranking across templates). */
  score: number;
  /** FWHM, lags of its curve. */
  widthLags: number;
  /** FWHM in ln(1 + z). */
  widthLn: number;
  r: number;
  overlap: number;
}

/** Local maxima of ρ with ρ > 0, away from the ends of the searched range and with a Tonry–Davis r, best `maxPeaks` by score. */
export function findPeaks(curve: CorrelationCurveData, maxPeaks: number): Peak[] {
  const { rho, score, searchLo, searchHi } = curve;
  const idx: number[] = [];
  for (let i = searchLo + 2; i <= searchHi - 2; i++) {
    const v = rho[i];
    if (!(v > 0) || !(v >= rho[i - 1]) || !(v > rho[i + 1])) continue;
    if (!(rho[i - 1] === rho[i - 1]) || !(rho[i + 1] === rho[i + 1])) continue;
    idx.push(i);
  }
  idx.sort((a, b) => score[b] - score[a]);
  const out: Peak[] = [];
  for (const i of idx) {
    if (out.length >= maxPeaks) break;
    const peak = describePeak(curve, i);
    if (peak.r > 0) out.push(peak);
  }
  return out;
}

export function describePeak(curve: CorrelationCurveData, i: number): Peak {
  const { rho, score, overlap, step, lagMin } = curve;
  const y0 = rho[i - 1], y1 = rho[i], y2 = rho[i + 1];
  const den = y0 - 2 * y1 + y2;
  const delta = den < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (y0 - y2)) / den)) : 0;
  const h = y1 - 0.25 * (y0 - y2) * delta;
  const widthLags = fwhm(rho, i, h);
  const r = tonryDavisR(rho, i, h, widthLags, curve.minWindowLags);
  const lag = lagMin + i + delta;
  const z = Math.expm1(lag * step);
  const sigmaLag = ((3 / 8) * widthLags) / (1 + r);
  return { lag, z, zErr: (1 + z) * step * sigmaLag, height: h, score: score[i], widthLags, widthLn: widthLags * step, r, overlap: overlap[i] };
}

/** Full width at half of h (linear interpolation of the crossings), lags. */
export function fwhm(rho: Float64Array, i: number, h: number): number {
  const half = 0.5 * h;
  const n = rho.length;
  const side = (dir: number): number => {
    let k = i;
    while (k + dir >= 0 && k + dir < n && rho[k + dir] > half) k += dir;
    const next = k + dir;
    if (next < 0 || next >= n || !(rho[next] === rho[next])) return Math.abs(k - i) + 0.5;
    return Math.abs(k - i) + (rho[k] - half) / (rho[k] - rho[next]);
  };
  return side(-1) + side(1);
}

/**
 * Tonry–Davis r: σ_a from the antisymmetric part a(k) = (ρ(i+k) − ρ(i−k))/2 over k up to
 * ten peak widths (at least minWindowLags) either side, as far as both sides exist. A peak with fewer
 * such pairs than its FWHM (at the end of the searched range, or where the template barely
 * overlaps) gets r = 0: a(k) would then sample only the peak's own symmetric core, σ_a → 0 and
 * r → ∞ without evidence (z ≈ 4.9 QSO peaks reached r ≈ 58 on SDSS galaxies). Our rule, no source.
 */
export function tonryDavisR(rho: Float64Array, i: number, h: number, widthLags: number, minWindowLags: number): number {
  const n = rho.length;
  const kMax = Math.min(i, n - 1 - i, Math.max(minWindowLags, Math.ceil(TD_WINDOW_WIDTHS * widthLags)));
  let ss = 0, m = 0;
  for (let k = 1; k <= kMax; k++) {
    const a = rho[i + k], b = rho[i - k];
    if (!(a === a) || !(b === b)) continue;
    const d = 0.5 * (a - b);
    ss += d * d;
    m++;
  }
  if (m === 0 || m < widthLags) return 0;
  const sigmaA = Math.sqrt(ss / m);
  return sigmaA > 0 ? h / (Math.SQRT2 * sigmaA) : 0;
}
