/**
 * The correlation curves as the window draws them: each thinned to about MAX_CURVE_POINTS, the
 * largest value of each stride kept so peaks survive. Where a peak was described on the native
 * grid, the native values replace the coarse ones, so a narrow-line peak is drawn at its true
 * height and not at the lower one of the binned spectrum.
 */
import type { CorrelationCurveData } from './correlate.js';
import type { CorrelationCurve } from './types.js';

const MAX_CURVE_POINTS = 2000;

export function displayCurve(c: CorrelationCurveData): CorrelationCurve {
  const coarse = thinned(c, MAX_CURVE_POINTS);
  const windows = (c.nativeWindows ?? []).map((w) => thinned(w, MAX_CURVE_POINTS)).filter((w) => w.z.length > 0);
  if (windows.length === 0) return { template: c.template.name, ...coarse };
  const points: [number, number][] = [];
  const covered = (z: number) => windows.some((w) => z >= w.z[0] && z <= w.z[w.z.length - 1]);
  coarse.z.forEach((z, i) => {
    if (!covered(z)) points.push([z, coarse.value[i]]);
  });
  for (const w of windows) w.z.forEach((z, i) => points.push([z, w.value[i]]));
  points.sort((a, b) => a[0] - b[0]);
  // Overlapping windows hold the same native lags twice.
  const kept = points.filter((p, i) => i === 0 || p[0] !== points[i - 1][0]);
  return { template: c.template.name, z: kept.map((p) => p[0]), value: kept.map((p) => p[1]) };
}

function thinned(c: CorrelationCurveData, maxPoints: number): { z: number[]; value: number[] } {
  const n = c.searchHi + 1;
  const every = Math.max(1, Math.ceil((n - c.searchLo) / maxPoints));
  const z: number[] = [];
  const value: number[] = [];
  for (let i = c.searchLo; i < n; i += every) {
    let k = i;
    for (let j = i; j < Math.min(n, i + every); j++) if (c.rho[j] > c.rho[k] || !(c.rho[k] === c.rho[k])) k = j;
    const v = c.rho[k];
    if (!(v === v)) continue;
    z.push(Math.expm1((c.lagMin + k) * c.step));
    value.push(v);
  }
  return { z, value };
}
