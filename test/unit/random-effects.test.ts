// The random-effects pieces behind the line-fit σz floor (core/math/random-effects.ts), checked
// against a published worked example and against answers known in closed form.
import { describe, expect, it } from 'vitest';
import { pauleMandelTau2, weightedMeanError } from '../../core/math/random-effects.js';
import { normalDeviates } from '../support/prng.js';

// The 13 BCG vaccine trials of Colditz et al. (1994, JAMA 271, 698), as the `dat.bcg` example
// data of R's metafor package (Viechtbauer 2010, J. Stat. Softw. 36(3)): TB cases and non-cases,
// vaccinated (tpos, tneg) and not (cpos, cneg); log risk ratios and their sampling variances.
const tpos = [4, 6, 3, 62, 33, 180, 8, 505, 29, 17, 186, 5, 27];
const tneg = [119, 300, 228, 13536, 5036, 1361, 2537, 87886, 7470, 1699, 50448, 2493, 16886];
const cpos = [11, 29, 11, 248, 47, 372, 10, 499, 45, 65, 141, 3, 29];
const cneg = [128, 274, 209, 12619, 5761, 1079, 619, 87892, 7232, 1600, 27197, 2338, 17825];
const yi = tpos.map((a, i) => Math.log(a / (a + tneg[i]) / (cpos[i] / (cpos[i] + cneg[i]))));
const vi = tpos.map((a, i) => 1 / a - 1 / (a + tneg[i]) + 1 / cpos[i] - 1 / (cpos[i] + cneg[i]));

describe('Paule–Mandel τ²', () => {
  it('is 0.3181 on the BCG trials, as metafor gives with method "PM"', () => {
    // Value printed by metafor's rma(yi, vi, method = "PM") on dat.bcg, to 4 decimals (from
    // memory; the same value is asserted by public test suites that re-implement metafor).
    expect(pauleMandelTau2(yi, vi)).toBeCloseTo(0.3181, 4);
  });

  it('solves its defining equation Σ w·(v − μ_w)² = k − 1', () => {
    const tau2 = pauleMandelTau2(yi, vi);
    const w = vi.map((v) => 1 / (v + tau2));
    const mu = w.reduce((s, wi, i) => s + wi * yi[i], 0) / w.reduce((s, wi) => s + wi, 0);
    expect(w.reduce((s, wi, i) => s + wi * (yi[i] - mu) ** 2, 0)).toBeCloseTo(yi.length - 1, 8);
  });

  it('is s² − σ² for values of one variance σ² (every moment estimator agrees there), and 0 when they agree within it', () => {
    const v = [3.1, -1.2, 0.4, 5.6, -2.2, 1.9];
    const mean = v.reduce((s, x) => s + x, 0) / v.length;
    const s2 = v.reduce((s, x) => s + (x - mean) ** 2, 0) / (v.length - 1);
    expect(pauleMandelTau2(v, v.map(() => 1.5))).toBeCloseTo(s2 - 1.5, 9);
    expect(pauleMandelTau2(v, v.map(() => 2 * s2))).toBe(0);
  });
});

describe('error of a weighted mean with intrinsic scatter', () => {
  it('gives metafor’s random-effects estimate and error for the BCG trials at τ² = 0.3132', () => {
    // metafor's REML fit of dat.bcg prints τ² = 0.3132, estimate −0.7145, se 0.1798 (from
    // memory of Viechtbauer 2010); with u = 1/(σ² + τ²) the error is 1/√Σu.
    const tau2 = 0.3132, u = vi.map((v) => 1 / (v + tau2));
    const su = u.reduce((s, x) => s + x, 0);
    expect(u.reduce((s, ui, i) => s + ui * yi[i], 0) / su).toBeCloseTo(-0.7145, 4);
    expect(weightedMeanError(u, vi, tau2)).toBeCloseTo(0.1798, 4);
    expect(weightedMeanError(u, vi, tau2)).toBeCloseTo(1 / Math.sqrt(su), 12);
  });

  it('matches the scatter of simulated weighted means whose weights are not 1/(σ² + τ²)', () => {
    // Known answer by simulation: 20,000 draws of 6 values about μ = 0 with errors σ_i and an
    // intrinsic scatter τ = 2, averaged with the weights 1/σ² (which ignore τ).
    const sigma = [0.3, 0.5, 1, 2, 4, 8], tau2 = 4, g = normalDeviates(7);
    const variances = sigma.map((s) => s * s), u = variances.map((v) => 1 / v);
    const su = u.reduce((s, x) => s + x, 0);
    let sum2 = 0;
    const draws = 20000;
    for (let d = 0; d < draws; d++) {
      let m = 0;
      sigma.forEach((s, i) => (m += u[i] * (Math.sqrt(tau2) * g() + s * g())));
      sum2 += (m / su) ** 2;
    }
    // The simulated error has a relative standard error of 1/√(2·20000) = 0.5 %.
    expect(Math.abs(Math.sqrt(sum2 / draws) / weightedMeanError(u, variances, tau2) - 1)).toBeLessThan(0.02);
  });
});
