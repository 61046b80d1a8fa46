// The fast paths of the refinement stage against the plain computations they replace.
import { describe, expect, it } from 'vitest';
import { unitGaussian } from '../../core/redshift/gaussian.js';

/** Unit in the last place of a positive double. */
function ulp(x: number): number {
  return 2 ** (Math.floor(Math.log2(x)) - 52);
}

describe('unitGaussian', () => {
  it('is exp(−u²/2) within 2 ulp of Math.exp out to the profiles’ reach and beyond', () => {
    // Reference: Math.exp (ECMAScript's exponential; V8's is fdlibm's, within 1 ulp).
    let worstUlp = 0;
    for (let k = 0; k <= 600_000; k++) {
      const u = k * 1e-5;
      const exact = Math.exp(-0.5 * u * u);
      worstUlp = Math.max(worstUlp, Math.abs(unitGaussian(u) - exact) / ulp(exact));
      expect(unitGaussian(-u)).toBe(unitGaussian(u));
    }
    expect(worstUlp).toBeLessThanOrEqual(2);
  });

  it('is exact at the centre, follows Math.exp past the table and keeps NaN', () => {
    expect(unitGaussian(0)).toBe(1);
    for (const u of [5.01, 7, 12.3, 40]) expect(unitGaussian(u)).toBe(Math.exp(-0.5 * u * u));
    expect(unitGaussian(NaN)).toBeNaN();
    expect(unitGaussian(Infinity)).toBe(0);
  });
});
