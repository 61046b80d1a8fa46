/**
 * A template as a sum of profiles with one free amplitude each (a line, or a tied doublet; a
 * spectrum template is one profile), and their weighted least-squares amplitudes with the
 * template's signs. Used to draw a template on a spectrum and to refine absorption redshifts.
 */
import { invert } from './linalg.js';
import { lineGroups } from './line-groups.js';
import { addLineProfile, type Template } from './templates.js';

/**
 * One profile per free amplitude, each signed as the template has it (amplitudes are then ≥ 0),
 * and the template's own |strength| of each.
 */
export function templateBasis(t: Template, rest: Float64Array, instSigmaKmS: number): { basis: Float64Array[]; strength: number[] } {
  if (t.lines.length === 0) {
    const b = new Float64Array(rest.length);
    t.evaluate(rest, instSigmaKmS, b);
    return { basis: [b], strength: [1] };
  }
  const { members, nGroups } = lineGroups(t.lines);
  const basis = Array.from({ length: nGroups }, () => new Float64Array(rest.length));
  const strength = new Array<number>(nGroups).fill(0);
  t.lines.forEach((l, k) => {
    const { group, ratio } = members[k];
    addLineProfile(l, rest, instSigmaKmS, basis[group], Math.sign(l.strength) * ratio);
    if (ratio === 1) strength[group] = Math.abs(l.strength);
  });
  return { basis, strength };
}

/**
 * Weighted least-squares amplitudes ≥ 0 of the profiles in `groups` (the others stay 0): the
 * unconstrained solution, then the most negative amplitude fixed at 0 and the rest refitted
 * until none is negative (an active-set reduction, after Lawson & Hanson 1974, Solving Least
 * Squares Problems, ch. 23).
 */
export function nonNegativeFit(basis: Float64Array[], y: Float64Array, w: Float64Array, groups: number[]): Float64Array {
  const m = basis.length;
  const a = new Float64Array(m);
  const ata = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  const aty = new Array<number>(m).fill(0);
  const support = basis.map((b) => {
    const idx: number[] = [];
    for (let i = 0; i < b.length; i++) if (b[i] !== 0 && w[i] > 0) idx.push(i);
    return idx;
  });
  for (let g = 0; g < m; g++) {
    for (const i of support[g]) aty[g] += w[i] * basis[g][i] * y[i];
    for (let h = g; h < m; h++) {
      let s = 0;
      for (const i of support[g]) s += w[i] * basis[g][i] * basis[h][i];
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

/**
 * χ² of the template at z against y (weights w) at the observed wavelengths, each profile's
 * amplitude fitted with the template's sign. `rest` is scratch of the same length.
 */
export function templateChi2(template: Template, z: number, wave: Float64Array, y: Float64Array, w: Float64Array, instSigmaKmS: number, rest: Float64Array): { chi2: number; nFree: number } {
  for (let k = 0; k < wave.length; k++) rest[k] = wave[k] / (1 + z);
  const { basis } = templateBasis(template, rest, instSigmaKmS);
  const amplitude = nonNegativeFit(basis, y, w, basis.map((_, g) => g));
  let chi2 = 0;
  for (let k = 0; k < y.length; k++) {
    let m = 0;
    for (let g = 0; g < basis.length; g++) m += amplitude[g] * basis[g][k];
    chi2 += w[k] * (y[k] - m) ** 2;
  }
  return { chi2, nFree: 1 + basis.length };
}
