/**
 * FFT cross-correlation of a prepared spectrum with templates, normalised over the overlap at
 * each lag (Tonry & Davis 1979, AJ 84, 1511, with the per-lag normalisation of masked
 * correlation, e.g. Padfield 2012, IEEE TIP 21, 2706):
 *
 *   ρ(L) = Σ w·s·t / √(Σ w·t² · Σ w·s²·m_t),   sums over the pixels both cover at lag L,
 *
 * where s is the spectrum, w its weights, t the template and m_t the template's coverage. On a
 * coarse grid Σ w·s² and the overlap are summed over the native pixels, so ρ keeps the native
 * normalisation.
 * Without the per-lag denominators a plain correlation grows or shrinks with how much template
 * falls in the window and makes false peaks at the ends of the lag range.
 *
 * Lag L (whole grid pixels) means z = exp(L·step) − 1. Templates are transformed once per grid
 * and cached; the spectrum is transformed once per grid. The FFT is only as long as the
 * searched lags need without wrap-around given where the template profile is non-zero
 * (templateFftSize), not as long as the whole template window. A template's coverage m_t is one
 * interval of rest wavelengths, so the sums over it are differences of running sums, not
 * transforms.
 */
import { complexFft, forwardPackedPair, forwardRealPair, nextPowerOfTwo, type ComplexFft } from './fft.js';
import { binnedInput, gridChoiceFor, pixelSigmaKmS, type CorrelationInput } from './coarse-grid.js';
import type { PreparedSpectrum } from './preprocess.js';
import { TD_MIN_WINDOW_LAGS, TD_WINDOW_WIDTHS } from './peaks.js';
import type { TemplateUse } from './template-set.js';
import type { Template } from './templates.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';
import { LruCache } from '../util/lru-cache.js';

/**
 * Spectrum ranges are rounded out to multiples of this many pixels to share cached templates;
 * small, because the FFT length follows the rounded range (at 256 a BOSS spectrum's passive
 * correlation on the two-pixel grid needed 8192 points instead of 4096).
 */
const RANGE_QUANTUM = 32;
/** Lags where the template covers less than this fraction of the spectrum are not searched. */
export const MIN_OVERLAP = 0.1;
/** Lags where the template holds less than this fraction of its best window's energy are not searched. */
const MIN_TEMPLATE_ENERGY = 0.02;
/**
 * Line strengths enter the correlation as |S|^0.5, so one strong line (Lyα, Hα) cannot decide
 * the redshift alone: the pattern of lines does (common practice, no source).
 */
export const CORRELATION_STRENGTH_POWER = 0.5;
/** Cached template transforms kept (least recently used dropped). */
const BANK_SIZE = 48;

export interface CorrelationCurveData {
  template: Template;
  /** Δ ln λ per lag. */
  step: number;
  /** Native pixels per lag (1 on the native grid). */
  binFactor: number;
  /** Least half-width of the Tonry–Davis σ_a window, lags (TD_MIN_WINDOW_LAGS native lags). */
  minWindowLags: number;
  /** true when this curve only locates peaks, to be described on the native grid (native-description.ts). */
  describeNatively: boolean;
  /** The native-grid windows its peaks were described on (for display), when describeNatively. */
  nativeWindows?: CorrelationCurveData[];
  /** Lag of index 0. */
  lagMin: number;
  /** Indices [searchLo, searchHi] of the searched z range; the lags outside serve σ_a only. */
  searchLo: number;
  searchHi: number;
  /** Correlation coefficient over the overlap (NaN where not searched). */
  rho: Float64Array;
  /** √Δχ² of the best-scaled template at each lag, Σ w·s·t / √Σ w·t² (ranks across templates). */
  score: Float64Array;
  /** Fraction of the spectrum's good pixels the template covers at each lag. */
  overlap: Float64Array;
}

interface BankEntry {
  fft: ComplexFft;
  t: Float64Array;
  t2: Float64Array;
  /** Template buffer positions [coverLo, coverHi] inside the template's rest range. */
  coverLo: number;
  coverHi: number;
}

const bank = new LruCache<string, BankEntry>(BANK_SIZE);

interface Layout {
  lagMin: number;
  lagMax: number;
  /** Absolute grid index of spectrum buffer position 0. */
  specOrigin: number;
  /** Absolute rest index of template buffer position 0. */
  templateOrigin: number;
  templateLength: number;
  /** Spectrum buffer positions [0, specLength) may be non-zero. */
  specLength: number;
}

/**
 * Lags correlated beyond each end of the searched range, for the Tonry–Davis σ_a only: the
 * antisymmetric part about a peak near an end needs the curve on both sides over the window
 * tonryDavisR uses (ten peak widths, at least 100 lags), or σ_a measures only the peak's own core
 * and r comes out far too high. The width is that of the template's widest line correlated with
 * itself: FWHM = 2√(2 ln 2)·√2·σ, σ the line's width with the pixel's in quadrature.
 */
export function sigmaAMarginLags(template: Template, input: CorrelationInput): number {
  const lagKmS = SPEED_OF_LIGHT_KMS * input.grid.step;
  const widest = template.lines.reduce((m, l) => Math.max(m, l.sigmaKmS), 0);
  const fwhmLags = (2 * Math.sqrt(2 * Math.LN2) * Math.SQRT2 * Math.hypot(widest, pixelSigmaKmS(input))) / lagKmS;
  return Math.max(minWindowLags(input), Math.ceil(TD_WINDOW_WIDTHS * fwhmLags));
}

function minWindowLags(input: CorrelationInput): number {
  return Math.ceil(TD_MIN_WINDOW_LAGS / input.binFactor);
}

function layoutFor(p: CorrelationInput, zMin: number, zMax: number, margin: number): Layout {
  const { step, start, length } = p.grid;
  const lagMin = Math.floor(Math.log1p(zMin) / step) - 1 - margin;
  const lagMax = Math.ceil(Math.log1p(zMax) / step) + 1 + margin;
  const a = Math.floor(start / RANGE_QUANTUM) * RANGE_QUANTUM;
  const b = Math.ceil((start + length) / RANGE_QUANTUM) * RANGE_QUANTUM;
  const templateLength = b - a + lagMax - lagMin;
  return { lagMin, lagMax, specOrigin: a, templateOrigin: a - lagMax, templateLength, specLength: b - a };
}

/**
 * The smallest power-of-two size whose circular correlation equals the linear one at the searched
 * buffer positions m ∈ [0, nLag): a spectrum term j ∈ [0, specLength) meets template position
 * j + m, which must not wrap past N onto the template's support [supportLo, supportHi].
 */
function templateFftSize(lay: Layout, supportLo: number, supportHi: number): number {
  const nLag = lay.lagMax - lay.lagMin + 1;
  const noWrap = supportHi >= supportLo ? Math.max(supportHi + 1, lay.specLength + nLag - 1 - supportLo) : 0;
  return nextPowerOfTwo(Math.max(noWrap, nLag, lay.specLength));
}

function bankEntry(t: Template, input: CorrelationInput, lay: Layout): BankEntry {
  const { step } = input.grid;
  const instKmS = pixelSigmaKmS(input);
  return bank.get(`${t.name}|${input.gridKey}|${lay.templateOrigin}|${lay.templateLength}|${lay.specLength}`, () => {
    const n = lay.templateLength;
    const wave = new Float64Array(n);
    for (let i = 0; i < n; i++) wave[i] = Math.exp((lay.templateOrigin + i) * step);
    const prof = new Float64Array(n);
    t.evaluate(wave, instKmS, prof, CORRELATION_STRENGTH_POWER);
    let supportLo = 0, supportHi = n - 1;
    while (supportLo < n && prof[supportLo] === 0) supportLo++;
    while (supportHi >= 0 && prof[supportHi] === 0) supportHi--;
    const fft = complexFft(templateFftSize(lay, supportLo, supportHi));
    const sq = new Float64Array(n);
    for (let i = 0; i < n; i++) sq[i] = prof[i] * prof[i];
    const [coverLo, coverHi] = coveredRange(wave, t.restRangeAngstrom);
    const entry: BankEntry = { fft, t: fft.buffer(), t2: fft.buffer(), coverLo, coverHi };
    forwardRealPair(fft, prof, sq, entry.t, entry.t2, fft.buffer());
    return entry;
  });
}

/** Positions [first, last] of the ascending wavelengths inside [lo, hi] (first > last when none). */
export function coveredRange(waveAngstrom: Float64Array, [lo, hi]: [number, number]): [number, number] {
  let first = 0, last = waveAngstrom.length - 1;
  while (first < waveAngstrom.length && !(waveAngstrom[first] >= lo)) first++;
  while (last >= 0 && !(waveAngstrom[last] <= hi)) last--;
  return [first, last];
}

interface SpectrumTransforms {
  /** FT(w·s) and FT(w) at an FFT `stride` times longer: bin k of this size is bin k·stride there. */
  sw: Float64Array;
  w: Float64Array;
  stride: number;
  /** Running sums over the spectrum buffer: s2Sum[j] = Σ_{i<j} w·s², goodSum[j] = Σ_{i<j} good. */
  s2Sum: Float64Array;
  goodSum: Float64Array;
  nGood: number;
}

/**
 * A spectrum's transforms and running sums per grid and FFT size, reused from spectrum to
 * spectrum (one correlation at a time per thread); per grid, because a spectrum's transforms on
 * one grid are kept while templates on another grid run. Only a grid's longest FFT has them.
 */
interface TransformBuffers {
  s2Sum: Float64Array;
  goodSum: Float64Array;
  /** Interleaved complex buffers: the packed input, then the two transforms. */
  packed: Float64Array;
  sw: Float64Array;
  w: Float64Array;
}

const transformBuffers = new Map<string, TransformBuffers>();

function transformBuffersFor(fft: ComplexFft, binFactor: number): TransformBuffers {
  const key = `${binFactor}|${fft.size}`;
  let s = transformBuffers.get(key);
  if (!s) {
    const n = fft.size;
    s = { s2Sum: new Float64Array(n + 1), goodSum: new Float64Array(n + 1), packed: fft.buffer(), sw: fft.buffer(), w: fft.buffer() };
    transformBuffers.set(key, s);
  }
  return s;
}

/** The product spectrum and its inverse transform per FFT size, scratch of one template at a time. */
const productBuffers = new Map<number, [Float64Array, Float64Array]>();

function productBuffersFor(fft: ComplexFft): [Float64Array, Float64Array] {
  let b = productBuffers.get(fft.size);
  if (!b) productBuffers.set(fft.size, (b = [fft.buffer(), fft.buffer()]));
  return b;
}

function spectrumTransforms(p: CorrelationInput, lay: Layout, fft: ComplexFft): SpectrumTransforms {
  const off = p.grid.start - lay.specOrigin;
  const { packed, sw, w: ww, s2Sum, goodSum } = transformBuffersFor(fft, p.binFactor);
  packed.fill(0);
  s2Sum.fill(0, 0, off + 1);
  goodSum.fill(0, 0, off + 1);
  let nGood = 0;
  for (let i = 0; i < p.grid.length; i++) {
    const w = p.weight[i], j = off + i;
    packed[2 * j] = w * p.resid[i];
    packed[2 * j + 1] = w;
    s2Sum[j + 1] = s2Sum[j] + p.energy[i];
    goodSum[j + 1] = goodSum[j] + p.goodCount[i];
    nGood += p.goodCount[i];
  }
  s2Sum.fill(s2Sum[off + p.grid.length], off + p.grid.length + 1);
  goodSum.fill(goodSum[off + p.grid.length], off + p.grid.length + 1);
  forwardPackedPair(fft, packed, sw, ww);
  return { sw, w: ww, stride: 1, s2Sum, goodSum, nGood };
}

/** Correlates the spectrum with each template over its z range, each on its grid (coarse-grid.ts). */
export function correlate(p: PreparedSpectrum, templates: TemplateUse[]): CorrelationCurveData[] {
  const inputs = new Map<number, CorrelationInput>();
  const plans = templates.map(({ template, zMin, zMax }) => {
    const choice = gridChoiceFor(template, p.grid.step);
    let input = inputs.get(choice.binFactor);
    if (!input) inputs.set(choice.binFactor, (input = binnedInput(p, choice.binFactor)));
    const margin = sigmaAMarginLags(template, input);
    const lay = layoutFor(input, zMin, zMax, margin);
    return { template, choice, input, margin, lay, entry: bankEntry(template, input, lay) };
  });
  // One forward transform per grid, at its longest FFT; shorter ones are every k-th bin of it.
  const transforms = new Map<string, SpectrumTransforms>();
  const transformsFor = (input: CorrelationInput, lay: Layout, fft: ComplexFft): SpectrumTransforms => {
    const key = (size: number) => `${input.binFactor}|${size}`;
    let st = transforms.get(key(fft.size));
    if (st) return st;
    const longest = plans.filter((q) => q.input === input).reduce((m, q) => (q.entry.fft.size > m.size ? q.entry.fft : m), fft);
    let full = transforms.get(key(longest.size));
    if (!full) transforms.set(key(longest.size), (full = spectrumTransforms(input, lay, longest)));
    if (longest !== fft) transforms.set(key(fft.size), (st = { ...full, stride: longest.size / fft.size }));
    return st ?? full;
  };
  return plans.map(({ template, choice, input, margin, lay, entry }) => {
    const curve = correlateOne(input, template, entry, lay, transformsFor(input, lay, entry.fft), margin);
    return choice.describeNatively ? { ...curve, describeNatively: true, nativeWindows: [] } : curve;
  });
}

/** ρ, score and overlap of a curve of nLag lags, as views of one allocation (or of `all`, 3·nLag values). */
export function curveArrays(nLag: number, all: Float64Array = new Float64Array(3 * nLag)): [Float64Array, Float64Array, Float64Array] {
  return [all.subarray(0, nLag), all.subarray(nLag, 2 * nLag), all.subarray(2 * nLag)];
}

function correlateOne(p: CorrelationInput, template: Template, e: BankEntry, lay: Layout, st: SpectrumTransforms, margin: number): CorrelationCurveData {
  const { fft } = e;
  const n = fft.size;
  const [x, cx] = productBuffersFor(fft);
  const sw = st.sw, w = st.w, t = e.t, t2v = e.t2;
  // X = A + i·B with A = conj(SW)·T and B = conj(W)·T2, both spectra of real correlations and
  // so Hermitian (exactly, as forwardPackedPair unpacks them): bins k ≤ N/2 give bin N − k as
  // conj(A) + i·conj(B). A shorter FFT reads every stride-th bin of the spectrum's longer one:
  // its buffer is zero beyond this length, so its N-point DFT is those bins.
  for (let k = 0; k <= n >> 1; k++) {
    const re = 2 * k, im = re + 1, sre = re * st.stride, sim = sre + 1;
    const swr = sw[sre], swi = sw[sim], tr = t[re], ti = t[im], wr = w[sre], wi = w[sim], ur = t2v[re], ui = t2v[im];
    const ar = swr * tr + swi * ti, ai = swr * ti - swi * tr, br = wr * ur + wi * ui, bi = wr * ui - wi * ur;
    x[re] = ar - bi;
    x[im] = ai + br;
    if (k === 0 || 2 * k === n) continue;
    const mr = 2 * (n - k);
    x[mr] = ar + bi;
    x[mr + 1] = br - ai;
  }
  fft.inverse(cx, x);
  const nLag = lay.lagMax - lay.lagMin + 1;
  let t2Max = 0;
  for (let i = 0; i < nLag; i++) t2Max = Math.max(t2Max, cx[2 * (lay.lagMax - lay.lagMin - i) + 1]);
  const t2Floor = MIN_TEMPLATE_ENERGY * t2Max;
  const [rho, score, overlap] = curveArrays(nLag);
  // Buffer position m pairs spectrum origin with template origin + m, i.e. lag L = lagMax − m.
  for (let i = 0; i < nLag; i++) {
    const m = lay.lagMax - (lay.lagMin + i);
    const c = cx[2 * m], t2 = cx[2 * m + 1];
    // Spectrum buffer positions j with template position j + m inside the coverage.
    const jLo = Math.max(0, e.coverLo - m), jHi = Math.min(n - 1, e.coverHi - m);
    const s2 = jHi >= jLo ? st.s2Sum[jHi + 1] - st.s2Sum[jLo] : 0;
    const g = jHi >= jLo ? st.goodSum[jHi + 1] - st.goodSum[jLo] : 0;
    const ov = st.nGood > 0 ? g / st.nGood : 0;
    overlap[i] = Math.min(1, Math.max(0, ov));
    if (ov < MIN_OVERLAP || !(t2 > t2Floor) || !(s2 > 0)) {
      rho[i] = NaN;
      score[i] = NaN;
      continue;
    }
    const sc = c / Math.sqrt(t2);
    score[i] = sc;
    rho[i] = sc / Math.sqrt(s2);
  }
  return { template, step: p.grid.step, binFactor: p.binFactor, minWindowLags: minWindowLags(p), describeNatively: false, lagMin: lay.lagMin, searchLo: margin, searchHi: nLag - 1 - margin, rho, score, overlap };
}
