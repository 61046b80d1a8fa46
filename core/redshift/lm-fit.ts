/**
 * Levenberg–Marquardt on typed arrays with Marquardt's diagonal scaling (Marquardt 1963,
 * J. SIAM 11, 431; e.g. Press et al., Numerical Recipes, §15.5), parameters clamped to their
 * bounds, a bounded number of iterations that stops when χ² improves by less than a relative
 * tolerance. Parameters with equal lower and upper bounds are held fixed. The caller's model
 * fills the values and the analytic Jacobian in place, so an iteration allocates nothing.
 */

export interface LmProblem {
  y: Float64Array;
  /** Weights 1/σ². */
  w: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  /** Fills model[k] and, when jac is given, jac[k·nParams + j] = ∂model[k]/∂p[j] (zeroed before). */
  evaluate(p: Float64Array, model: Float64Array, jac: Float64Array | null): void;
}

export interface LmResult {
  p: Float64Array;
  chi2: number;
  /** Indices of the parameters that were free (not fixed by their bounds). */
  free: number[];
  /** JᵀWJ over the free parameters at the solution, row-major free.length². */
  normal: Float64Array;
  iterations: number;
}

/** Default iteration cap; fits here start near the answer and take a handful. */
export const LM_MAX_ITERATIONS = 20;
/** Stop when an accepted step improves χ² by less than this fraction. */
export const LM_RELATIVE_TOLERANCE = 1e-6;

export function lmFit(prob: LmProblem, start: Float64Array, maxIterations = LM_MAX_ITERATIONS, relTol = LM_RELATIVE_TOLERANCE): LmResult {
  const nP = start.length, nY = prob.y.length;
  const p = Float64Array.from(start);
  const free: number[] = [];
  for (let j = 0; j < nP; j++) if (prob.upper[j] > prob.lower[j]) free.push(j);
  const nF = free.length;
  const model = new Float64Array(nY), jac = new Float64Array(nY * nP);
  const a = new Float64Array(nF * nF), g = new Float64Array(nF), m = new Float64Array(nF * nF), step = new Float64Array(nF);
  const trial = new Float64Array(nP);
  const nzIndex = new Int32Array(nF), nzValue = new Float64Array(nF);
  const chi2At = (q: Float64Array): number => {
    prob.evaluate(q, model, null);
    let s = 0;
    for (let k = 0; k < nY; k++) s += prob.w[k] * (prob.y[k] - model[k]) ** 2;
    return s;
  };
  const normalAt = (q: Float64Array): void => {
    jac.fill(0);
    prob.evaluate(q, model, jac);
    a.fill(0);
    g.fill(0);
    for (let k = 0; k < nY; k++) {
      const wk = prob.w[k], r = wk * (prob.y[k] - model[k]), row = k * nP;
      // A point depends on few parameters (the lines near it): accumulate over those only.
      let nz = 0;
      for (let i = 0; i < nF; i++) {
        const ji = jac[row + free[i]];
        if (ji !== 0) {
          nzIndex[nz] = i;
          nzValue[nz++] = ji;
        }
      }
      for (let u = 0; u < nz; u++) {
        const i = nzIndex[u], ji = nzValue[u];
        g[i] += ji * r;
        const wji = wk * ji;
        for (let v = u; v < nz; v++) a[i * nF + nzIndex[v]] += wji * nzValue[v];
      }
    }
    for (let i = 0; i < nF; i++) for (let l = 0; l < i; l++) a[i * nF + l] = a[l * nF + i];
  };
  let chi2 = chi2At(p);
  let damping = 1e-3;
  let it = 0;
  for (; it < maxIterations; it++) {
    normalAt(p);
    let accepted = false, gain = 0;
    while (damping < 1e10) {
      m.set(a);
      for (let i = 0; i < nF; i++) m[i * nF + i] = a[i * nF + i] * (1 + damping) || 1e-300;
      if (!choleskySolve(m, g, step, nF)) {
        damping *= 10;
        continue;
      }
      trial.set(p);
      for (let i = 0; i < nF; i++) {
        const j = free[i];
        trial[j] = Math.min(prob.upper[j], Math.max(prob.lower[j], p[j] + step[i]));
      }
      const c = chi2At(trial);
      if (c < chi2) {
        gain = (chi2 - c) / Math.max(c, 1e-300);
        p.set(trial);
        chi2 = c;
        damping = Math.max(damping / 10, 1e-7);
        accepted = true;
        break;
      }
      damping *= 10;
    }
    if (!accepted || gain < relTol) break;
  }
  normalAt(p);
  return { p, chi2, free, normal: Float64Array.from(a), iterations: it + 1 };
}

/** Solves M·x = b for symmetric positive-definite M (n×n, overwritten by its Cholesky factor). */
export function choleskySolve(mat: Float64Array, b: Float64Array, x: Float64Array, n: number): boolean {
  for (let j = 0; j < n; j++) {
    let d = mat[j * n + j];
    for (let k = 0; k < j; k++) d -= mat[j * n + k] * mat[j * n + k];
    if (!(d > 0)) return false;
    const l = Math.sqrt(d);
    mat[j * n + j] = l;
    for (let i = j + 1; i < n; i++) {
      let s = mat[i * n + j];
      for (let k = 0; k < j; k++) s -= mat[i * n + k] * mat[j * n + k];
      mat[i * n + j] = s / l;
    }
  }
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= mat[i * n + k] * x[k];
    x[i] = s / mat[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= mat[k * n + i] * x[k];
    x[i] = s / mat[i * n + i];
  }
  return true;
}
