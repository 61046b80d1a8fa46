/**
 * Evidence for an absorption redshift, as an astronomer weighs it: how many distinct absorption
 * features (Ca II K, Ca II H, G band, Mg b, Na D …) are seen at the right depth sign, and how much
 * better the template's lines explain the spectrum at this redshift than the next candidate's do
 * (a χ² difference, each line's depth fitted with the template's sign).
 */
import { pixelArrays, pixelsNearLines, type NativeResidual } from './native-residual.js';
import type { LineDetection } from './line-detection.js';
import { DETECTION_SNR } from './line-detection.js';
import { chi2Scratch, templateChi2 } from './template-basis.js';
import type { Template } from './templates.js';

/** Lines closer than this in the rest frame are one feature (the Mg b triplet, Na D, Ca II H + Hε; common practice, no source). */
const FEATURE_MERGE_ANGSTROM = 20;

/** Number of distinct absorption features detected (S/N ≥ DETECTION_SNR with absorption sign). */
export function absorptionFeatures(template: Template, detections: LineDetection[]): number {
  const seen = new Set(detections.filter((d) => d.snr >= DETECTION_SNR).map((d) => d.id));
  const waves = template.lines.filter((l) => l.strength < 0 && seen.has(l.id)).map((l) => l.waveRestAngstrom).sort((a, b) => a - b);
  let features = 0, last = -Infinity;
  for (const w of waves) {
    if (w - last > FEATURE_MERGE_ANGSTROM) features++;
    last = w;
  }
  return features;
}

/** χ² the template's lines remove at z: Σw·y² − χ²(lines fitted), over the pixels near its lines. */
export function lineChi2Gain(nr: NativeResidual, template: Template, z: number): number {
  if (template.lines.length === 0) return 0;
  const idx = pixelsNearLines(nr, template, z, 4);
  if (idx.length === 0) return 0;
  const { wave, y, w } = pixelArrays(nr, idx);
  let syy = 0;
  for (let k = 0; k < y.length; k++) syy += w[k] * y[k] * y[k];
  return syy - templateChi2(template, z, wave, y, w, nr.pixelKmS, chi2Scratch(wave.length)).chi2;
}
