/**
 * A template as a sum of profiles with one free amplitude each (a line, or a tied doublet; a
 * spectrum template is one profile), and their weighted least-squares amplitudes with the
 * template's signs. Used to draw a template on a spectrum and to refine absorption redshifts.
 */
import { lineGroups } from './line-groups.js';
import { choleskySolve } from './lm-fit.js';
import { addLineProfile, type Template } from './templates.js';

/**
 * One profile per free amplitude, each signed as the template has it (amplitudes are then ≥ 0),
 * and the template's own |strength| of each. Arrays in `reuse` (of rest's length) are zeroed
 * and filled instead of new ones.
 */
export function templateBasis(t: Template, rest: Float64Array, instSigmaKmS: number, reuse: Float64Array[] = []): { basis: Float64Array[]; strength: number[] } {
  const buffer = (g: number) => (reuse[g] ? reuse[g].fill(0) : (reuse[g] = new Float64Array(rest.length)));
  if (t.lines.length === 0) {
    const b = buffer(0);
    t.evaluate(rest, instSigmaKmS, b);
    return { basis: [b], strength: [1] };
  }
  const { members, nGroups } = lineGroups(t.lines);
  const basis = Array.from({ length: nGroups }, (_, g) => buffer(g));
  const strength = new Array<number>(nGroups).fill(0);
  t.lines.forEach((l, k) => {
    const { group, ratio } = members[k];
    addLineProfile(l, rest, instSigmaKmS, basis[group], Math.sign(l.strength) * ratio);
    if (ratio === 1) strength[group] = Math.abs(l.strength);
  });
  return { basis, strength };
}

/** Per profile, the indices (ascending) where it is non-zero and the weight positive. */
export function profileSupports(basis: Float64Array[], w: Float64Array): number[][] {
  return basis.map((b) => {
    const idx: number[] = [];
    for (let i = 0; i < b.length; i++) if (b[i] !== 0 && w[i] > 0) idx.push(i);
    return idx;
  });
}

/**
 * Weighted least-squares amplitudes ≥ 0 of the profiles in `groups` (the others stay 0): the
 * unconstrained solution, then the most negative amplitude fixed at 0 and the rest refitted
 * until none is negative (an active-set reduction, after Lawson & Hanson 1974, Solving Least
 * Squares Problems, ch. 23), each by a Cholesky solve of its normal equations.
 */
export function nonNegativeFit(basis: Float64Array[], y: Float64Array, w: Float64Array, groups: number[], support = profileSupports(basis, w)): Float64Array {
  const m = basis.length;
  const a = new Float64Array(m);
  const ata = new Float64Array(m * m), aty = new Float64Array(m);
  for (let g = 0; g < m; g++) {
    const sg = support[g], bg = basis[g];
    let sy = 0;
    for (const i of sg) sy += w[i] * bg[i] * y[i];
    aty[g] = sy;
    for (let h = g; h < m; h++) {
      // Only where both profiles are non-zero: the other terms are exactly 0.
      const sh = support[h], bh = basis[h];
      if (!sg.length || !sh.length || sg[sg.length - 1] < sh[0] || sh[sh.length - 1] < sg[0]) continue;
      const first = sh[0], last = sh[sh.length - 1];
      let s = 0;
      for (const i of sg) if (i >= first && i <= last) s += w[i] * bg[i] * bh[i];
      ata[g * m + h] = ata[h * m + g] = s;
    }
  }
  const active = groups.filter((g) => ata[g * m + g] > 0);
  const normal = new Float64Array(m * m), rhs = new Float64Array(m), sol = new Float64Array(m);
  while (active.length) {
    const n = active.length;
    let scale = 0;
    for (let u = 0; u < n; u++) {
      for (let v = 0; v < n; v++) scale = Math.max(scale, Math.abs((normal[u * n + v] = ata[active[u] * m + active[v]])));
      rhs[u] = aty[active[u]];
    }
    // Singular to working precision (a pivot below 1e-14 of the largest entry): the last profile goes.
    if (!choleskySolve(normal, rhs, sol, n, 1e-14 * scale)) {
      active.pop();
      continue;
    }
    let worst = -1;
    for (let k = 0; k < n; k++) if (sol[k] < 0 && (worst < 0 || sol[k] < sol[worst])) worst = k;
    if (worst < 0) {
      for (let k = 0; k < n; k++) a[active[k]] = sol[k];
      break;
    }
    active.splice(worst, 1);
  }
  return a;
}

/** Work arrays of templateChi2 for one set of wavelengths, reused from one z to the next. */
export interface Chi2Scratch {
  rest: Float64Array;
  model: Float64Array;
  basis: Float64Array[];
}

export function chi2Scratch(length: number): Chi2Scratch {
  return { rest: new Float64Array(length), model: new Float64Array(length), basis: [] };
}

/**
 * χ² of the template at z against y (weights w) at the observed wavelengths, each profile's
 * amplitude fitted with the template's sign.
 */
export function templateChi2(template: Template, z: number, wave: Float64Array, y: Float64Array, w: Float64Array, instSigmaKmS: number, scratch: Chi2Scratch): { chi2: number; nFree: number } {
  const { rest } = scratch;
  for (let k = 0; k < wave.length; k++) rest[k] = wave[k] / (1 + z);
  const { basis } = templateBasis(template, rest, instSigmaKmS, scratch.basis);
  const support = profileSupports(basis, w);
  const amplitude = nonNegativeFit(basis, y, w, basis.map((_, g) => g), support);
  // The model matters only where the weight is positive, and there each profile only on its support.
  const model = scratch.model.fill(0);
  for (let g = 0; g < basis.length; g++) if (amplitude[g] !== 0) for (const k of support[g]) model[k] += amplitude[g] * basis[g][k];
  let chi2 = 0;
  for (let k = 0; k < y.length; k++) chi2 += w[k] * (y[k] - model[k]) ** 2;
  return { chi2, nFree: 1 + basis.length };
}
