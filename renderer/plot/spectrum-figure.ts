/**
 * Builds the plotly figure of one spectrum: error band, flux (smoothed for display), optional
 * sky and template overlay, shaded masked and telluric regions, line markers at the trial z and
 * a rest-frame wavelength axis on top. Pure: data in, {data, layout} out, so Plotly.react can
 * redraw in place.
 */
import type { Annotations, Data, Layout, Shape } from 'plotly.js';
import type { SpectrumArrays } from '../../core/api/host-api.js';
import { THEME } from '../ui/theme.js';
import { MARKER_STYLE, markersInRange, type LineMarker } from './markers.js';
import { maskedRuns, TELLURIC_BANDS } from './regions.js';
import { smooth, smoothError, type SmoothingSetting } from './smoothing.js';
import { robustRange, scaleToSpectrum } from './scaling.js';

export interface SpectrumFigureInput {
  arrays: SpectrumArrays;
  fluxUnit: string;
  /** Redshift the markers and the rest axis are drawn at; null draws none. */
  z: number | null;
  smoothing: SmoothingSetting;
  showSky: boolean;
  /** Template model on the spectrum's pixels, drawn when given. */
  templateFlux: (number | null)[] | null;
  templateName: string | null;
  /** Visible observed range, Å; null for the whole spectrum. */
  xRange: [number, number] | null;
  widthPx: number;
}

export interface SpectrumFigure {
  data: Data[];
  layout: Partial<Layout>;
  markers: LineMarker[];
  fullRange: [number, number];
}

const LABEL_ROW_STEP = 0.055;

export function fullWaveRange(wave: readonly (number | null)[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const w of wave) if (w !== null && Number.isFinite(w)) {
    if (w < lo) lo = w;
    if (w > hi) hi = w;
  }
  return [lo, hi];
}

export function buildSpectrumFigure(input: SpectrumFigureInput): SpectrumFigure {
  const { arrays, z } = input;
  const wave = arrays.waveAngstrom;
  const fullRange = fullWaveRange(wave);
  const [lo, hi] = input.xRange ?? fullRange;
  const flux = smooth(arrays.flux, arrays.mask, input.smoothing);
  const err = smoothError(arrays.error, arrays.mask, input.smoothing);
  const lower = flux.map((f, i) => (f === null || err[i] === null ? null : f - (err[i] as number)));
  const upper = flux.map((f, i) => (f === null || err[i] === null ? null : f + (err[i] as number)));
  const hover = 'skip' as const;
  const data: Data[] = [
    { type: 'scatter', mode: 'lines', x: wave, y: lower, line: { width: 0 }, hoverinfo: hover, showlegend: false, name: 'flux − 1σ' },
    { type: 'scatter', mode: 'lines', x: wave, y: upper, line: { width: 0 }, fill: 'tonexty', fillcolor: THEME.errorBand, hoverinfo: hover, name: '1σ error', showlegend: true },
    {
      type: 'scatter', mode: 'lines', x: wave, y: flux, name: input.smoothing.widthPx > 1 ? `flux (${input.smoothing.kernel} ${input.smoothing.widthPx} px)` : 'flux',
      line: { color: THEME.flux, width: 1.2 }, hovertemplate: '%{x:.1f} Å<br>%{y:.4g}<extra></extra>',
    },
  ];
  if (input.showSky && arrays.sky) {
    data.push({ type: 'scatter', mode: 'lines', x: wave, y: arrays.sky, yaxis: 'y3', name: 'sky (right axis)', line: { color: THEME.sky, width: 1, dash: 'dot' }, hoverinfo: hover });
  }
  if (input.templateFlux) {
    const scaled = scaleToSpectrum(arrays.flux, input.templateFlux, arrays.mask);
    data.push({ type: 'scatter', mode: 'lines', x: wave, y: scaled, name: `template ${input.templateName ?? ''}`.trim(), line: { color: THEME.template, width: 1.4 }, opacity: 0.85, hoverinfo: hover });
  }
  // An invisible trace on the top axis, so plotly draws it.
  data.push({ type: 'scatter', mode: 'lines', x: [lo, hi].map((w) => w / (1 + (z ?? 0))), y: [null, null], xaxis: 'x2', hoverinfo: hover, showlegend: false });

  const markers = z === null ? [] : markersInRange(z, lo, hi, { widthPx: input.widthPx, charPx: 7.5, maxRows: 4 });
  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotations>[] = [];
  for (const band of TELLURIC_BANDS) {
    shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: band.loAngstrom, x1: band.hiAngstrom, y0: 0, y1: 1, fillcolor: THEME.telluric, line: { width: 0 }, layer: 'below' });
    annotations.push({ x: (band.loAngstrom + band.hiAngstrom) / 2, xref: 'x', yref: 'paper', y: 0.5, text: band.name, textangle: '-90', showarrow: false, font: { size: 12, color: THEME.muted } });
  }
  for (const run of maskedRuns(wave, arrays.mask)) {
    shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: run.loAngstrom, x1: run.hiAngstrom, y0: 0, y1: 1, fillcolor: THEME.masked, line: { width: 0 }, layer: 'below' });
  }
  for (const m of markers) {
    const style = MARKER_STYLE[m.kind];
    const colour = THEME[m.kind];
    for (const w of m.observedWaveAngstrom) {
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: w, x1: w, y0: 0, y1: 1, line: { color: colour, width: 1, dash: style.dash }, opacity: 0.75 });
    }
    const y = style.side === 'top' ? 0.985 - m.row * LABEL_ROW_STEP : 0.015 + m.row * LABEL_ROW_STEP;
    annotations.push({
      x: m.labelWaveAngstrom, xref: 'x', yref: 'paper', y, yanchor: style.side === 'top' ? 'top' : 'bottom',
      text: m.named ? `${style.glyph} ${m.label}` : style.glyph, hovertext: m.label, showarrow: false, bgcolor: 'rgba(20,23,28,0.75)', borderpad: 1,
      font: { size: 13, color: colour, family: THEME.font },
    });
  }
  const yRange = robustRange(flux, wave, lo, hi);
  const axisCommon = { gridcolor: THEME.grid, linecolor: THEME.axis, zerolinecolor: THEME.axis, tickfont: { size: 13, color: THEME.muted }, title: { font: { size: 13, color: THEME.text } } };
  const layout: Partial<Layout> = {
    paper_bgcolor: THEME.ground,
    plot_bgcolor: THEME.ground,
    font: { family: THEME.font, size: 13, color: THEME.text },
    margin: { l: 72, r: input.showSky && arrays.sky ? 64 : 20, t: 56, b: 48 },
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: -0.13, yanchor: 'top', font: { size: 13, color: THEME.muted }, bgcolor: 'rgba(0,0,0,0)' },
    hovermode: 'x',
    dragmode: 'zoom',
    uirevision: 'spectrum',
    xaxis: { ...axisCommon, range: [lo, hi], autorange: false, title: { ...axisCommon.title, text: 'observed wavelength, vacuum (Å)' } },
    xaxis2: {
      ...axisCommon, overlaying: 'x', side: 'top', range: [lo / (1 + (z ?? 0)), hi / (1 + (z ?? 0))], autorange: false, showgrid: false,
      title: { ...axisCommon.title, text: z === null ? 'rest wavelength (Å): no z' : `rest wavelength at z = ${z.toFixed(5)} (Å)`, standoff: 4 },
    },
    yaxis: { ...axisCommon, range: yRange, autorange: false, title: { ...axisCommon.title, text: `flux (${input.fluxUnit})` } },
    yaxis3: { ...axisCommon, overlaying: 'y', side: 'right', showgrid: false, title: { ...axisCommon.title, text: 'sky' } },
    shapes,
    annotations,
  };
  return { data, layout, markers, fullRange };
}
