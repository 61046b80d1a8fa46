/**
 * Where a clicked feature really is: a click is good to a screen pixel (several Å on a full
 * spectrum), the line centre to a fraction of a resolution element. Within a few pixels of the
 * click, the pixel that departs most from the local continuum (a running median) is taken, and
 * a parabola through it and its two neighbours gives the centre (common practice, no source).
 */

export interface FeatureCentre {
  waveAngstrom: number;
  kind: 'emission' | 'absorption';
}

/** Pixels either side of the click searched for the feature's extreme. */
const SEARCH_PIXELS = 4;
/** Pixels either side used for the local continuum (a median, robust to the line itself). */
const CONTINUUM_PIXELS = 30;

function median(values: number[]): number {
  const s = values.filter(Number.isFinite).sort((a, b) => a - b);
  if (s.length === 0) return NaN;
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Index of the first wavelength ≥ w (wave ascending). */
function lowerBound(wave: ArrayLike<number | null>, w: number): number {
  let lo = 0;
  let hi = wave.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((wave[mid] ?? -Infinity) < w) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The centre of the feature nearest the click, or null when there is none to find. */
export function featureCentre(wave: ArrayLike<number | null>, flux: ArrayLike<number | null>, clickAngstrom: number): FeatureCentre | null {
  const n = wave.length;
  const at = Math.min(n - 1, lowerBound(wave, clickAngstrom));
  const value = (i: number) => (i >= 0 && i < n ? (flux[i] ?? NaN) : NaN);
  const around: number[] = [];
  for (let i = at - CONTINUUM_PIXELS; i <= at + CONTINUUM_PIXELS; i++) around.push(value(i));
  const continuum = median(around);
  if (!Number.isFinite(continuum)) return null;
  let best = -1;
  for (let i = Math.max(1, at - SEARCH_PIXELS); i <= Math.min(n - 2, at + SEARCH_PIXELS); i++) {
    if (Number.isFinite(value(i)) && (best < 0 || Math.abs(value(i) - continuum) > Math.abs(value(best) - continuum))) best = i;
  }
  if (best < 0) return null;
  const [y0, y1, y2] = [value(best - 1), value(best), value(best + 1)];
  const [w0, w1, w2] = [wave[best - 1], wave[best], wave[best + 1]];
  if (w0 === null || w1 === null || w2 === null) return null;
  const kind = y1 >= continuum ? 'emission' : 'absorption';
  const curvature = y0 - 2 * y1 + y2;
  // Vertex of the parabola through the three pixels, in pixel units from the middle one.
  const offset = Number.isFinite(curvature) && curvature !== 0 ? Math.max(-1, Math.min(1, (0.5 * (y0 - y2)) / curvature)) : 0;
  const waveAngstrom = offset >= 0 ? w1 + offset * (w2 - w1) : w1 + offset * (w1 - w0);
  return { waveAngstrom, kind };
}
