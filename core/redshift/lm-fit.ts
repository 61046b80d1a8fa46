/**
 * Levenberg–Marquardt with Marquardt's diagonal scaling (Marquardt 1963, J. SIAM 11, 431; e.g.
 * Press et al., Numerical Recipes, §15.5), parameters clamped to their bounds, a bounded number
 * of iterations that stops when χ² improves by less than a relative tolerance. Parameters with
 * equal lower and upper bounds are held fixed. The problem evaluates χ² at a trial point and,
 * only when the step is accepted, linearises itself there (the normal matrix and the gradient, in
 * place), so it can use its own sparsity; an iteration allocates nothing.
 */

export interface LmProblem {
  lower: Float64Array;
  upper: Float64Array;
  /** χ² at p. */
  chi2(p: Float64Array): number;
  /**
   * At the point of the last chi2 call: JᵀWJ over the parameters in `free` (row-major,
   * free.length²) into `normal` and JᵀW(y − model) into `gradient`.
   */
  linearise(free: readonly number[], normal: Float64Array, gradient: Float64Array): void;
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
/** Stop when an accepted step improves χ² by less than this fraction… */
export const LM_RELATIVE_TOLERANCE = 1e-6;
/**
 * …or moves the parameters by less than this many standard errors (δᵀ·JᵀWJ·δ below its square):
 * what is left to go is then smaller still (common practice, no source).
 */
export const LM_STEP_TOLERANCE = 0.05;

export function lmFit(prob: LmProblem, start: Float64Array, maxIterations = LM_MAX_ITERATIONS, relTol = LM_RELATIVE_TOLERANCE): LmResult {
  const nP = start.length;
  const p = Float64Array.from(start);
  const free: number[] = [];
  for (let j = 0; j < nP; j++) if (prob.upper[j] > prob.lower[j]) free.push(j);
  const nF = free.length;
  // The normal matrix and gradient at p.
  const a = new Float64Array(nF * nF), g = new Float64Array(nF);
  const m = new Float64Array(nF * nF), rhs = new Float64Array(nF), step = new Float64Array(nF);
  const trial = new Float64Array(nP);
  const moving = new Int32Array(nF);
  let chi2 = prob.chi2(p);
  prob.linearise(free, a, g);
  let damping = 1e-3;
  let it = 0;
  for (; it < maxIterations; it++) {
    // A parameter on a bound that the descent direction pushes outwards is held for this step,
    // so that clamping does not spoil the others' step (a projected step, e.g. Nocedal & Wright,
    // Numerical Optimization, §16.7).
    let nM = 0;
    for (let i = 0; i < nF; i++) {
      const j = free[i];
      if ((p[j] >= prob.upper[j] && g[i] > 0) || (p[j] <= prob.lower[j] && g[i] < 0)) continue;
      moving[nM++] = i;
    }
    if (nM === 0) break;
    let accepted = false, rejected = false, gain = 0, stepSigmas2 = Infinity;
    while (damping < 1e10) {
      for (let u = 0; u < nM; u++) {
        const i = moving[u];
        for (let v = 0; v < nM; v++) m[u * nM + v] = a[i * nF + moving[v]];
        m[u * nM + u] = a[i * nF + i] * (1 + damping) || 1e-300;
        rhs[u] = g[i];
      }
      if (!choleskySolve(m, rhs, step, nM)) {
        damping *= 10;
        continue;
      }
      // After a rejected step, a damped step too short to matter ends the fit: the rejections
      // would otherwise go on until the damping reaches its cap.
      let stepNorm2 = 0, predicted = 0;
      for (let u = 0; u < nM; u++) {
        predicted += 2 * rhs[u] * step[u];
        for (let v = 0; v < nM; v++) stepNorm2 += step[u] * a[moving[u] * nF + moving[v]] * step[v];
      }
      predicted -= stepNorm2;
      if (rejected && (stepNorm2 < LM_STEP_TOLERANCE ** 2 || predicted < relTol * chi2)) break;
      trial.set(p);
      for (let u = 0; u < nM; u++) {
        const j = free[moving[u]];
        trial[j] = Math.min(prob.upper[j], Math.max(prob.lower[j], p[j] + step[u]));
      }
      const c = prob.chi2(trial);
      if (c < chi2) {
        gain = (chi2 - c) / Math.max(c, 1e-300);
        stepSigmas2 = stepNorm2;
        p.set(trial);
        chi2 = c;
        prob.linearise(free, a, g);
        damping = Math.max(damping / 10, 1e-7);
        accepted = true;
        break;
      }
      rejected = true;
      damping *= 10;
    }
    if (!accepted || gain < relTol || stepSigmas2 < LM_STEP_TOLERANCE ** 2) break;
  }
  return { p, chi2, free, normal: a, iterations: it + 1 };
}

/**
 * Overwrites the lower triangle of symmetric M (n×n, row-major) with its Cholesky factor L
 * (M = L·Lᵀ); false when a pivot is not above minPivot (M not positive definite).
 */
function choleskyFactor(mat: Float64Array, n: number, minPivot = 0): boolean {
  for (let j = 0; j < n; j++) {
    let d = mat[j * n + j];
    for (let k = 0; k < j; k++) d -= mat[j * n + k] * mat[j * n + k];
    if (!(d > minPivot)) return false;
    const l = Math.sqrt(d);
    mat[j * n + j] = l;
    for (let i = j + 1; i < n; i++) {
      let s = mat[i * n + j];
      for (let k = 0; k < j; k++) s -= mat[i * n + k] * mat[j * n + k];
      mat[i * n + j] = s / l;
    }
  }
  return true;
}

/**
 * Solves M·x = b for symmetric positive-definite M (n×n, overwritten by its Cholesky factor);
 * false when a pivot is not above minPivot.
 */
export function choleskySolve(mat: Float64Array, b: Float64Array, x: Float64Array, n: number, minPivot = 0): boolean {
  if (!choleskyFactor(mat, n, minPivot)) return false;
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

/**
 * The diagonal of M⁻¹ for symmetric positive-definite M (n×n, row-major; left as it was), from
 * its Cholesky factor L: (M⁻¹)_ii = Σ_k (L⁻¹)_ki². null when M is singular to working precision
 * (a pivot below 1e-14 of the largest entry, as Gauss–Jordan elimination would reject it).
 */
export function inverseDiagonal(mat: Float64Array, n: number): Float64Array | null {
  let scale = 0;
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(mat[i]));
  const l = Float64Array.from(mat.subarray(0, n * n));
  if (!choleskyFactor(l, n, 1e-14 * scale)) return null;
  // Column c of L⁻¹ (zero above c) by forward substitution; its squares sum to (M⁻¹)_cc.
  const diag = new Float64Array(n), col = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    let sum = 0;
    for (let i = c; i < n; i++) {
      let s = i === c ? 1 : 0;
      for (let k = c; k < i; k++) s -= l[i * n + k] * col[k];
      col[i] = s / l[i * n + i];
      sum += col[i] * col[i];
    }
    diag[c] = sum;
  }
  return diag;
}
