/** Display scaling: a y range that ignores spikes, and a template scaled onto the flux. */

/**
 * Flux range of the pixels inside [lo, hi] from the 1st to the 99.5th percentile, widened above
 * and below so that the data sit in the middle band between the rows of line labels; raised to
 * the fourth-highest pixel where a strong line's peak reaches above that (a resolved line spans
 * several pixels, a spike one or two), up to three spans above the data.
 */
/** The pixel of this rank from the top sets the peak kept in view. */
const PEAK_RANK = 4;

export function robustRange(flux: readonly (number | null)[], wave: readonly (number | null)[], lo: number, hi: number): [number, number] {
  const inside: number[] = [];
  for (let i = 0; i < flux.length; i++) {
    const f = flux[i];
    const w = wave[i];
    if (f !== null && Number.isFinite(f) && w !== null && w >= lo && w <= hi) inside.push(f);
  }
  if (inside.length === 0) return [0, 1];
  inside.sort((a, b) => a - b);
  const at = (q: number) => inside[Math.min(inside.length - 1, Math.max(0, Math.round(q * (inside.length - 1))))];
  const bottom = at(0.01);
  const top = at(0.995);
  const span = top - bottom || Math.abs(top) || 1;
  const peak = Math.min(inside[Math.max(0, inside.length - PEAK_RANK)], top + 3 * span);
  return [bottom - 0.35 * span, Math.max(top + 0.4 * span, peak + 0.05 * span)];
}

/** The template multiplied by the least-squares factor a = Σ f·t / Σ t² over good pixels. */
export function scaleToSpectrum(flux: readonly (number | null)[], template: readonly (number | null)[], mask: readonly number[]): (number | null)[] {
  let ft = 0;
  let tt = 0;
  for (let i = 0; i < flux.length; i++) {
    const f = flux[i];
    const t = template[i];
    if (mask[i] || f === null || t === null || !Number.isFinite(f) || !Number.isFinite(t)) continue;
    ft += f * t;
    tt += t * t;
  }
  const a = tt > 0 ? ft / tt : 1;
  return template.map((t) => (t === null ? null : a * t));
}
