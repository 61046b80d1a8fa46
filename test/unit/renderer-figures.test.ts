import { describe, expect, it } from 'vitest';
import { buildCorrelationFigure, curveAt, labelSides } from '../../renderer/plot/correlation-figure.js';
import { buildBptFigure, demarcationCurve } from '../../renderer/plot/bpt-figure.js';
import { buildSpectrumFigure, FLUX_TRACE } from '../../renderer/plot/spectrum-figure.js';
import { kauffmann03 } from '../../core/hosts/demarcation.js';
import type { Candidate } from '../../core/redshift/types.js';

const cand = (z: number, template: string): Candidate => ({ z, zErr: 1e-4, r: 6, template, templateClass: 'star-forming', overlap: 0.9, lines: [] });

describe('correlation figure', () => {
  const curve = { template: 'sf', z: [0, 0.1, 0.2, 0.3], value: [0, 0.5, 0.1, -0.1] };
  it('interpolates the curve linearly and is empty outside it', () => {
    expect(curveAt(curve, 0.05)).toBeCloseTo(0.25, 12);
    expect(curveAt(curve, 0.25)).toBeCloseTo(0, 12);
    expect(curveAt(curve, 0.4)).toBeNull();
  });
  it('numbers every candidate as in the table, hollow when it belongs to another template', () => {
    const fig = buildCorrelationFigure(curve, [cand(0.1, 'sf'), cand(0.2, 'qso'), cand(0.3, 'sf')], 0.1, 0);
    const own = fig.data[1] as { text: string[]; customdata: number[]; marker: { symbol: string } };
    const other = fig.data[2] as { text: string[]; customdata: number[]; marker: { symbol: string } };
    expect(own.text).toEqual(['1', '3']);
    expect(own.customdata).toEqual([0, 2]);
    expect(other.text).toEqual(['2']);
    expect(other.marker.symbol).toBe('circle-open');
    expect(own.marker.symbol).toBe('circle');
  });
  it('leaves out another template\'s candidate outside this curve\'s z range (it would stretch the axis)', () => {
    const fig = buildCorrelationFigure(curve, [cand(0.1, 'sf'), cand(4.87, 'qso'), cand(0.2, 'qso')], 0.1, 0);
    expect((fig.data[2] as { text: string[] }).text).toEqual(['3']);
  });
  it('puts the numbers of candidates close in z on alternate sides of their markers', () => {
    // z span 5: 0.90 and 0.92 clash (0.4 % of the axis), 0.95 clashes with 0.92, 3.0 stands alone.
    expect(labelSides([0.92, 3.0, 0.9, 0.95], 5)).toEqual(['bottom center', 'top center', 'top center', 'top center']);
  });
});

describe('[N II] diagram', () => {
  it('samples the Kauffmann et al. (2003) curve short of its asymptote at x = 0.05', () => {
    const c = demarcationCurve(kauffmann03, 0.05);
    expect(Math.max(...c.x)).toBeLessThan(0.05);
    // Kauffmann et al. 2003 eq. 1 at log([N II]/Hα) = −0.5: 0.61/(−0.55) + 1.3 = 0.1909.
    const i = c.x.findIndex((x) => Math.abs(x + 0.5) < 0.01);
    expect(c.y[i]).toBeCloseTo(0.61 / (c.x[i] - 0.05) + 1.3, 12);
    expect(kauffmann03(-0.5)).toBeCloseTo(0.1909, 4);
  });
  it('draws the object with its error bars only when both ratios are measured', () => {
    const point = { log_nii_ha: -0.1, log_nii_ha_err: 0.05, log_oiii_hb: 1.0, log_oiii_hb_err: 0.1, log_sii_ha: null, log_sii_ha_err: null, log_oi_ha: null, log_oi_ha_err: null };
    const with_ = buildBptFigure(point).data as { name: string; error_y?: { array: number[] } }[];
    expect(with_.find((t) => t.name === 'this object')?.error_y?.array).toEqual([0.1]);
    const without = buildBptFigure({ ...point, log_oiii_hb: null }).data as { name: string }[];
    expect(without.some((t) => t.name === 'this object')).toBe(false);
  });
});

describe('spectrum figure', () => {
  const wave = Array.from({ length: 3000 }, (_, i) => 3800 + 1.8 * i);
  const arrays = { waveAngstrom: wave, flux: wave.map(() => 1), error: wave.map(() => 0.1), mask: wave.map(() => 0), sky: null };
  const figure = (stellar: boolean, pick: { featureAngstrom: number; clickAngstrom: number } | null = null) =>
    buildSpectrumFigure({ arrays, fluxUnit: '1e-17 erg/s/cm2/Angstrom', z: 0.0001, smoothing: { kernel: 'boxcar', widthPx: 1 }, showSky: false, templateFlux: null, templateName: null, xRange: null, widthPx: 900, heightPx: 500, stellar, pick });
  it('marks no nebular emission line on a star, and all kinds on a galaxy', () => {
    expect(figure(true).markers.some((m) => m.kind === 'emission')).toBe(false);
    expect(figure(true).markers.some((m) => m.label === 'Na D')).toBe(true);
    expect(figure(false).markers.some((m) => m.label === '[O III]')).toBe(true);
  });
  it('draws the clicked point and the feature centre found from it while a line is picked', () => {
    const shapes = figure(false, { featureAngstrom: 5447.1, clickAngstrom: 5439.5 }).layout.shapes as { x0: number; line: { dash?: string } }[];
    expect(shapes.filter((s) => s.x0 === 5447.1 || s.x0 === 5439.5).map((s) => s.line.dash ?? 'solid')).toEqual(['dot', 'solid']);
  });
});

describe('the 1σ band', () => {
  it('is one closed outline per run of pixels with flux and σ, never joined across a gap', async () => {
    const { errorBandOutline } = await import('../../renderer/plot/spectrum-figure.js');
    const x = [1, 2, 3, 4, 5, 6, 7];
    const flux = [10, 11, 12, null, 14, 15, 16];
    const sigma = [1, 1, 1, 1, 2, null, 2];
    const band = errorBandOutline(x, flux, sigma);
    // run 1: pixels 1–3 (upper, then lower back); gap; run 2: pixel 5 alone; gap; run 3: pixel 7
    expect(band.x).toEqual([1, 2, 3, 3, 2, 1, null, 5, 5, null, 7, 7]);
    expect(band.y).toEqual([11, 12, 13, 11, 10, 9, null, 16, 12, null, 18, 14]);
  });

  it('is drawn filled to itself, so that plotly closes each run on its own', () => {
    const arrays = { waveAngstrom: [4000, 4001, 4002, 4003], flux: [1, 2, null, 3], error: [0.1, 0.1, 0.1, 0.1], mask: [0, 0, 1, 0], sky: null };
    const fig = buildSpectrumFigure({ arrays, fluxUnit: 'erg/s/cm2/Angstrom', z: null, smoothing: { kernel: 'boxcar', widthPx: 1 }, showSky: false, templateFlux: null, templateName: null, xRange: null, widthPx: 900, heightPx: 500 });
    const band = fig.data.find((t) => t.name === '1σ error') as { fill: string; x: (number | null)[] };
    expect(band.fill).toBe('toself');
    expect(band.x).toContain(null);
    expect((fig.data[FLUX_TRACE] as { name: string }).name).toBe('flux');
  });
});
