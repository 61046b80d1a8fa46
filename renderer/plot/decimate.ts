/**
 * Fewer points for the screen, same picture: where a spectrum has more pixels than the plot has
 * columns, keep in each screen column only the pixels with the lowest and highest flux (the
 * min–max envelope, common practice for drawing long series), plus one empty pixel where the
 * column has a gap so lines still break there. Zooming in redraws with more of the pixels.
 */

/** Indices to draw, ascending; null when every pixel should be drawn. */
export function envelopeIndices(wave: readonly (number | null)[], flux: readonly (number | null)[], loAngstrom: number, hiAngstrom: number, columns: number): number[] | null {
  const n = wave.length;
  const perColumn = (hiAngstrom - loAngstrom) / Math.max(1, columns);
  const visible = wave.reduce<number>((k, w) => k + (w !== null && w >= loAngstrom && w <= hiAngstrom ? 1 : 0), 0);
  if (!(perColumn > 0) || visible <= 3 * columns) return null;
  const keep: number[] = [];
  let i = 0;
  while (i < n) {
    const w0 = wave[i];
    const column = w0 === null ? NaN : Math.floor((w0 - loAngstrom) / perColumn);
    let j = i;
    let lo = -1;
    let hi = -1;
    let gap = -1;
    for (; j < n; j++) {
      const w = wave[j];
      if (w === null || Math.floor((w - loAngstrom) / perColumn) !== column) {
        if (j > i) break;
      }
      const f = flux[j];
      if (f === null || !Number.isFinite(f)) {
        if (gap < 0) gap = j;
        continue;
      }
      if (lo < 0 || f < (flux[lo] as number)) lo = j;
      if (hi < 0 || f > (flux[hi] as number)) hi = j;
    }
    for (const k of [lo, hi, gap].filter((x) => x >= 0).sort((a, b) => a - b)) if (keep[keep.length - 1] !== k) keep.push(k);
    i = Math.max(j, i + 1);
  }
  return keep;
}

export function pick<T>(values: readonly T[], indices: readonly number[] | null): T[] {
  return indices ? indices.map((i) => values[i]) : [...values];
}
