/**
 * templateModelFlux: a template at a trial redshift on the spectrum's own pixels, for the
 * window's overlay. The model is the spectrum's smooth continuum (estimated as for refinement,
 * with the template's lines masked) plus the template's line profiles at the template's widths,
 * broadened by the pixel width as the engine does; each line (or tied doublet) gets its own
 * amplitude, with the template's sign, by weighted linear least squares (weights 1/σ²;
 * e.g. Press et al., Numerical Recipes, §15.4). A spectrum template has one amplitude.
 */
import type { Spectrum } from '../spectrum/spectrum.js';
import { median } from './continuum.js';
import { invert } from './linalg.js';
import { lineGroups } from './line-groups.js';
import { nativeResidual } from './native-residual.js';
import { nativePixels, preprocess } from './preprocess.js';
import { availableTemplates, TemplateChoiceError } from './template-set.js';
import { addLineProfile, type Template } from './templates.js';
import type { MeasureOptions } from './types.js';

/**
 * Model flux (the spectrum's flux unit) at each pixel of `spectrum` for the template named
 * `template` (built-in, or a user one given in options) at redshift z. NaN where the model is
 * undefined: outside the template's rest range, outside the continuum's range, and on pixels
 * the file marks bad. Pixels in the telluric and sky masks get the model but do not steer the fit.
 */
export function templateModelFlux(template: string, z: number, spectrum: Spectrum, options: MeasureOptions = {}): Float64Array {
  const all = availableTemplates(options);
  const t = all.find((x) => x.name === template);
  if (!t) throw new TemplateChoiceError(`unknown template "${template}" (known: ${all.map((x) => x.name).join(', ')})`);
  if (!(z > -1) || !Number.isFinite(z)) throw new RangeError(`z ${z} is not a redshift (a number above −1)`);
  const masks = { maskTelluric: options.maskTelluric ?? true, maskSky: options.maskSky ?? true };
  const p = preprocess(spectrum, masks);
  const nr = nativeResidual(p, t, z);
  const readable = nativePixels(spectrum, { maskTelluric: false, maskSky: false }).native.good;
  const n = nr.waveAngstrom.length;
  const rest = Float64Array.from(nr.waveAngstrom, (w) => w / (1 + z));
  const [lo, hi] = t.restRangeAngstrom;
  const defined = new Uint8Array(n);
  for (let i = 0; i < n; i++) defined[i] = readable[i] && rest[i] >= lo && rest[i] <= hi && Number.isFinite(nr.continuum[i]) ? 1 : 0;

  const { basis, strength } = basisProfiles(t, rest, nr.pixelKmS);
  const weight = new Float64Array(n);
  for (let i = 0; i < n; i++) if (defined[i] && nr.good[i] && Number.isFinite(nr.resid[i])) weight[i] = 1 / (nr.sigma[i] * nr.sigma[i]);
  const { amplitude, fitted } = nonNegativeFit(basis, nr.resid, weight, defined);
  // A line mostly in a masked band (Na D on the sky line at z ≈ 0) is drawn at the template's
  // strength relative to the lines that were fitted.
  const scales = fitted.map((g) => amplitude[g] / strength[g]).filter((v) => v > 0);
  const scale = scales.length ? median(scales) : 0;
  for (let g = 0; g < basis.length; g++) if (!fitted.includes(g) && !(amplitude[g] > 0)) amplitude[g] = scale * strength[g];

  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (!defined[i]) {
      out[i] = NaN;
      continue;
    }
    let f = nr.continuum[i];
    for (let g = 0; g < basis.length; g++) f += amplitude[g] * basis[g][i];
    out[i] = f;
  }
  return out;
}

/**
 * One profile per free amplitude, each signed as the template has it (amplitudes are then ≥ 0),
 * and the template's own |strength| of each.
 */
function basisProfiles(t: Template, rest: Float64Array, instSigmaKmS: number): { basis: Float64Array[]; strength: number[] } {
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

/** A profile is fitted only where the fit sees at least this fraction of its Σ b² (common practice, no source). */
const MIN_FITTED_PROFILE = 0.5;

/**
 * Weighted least-squares amplitudes ≥ 0 of the profiles the fit sees enough of: the
 * unconstrained solution, then the most negative amplitude fixed at 0 and the rest refitted
 * until none is negative (an active-set reduction, after Lawson & Hanson 1974, Solving Least
 * Squares Problems, ch. 23).
 */
function nonNegativeFit(basis: Float64Array[], y: Float64Array, w: Float64Array, defined: Uint8Array): { amplitude: Float64Array; fitted: number[] } {
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
  const seen = (b: Float64Array, use: (i: number) => boolean) => {
    let s = 0;
    for (let i = 0; i < b.length; i++) if (use(i)) s += b[i] * b[i];
    return s;
  };
  const fitted = Array.from({ length: m }, (_, g) => g).filter(
    (g) => ata[g][g] > 0 && seen(basis[g], (i) => w[i] > 0) >= MIN_FITTED_PROFILE * seen(basis[g], (i) => defined[i] === 1),
  );
  const active = [...fitted];
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
  return { amplitude: a, fitted };
}
