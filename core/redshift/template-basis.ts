/**
 * A template as a sum of profiles with one free amplitude each (a line, or a tied doublet; a
 * spectrum template is one profile), and their weighted least-squares amplitudes with the
 * template's signs. Used to draw a template on a spectrum and to refine absorption redshifts.
 */
import { invert } from '../math/linear-algebra.js';
import { lineGroups } from './line-groups.js';
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
 * Squares Problems, ch. 23).
 */
export function nonNegativeFit(basis: Float64Array[], y: Float64Array, w: Float64Array, groups: number[], support = profileSupports(basis, w)): Float64Array {
  const m = basis.length;
  const a = new Float64Array(m);
  const ata = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  const aty = new Array<number>(m).fill(0);
  for (let g = 0; g < m; g++) {
    const sg = support[g];
    for (const i of sg) aty[g] += w[i] * basis[g][i] * y[i];
    for (let h = g; h < m; h++) {
      // Only where both profiles are non-zero: the other terms are exactly 0.
      const sh = support[h];
      if (!sg.length || !sh.length || sg[sg.length - 1] < sh[0] || sh[sh.length - 1] < sg[0]) continue;
      let s = 0;
      for (const i of sg) if (i >= sh[0] && i <= sh[sh.length - 1]) s += w[i] * basis[g][i] * basis[h][i];
      ata[g][h] = ata[h][g] = s;
    }
  }
  const active = groups.filter((g) => ata[g][g] > 0);
  while (active.length) {
    const inv = invert(active.map((g) => active.map((h) => ata[g][h])));
    if (!inv) {
      active.pop();
      continue;
    }
    const sol = inv.map((row) => row.reduce((s, v, j) => s + v * aty[active[j]], 0));
    let worst = -1;
    sol.forEach((v, k) => {
      if (v < 0 && (worst < 0 || v < sol[worst])) worst = k;
    });
    if (worst < 0) {
      active.forEach((g, k) => (a[g] = sol[k]));
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
