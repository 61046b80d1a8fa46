/**
 * The automatic confidence suggestion, in the verdict words. Common practice, no single source:
 * a Tonry–Davis r above about 3–5 with good overlap is trustworthy (DESIGN.md); we also ask for
 * lines actually seen and a clear lead over the next distinct candidate. The thresholds were
 * set on noise simulations (test/unit/redshift-engine.test.ts) and the open spectra.
 */
import type { Confidence } from './types.js';

export interface ConfidenceInputs {
  r: number;
  overlap: number;
  nLines: number;
  /** √Δχ² of the best over that of the next distinct candidate (∞ when there is none). */
  lead: number;
}

export function suggestConfidence({ r, overlap, nLines, lead }: ConfidenceInputs): Confidence {
  // On pure noise the best peak reaches r ≈ 9 with one "line" and r < 5 with two.
  if (nLines < 2 || overlap < 0.3 || !(r >= 5 || nLines >= 4)) return 'none';
  if (r >= 8 && nLines >= 3 && overlap >= 0.5 && lead >= 1.3) return 'secure';
  if (r >= 5 && nLines >= 3 && lead >= 1.1) return 'likely';
  return 'tentative';
}
