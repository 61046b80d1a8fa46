/**
 * Correlation peaks of narrow-line templates described on the native grid. The coarse search
 * (coarse-grid.ts) finds where a peak is; here the same overlap-normalised correlation as in
 * correlate.ts is summed directly over a window of native lags around it, wide enough for the
 * Tonry–Davis σ_a window, so z, r, the width and σz are those of the native-grid curve. The
 * template is sparse (lines over ±5σ), so the direct sums cost (window lags) × (template pixels).
 */
import { CORRELATION_STRENGTH_POWER, coveredRange, curveArrays, MIN_OVERLAP, sigmaAMarginLags, type CorrelationCurveData } from './correlate.js';
import { nativeInput, pixelSigmaKmS, type CorrelationInput } from './coarse-grid.js';
import { describePeak, TD_MIN_WINDOW_LAGS, TD_WINDOW_WIDTHS, type Peak } from './peaks.js';
import type { PreparedSpectrum } from './preprocess.js';
import type { TemplateUse } from './template-set.js';
import type { Template } from './templates.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';
import { LruCache } from '../util/lru-cache.js';
import { WorkBuffer } from '../util/work-buffer.js';
import { perSpectrum } from './per-spectrum.js';

/** Profile evaluated to this many line σ beyond the outer lines (the lines are cut at ±5σ). */
const PROFILE_SIGMAS = 6;
/** Sparse profiles kept (least recently used dropped). */
const PROFILE_CACHE_SIZE = 24;

/** Non-zero runs of a template profile on the native grid's rest indices. */
interface SparseProfile {
  /** Rest index of each run's first value. */
  runStart: number[];
  t: Float64Array[];
  t2: Float64Array[];
  /** Rest indices [coverLo, coverHi] inside the template's rest range. */
  coverLo: number;
  coverHi: number;
}

const profiles = new LruCache<string, SparseProfile>(PROFILE_CACHE_SIZE);

function sparseProfile(template: Template, input: CorrelationInput): SparseProfile {
  const { step } = input.grid, instKmS = pixelSigmaKmS(input);
  return profiles.get(`${template.name}|${input.gridKey}`, () => {
    let [waveLo, waveHi] = template.restRangeAngstrom;
    for (const l of template.lines) {
      const reach = (PROFILE_SIGMAS * Math.hypot(l.sigmaKmS, instKmS)) / SPEED_OF_LIGHT_KMS;
      waveLo = Math.min(waveLo, l.waveRestAngstrom * (1 - reach));
      waveHi = Math.max(waveHi, l.waveRestAngstrom * (1 + reach));
    }
    const r0 = Math.floor(Math.log(waveLo) / step), n = Math.ceil(Math.log(waveHi) / step) - r0 + 1;
    const wave = new Float64Array(n);
    for (let i = 0; i < n; i++) wave[i] = Math.exp((r0 + i) * step);
    const prof = new Float64Array(n);
    template.evaluate(wave, instKmS, prof, CORRELATION_STRENGTH_POWER);
    const [coverLo, coverHi] = coveredRange(wave, template.restRangeAngstrom);
    const sp: SparseProfile = { runStart: [], t: [], t2: [], coverLo: r0 + coverLo, coverHi: r0 + coverHi };
    for (let i = 0; i < n; ) {
      if (prof[i] === 0) {
        i++;
        continue;
      }
      let j = i;
      while (j < n && prof[j] !== 0) j++;
      const t = prof.slice(i, j);
      sp.runStart.push(r0 + i);
      sp.t.push(t);
      sp.t2.push(t.map((v) => v * v));
      i = j;
    }
    return sp;
  });
}

/** Per-spectrum sums the window needs: w·s, and running sums of w·s² and of good pixels. */
interface SpectrumSums {
  ws: Float64Array;
  s2Sum: Float64Array;
  goodSum: Float64Array;
}

const spectrumSums = perSpectrum((p): SpectrumSums => {
  const n = p.grid.length, { energy, goodCount } = nativeInput(p);
  const s = { ws: new Float64Array(n), s2Sum: new Float64Array(n + 1), goodSum: new Float64Array(n + 1) };
  for (let j = 0; j < n; j++) {
    s.ws[j] = p.weight[j] * p.resid[j];
    s.s2Sum[j + 1] = s.s2Sum[j] + energy[j];
    s.goodSum[j + 1] = s.goodSum[j] + goodCount[j];
  }
  return s;
});

/** A window's two sums, and the curve of a window only looked at (locating), reused: neither outlives its use. */
const windowSums = new WorkBuffer(), lookedAtCurve = new WorkBuffer();

/**
 * The native-grid correlation over lags [centre − half, centre + half] (clipped to the searched
 * range and its σ_a margins), as a curve; lags the coarse curve left out stay left out. A curve
 * not `kept` lives in a work buffer until the next such window.
 */
function nativeWindow(p: PreparedSpectrum, coarse: CorrelationCurveData, use: TemplateUse, centre: number, half: number, kept = true): CorrelationCurveData {
  const { template } = use;
  const { step, start, length } = p.grid;
  const native = nativeInput(p);
  const margin = sigmaAMarginLags(template, native);
  const searchMin = Math.floor(Math.log1p(use.zMin) / step) - 1, searchMax = Math.ceil(Math.log1p(use.zMax) / step) + 1;
  const la = Math.max(centre - half, searchMin - margin), lb = Math.min(centre + half, searchMax + margin);
  const nLag = Math.max(0, lb - la + 1);
  const sp = sparseProfile(template, native);
  const sums = spectrumSums(p);
  const nGood = sums.goodSum[length];
  const work = windowSums.take(2 * nLag, true), c = work.subarray(0, nLag), t2 = work.subarray(nLag);
  // At lag la + i, rest index runStart + u meets native pixel runStart + u + la + i − start.
  for (let r = 0; r < sp.runStart.length; r++) addRunSums(sums.ws, p.weight, sp.t[r], sp.t2[r], sp.runStart[r] + la - start, c, t2);
  const [rho, score, overlap] = kept ? curveArrays(nLag) : curveArrays(nLag, lookedAtCurve.take(3 * nLag));
  for (let i = 0; i < nLag; i++) {
    const lag = la + i;
    const jLo = Math.max(0, sp.coverLo + lag - start), jHi = Math.min(length - 1, sp.coverHi + lag - start);
    const s2 = jHi >= jLo ? sums.s2Sum[jHi + 1] - sums.s2Sum[jLo] : 0;
    const ov = jHi >= jLo && nGood > 0 ? (sums.goodSum[jHi + 1] - sums.goodSum[jLo]) / nGood : 0;
    overlap[i] = Math.min(1, Math.max(0, ov));
    const k = Math.round(lag / coarse.binFactor) - coarse.lagMin;
    const coarseKept = k >= 0 && k < coarse.rho.length && coarse.rho[k] === coarse.rho[k];
    if (!coarseKept || ov < MIN_OVERLAP || !(t2[i] > 0) || !(s2 > 0)) {
      rho[i] = NaN;
      score[i] = NaN;
      continue;
    }
    score[i] = c[i] / Math.sqrt(t2[i]);
    rho[i] = score[i] / Math.sqrt(s2);
  }
  return { template, step, binFactor: 1, minWindowLags: TD_MIN_WINDOW_LAGS, describeNatively: false, lagMin: la, searchLo: Math.max(0, searchMin - la), searchHi: Math.min(nLag - 1, searchMax - la), rho, score, overlap };
}

/**
 * c[i] += Σ_u ws[base + i + u]·t[u] and t2[i] += Σ_u w[base + i + u]·tSq[u] for every lag i of
 * c, pixels outside the spectrum counting as zero. Four lags at a time, so that each template
 * value is loaded once per four lags and the sums stay in registers (about twice as fast as
 * pixel by pixel over the lags).
 */
function addRunSums(ws: Float64Array, w: Float64Array, t: Float64Array, tSq: Float64Array, base: number, c: Float64Array, t2: Float64Array): void {
  const nLag = c.length, len = t.length, length = ws.length;
  let i = 0;
  for (; i < nLag; i++) {
    const off = base + i;
    if (off >= 0 && off + 3 + len <= length && i + 3 < nLag) break;
    addOneLag(ws, w, t, tSq, off, c, t2, i);
  }
  for (; i + 3 < nLag && base + i + 3 + len <= length; i += 4) {
    const off = base + i;
    let a0 = 0, a1 = 0, a2 = 0, a3 = 0, b0 = 0, b1 = 0, b2 = 0, b3 = 0;
    for (let u = 0; u < len; u++) {
      const tu = t[u], qu = tSq[u], o = off + u;
      a0 += ws[o] * tu;
      a1 += ws[o + 1] * tu;
      a2 += ws[o + 2] * tu;
      a3 += ws[o + 3] * tu;
      b0 += w[o] * qu;
      b1 += w[o + 1] * qu;
      b2 += w[o + 2] * qu;
      b3 += w[o + 3] * qu;
    }
    c[i] += a0;
    c[i + 1] += a1;
    c[i + 2] += a2;
    c[i + 3] += a3;
    t2[i] += b0;
    t2[i + 1] += b1;
    t2[i + 2] += b2;
    t2[i + 3] += b3;
  }
  for (; i < nLag; i++) addOneLag(ws, w, t, tSq, base + i, c, t2, i);
}

/** One lag of addRunSums, clipped to the spectrum. */
function addOneLag(ws: Float64Array, w: Float64Array, t: Float64Array, tSq: Float64Array, off: number, c: Float64Array, t2: Float64Array, i: number): void {
  const uLo = Math.max(0, -off), uHi = Math.min(t.length, ws.length - off);
  let a = 0, b = 0;
  for (let u = uLo; u < uHi; u++) {
    a += ws[off + u] * t[u];
    b += w[off + u] * tSq[u];
  }
  c[i] += a;
  t2[i] += b;
}

/** A coarse peak's position on the native grid. */
export interface NativeLocation {
  /** Absolute native lag of the local maximum. */
  lag: number;
  z: number;
  /** √Δχ² there, as in CorrelationCurveData.score. */
  score: number;
}

/**
 * The best local maximum of the native-grid correlation within about half a coarse lag of the
 * interpolated coarse peak (a few lags summed: cheap enough for every coarse peak), or null.
 */
export function locateOnNativeGrid(p: PreparedSpectrum, coarse: CorrelationCurveData, use: TemplateUse, peak: Peak): NativeLocation | null {
  // The interpolated coarse peak is within half a coarse lag of the native one.
  const centre = Math.round(peak.lag * coarse.binFactor);
  const win = nativeWindow(p, coarse, use, centre, Math.ceil(coarse.binFactor / 2) + 2, false);
  const { rho, score } = win;
  let best = -1;
  const from = Math.max(win.searchLo + 2, 1), to = Math.min(win.searchHi - 2, rho.length - 2);
  for (let i = from; i <= to; i++) {
    const v = rho[i];
    if (!(v > 0) || !(v >= rho[i - 1]) || !(v > rho[i + 1]) || !(rho[i - 1] === rho[i - 1]) || !(rho[i + 1] === rho[i + 1])) continue;
    if (best < 0 || score[i] > score[best]) best = i;
  }
  if (best < 0) return null;
  const lag = win.lagMin + best;
  return { lag, z: Math.expm1(lag * p.grid.step), score: score[best] };
}

/**
 * The located peak described on the native grid (z, r, width, σz), over a window as wide as the
 * least Tonry–Davis σ_a window; a peak too wide for it (ten widths beyond that) gets a second,
 * wider window. Null when r cannot be measured.
 */
export function describeOnNativeGrid(p: PreparedSpectrum, coarse: CorrelationCurveData, use: TemplateUse, at: NativeLocation): Peak | null {
  const half = TD_MIN_WINDOW_LAGS + 2;
  let win = nativeWindow(p, coarse, use, at.lag, half);
  let peak = describePeak(win, at.lag - win.lagMin);
  const needed = Math.ceil(TD_WINDOW_WIDTHS * peak.widthLags) + 2;
  if (needed > half) {
    win = nativeWindow(p, coarse, use, at.lag, needed);
    peak = describePeak(win, at.lag - win.lagMin);
  }
  coarse.nativeWindows?.push(win);
  return peak.r > 0 ? peak : null;
}
