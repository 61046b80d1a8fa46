/**
 * The short list offered after a click on a spectral feature: which rest line might it be, and
 * the z each choice implies. Lines that put the object near the current solution or one of the
 * candidates come first, then the strong lines a person usually identifies first.
 */
import { REST_LINES, type RestLine } from '../../core/redshift/line-list.js';
import { zFromFeature } from './z-math.js';

export interface LineChoice {
  line: RestLine;
  z: number;
  /** Why it is on the list, for the person choosing. */
  hint: 'near current z' | 'near a candidate' | 'strong line';
}

/** Lines astronomers identify first in low-resolution spectra (common practice, no source). */
const STRONG_LINE_IDS = ['Halpha', '[OIII]5008', 'Hbeta', '[OII]3727', 'MgII', 'CIV', 'Lya', 'CaK', 'CaH', 'NaD2', 'CIII]', 'Gband', 'Mgb5174', '[SII]6718', '[NII]6585'];

/** Two redshifts closer than this are "near" (Δz, common practice: a few hundred km/s at z≈0.3). */
const NEAR_DZ = 0.003;

export function likelyLines(clickWaveAngstrom: number, currentZ: number | null, candidateZs: readonly number[], opts: { zMin?: number; zMax?: number; max?: number } = {}): LineChoice[] {
  const zMin = opts.zMin ?? -0.005;
  const zMax = opts.zMax ?? 7;
  const max = opts.max ?? 8;
  const choices: LineChoice[] = [];
  const seen = new Set<string>();
  const add = (line: RestLine, hint: LineChoice['hint']) => {
    const z = zFromFeature(clickWaveAngstrom, line.waveVacuumAngstrom);
    if (seen.has(line.id) || z < zMin || z > zMax) return;
    seen.add(line.id);
    choices.push({ line, z, hint });
  };
  const byCloseness = (target: number) => [...REST_LINES]
    .filter((l) => Math.abs(zFromFeature(clickWaveAngstrom, l.waveVacuumAngstrom) - target) < NEAR_DZ * (1 + target))
    .sort((a, b) => Math.abs(zFromFeature(clickWaveAngstrom, a.waveVacuumAngstrom) - target) - Math.abs(zFromFeature(clickWaveAngstrom, b.waveVacuumAngstrom) - target));
  if (currentZ !== null) for (const l of byCloseness(currentZ)) add(l, 'near current z');
  for (const zc of candidateZs) for (const l of byCloseness(zc)) add(l, 'near a candidate');
  for (const id of STRONG_LINE_IDS) {
    const l = REST_LINES.find((x) => x.id === id);
    if (l) add(l, 'strong line');
  }
  return choices.slice(0, max);
}
