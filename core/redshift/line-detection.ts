/**
 * Which of a template's lines are seen at a redshift: each line's amplitude fitted alone (its
 * template width, continuum removed) by weighted least squares; seen when its S/N ≥ 3 with the
 * template's sign (common practice, no source).
 */
import { unitGaussian } from './gaussian.js';
import { lineRun, usable, type NativeResidual } from './native-residual.js';
import type { Template } from './templates.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';

export const DETECTION_SNR = 3;

export interface LineDetection {
  id: string;
  snr: number;
}

export function detectLines(nr: NativeResidual, template: Template, z: number): LineDetection[] {
  const out: LineDetection[] = [];
  for (const l of template.lines) {
    const [from, to] = lineRun(nr, l, z, 2.5);
    const centre = l.waveRestAngstrom * (1 + z);
    const sigmaA = (centre * Math.hypot(l.sigmaKmS, nr.pixelKmS)) / SPEED_OF_LIGHT_KMS;
    const invSigmaA = 1 / sigmaA;
    let sty = 0, stt = 0, used = 0;
    for (let i = from; i < to; i++) {
      if (!usable(nr, i)) continue;
      used++;
      const t = unitGaussian((nr.waveAngstrom[i] - centre) * invSigmaA);
      const w = 1 / (nr.sigma[i] * nr.sigma[i]);
      sty += w * t * nr.resid[i];
      stt += w * t * t;
    }
    if (used < 3 || !(stt > 0)) continue;
    const snr = (Math.sign(l.strength) * sty) / Math.sqrt(stt);
    out.push({ id: l.id, snr });
  }
  return out;
}

/** Ids of the template's lines whose observed wavelength at z lies inside [lo, hi] Å. */
export function linesInRange(template: Template, z: number, loAngstrom: number, hiAngstrom: number): string[] {
  return template.lines.filter((l) => l.waveRestAngstrom * (1 + z) >= loAngstrom && l.waveRestAngstrom * (1 + z) <= hiAngstrom).map((l) => l.id);
}
