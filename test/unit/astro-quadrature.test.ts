// The Gauss–Kronrod rule's defining property (Kronrod 1965; Piessens et al. 1983, QUADPACK):
// the 15-point Kronrod extension of the 7-point Gauss rule integrates polynomials up to degree
// 3·7 + 2 = 23 exactly, the Gauss rule up to degree 13 — a check of every tabulated node and weight.
import { describe, expect, it } from 'vitest';
import { integrate, kronrod15 } from '../../core/astro/quadrature.js';

describe('Gauss–Kronrod quadrature', () => {
  it('K15 is exact for x^n on [−1, 1] up to n = 23, and not at n = 24', () => {
    for (let n = 0; n <= 23; n++) {
      const exact = n % 2 === 1 ? 0 : 2 / (n + 1);
      expect(kronrod15((x) => x ** n, -1, 1).value).toBeCloseTo(exact, 14);
    }
    expect(Math.abs(kronrod15((x) => x ** 24, -1, 1).value - 2 / 25)).toBeGreaterThan(1e-10);
  });

  it('the G7 error estimate vanishes up to degree 13 and not at degree 14', () => {
    for (let n = 0; n <= 13; n++) expect(kronrod15((x) => x ** n, -1, 1).error).toBeLessThan(1e-15);
    expect(kronrod15((x) => x ** 14, -1, 1).error).toBeGreaterThan(1e-6);
  });

  it('adapts to a peaked integrand: ∫0^1 1/(1e-4 + (x − 0.3)²) dx', () => {
    const a = 1e-2;
    const exact = (Math.atan(0.7 / a) + Math.atan(0.3 / a)) / a;
    expect(integrate((x) => 1 / (a * a + (x - 0.3) ** 2), 0, 1) / exact - 1).toBeLessThan(1e-12);
  });

  it('handles a reversed interval and refuses a non-finite integrand', () => {
    expect(integrate(Math.exp, 1, 0)).toBeCloseTo(1 - Math.E, 14);
    expect(() => integrate((x) => 1 / (x - 0.5), 0, 1)).toThrow(RangeError);
  });
});
