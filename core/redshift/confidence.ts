/**
 * The automatic confidence suggestion, in the verdict words. Common practice, no single source:
 * a Tonry–Davis r above about 3–5 with good overlap is trustworthy (DESIGN.md); we also ask for
 * lines actually seen and a clear lead over the next distinct candidate, and for absorption
 * spectra the distinct features seen and their χ² lead (absorptionConfidence). The thresholds were
 * set on noise simulations (test/unit/redshift-engine.test.ts) and the open spectra.
 */
import type { Confidence } from './types.js';

export interface ConfidenceInputs {
  r: number;
  overlap: number;
  nLines: number;
  /** √Δχ² of the best over that of the next distinct candidate (∞ when there is none). */
  lead: number;
  /** For an absorption template: distinct features seen, and the χ² its lines remove beyond the next candidate's. */
  absorption?: { features: number; chi2Lead: number };
}

export function suggestConfidence({ r, overlap, nLines, lead, absorption }: ConfidenceInputs): Confidence {
  // On pure noise the best peak reaches r ≈ 9 with one "line" and r < 5 with two.
  if (nLines < 2 || overlap < 0.3 || !(r >= 5 || nLines >= 4)) return 'none';
  if (r >= 8 && nLines >= 3 && overlap >= 0.5 && lead >= 1.3) return 'secure';
  const fromAbsorption = absorption && r >= ABSORPTION_MIN_R ? absorptionConfidence(absorption, overlap) : null;
  if (fromAbsorption) return fromAbsorption;
  if (r >= 5 && nLines >= 3 && lead >= 1.1) return 'likely';
  return 'tentative';
}

/** The correlation must still show a peak this clear for the absorption evidence to count. */
const ABSORPTION_MIN_R = 3;

/**
 * An absorption redshift is as good as the features that make it: a strong 4000 Å break with
 * Ca II H&K, the G band, Mg b and Na D all in place is secure even when the Tonry–Davis r is
 * modest (broad, blended absorption gives low, wide correlation peaks). Δχ² ≥ 100 over the next
 * candidate is a 10σ likelihood-ratio lead, ≥ 25 a 5σ one (common practice, no source); on
 * pure noise the best peak reached Δχ² ≈ 25 with one feature (test/unit/redshift-engine.test.ts).
 */
function absorptionConfidence({ features, chi2Lead }: { features: number; chi2Lead: number }, overlap: number): Confidence | null {
  if (features >= 5 && chi2Lead >= 100 && overlap >= 0.5) return 'secure';
  if (features >= 3 && chi2Lead >= 25) return 'likely';
  return null;
}
