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
import { inUnitsOfNoise } from './flux-scale.js';
import { nativeResidual } from './native-residual.js';
import { nativePixels, preprocess } from './preprocess.js';
import { availableTemplates, TemplateChoiceError } from './template-set.js';
import { nonNegativeFit, templateBasis } from './template-basis.js';
import type { MeasureOptions } from './types.js';

/** A profile is fitted only where the fit sees at least this fraction of its Σ b² (common practice, no source). */
const MIN_FITTED_PROFILE = 0.5;

/**
 * Model flux (the spectrum's flux unit) at each pixel of `spectrum` for the template named
 * `template` (built-in, or a user one given in options) at redshift z. NaN where the model is
 * undefined: outside the template's rest range, outside the continuum's range, and on pixels
 * the file marks bad. Pixels in the telluric and sky masks get the model but do not steer the fit.
 */
export function templateModelFlux(template: string, z: number, inFileUnits: Spectrum, options: MeasureOptions = {}): Float64Array {
  const all = availableTemplates(options);
  const t = all.find((x) => x.name === template);
  if (!t) throw new TemplateChoiceError(`unknown template "${template}" (known: ${all.map((x) => x.name).join(', ')})`);
  if (!(z > -1) || !Number.isFinite(z)) throw new RangeError(`z ${z} is not a redshift (a number above −1)`);
  // Fitted in units of the noise (flux-scale.ts), returned in the file's unit.
  const { spectrum, scale: noiseUnit } = inUnitsOfNoise(inFileUnits);
  const masks = { maskTelluric: options.maskTelluric ?? true, maskSky: options.maskSky ?? true };
  const p = preprocess(spectrum, masks);
  const nr = nativeResidual(p, [{ template: t, z }]);
  const readable = nativePixels(spectrum, { maskTelluric: false, maskSky: false }).native.good;
  const n = nr.waveAngstrom.length;
  const rest = Float64Array.from(nr.waveAngstrom, (w) => w / (1 + z));
  const [lo, hi] = t.restRangeAngstrom;
  const defined = new Uint8Array(n);
  for (let i = 0; i < n; i++) defined[i] = readable[i] && rest[i] >= lo && rest[i] <= hi && Number.isFinite(nr.continuum[i]) ? 1 : 0;

  const { basis, strength } = templateBasis(t, rest, nr.pixelKmS);
  const weight = new Float64Array(n);
  for (let i = 0; i < n; i++) if (defined[i] && nr.good[i] && Number.isFinite(nr.resid[i])) weight[i] = 1 / (nr.sigma[i] * nr.sigma[i]);
  const fitted = basis.map((_, g) => g).filter((g) => {
    const seen = energy(basis[g], weight);
    return seen > 0 && seen >= MIN_FITTED_PROFILE * energy(basis[g], defined);
  });
  const amplitude = nonNegativeFit(basis, nr.resid, weight, fitted);
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
    out[i] = f * noiseUnit;
  }
  return out;
}


/** Σ b² over the pixels where use[i] > 0. */
function energy(b: Float64Array, use: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < b.length; i++) if (use[i] > 0) s += b[i] * b[i];
  return s;
}
