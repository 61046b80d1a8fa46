/**
 * Means of measurements that scatter by more than their errors (the random-effects model):
 * v_i = μ + δ_i + e_i, with e_i ~ N(0, σ_i²) and an intrinsic δ_i ~ N(0, τ²) of its own.
 */

/**
 * τ² by the estimator of Paule & Mandel (1982, J. Res. Natl. Bur. Stand. 87, 377): the τ² ≥ 0 at
 * which Σ w·(v − μ_w)² = k − 1, with w = 1/(σ² + τ²) and μ_w the w-weighted mean (0 when that sum
 * is at most k − 1 already). Its weights even out as τ² grows, so one or two very precise values
 * do not decide it alone; Veroniki et al. (2016, Res. Synth. Methods 7, 55) recommend it.
 */
export function pauleMandelTau2(values: ArrayLike<number>, variances: ArrayLike<number>): number {
  const k = values.length;
  if (k < 2 || variances.length !== k) throw new RangeError(`pauleMandelTau2 needs two or more values with a variance each (got ${k} and ${variances.length})`);
  if (!(excessScatter(values, variances, 0) > 0)) return 0;
  // The sum falls as τ² grows and is below k − 1 at τ² = Σ(v − v̄)², v̄ the plain mean.
  let plain = 0;
  for (let i = 0; i < k; i++) plain += values[i] / k;
  let lo = 0, hi = 0;
  for (let i = 0; i < k; i++) hi += (values[i] - plain) ** 2;
  for (let it = 0; it < 100 && hi - lo > 1e-12 * hi; it++) {
    const mid = 0.5 * (lo + hi);
    if (excessScatter(values, variances, mid) > 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Σ w·(v − μ_w)² − (k − 1) with w = 1/(σ² + τ²). */
function excessScatter(values: ArrayLike<number>, variances: ArrayLike<number>, tau2: number): number {
  let sw = 0, swv = 0;
  for (let i = 0; i < values.length; i++) {
    const w = 1 / (variances[i] + tau2);
    sw += w;
    swv += w * values[i];
  }
  const mean = swv / sw;
  let q = 0;
  for (let i = 0; i < values.length; i++) q += (values[i] - mean) ** 2 / (variances[i] + tau2);
  return q - (values.length - 1);
}

/**
 * Standard error of the weighted mean Σ u·v / Σ u of values with variances σ_i² about μ and an
 * intrinsic scatter τ²: √(Σ u_i²·(σ_i² + τ²)) / Σ u_i. With u = 1/(σ² + τ²) it is the usual
 * random-effects error 1/√Σu; with equal σ_i it is √((σ² + τ²)/k).
 */
export function weightedMeanError(weights: ArrayLike<number>, variances: ArrayLike<number>, tau2: number): number {
  let su = 0, spread = 0;
  for (let i = 0; i < weights.length; i++) {
    su += weights[i];
    spread += weights[i] ** 2 * (variances[i] + tau2);
  }
  return Math.sqrt(spread) / su;
}
