/**
 * exp(−u²/2), the shape of every line profile the fits evaluate, about twice as fast as
 * Math.exp in their inner loops and within 2 ulp of it. Table-driven exponential (Tang 1989,
 * ACM Trans. Math. Softw. 15, 144): with y = −u²/2 and i = ⌊−256·y⌋, e^y = e^(−i/256)·e^r, where
 * r = y + i/256 ∈ (−1/256, 0] is exact (Sterbenz's lemma) and e^r is its Taylor polynomial to r⁵
 * (truncation below 5·10⁻¹⁸). Beyond the table (|u| > 5, past the profiles' reach) and for NaN,
 * Math.exp.
 */

const STEPS_PER_UNIT = 256;
/** Table entries: exponents down to −12.5 (u = 5) and a little beyond. */
const TABLE_LENGTH = 12.5 * STEPS_PER_UNIT + 2;
const EXP_TABLE = Float64Array.from({ length: TABLE_LENGTH }, (_, i) => Math.exp(-i / STEPS_PER_UNIT));

export function unitGaussian(u: number): number {
  const y = -0.5 * u * u;
  const t = -STEPS_PER_UNIT * y;
  if (!(t < TABLE_LENGTH - 1)) return Math.exp(y);
  const i = t | 0;
  const r = y + i / STEPS_PER_UNIT, r2 = r * r;
  return EXP_TABLE[i] * (1 + r + r2 * (0.5 + r * (1 / 6) + r2 * (1 / 24 + r * (1 / 120))));
}
