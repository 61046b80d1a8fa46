/**
 * The correlation against z for one template, with every candidate marked (numbered as in the
 * candidate table; those from other templates drawn hollow at their own z, when that is inside
 * this curve's range) and the trial z as a vertical line. Pure.
 */
import type { Data, Layout } from 'plotly.js';
import type { Candidate, CorrelationCurve } from '../../core/redshift/types.js';
import { THEME } from '../ui/theme.js';

/** Value of the curve at z by linear interpolation (the curve's z is ascending). */
export function curveAt(curve: CorrelationCurve, z: number): number | null {
  const zs = curve.z;
  if (zs.length === 0 || z < zs[0] || z > zs[zs.length - 1]) return null;
  let lo = 0;
  let hi = zs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (zs[mid] <= z) lo = mid;
    else hi = mid;
  }
  const t = zs[hi] === zs[lo] ? 0 : (z - zs[lo]) / (zs[hi] - zs[lo]);
  return curve.value[lo] + t * (curve.value[hi] - curve.value[lo]);
}

/** Two candidate numbers closer than this fraction of the z axis would overlap (about 3 characters on a 300 px plot). */
const LABEL_CLASH_FRACTION = 0.04;

/** Above or below its marker for each candidate's number: neighbours too close in z alternate. */
export function labelSides(zs: readonly number[], zSpan: number): ('top center' | 'bottom center')[] {
  const sides: ('top center' | 'bottom center')[] = zs.map(() => 'top center');
  const order = zs.map((z, i) => ({ z, i })).sort((a, b) => a.z - b.z);
  for (let k = 1; k < order.length; k++) {
    const [prev, cur] = [order[k - 1], order[k]];
    if (cur.z - prev.z < LABEL_CLASH_FRACTION * zSpan) sides[cur.i] = sides[prev.i] === 'top center' ? 'bottom center' : 'top center';
  }
  return sides;
}

export function buildCorrelationFigure(curve: CorrelationCurve, candidates: readonly Candidate[], trialZ: number | null, chosenIndex: number | null): { data: Data[]; layout: Partial<Layout> } {
  const own = candidates.map((c, i) => ({ c, i })).filter(({ c }) => c.template === curve.template);
  // Another template's candidate is drawn only inside this curve's z range, where it can be compared.
  const other = candidates.map((c, i) => ({ c, i })).filter(({ c }) => c.template !== curve.template && curveAt(curve, c.z) !== null);
  const yOf = (c: Candidate) => curveAt(curve, c.z) ?? 0;
  const sides = labelSides(candidates.map((c) => c.z), (curve.z[curve.z.length - 1] ?? 1) - (curve.z[0] ?? 0) || 1);
  const markerTrace = (list: { c: Candidate; i: number }[], hollow: boolean): Data => ({
    type: 'scatter', mode: 'text+markers', name: hollow ? 'candidates of other templates' : `candidates (${curve.template})`,
    x: list.map(({ c }) => c.z), y: list.map(({ c }) => yOf(c)), text: list.map(({ i }) => String(i + 1)), // plotly takes one position per point (arrayOk), which its types do not say.
    textposition: list.map(({ i }) => sides[i]) as unknown as 'top center',
    customdata: list.map(({ i }) => i),
    textfont: { color: THEME.text, size: 13 },
    marker: { size: list.map(({ i }) => (i === chosenIndex ? 14 : 10)), symbol: hollow ? 'circle-open' : 'circle', color: THEME.template, line: { color: THEME.template, width: 2 } },
    hovertemplate: list.map(({ c, i }) => `candidate ${i + 1}: z = ${c.z.toFixed(5)}<br>${c.template}, r = ${c.r.toFixed(1)}<extra>click to try</extra>`),
  });
  const data: Data[] = [
    { type: 'scatter', mode: 'lines', name: `correlation, ${curve.template}`, x: curve.z, y: curve.value, line: { color: THEME.flux, width: 1 }, hoverinfo: 'skip' },
    markerTrace(own, false),
    markerTrace(other, true),
  ];
  const shapes: Partial<Layout>['shapes'] = trialZ === null ? [] : [{ type: 'line', xref: 'x', yref: 'paper', x0: trialZ, x1: trialZ, y0: 0, y1: 1, line: { color: THEME.trialZ, width: 1.5, dash: 'dot' } }];
  const finite = curve.value.filter((v) => Number.isFinite(v));
  const top = Math.max(...finite, 0);
  const bottom = Math.min(...finite, 0);
  const pad = 0.18 * (top - bottom || 1);
  const axis = { gridcolor: THEME.grid, linecolor: THEME.axis, zerolinecolor: THEME.axis, tickfont: { size: 13, color: THEME.muted } };
  return {
    data,
    layout: {
      paper_bgcolor: THEME.ground, plot_bgcolor: THEME.ground, font: { family: THEME.font, size: 13, color: THEME.text },
      margin: { l: 52, r: 12, t: 8, b: 40 }, showlegend: false, hovermode: 'closest', uirevision: curve.template,
      xaxis: { ...axis, title: { text: 'z (trial z dotted)', font: { size: 13, color: THEME.text } } },
      yaxis: { ...axis, range: [bottom - 0.05 * pad, top + pad], autorange: false, title: { text: 'correlation', font: { size: 13, color: THEME.text } } },
      shapes,
    },
  };
}
