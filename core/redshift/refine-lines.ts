/**
 * Refinement of an emission-line redshift: a joint fit of Gaussian lines at one common z with
 * the error spectrum (Levenberg–Marquardt on the analytic Jacobian, lm-fit.ts). Parameters: velocity
 * offset v (km/s), one σ for narrow and one for broad lines (km/s), and one amplitude per line
 * or tied doublet. The covariance is (Jᵀ W J)⁻¹ at the solution (e.g. Press et al., Numerical
 * Recipes, §15.5), scaled by √χ²_red when that exceeds 1; when χ²_red is large the spread of the
 * lines' own velocities is a floor (centroidScatterKmS).
 */
import { lineGroups } from './line-groups.js';
import { choleskySolve, lmFit, type LmProblem } from './lm-fit.js';
import { invert } from '../math/linear-algebra.js';
import { lineRun, pixelsNearLines, usable, type NativeResidual } from './native-residual.js';
import { lowerBound, type ProfileLine, type Template } from './templates.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';

const SQRT_2PI = Math.sqrt(2 * Math.PI);
/** Lines wider than this (km/s) share the broad σ (common practice, no source). */
const BROAD_KMS = 600;
/** A fit that wanders further than this from the correlation z is rejected, km/s. */
const MAX_SHIFT_KMS = 1500;
/** A line enters the fit only with at least this many good pixels within 4σ (common practice, no source). */
const MIN_LINE_PIXELS = 3;
/** A line's profile is evaluated out to this many σ (e^(−32) beyond: nothing left). */
const PROFILE_REACH = 8;

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
  // A line with no good pixels (inside a masked telluric band, say) has no amplitude to fit and
  // would make the normal matrix singular: it is left out.
  const inRange = template.lines.filter(
    (l) => l.strength > 0 && l.waveRestAngstrom * (1 + z0) > lo && l.waveRestAngstrom * (1 + z0) < hi && usablePixels(nr, l, z0) >= MIN_LINE_PIXELS,
  );
  const { members, nGroups } = lineGroups(inRange);
  const comps: Component[] = inRange.map((line, k) => ({ line, ...members[k], broad: line.sigmaKmS > BROAD_KMS }));
  if (nGroups === 0) return null;
  const sub = { ...template, lines: inRange };
  const idx = pixelsNearLines(nr, sub, z0, 4);
  if (idx.length < nGroups + 4) return null;
  const narrow0 = Math.min(...inRange.map((l) => l.sigmaKmS));
  const broadLines = inRange.filter((l) => l.sigmaKmS > BROAD_KMS);
  const broad0 = broadLines.length ? Math.min(...broadLines.map((l) => l.sigmaKmS)) : 1000;
  const inst = nr.pixelKmS;

  const nP = 3 + nGroups;
  const xs = Float64Array.from(idx, (i) => nr.waveAngstrom[i]);
  const ys = Float64Array.from(idx, (i) => nr.resid[i]);
  const ws = Float64Array.from(idx, (i) => 1 / (nr.sigma[i] * nr.sigma[i]));
  const evaluate = lineModel(comps, z0, inst, xs, nP);
  const start = new Float64Array(nP);
  start[1] = narrow0;
  start[2] = broad0;
  setInitialAmplitudes(evaluate, ys, ws, start);
  const fixedBroad = broadLines.length === 0;
  const fixedNarrow = inRange.every((l) => l.sigmaKmS > BROAD_KMS);
  const lower = Float64Array.from([-MAX_SHIFT_KMS * 2, fixedNarrow ? narrow0 : 5, fixedBroad ? broad0 : 300, ...new Array<number>(nGroups).fill(-Infinity)]);
  const upper = Float64Array.from([MAX_SHIFT_KMS * 2, fixedNarrow ? narrow0 : BROAD_KMS, fixedBroad ? broad0 : 6000, ...new Array<number>(nGroups).fill(Infinity)]);
  const fit = lmFit({ y: ys, w: ws, lower, upper, evaluate }, start);
  const p = fit.p;
  if (!p.every(Number.isFinite) || Math.abs(p[0]) > MAX_SHIFT_KMS) return null;
  const nF = fit.free.length;
  const cov = invert(Array.from({ length: nF }, (_, i) => Array.from(fit.normal.subarray(i * nF, (i + 1) * nF))));
  if (!cov || fit.free[0] !== 0 || !(cov[0][0] > 0)) return null;
  const dof = Math.max(1, xs.length - nF);
  const chi2Red = fit.chi2 / dof;
  const covarianceKmS = Math.sqrt(cov[0][0]) * Math.sqrt(Math.max(1, chi2Red));
  const ampErr = (g: number) => {
    const f = fit.free.indexOf(3 + g);
    return f >= 0 && cov[f][f] > 0 ? Math.sqrt(cov[f][f] * Math.max(1, chi2Red)) : Infinity;
  };
  const scatterKmS = chi2Red > SCATTER_FLOOR_CHI2RED ? centroidScatterKmS({ comps, nGroups, z0, inst, xs, ys, ws, lower, upper }, p, ampErr) : 0;
  const sigmaV = Math.max(covarianceKmS, scatterKmS);
  const z = (1 + z0) * (1 + p[0] / SPEED_OF_LIGHT_KMS) - 1;
  return { z, zErr: ((1 + z0) * sigmaV) / SPEED_OF_LIGHT_KMS, chi2Red, nLinesFitted: inRange.length };
}

function usablePixels(nr: NativeResidual, line: ProfileLine, z: number): number {
  const [from, to] = lineRun(nr, line, z, 4);
  let k = 0;
  for (let i = from; i < to; i++) if (usable(nr, i)) k++;
  return k;
}

/**
 * The model of the lines in `comps` at the pixels xs, for lmFit. Parameters: [v, σ_narrow,
 * σ_broad, A_0 … A_(g−1)]. Each line touches only the points within PROFILE_REACH of its centre,
 * found by bisection in the sorted wavelengths.
 */
function lineModel(comps: Component[], z0: number, inst: number, xs: Float64Array, nP: number): LmProblem['evaluate'] {
  return (p, model, jac) => {
    model.fill(0);
    const zf = (1 + z0) * (1 + p[0] / SPEED_OF_LIGHT_KMS);
    for (const comp of comps) {
      const c = comp.line.waveRestAngstrom * zf;
      const sv = comp.broad ? p[2] : p[1];
      const stot = Math.hypot(sv, inst);
      const sA = (c * stot) / SPEED_OF_LIGHT_KMS;
      const amp = p[3 + comp.group];
      const norm = comp.ratio / (sA * SQRT_2PI);
      // ∂g/∂c = g·u/s, ∂c/∂v = λ_rest(1+z0)/c; ∂g/∂s = g(u² − 1)/s, ∂s/∂σv = c·σv/(C·stot)
      const dcdv = (comp.line.waveRestAngstrom * (1 + z0)) / SPEED_OF_LIGHT_KMS, dsdsv = (c * sv) / (SPEED_OF_LIGHT_KMS * stot);
      const jS = comp.broad ? 2 : 1, jA = 3 + comp.group;
      const end = c + PROFILE_REACH * sA;
      for (let k = lowerBound(xs, c - PROFILE_REACH * sA); k < xs.length && xs[k] <= end; k++) {
        const u = (xs[k] - c) / sA;
        const g = norm * Math.exp(-0.5 * u * u);
        model[k] += amp * g;
        if (jac) {
          const row = k * nP;
          jac[row] += amp * ((g * u) / sA) * dcdv;
          jac[row + jS] += amp * ((g * (u * u - 1)) / sA) * dsdsv;
          jac[row + jA] += g;
        }
      }
    }
  };
}

/** Above this χ²_red the covariance error is in doubt and the scatter between lines is a floor. */
const SCATTER_FLOOR_CHI2RED = 2;
/** Lines (or tied doublets) count for the scatter from this amplitude S/N up. */
const SCATTER_MIN_SNR = 5;
const SCATTER_MIN_LINES = 3;

interface JointFit {
  comps: Component[];
  nGroups: number;
  z0: number;
  inst: number;
  xs: Float64Array;
  ys: Float64Array;
  ws: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
}

/**
 * Error of the common velocity from the spread of the lines' own velocities: each strong line
 * (or doublet) refitted alone for its offset, widths and the other lines held at the joint fit;
 * the standard error of the mean, s/√N. The lines share one z, so their spread is an honest
 * empirical error when the profiles are not the Gaussians the covariance assumes (outflows,
 * blends, asymmetric wings). Common practice, no single source. 0 when fewer than
 * SCATTER_MIN_LINES lines are strong enough.
 */
function centroidScatterKmS(j: JointFit, p: Float64Array, ampErr: (g: number) => number): number {
  const nP = 3 + j.nGroups;
  const full = new Float64Array(j.xs.length);
  lineModel(j.comps, j.z0, j.inst, j.xs, nP)(p, full, null);
  const velocities: number[] = [];
  for (let g = 0; g < j.nGroups; g++) {
    if (!(Math.abs(p[3 + g]) >= SCATTER_MIN_SNR * ampErr(g))) continue;
    const own = j.comps.filter((c) => c.group === g);
    const near = new Uint8Array(j.xs.length);
    for (const c of own) {
      const centre = c.line.waveRestAngstrom * (1 + j.z0) * (1 + p[0] / SPEED_OF_LIGHT_KMS);
      const half = (3 * centre * Math.hypot(c.broad ? p[2] : p[1], j.inst)) / SPEED_OF_LIGHT_KMS;
      for (let k = lowerBound(j.xs, centre - half); k < j.xs.length && j.xs[k] <= centre + half; k++) near[k] = 1;
    }
    const idx: number[] = [];
    near.forEach((v, k) => v && idx.push(k));
    if (idx.length < 4) continue;
    const xs = Float64Array.from(idx, (k) => j.xs[k]);
    const mine = new Float64Array(xs.length);
    const evaluate = lineModel(own, j.z0, j.inst, xs, nP);
    evaluate(p, mine, null);
    // The other lines' share of the joint model stays subtracted.
    const ys = Float64Array.from(idx, (k, i) => j.ys[k] - (full[k] - mine[i]));
    const ws = Float64Array.from(idx, (k) => j.ws[k]);
    const lower = Float64Array.from(p), upper = Float64Array.from(p);
    lower[0] = j.lower[0];
    upper[0] = j.upper[0];
    lower[3 + g] = -Infinity;
    upper[3 + g] = Infinity;
    const v = lmFit({ y: ys, w: ws, lower, upper, evaluate }, p).p[0];
    if (Math.abs(v) <= MAX_SHIFT_KMS) velocities.push(v);
  }
  const n = velocities.length;
  if (n < SCATTER_MIN_LINES) return 0;
  const mean = velocities.reduce((a, v) => a + v, 0) / n;
  const s = Math.sqrt(velocities.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1));
  return s / Math.sqrt(n);
}

/**
 * Sets p[3…] to the linear least-squares amplitudes at p's velocity and widths (the model is
 * linear in them: its Jacobian columns for the amplitudes are the unit-amplitude profiles);
 * zero when the normal equations cannot be solved.
 */
function setInitialAmplitudes(evaluate: LmProblem['evaluate'], y: Float64Array, w: Float64Array, p: Float64Array): void {
  const nP = p.length, nA = nP - 3, nY = y.length;
  const model = new Float64Array(nY), jac = new Float64Array(nY * nP);
  evaluate(p, model, jac);
  const a = new Float64Array(nA * nA), b = new Float64Array(nA), amp = new Float64Array(nA);
  for (let k = 0; k < nY; k++) {
    const row = k * nP + 3;
    for (let i = 0; i < nA; i++) {
      const gi = jac[row + i];
      if (gi === 0) continue;
      b[i] += w[k] * gi * y[k];
      for (let j = i; j < nA; j++) a[i * nA + j] += w[k] * gi * jac[row + j];
    }
  }
  for (let i = 0; i < nA; i++) {
    for (let j = 0; j < i; j++) a[i * nA + j] = a[j * nA + i];
    a[i * nA + i] += 1e-12 * (a[i * nA + i] || 1);
  }
  if (choleskySolve(a, b, amp, nA)) p.set(amp, 3);
}
