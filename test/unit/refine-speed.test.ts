// The fast paths of the refinement stage against the plain computations they replace.
import { describe, expect, it } from 'vitest';
import { invert } from '../../core/math/linear-algebra.js';
import { unitGaussian } from '../../core/redshift/gaussian.js';
import { nonNegativeFit } from '../../core/redshift/template-basis.js';

/** Unit in the last place of a positive double. */
function ulp(x: number): number {
  return 2 ** (Math.floor(Math.log2(x)) - 52);
}

describe('unitGaussian', () => {
  it('is exp(−u²/2) within 2 ulp of Math.exp out to the profiles’ reach and beyond', () => {
    // Reference: Math.exp (ECMAScript's exponential; V8's is fdlibm's, within 1 ulp).
    let worstUlp = 0, asymmetric = 0;
    for (let k = 0; k <= 600_000; k++) {
      const u = k * 1e-5;
      const exact = Math.exp(-0.5 * u * u);
      worstUlp = Math.max(worstUlp, Math.abs(unitGaussian(u) - exact) / ulp(exact));
      if (unitGaussian(-u) !== unitGaussian(u)) asymmetric++;
    }
    expect(worstUlp).toBeLessThanOrEqual(2);
    expect(asymmetric).toBe(0);
  });

  it('is exact at the centre, follows Math.exp past the table and keeps NaN', () => {
    expect(unitGaussian(0)).toBe(1);
    for (const u of [5.01, 7, 12.3, 40]) expect(unitGaussian(u)).toBe(Math.exp(-0.5 * u * u));
    expect(unitGaussian(NaN)).toBeNaN();
    expect(unitGaussian(Infinity)).toBe(0);
  });
});

describe('nonNegativeFit', () => {
  // Three overlapping Gaussian profiles on 200 pixels with uneven weights.
  const n = 200;
  const basis = [60, 75, 140].map((c, g) => Float64Array.from({ length: n }, (_, i) => (Math.abs(i - c) <= 25 ? Math.exp(-0.5 * ((i - c) / (5 + g)) ** 2) : 0)));
  const w = Float64Array.from({ length: n }, (_, i) => 1 + (i % 7) / 3);
  const combine = (amp: number[]) => Float64Array.from({ length: n }, (_, i) => amp.reduce((s, a, g) => s + a * basis[g][i], 0));

  it('recovers the amplitudes of a noise-free sum of its profiles', () => {
    const truth = [2.5, 0.7, 4];
    const a = nonNegativeFit(basis, combine(truth), w, [0, 1, 2]);
    truth.forEach((t, g) => expect(a[g]).toBeCloseTo(t, 12));
  });

  it('holds a profile the data want negative at 0 and refits the others as Gauss–Jordan normal equations do', () => {
    const y = combine([2.5, -1.5, 4]);
    const a = nonNegativeFit(basis, y, w, [0, 1, 2]);
    expect(a[1]).toBe(0);
    // Reference: the weighted least-squares amplitudes of profiles 0 and 2 alone, by invert().
    const kept = [0, 2];
    const dot = (f: (i: number) => number) => Array.from({ length: n }, (_, i) => f(i)).reduce((s, v) => s + v, 0);
    const inv = invert(kept.map((g) => kept.map((h) => dot((i) => w[i] * basis[g][i] * basis[h][i]))))!;
    const rhs = kept.map((g) => dot((i) => w[i] * basis[g][i] * y[i]));
    kept.forEach((g, k) => expect(a[g]).toBeCloseTo(inv[k][0] * rhs[0] + inv[k][1] * rhs[1], 10));
  });
});
