/**
 * Small dense linear algebra for the line and template fits (a handful of parameters): inverse of a
 * square matrix and weighted linear least squares.
 */

/** Inverse of a square matrix by Gauss–Jordan elimination with partial pivoting; null when singular. */
export function invert(matrix: number[][]): number[][] | null {
  const n = matrix.length;
  const a = matrix.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  let scale = 0;
  for (const row of matrix) for (const v of row) scale = Math.max(scale, Math.abs(v));
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    if (!(Math.abs(a[pivot][col]) > scale * 1e-14)) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    const p = a[col][col];
    for (let j = 0; j < 2 * n; j++) a[col][j] /= p;
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = a[r][col];
      if (f === 0) continue;
      for (let j = 0; j < 2 * n; j++) a[r][j] -= f * a[col][j];
    }
  }
  return a.map((row) => row.slice(n));
}

/** JᵀWJ for a design matrix given by rows (one per data point) and weights w = 1/σ². */
export function normalMatrix(rows: ArrayLike<number>[], weights: ArrayLike<number>): number[][] {
  const p = rows.length ? rows[0].length : 0;
  const m = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    const w = weights[i];
    for (let a = 0; a < p; a++) {
      const wa = w * r[a];
      if (wa === 0) continue;
      for (let b = a; b < p; b++) m[a][b] += wa * r[b];
    }
  }
  for (let a = 0; a < p; a++) for (let b = 0; b < a; b++) m[a][b] = m[b][a];
  return m;
}

/**
 * Weighted linear least squares y ≈ X·β: β and its covariance (X ᵀWX)⁻¹, null when the
 * design is degenerate.
 */
export function linearLeastSquares(
  rows: ArrayLike<number>[],
  y: ArrayLike<number>,
  weights: ArrayLike<number>,
): { beta: number[]; covariance: number[][]; chi2: number } | null {
  const p = rows.length ? rows[0].length : 0;
  const covariance = invert(normalMatrix(rows, weights));
  if (!covariance) return null;
  const rhs = new Array<number>(p).fill(0);
  for (let i = 0; i < rows.length; i++) for (let a = 0; a < p; a++) rhs[a] += weights[i] * rows[i][a] * y[i];
  const beta = covariance.map((row) => row.reduce((s, v, j) => s + v * rhs[j], 0));
  let chi2 = 0;
  for (let i = 0; i < rows.length; i++) {
    let model = 0;
    for (let a = 0; a < p; a++) model += rows[i][a] * beta[a];
    chi2 += weights[i] * (y[i] - model) ** 2;
  }
  return { beta, covariance, chi2 };
}
