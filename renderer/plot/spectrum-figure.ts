/**
 * Builds the plotly figure of one spectrum: error band, flux (smoothed for display), optional
 * sky and template overlay, shaded masked and telluric regions, line markers at the trial z and
 * a rest-frame wavelength axis on top. Pure: data in, {data, layout} out, so Plotly.react can
 * redraw in place.
 */
import type { Annotations, Data, Layout, Shape } from 'plotly.js';
import type { SpectrumArrays } from '../../core/api/host-api.js';
import { THEME } from '../ui/theme.js';
import { REST_LINES } from '../../core/redshift/line-list.js';
import { MARKER_STYLE, markersInRange, type LineMarker } from './markers.js';
import { maskedRuns, TELLURIC_BANDS } from './regions.js';
import { smooth, smoothError, type SmoothingSetting } from './smoothing.js';
import { robustRange, scaleToSpectrum } from './scaling.js';
import { envelopeIndices, pick } from './decimate.js';

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
  /** Size of the plot's box, CSS px. */
  widthPx: number;
  heightPx: number;
  /** A star's spectrum: only absorption (and Balmer) lines are marked, no nebular emission. */
  stellar?: boolean;
  /** While a line is being picked: the feature's centre and the click it was found from, Å. */
  pick?: { featureAngstrom: number; clickAngstrom: number } | null;
}

export interface SpectrumFigure {
  data: Data[];
  layout: Partial<Layout>;
  markers: LineMarker[];
  fullRange: [number, number];
}

/** Height of one row of line labels, CSS px: the 13 px text and a little leading. */
const LABEL_ROW_PX = 17;
/** Gap between the plot's edge and the first row of labels, in plot heights. */
const LABEL_EDGE = 0.015;
/** The labels of one side may take up to this fraction of the plot's height; the middle is the spectrum's. */
const LABEL_BAND_FRACTION = 0.3;
/** Most rows of named labels per side. */
const MAX_LABEL_ROWS = 4;

/** How the line labels are stacked on a plot area of a given height. */
export interface LabelRows {
  /** Rows of named labels per side; glyphs without room for their names take one row more. */
  maxRows: number;
  /** One row, in plot heights. */
  rowStep: number;
  /** The band the marker lines span (plot heights), clear of every label row. */
  lineBand: [number, number];
}

/** Rows of a fixed height in px, so that a short plot gets fewer rows rather than rows that overlap. */
export function labelRows(plotAreaHeightPx: number): LabelRows {
  const rowStep = LABEL_ROW_PX / Math.max(plotAreaHeightPx, LABEL_ROW_PX);
  const maxRows = Math.max(1, Math.min(MAX_LABEL_ROWS, Math.floor(LABEL_BAND_FRACTION / rowStep) - 1));
  const edge = LABEL_EDGE + (maxRows + 1) * rowStep;
  return { maxRows, rowStep, lineBand: [Math.min(edge, 0.5), Math.max(1 - edge, 0.5)] };
}

export function fullWaveRange(wave: readonly (number | null)[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const w of wave) if (w !== null && Number.isFinite(w)) {
    if (w < lo) lo = w;
    if (w > hi) hi = w;
  }
  return [lo, hi];
}

/** Index of the flux trace in the figure's data (clicks on the spectrum are read from it). */
export const FLUX_TRACE = 1;

/**
 * The flux ± 1σ band as one outline per run of pixels that have both, runs apart by a gap
 * (filled 'toself', each run is its own polygon). Filling from a lower to an upper trace instead
 * joins the runs across masked pixels into wedges that are not there.
 */
export function errorBandOutline(x: readonly (number | null)[], flux: readonly (number | null)[], sigma: readonly (number | null)[]): { x: (number | null)[]; y: (number | null)[] } {
  const outX: (number | null)[] = [], outY: (number | null)[] = [];
  let start = -1;
  const close = (end: number) => {
    if (outX.length) outX.push(null), outY.push(null);
    for (let i = start; i < end; i++) outX.push(x[i]), outY.push((flux[i] as number) + (sigma[i] as number));
    for (let i = end - 1; i >= start; i--) outX.push(x[i]), outY.push((flux[i] as number) - (sigma[i] as number));
  };
  for (let i = 0; i <= x.length; i++) {
    const has = i < x.length && x[i] !== null && flux[i] !== null && sigma[i] !== null;
    if (has && start < 0) start = i;
    else if (!has && start >= 0) {
      close(i);
      start = -1;
    }
  }
  return { x: outX, y: outY };
}

/**
 * Line markers as a few traces rather than one plotly shape and annotation each (much quicker
 * to redraw): per line kind one trace of vertical segments in its dash pattern, and one text
 * trace per label side, labels carrying their kind's glyph.
 */
export function markerTraces(markers: readonly LineMarker[], rows: LabelRows): Data[] {
  const traces: Data[] = [];
  const [bandLo, bandHi] = rows.lineBand;
  for (const kind of ['emission', 'absorption', 'both'] as const) {
    const x: (number | null)[] = [];
    const y: (number | null)[] = [];
    for (const m of markers) if (m.kind === kind) for (const w of m.observedWaveAngstrom) x.push(w, w, null), y.push(bandLo, bandHi, null);
    if (x.length === 0) continue;
    traces.push({ type: 'scatter', mode: 'lines', x, y, yaxis: 'y2', name: `${MARKER_STYLE[kind].glyph} ${kind === 'both' ? 'Balmer' : kind} lines`, showlegend: false, hoverinfo: 'skip', line: { color: THEME[kind], width: 1, dash: MARKER_STYLE[kind].dash }, opacity: 0.75 });
  }
  for (const side of ['top', 'bottom'] as const) {
    const ms = markers.filter((m) => MARKER_STYLE[m.kind].side === side && m.shows !== 'line');
    if (ms.length === 0) continue;
    traces.push({
      type: 'scatter', mode: 'text', yaxis: 'y2', showlegend: false, hoverinfo: 'skip', name: `labels ${side}`,
      x: ms.map((m) => m.labelWaveAngstrom),
      y: ms.map((m) => (side === 'top' ? 1 - LABEL_EDGE - m.row * rows.rowStep : LABEL_EDGE + m.row * rows.rowStep)),
      text: ms.map((m) => (m.shows === 'name' ? `${MARKER_STYLE[m.kind].glyph} ${m.label}` : MARKER_STYLE[m.kind].glyph)),
      textposition: side === 'top' ? 'bottom center' : 'top center',
      textfont: { family: THEME.font, size: 13, color: ms.map((m) => THEME[m.kind]) },
    });
  }
  return traces;
}

export function buildSpectrumFigure(input: SpectrumFigureInput): SpectrumFigure {
  const { arrays, z } = input;
  const wave = arrays.waveAngstrom;
  const fullRange = fullWaveRange(wave);
  const [lo, hi] = input.xRange ?? fullRange;
  const smoothed = smooth(arrays.flux, arrays.mask, input.smoothing);
  const err = smoothError(arrays.error, arrays.mask, input.smoothing);
  // The bottom margin holds the tick labels, the axis title and, below them, the legend.
  const margin = { l: 72, r: input.showSky && arrays.sky ? 64 : 20, t: 56, b: 78 };
  const shown = envelopeIndices(wave, smoothed, lo, hi, input.widthPx - margin.l - margin.r);
  const x = pick(wave, shown);
  const flux = pick(smoothed, shown);
  const sigma = pick(err, shown);
  const band = errorBandOutline(x, flux, sigma);
  const hover = 'skip' as const;
  const data: Data[] = [
    { type: 'scatter', mode: 'lines', x: band.x, y: band.y, line: { width: 0 }, fill: 'toself', fillcolor: THEME.errorBand, hoverinfo: hover, name: '1σ error', showlegend: true },
    {
      type: 'scatter', mode: 'lines', x, y: flux, name: input.smoothing.widthPx > 1 ? `flux (${input.smoothing.kernel} ${input.smoothing.widthPx} px)` : 'flux',
      line: { color: THEME.flux, width: 1.2 }, hovertemplate: `%{x:.1f} Å<br>%{y:.4g} ${input.fluxUnit.replace(/[%{}]/g, '')}<extra></extra>`,
    },
  ];
  if (input.showSky && arrays.sky) {
    data.push({ type: 'scatter', mode: 'lines', x, y: pick(arrays.sky, shown), yaxis: 'y3', name: 'sky (right axis)', line: { color: THEME.sky, width: 1, dash: 'dot' }, hoverinfo: hover });
  }
  if (input.templateFlux) {
    const scaled = scaleToSpectrum(arrays.flux, input.templateFlux, arrays.mask);
    data.push({ type: 'scatter', mode: 'lines', x, y: pick(scaled, shown), name: `template ${input.templateName ?? ''}`.trim(), line: { color: THEME.template, width: 1.4 }, opacity: 0.85, hoverinfo: hover });
  }
  // An invisible trace on the top axis, so plotly draws it.
  data.push({ type: 'scatter', mode: 'lines', x: [lo, hi].map((w) => w / (1 + (z ?? 0))), y: [null, null], xaxis: 'x2', hoverinfo: hover, showlegend: false });

  const lines = input.stellar ? REST_LINES.filter((l) => l.kind !== 'emission') : REST_LINES;
  const rows = labelRows(input.heightPx - margin.t - margin.b);
  const markers = z === null ? [] : markersInRange(z, lo, hi, { widthPx: input.widthPx - margin.l - margin.r, charPx: 7.5, maxRows: rows.maxRows }, lines);
  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotations>[] = [];
  for (const band of TELLURIC_BANDS) {
    shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: band.loAngstrom, x1: band.hiAngstrom, y0: 0, y1: 1, fillcolor: THEME.telluric, line: { width: 0 }, layer: 'below' });
    annotations.push({ x: (band.loAngstrom + band.hiAngstrom) / 2, xref: 'x', yref: 'paper', y: 0.5, text: band.name, textangle: '-90', showarrow: false, font: { size: 12, color: THEME.muted }, bgcolor: 'rgba(20, 23, 28, 0.75)' });
  }
  for (const run of maskedRuns(wave, arrays.mask)) {
    shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: run.loAngstrom, x1: run.hiAngstrom, y0: 0, y1: 1, fillcolor: THEME.masked, line: { width: 0 }, layer: 'below' });
  }
  if (input.pick) {
    const { featureAngstrom, clickAngstrom } = input.pick;
    shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: clickAngstrom, x1: clickAngstrom, y0: 0, y1: 1, line: { color: THEME.muted, width: 1, dash: 'dot' } });
    shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: featureAngstrom, x1: featureAngstrom, y0: 0, y1: 1, line: { color: THEME.trialZ, width: 2 } });
    annotations.push({ x: featureAngstrom, xref: 'x', yref: 'paper', y: 1, yanchor: 'bottom', text: `feature ${featureAngstrom.toFixed(1)} Å`, showarrow: false, bgcolor: THEME.ground, font: { size: 13, color: THEME.trialZ } });
  }
  data.push(...markerTraces(markers, rows));
  const yRange = robustRange(smoothed, wave, lo, hi);
  const axisCommon = { gridcolor: THEME.grid, linecolor: THEME.axis, zerolinecolor: THEME.axis, tickfont: { size: 13, color: THEME.muted }, title: { font: { size: 13, color: THEME.text } } };
  const layout: Partial<Layout> = {
    paper_bgcolor: THEME.ground,
    plot_bgcolor: THEME.ground,
    font: { family: THEME.font, size: 13, color: THEME.text },
    margin,
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: 0, yref: 'container', yanchor: 'bottom', font: { size: 13, color: THEME.muted }, bgcolor: 'rgba(0,0,0,0)' },
    hovermode: 'x',
    dragmode: 'zoom',
    uirevision: 'spectrum',
    xaxis: { ...axisCommon, range: [lo, hi], autorange: false, title: { ...axisCommon.title, text: 'observed wavelength, vacuum (Å)' } },
    xaxis2: {
      ...axisCommon, overlaying: 'x', side: 'top', range: [lo / (1 + (z ?? 0)), hi / (1 + (z ?? 0))], autorange: false, showgrid: false,
      title: { ...axisCommon.title, text: z === null ? 'rest wavelength (Å): no z' : `rest wavelength at z = ${z.toFixed(5)} (Å)`, standoff: 4 },
    },
    yaxis: { ...axisCommon, range: yRange, autorange: false, title: { ...axisCommon.title, text: `flux (${input.fluxUnit})` } },
    // The marker lines and labels live on a hidden 0–1 axis, so zooming the flux leaves them put.
    yaxis2: { overlaying: 'y', range: [0, 1], autorange: false, visible: false, fixedrange: true },
    yaxis3: { ...axisCommon, overlaying: 'y', side: 'right', showgrid: false, title: { ...axisCommon.title, text: `sky (${input.fluxUnit})` } },
    shapes,
    annotations,
  };
  return { data, layout, markers, fullRange };
}
