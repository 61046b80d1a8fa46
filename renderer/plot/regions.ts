/** Wavelength regions shaded on the spectrum: masked pixels and the telluric O₂ bands. */

/**
 * Telluric O₂ bands in the observed frame, Å (approximate extents given in DESIGN.md, "Mask";
 * common practice: the Fraunhofer A and B bands).
 */
export const TELLURIC_BANDS = [
  { name: 'O₂ B band', loAngstrom: 6860, hiAngstrom: 6960 },
  { name: 'O₂ A band', loAngstrom: 7590, hiAngstrom: 7700 },
] as const;

export interface WaveRun {
  loAngstrom: number;
  hiAngstrom: number;
}

/**
 * Runs of masked pixels as wavelength intervals (pixel edges halfway to the neighbours). Runs
 * separated by at most `bridgePx` good pixels are merged so that scattered bad pixels do not
 * become hundreds of shapes.
 */
export function maskedRuns(waveAngstrom: readonly (number | null)[], mask: readonly number[], bridgePx = 2): WaveRun[] {
  const runs: { from: number; to: number }[] = [];
  for (let i = 0; i < mask.length; i++) {
    if (!mask[i]) continue;
    const last = runs[runs.length - 1];
    if (last && i - last.to - 1 <= bridgePx) last.to = i;
    else runs.push({ from: i, to: i });
  }
  const w = (i: number) => waveAngstrom[Math.min(Math.max(i, 0), waveAngstrom.length - 1)] ?? NaN;
  const edge = (i: number, side: -1 | 1) => {
    const here = w(i);
    const there = w(i + side);
    return Number.isFinite(there) && i + side >= 0 && i + side < waveAngstrom.length ? (here + there) / 2 : here;
  };
  return runs.map((r) => ({ loAngstrom: edge(r.from, -1), hiAngstrom: edge(r.to, 1) })).filter((r) => Number.isFinite(r.loAngstrom) && Number.isFinite(r.hiAngstrom));
}
