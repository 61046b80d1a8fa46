/**
 * Refinement of an emission-line redshift: a joint fit of Gaussian lines at one common z with
 * the error spectrum (Levenberg–Marquardt, ml-levenberg-marquardt). Parameters: velocity
 * offset v (km/s), one σ for narrow and one for broad lines (km/s), and one amplitude per line
 * or tied doublet. The covariance is (Jᵀ W J)⁻¹ at the solution (e.g. Press et al., Numerical
 * Recipes, §15.5), scaled by χ²_red when that exceeds 1.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { lineGroups } from './line-groups.js';
import { invert, normalMatrix } from './linalg.js';
import { pixelsNearLines, type NativeResidual } from './native-residual.js';
import type { ProfileLine, Template } from './templates.js';

const C_KMS = 299792.458;
const SQRT_2PI = Math.sqrt(2 * Math.PI);
/** Lines wider than this (km/s) share the broad σ (common practice, no source). */
const BROAD_KMS = 600;
/** A fit that wanders further than this from the correlation z is rejected, km/s. */
const MAX_SHIFT_KMS = 1500;

export interface LineFit {
  z: number;
  zErr: number;
  chi2Red: number;
  nLinesFitted: number;
}

interface Component {
  line: ProfileLine;
  group: number;
  ratio: number;
  broad: boolean;
}

export function fitEmissionLines(nr: NativeResidual, template: Template, z0: number): LineFit | null {
  const lo = nr.waveAngstrom[0], hi = nr.waveAngstrom[nr.waveAngstrom.length - 1];
  const inRange = template.lines.filter((l) => l.strength > 0 && l.waveRestAngstrom * (1 + z0) > lo && l.waveRestAngstrom * (1 + z0) < hi);
  const { members, nGroups } = lineGroups(inRange);
  const comps: Component[] = inRange.map((line, k) => ({ line, ...members[k], broad: line.sigmaKmS > BROAD_KMS }));
  if (nGroups === 0) return null;
  const sub = { ...template, lines: inRange };
  const idx = pixelsNearLines(nr, sub, z0, 4);
  if (idx.length < nGroups + 4) return null;
  const x = idx.map((i) => nr.waveAngstrom[i]);
  const y = idx.map((i) => nr.resid[i]);
  const w = idx.map((i) => 1 / (nr.sigma[i] * nr.sigma[i]));
  const narrow0 = Math.min(...inRange.map((l) => l.sigmaKmS));
  const broadLines = inRange.filter((l) => l.sigmaKmS > BROAD_KMS);
  const broad0 = broadLines.length ? Math.min(...broadLines.map((l) => l.sigmaKmS)) : 1000;
  const inst = nr.pixelKmS;

  // Parameters: [v, σ_narrow, σ_broad, A_0 … A_(g−1)].
  const basis = (p: number[], xi: number, comp: Component): { g: number; dv: number; ds: number } => {
    const zf = (1 + z0) * (1 + p[0] / C_KMS);
    const c = comp.line.waveRestAngstrom * zf;
    const sv = comp.broad ? p[2] : p[1];
    const stot = Math.hypot(sv, inst);
    const s = (c * stot) / C_KMS;
    const u = (xi - c) / s;
    const g = (comp.ratio * Math.exp(-0.5 * u * u)) / (s * SQRT_2PI);
    // ∂g/∂c = g·u/s, ∂c/∂v = λ_rest(1+z0)/c; ∂g/∂s = g(u² − 1)/s, ∂s/∂σv = c·σv/(C·stot)
    const dv = ((g * u) / s) * ((comp.line.waveRestAngstrom * (1 + z0)) / C_KMS);
    const ds = ((g * (u * u - 1)) / s) * ((c * sv) / (C_KMS * stot));
    return { g, dv, ds };
  };
  const model = (p: number[]) => (xi: number) => {
    let f = 0;
    for (const comp of comps) f += p[3 + comp.group] * basis(p, xi, comp).g;
    return f;
  };
  const jacobian = (p: number[]) => (xi: number) => {
    const row = new Array<number>(3 + nGroups).fill(0);
    for (const comp of comps) {
      const b = basis(p, xi, comp);
      const a = p[3 + comp.group];
      row[0] += a * b.dv;
      row[comp.broad ? 2 : 1] += a * b.ds;
      row[3 + comp.group] += b.g;
    }
    return row;
  };
  const start = [0, narrow0, broad0, ...initialAmplitudes(x, y, w, comps, nGroups, (xi, c) => basis([0, narrow0, broad0], xi, c).g)];
  const fixedBroad = broadLines.length === 0;
  const fixedNarrow = inRange.every((l) => l.sigmaKmS > BROAD_KMS);
  let p: number[];
  try {
    const res = levenbergMarquardt({ x, y }, model, {
      initialValues: start,
      weights: w,
      jacobianFunction: jacobian,
      minValues: [-MAX_SHIFT_KMS * 2, fixedNarrow ? narrow0 : 5, fixedBroad ? broad0 : 300, ...start.slice(3).map(() => -Infinity)],
      maxValues: [MAX_SHIFT_KMS * 2, fixedNarrow ? narrow0 : BROAD_KMS, fixedBroad ? broad0 : 6000, ...start.slice(3).map(() => Infinity)],
      // errorTolerance is an absolute χ² that noisy data never reach; the start is already close.
      maxIterations: 12,
      errorTolerance: 1e-12,
      damping: 1e-2,
    });
    p = res.parameterValues;
  } catch {
    return null;
  }
  if (!p.every(Number.isFinite) || Math.abs(p[0]) > MAX_SHIFT_KMS) return null;
  const f = model(p);
  let chi2 = 0;
  for (let k = 0; k < x.length; k++) chi2 += w[k] * (y[k] - f(x[k])) ** 2;
  // Free parameters: v, the widths that could move, the amplitudes.
  const free = [0, ...(fixedNarrow ? [] : [1]), ...(fixedBroad ? [] : [2]), ...Array.from({ length: nGroups }, (_, g) => 3 + g)];
  const jf = jacobian(p);
  const rows = x.map((xi) => {
    const r = jf(xi);
    return free.map((j) => r[j]);
  });
  const cov = invert(normalMatrix(rows, w));
  if (!cov || !(cov[0][0] > 0)) return null;
  const dof = Math.max(1, x.length - free.length);
  const chi2Red = chi2 / dof;
  const sigmaV = Math.sqrt(cov[0][0]) * Math.sqrt(Math.max(1, chi2Red));
  const z = (1 + z0) * (1 + p[0] / C_KMS) - 1;
  return { z, zErr: ((1 + z0) * sigmaV) / C_KMS, chi2Red, nLinesFitted: inRange.length };
}

/** Linear least-squares amplitudes at the start point (the model is linear in them). */
function initialAmplitudes(x: number[], y: number[], w: number[], comps: Component[], nGroups: number, g: (xi: number, c: Component) => number): number[] {
  const rows = x.map((xi) => {
    const r = new Array<number>(nGroups).fill(0);
    for (const c of comps) r[c.group] += g(xi, c);
    return r;
  });
  const a = normalMatrix(rows, w);
  for (let i = 0; i < nGroups; i++) a[i][i] += 1e-12 * (a[i][i] || 1);
  const inv = invert(a);
  if (!inv) return new Array<number>(nGroups).fill(0);
  const b = new Array<number>(nGroups).fill(0);
  rows.forEach((r, k) => r.forEach((v, i) => (b[i] += w[k] * v * y[k])));
  return inv.map((row) => row.reduce((s, v, j) => s + v * b[j], 0));
}
