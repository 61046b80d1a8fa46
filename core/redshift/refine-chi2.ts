/**
 * Refinement of an absorption redshift: χ² of the template against the spectrum on a fine z
 * grid around the correlation peak, on the native pixels with the error spectrum, each line (or
 * tied doublet) with its own amplitude of the template's sign, so that line ratios unlike the
 * template's do not masquerade as a poor redshift; the
 * minimum and its error from a parabola through the lowest points, Δχ² = 1 (e.g. Press et al.,
 * Numerical Recipes, §15.6), scaled by √χ²_red when that exceeds 1.
 */
import { pixelArrays, pixelsNearLines, type NativeResidual } from './native-residual.js';
import { chi2Scratch, templateChi2 } from './template-basis.js';
import type { Template } from './templates.js';

/** Grid points either side of the start z. */
const HALF_STEPS = 20;

export interface Chi2Fit {
  z: number;
  zErr: number;
  chi2Red: number;
  nLinesFitted: number;
}

export function fitTemplateChi2(nr: NativeResidual, template: Template, z0: number, halfRangeZ: number): Chi2Fit | null {
  const idx = template.lines.length ? pixelsNearLines(nr, template, z0, 4) : allGood(nr);
  if (idx.length < 10) return null;
  const { wave, y, w } = pixelArrays(nr, idx);
  const scratch = chi2Scratch(wave.length);
  const dz = halfRangeZ / HALF_STEPS;
  const nGrid = 2 * HALF_STEPS + 1;
  const zs = Array.from({ length: nGrid }, (_, k) => z0 + (k - HALF_STEPS) * dz);
  const chi = new Float64Array(nGrid).fill(NaN);
  let nFree = 1;
  const chiAt = (k: number): number => {
    if (chi[k] === chi[k]) return chi[k];
    const fit = templateChi2(template, zs[k], wave, y, w, nr.pixelKmS, scratch);
    nFree = fit.nFree;
    return (chi[k] = fit.chi2);
  };
  // Downhill from the correlation z to the grid minimum: near its minimum χ²(z) is one smooth
  // valley, so only the points on the way and the five the parabola needs are computed.
  let kMin = HALF_STEPS;
  const dir = chiAt(kMin - 1) < chiAt(kMin) ? -1 : 1;
  while (kMin + dir >= 0 && kMin + dir < nGrid && chiAt(kMin + dir) < chiAt(kMin)) kMin += dir;
  if (kMin < 2 || kMin > nGrid - 3) return null;
  for (let k = kMin - 2; k <= kMin + 2; k++) chiAt(k);
  const [a, b, c] = parabola(zs.slice(kMin - 2, kMin + 3), Array.from(chi.subarray(kMin - 2, kMin + 3)));
  if (!(a > 0)) return null;
  const z = -b / (2 * a);
  const chiMin = c - (b * b) / (4 * a);
  const chi2Red = Math.max(chiMin, 0) / Math.max(1, y.length - nFree);
  const zErr = (1 / Math.sqrt(a)) * Math.sqrt(Math.max(1, chi2Red));
  return { z, zErr, chi2Red, nLinesFitted: template.lines.length };
}

function allGood(nr: NativeResidual): number[] {
  const out: number[] = [];
  for (let i = 0; i < nr.good.length; i++) if (nr.good[i] && Number.isFinite(nr.resid[i])) out.push(i);
  return out;
}

/** Least-squares parabola y = a·x² + b·x + c, x taken about its mean for conditioning. */
function parabola(x: number[], y: number[]): [number, number, number] {
  const m = x.reduce((s, v) => s + v, 0) / x.length;
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let k = 0; k < x.length; k++) {
    const u = x[k] - m;
    s0 += 1; s1 += u; s2 += u * u; s3 += u * u * u; s4 += u * u * u * u;
    t0 += y[k]; t1 += u * y[k]; t2 += u * u * y[k];
  }
  const det = s4 * (s2 * s0 - s1 * s1) - s3 * (s3 * s0 - s1 * s2) + s2 * (s3 * s1 - s2 * s2);
  const A = (t2 * (s2 * s0 - s1 * s1) - s3 * (t1 * s0 - s1 * t0) + s2 * (t1 * s1 - s2 * t0)) / det;
  const B = (s4 * (t1 * s0 - t0 * s1) - t2 * (s3 * s0 - s1 * s2) + s2 * (s3 * t0 - t1 * s2)) / det;
  const C = (s4 * (s2 * t0 - s1 * t1) - s3 * (s3 * t0 - s1 * t2) + t2 * (s3 * s1 - s2 * s2)) / det;
  // Back to x: a(x−m)² + B(x−m) + C.
  return [A, B - 2 * A * m, A * m * m - B * m + C];
}
