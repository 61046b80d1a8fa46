/**
 * Least-squares fit of a GaussianModel to one window of a spectrum: Levenberg–Marquardt with
 * Marquardt's diagonal scaling (Marquardt 1963, J. SIAM 11, 431) on the analytic Jacobian,
 * parameters clamped to their bounds, then the covariance (JᵀWJ)⁻¹ at the optimum, scaled by
 * χ²_red when that exceeds 1 (or always, when the file gave no errors).
 *
 * Written here rather than taken from ml-levenberg-marquardt: that package stops only on an
 * absolute χ² threshold, so it always runs its full iteration count, and on these fits it needed
 * about 60 iterations (≈ 90 ms per spectrum) where this converges in a handful.
 */
import { evaluate, jacobian, type GaussianModel } from './gaussian-model.js';
import { invert, linearLeastSquares, normalMatrix } from '../math/linear-algebra.js';

export interface FitData {
  waveAngstrom: number[];
  flux: number[];
  /** 1σ per pixel; when errorsKnown is false these are all 1 and the scatter sets the scale. */
  sigma: number[];
  errorsKnown: boolean;
}

export interface FitResult {
  params: number[];
  /** Parameter covariance, already scaled by max(1, χ²_red); null when the fit is degenerate. */
  covariance: number[][] | null;
  chi2: number;
  dof: number;
}

export interface FitBounds {
  lower: number[];
  upper: number[];
  /** Typical size of each parameter (sets the tolerance for "at a bound"). */
  scale: number[];
}

const MAX_ITERATIONS = 100;
const RELATIVE_CHI2_TOLERANCE = 1e-9;

function chi2Of(model: GaussianModel, p: number[], data: FitData): number {
  let chi2 = 0;
  for (let i = 0; i < data.waveAngstrom.length; i++) chi2 += ((data.flux[i] - evaluate(model, p, data.waveAngstrom[i])) / data.sigma[i]) ** 2;
  return chi2;
}

/** Solves the parameters the model is linear in (continuum and fluxes) with the others held at `p`. */
export function solveLinear(model: GaussianModel, p: number[], data: FitData, bounds: FitBounds): { params: number[]; chi2: number } | null {
  const linear = [0, 1, ...new Set(model.terms.map((t) => t.fluxParam))];
  const rows = data.waveAngstrom.map((w) => {
    const j = jacobian(model, p, w);
    return linear.map((k) => j[k]);
  });
  const weights = data.sigma.map((s) => 1 / (s * s));
  const solved = linearLeastSquares(rows, data.flux, weights);
  if (!solved) return null;
  const params = p.slice();
  linear.forEach((k, i) => (params[k] = Math.min(bounds.upper[k], Math.max(bounds.lower[k], solved.beta[i]))));
  return { params, chi2: chi2Of(model, params, data) };
}

function atBound(params: number[], bounds: FitBounds, k: number): boolean {
  const tol = 1e-9 * bounds.scale[k];
  return Math.abs(params[k] - bounds.lower[k]) <= tol || Math.abs(params[k] - bounds.upper[k]) <= tol;
}

/** JᵀWJ and JᵀW·residual at `params`. */
function normalEquations(model: GaussianModel, params: number[], data: FitData) {
  const rows = data.waveAngstrom.map((w) => jacobian(model, params, w));
  const weights = data.sigma.map((v) => 1 / (v * v));
  const matrix = normalMatrix(rows, weights);
  const gradient = new Array<number>(params.length).fill(0);
  for (let i = 0; i < rows.length; i++) {
    const r = weights[i] * (data.flux[i] - evaluate(model, params, data.waveAngstrom[i]));
    for (let k = 0; k < params.length; k++) gradient[k] += rows[i][k] * r;
  }
  return { matrix, gradient };
}

/**
 * (JᵀWJ)⁻¹ × factor over the parameters that are free at the optimum: a parameter sitting on
 * one of its bounds, or one the model no longer depends on (the width of a zero-depth
 * absorption), is held fixed and gets zero variance.
 */
function covarianceAt(matrix: number[][], params: number[], bounds: FitBounds, factor: number): number[][] | null {
  const active = params.map((_, k) => k).filter((k) => !atBound(params, bounds, k) && matrix[k][k] > 0);
  const inv = invert(active.map((a) => active.map((b) => matrix[a][b])));
  if (!inv) return null;
  const cov = params.map(() => new Array<number>(params.length).fill(0));
  active.forEach((a, i) => active.forEach((b, j) => (cov[a][b] = inv[i][j] * factor)));
  return cov;
}

export function fitGaussians(model: GaussianModel, data: FitData, start: number[], bounds: FitBounds): FitResult {
  let params = start.slice();
  let chi2 = chi2Of(model, params, data);
  let damping = 1e-3;
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    const { matrix, gradient } = normalEquations(model, params, data);
    // Parameters on a bound that the descent direction pushes outward stay where they are.
    const free = params.map((_, k) => k).filter((k) => {
      const tol = 1e-9 * bounds.scale[k];
      if (params[k] >= bounds.upper[k] - tol && gradient[k] > 0) return false;
      if (params[k] <= bounds.lower[k] + tol && gradient[k] < 0) return false;
      return matrix[k][k] > 0;
    });
    let improved = false;
    while (damping < 1e10) {
      const inv = invert(free.map((a) => free.map((b) => (a === b ? matrix[a][b] * (1 + damping) : matrix[a][b]))));
      if (!inv) {
        damping *= 10;
        continue;
      }
      const trial = params.slice();
      free.forEach((a, i) => {
        const step = inv[i].reduce((sum, v, j) => sum + v * gradient[free[j]], 0);
        trial[a] = Math.min(bounds.upper[a], Math.max(bounds.lower[a], params[a] + step));
      });
      const trialChi2 = chi2Of(model, trial, data);
      if (trialChi2 < chi2) {
        const gain = (chi2 - trialChi2) / Math.max(trialChi2, 1e-300);
        params = trial;
        chi2 = trialChi2;
        damping = Math.max(damping / 10, 1e-7);
        improved = gain > RELATIVE_CHI2_TOLERANCE;
        break;
      }
      damping *= 10;
    }
    if (!improved) break;
  }
  const n = data.waveAngstrom.length;
  const dof = Math.max(1, n - model.nParams);
  const factor = data.errorsKnown ? Math.max(1, chi2 / dof) : chi2 / dof;
  const covariance = covarianceAt(normalEquations(model, params, data).matrix, params, bounds, factor);
  return { params, covariance, chi2, dof };
}
