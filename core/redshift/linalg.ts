/** Small dense linear algebra for the refinement fits (row-major number[][]). */

/** Inverse of a symmetric positive-definite matrix by Gauss–Jordan elimination; null if singular. */
export function invert(a: number[][]): number[][] | null {
  const n = a.length;
  const m = a.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[p][c])) p = r;
    if (!(Math.abs(m[p][c]) > 1e-300)) return null;
    [m[c], m[p]] = [m[p], m[c]];
    const d = m[c][c];
    for (let j = 0; j < 2 * n; j++) m[c][j] /= d;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r][c];
      if (f !== 0) for (let j = 0; j < 2 * n; j++) m[r][j] -= f * m[c][j];
    }
  }
  return m.map((row) => row.slice(n));
}

/** Weighted normal matrix Jᵀ·W·J from the Jacobian rows (one per data point). */
export function normalMatrix(jacobianRows: number[][], weights: ArrayLike<number>): number[][] {
  const p = jacobianRows[0]?.length ?? 0;
  const a = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  jacobianRows.forEach((row, k) => {
    const w = weights[k];
    for (let i = 0; i < p; i++) for (let j = i; j < p; j++) a[i][j] += w * row[i] * row[j];
  });
  for (let i = 0; i < p; i++) for (let j = 0; j < i; j++) a[i][j] = a[j][i];
  return a;
}
