/**
 * The best distinct correlation peaks over all templates, by score (√Δχ²). Coarse peaks of
 * narrow-line templates are described on the native grid as they come up (native-description.ts),
 * before they compete.
 */
import type { CorrelationCurveData } from './correlate.js';
import { describeOnNativeGrid, locateOnNativeGrid, type NativeLocation } from './native-description.js';
import { findPeaks, type Peak } from './peaks.js';
import type { PreparedSpectrum } from './preprocess.js';
import type { TemplateUse } from './template-set.js';
import type { Template } from './templates.js';

/** Peaks kept per template before merging across templates. */
const PEAKS_PER_TEMPLATE = 8;
/** Candidates closer than this in ln(1+z), or than a peak's FWHM, are the same solution (≈ 1500 km/s; common practice). */
const DISTINCT_LN = 0.005;

export interface ScoredPeak {
  peak: Peak;
  template: Template;
}

interface Contender {
  peak: Peak;
  curve: number;
  /** Where a narrow-line template's coarse peak lies on the native grid. */
  native: NativeLocation | null;
  z: number;
  score: number;
}

/** Up to `count` peaks, best first, no two closer than DISTINCT_LN or either one's width. */
export function distinctPeaks(p: PreparedSpectrum, curves: CorrelationCurveData[], uses: TemplateUse[], count: number): ScoredPeak[] {
  const all: Contender[] = [];
  curves.forEach((c, curve) => {
    for (const peak of findPeaks(c, PEAKS_PER_TEMPLATE)) {
      const native = c.describeNatively ? locateOnNativeGrid(p, c, uses[curve], peak) : null;
      all.push({ peak, curve, native, z: native?.z ?? peak.z, score: native?.score ?? peak.score });
    }
  });
  all.sort((a, b) => b.score - a.score);
  const kept: Contender[] = [];
  for (const s of all) {
    if (kept.length >= count) break;
    const apart = (k: Contender) => Math.abs(Math.log1p(k.z) - Math.log1p(s.z)) > Math.max(DISTINCT_LN, k.peak.widthLn, s.peak.widthLn);
    if (kept.every(apart)) kept.push(s);
  }
  return kept
    .map((s) => ({ peak: (s.native && describeOnNativeGrid(p, curves[s.curve], uses[s.curve], s.native)) || s.peak, template: curves[s.curve].template }))
    .sort((a, b) => b.peak.score - a.peak.score);
}
