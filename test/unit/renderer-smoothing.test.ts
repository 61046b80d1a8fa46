import { describe, expect, it } from 'vitest';
import { kernelWeights, smooth, smoothError, stepSmoothing } from '../../renderer/plot/smoothing.js';
import { maskedRuns } from '../../renderer/plot/regions.js';
import { robustRange, scaleToSpectrum } from '../../renderer/plot/scaling.js';
import { envelopeIndices, pick } from '../../renderer/plot/decimate.js';

describe('display smoothing', () => {
  it('a 3-px boxcar is the mean of three neighbours', () => {
    expect(smooth([0, 3, 6, 9, 12], [0, 0, 0, 0, 0], { kernel: 'boxcar', widthPx: 3 })).toEqual([1.5, 3, 6, 9, 10.5]);
  });
  it('width 1 changes nothing', () => {
    const v = [1, 5, 2, 8];
    expect(smooth(v, [0, 0, 0, 0], { kernel: 'boxcar', widthPx: 1 })).toEqual(v);
    expect(smooth(v, [0, 0, 0, 0], { kernel: 'gaussian', widthPx: 1 })).toEqual(v);
  });
  it('masked and missing pixels get no weight and stay empty', () => {
    expect(smooth([1, 100, 3, null, 5], [0, 1, 0, 0, 0], { kernel: 'boxcar', widthPx: 3 })).toEqual([1, null, 3, null, 5]);
  });
  it('a Gaussian of FWHM 5 px weighs ±2.5 px at one half (definition of FWHM)', () => {
    const w = kernelWeights({ kernel: 'gaussian', widthPx: 5 });
    const sigma = 5 / (2 * Math.sqrt(2 * Math.LN2));
    expect(Math.exp(-0.5 * (2.5 / sigma) ** 2)).toBeCloseTo(0.5, 12);
    expect(w[0]).toBe(1);
    expect(w.length).toBe(Math.ceil(3 * sigma) + 1);
  });
  it('keeps a constant constant and preserves the flux of a line away from the edges', () => {
    const flat = new Array(50).fill(2);
    for (const v of smooth(flat, new Array(50).fill(0), { kernel: 'gaussian', widthPx: 7 })) expect(v).toBeCloseTo(2, 12);
    const line = new Array(60).fill(0);
    line[30] = 10;
    const s = smooth(line, new Array(60).fill(0), { kernel: 'gaussian', widthPx: 7 }) as number[];
    expect(s.reduce((a, b) => a + b, 0)).toBeCloseTo(10, 9);
  });
  it('the error of an N-px boxcar mean of equal errors is σ/√N', () => {
    const e = smoothError(new Array(9).fill(3), new Array(9).fill(0), { kernel: 'boxcar', widthPx: 9 });
    expect(e[4]).toBeCloseTo(3 / 3, 12);
  });
  it('steps through the width ladder and stops at the ends', () => {
    expect(stepSmoothing(1, 1)).toBe(3);
    expect(stepSmoothing(1, -1)).toBe(1);
    expect(stepSmoothing(25, 1)).toBe(25);
  });
});

describe('shaded regions and scaling', () => {
  it('masked pixels become wavelength intervals, close runs merged', () => {
    const wave = [10, 11, 12, 13, 14, 15, 16, 17, 18, 19];
    expect(maskedRuns(wave, [0, 1, 1, 0, 0, 0, 0, 0, 1, 0], 2)).toEqual([
      { loAngstrom: 10.5, hiAngstrom: 12.5 },
      { loAngstrom: 17.5, hiAngstrom: 18.5 },
    ]);
    expect(maskedRuns(wave, [0, 1, 0, 1, 0, 0, 0, 0, 0, 0], 2)).toEqual([{ loAngstrom: 10.5, hiAngstrom: 13.5 }]);
  });
  it('the y range ignores a single cosmic-ray spike', () => {
    const flux = Array.from({ length: 400 }, (_, i) => (i === 200 ? 1e6 : 1 + 0.01 * (i % 7)));
    const wave = flux.map((_, i) => 4000 + i);
    const [, hi] = robustRange(flux, wave, 0, 1e9);
    expect(hi).toBeLessThan(2);
  });
  it('the y range keeps a strong line\'s peak of several pixels in view, up to three spans', () => {
    // Continuum rising from 1 to 5, a line of peak 8 (σ = 3 px) on it at 3: its fourth-highest
    // pixel is 3 + 8·exp(−2/9) = 9.41, above the 99.5th percentile (≈ 5) plus 40 % of the span.
    const wave = Array.from({ length: 4000 }, (_, i) => 4000 + i);
    const flux = wave.map((w, i) => 1 + (4 * i) / 4000 + 8 * Math.exp(-0.5 * ((w - 6000) / 3) ** 2));
    const [, hi] = robustRange(flux, wave, 0, 1e9);
    expect(hi).toBeGreaterThan(3 + 8 * Math.exp(-2 / 9));
    expect(hi).toBeLessThan(5 + 3.1 * 4);
  });
  it('scales a template onto the flux by least squares', () => {
    expect(scaleToSpectrum([2, 4, 6], [1, 2, 3], [0, 0, 0])).toEqual([2, 4, 6]);
    expect(scaleToSpectrum([2, 4, 600], [1, 2, 3], [0, 0, 1])).toEqual([2, 4, 6]);
  });
});

describe('min–max envelope for the screen', () => {
  const n = 5000;
  const wave = Array.from({ length: n }, (_, i) => 4000 + i);
  const flux: (number | null)[] = wave.map((w) => Math.sin(w / 7));
  flux[1234] = 50; // a narrow emission spike
  flux[3000] = null; // a masked pixel
  it('draws every pixel when there are few per screen column', () => {
    expect(envelopeIndices(wave, flux, 4000, 9000, 2000)).toBeNull();
  });
  it('keeps at most two pixels (plus a gap) per column, the spike and the gap included', () => {
    const idx = envelopeIndices(wave, flux, 4000, 9000, 500)!;
    expect(idx.length).toBeLessThanOrEqual(2 * 500 + 2);
    expect(idx).toContain(1234);
    expect(idx).toContain(3000);
    expect([...idx].sort((a, b) => a - b)).toEqual(idx);
    const kept = pick(flux, idx).filter((v): v is number => v !== null);
    expect(Math.max(...kept)).toBe(50);
    expect(Math.min(...kept)).toBeCloseTo(Math.min(...(flux.filter((v) => v !== null) as number[])), 12);
  });
});
