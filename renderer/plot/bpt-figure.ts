/**
 * The [N II] diagnostic diagram: log([N II]6585/Hα) against log([O III]5008/Hβ), with the
 * Kauffmann et al. (2003) and Kewley et al. (2001) demarcation curves (from core/hosts) and the
 * object's point with 1σ error bars. Pure.
 */
import type { Data, Layout } from 'plotly.js';
import type { DiagramPoint } from '../../core/hosts/classify.js';
import { ASYMPTOTE, kauffmann03, kewley01Nii } from '../../core/hosts/demarcation.js';
import { THEME } from '../ui/theme.js';

/** Samples a hyperbolic demarcation on x from −2 up to just short of its asymptote. */
export function demarcationCurve(curve: (x: number) => number, asymptote: number, yMin = -1.5): { x: number[]; y: number[] } {
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i <= 200; i++) {
    const xi = -2 + (i / 200) * (asymptote - 0.01 + 2);
    const yi = curve(xi);
    if (yi < yMin) break;
    x.push(xi);
    y.push(yi);
  }
  return { x, y };
}

export function buildBptFigure(point: DiagramPoint | null): { data: Data[]; layout: Partial<Layout> } {
  const ka = demarcationCurve(kauffmann03, ASYMPTOTE.kauffmann03);
  const ke = demarcationCurve(kewley01Nii, ASYMPTOTE.kewley01Nii);
  const data: Data[] = [
    { type: 'scatter', mode: 'lines', ...ka, name: 'Kauffmann+03', line: { color: THEME.emission, width: 1.5, dash: 'dash' }, hoverinfo: 'name' },
    { type: 'scatter', mode: 'lines', ...ke, name: 'Kewley+01', line: { color: THEME.absorption, width: 1.5 }, hoverinfo: 'name' },
  ];
  const hasPoint = point && point.log_nii_ha !== null && point.log_oiii_hb !== null;
  if (hasPoint) {
    data.push({
      type: 'scatter', mode: 'markers', name: 'this object', x: [point.log_nii_ha], y: [point.log_oiii_hb],
      error_x: { type: 'data', array: [point.log_nii_ha_err ?? 0], visible: true, color: THEME.template, thickness: 1.5 },
      error_y: { type: 'data', array: [point.log_oiii_hb_err ?? 0], visible: true, color: THEME.template, thickness: 1.5 },
      marker: { color: THEME.template, size: 11, symbol: 'diamond', line: { color: THEME.ground, width: 1 } },
      hovertemplate: 'log [N II]/Hα = %{x:.2f}<br>log [O III]/Hβ = %{y:.2f}<extra></extra>',
    });
  }
  const axis = { gridcolor: THEME.grid, linecolor: THEME.axis, zerolinecolor: THEME.axis, tickfont: { size: 12, color: THEME.muted } };
  const annotations: Partial<Layout>['annotations'] = [
    { x: -1.25, y: -0.9, text: 'star-forming', showarrow: false, font: { size: 12, color: THEME.muted } },
    { x: 0.45, y: 1.2, text: 'AGN', showarrow: false, font: { size: 12, color: THEME.muted } },
    { x: -0.05, y: -1.15, text: 'composite', showarrow: false, font: { size: 12, color: THEME.muted } },
  ];
  if (!hasPoint) annotations.push({ x: -0.5, y: 0.4, text: 'no point: a needed line has S/N < 3', showarrow: false, font: { size: 13, color: THEME.template } });
  return {
    data,
    layout: {
      paper_bgcolor: THEME.panel, plot_bgcolor: THEME.ground, font: { family: THEME.font, size: 12, color: THEME.text },
      margin: { l: 60, r: 8, t: 8, b: 64 }, showlegend: true,
      legend: { orientation: 'h', x: 0, y: -0.2, yanchor: 'top', bgcolor: 'rgba(0,0,0,0)', font: { size: 12 } },
      xaxis: { ...axis, range: [-2, 1], title: { text: 'log([N II] 6585 / Hα)', font: { size: 12 } } },
      yaxis: { ...axis, range: [-1.5, 1.5], title: { text: 'log([O III] 5008 / Hβ)', font: { size: 12 } } },
      annotations,
    },
  };
}
