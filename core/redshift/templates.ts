/**
 * Templates as the engine sees them: a rest-frame profile that can be evaluated at any vacuum
 * wavelength, a default z range, and the lines it holds. Built from the class line templates,
 * from user line lists, or from user rest-frame spectra.
 */
import { restLine } from './line-list.js';
import { LINE_TEMPLATES, type LineTemplateSpec } from './class-templates.js';
import { robustContinuum } from './continuum.js';
import { unitGaussian } from './gaussian.js';
import type { TemplateClass, UserLineTemplate, UserSpectrumTemplate } from './types.js';
import { SPEED_OF_LIGHT_KMS } from '../astro/constants.js';

const SQRT_2PI = Math.sqrt(2 * Math.PI);

export interface ProfileLine {
  id: string;
  waveRestAngstrom: number;
  /** Integrated strength (> 0 emission, < 0 absorption), template units. */
  strength: number;
  sigmaKmS: number;
}

export interface Template {
  name: string;
  templateClass: TemplateClass;
  zMin: number;
  zMax: number;
  /** Rest wavelengths (Å) where the template is defined. */
  restRangeAngstrom: [number, number];
  /** The lines (empty for spectrum templates). */
  lines: ProfileLine[];
  /** true when the template is absorption only (refined by χ² on a z grid, not a line fit). */
  absorptionOnly: boolean;
  /**
   * Adds the continuum-free rest-frame profile at each rest wavelength into out; lines are
   * broadened in quadrature by instSigmaKmS (the instrument or pixel width). With
   * strengthPower < 1 line strengths are compressed (|S|^p), as the correlation uses them.
   */
  evaluate(waveRestAngstrom: Float64Array, instSigmaKmS: number, out: Float64Array, strengthPower?: number): void;
}

/** Rest range covered by a line template: its lines ± this fraction (common practice, no source). */
const LINE_TEMPLATE_MARGIN = 0.03;

function lineTemplate(name: string, templateClass: TemplateClass, zMin: number, zMax: number, lines: ProfileLine[]): Template {
  const waves = lines.map((l) => l.waveRestAngstrom);
  const lo = Math.min(...waves) * (1 - LINE_TEMPLATE_MARGIN);
  const hi = Math.max(...waves) * (1 + LINE_TEMPLATE_MARGIN);
  return {
    name,
    templateClass,
    zMin,
    zMax,
    restRangeAngstrom: [lo, hi],
    lines,
    absorptionOnly: lines.every((l) => l.strength < 0),
    evaluate(waveRest, instSigmaKmS, out, strengthPower = 1) {
      for (const l of lines) addLineProfile(l, waveRest, instSigmaKmS, out, Math.sign(l.strength) * Math.pow(Math.abs(l.strength), strengthPower));
    },
  };
}

/**
 * Adds `scale` × the line's unit-area Gaussian (σ = the line's width and instSigmaKmS in
 * quadrature) at the sorted rest wavelengths into out, over ±5σ.
 */
export function addLineProfile(line: ProfileLine, waveRest: Float64Array, instSigmaKmS: number, out: Float64Array, scale: number): void {
  const n = waveRest.length;
  const sigmaA = (line.waveRestAngstrom * Math.hypot(line.sigmaKmS, instSigmaKmS)) / SPEED_OF_LIGHT_KMS;
  const peak = scale / (sigmaA * SQRT_2PI), inverseSigma = 1 / sigmaA;
  const b = line.waveRestAngstrom + 5 * sigmaA;
  for (let i = lowerBound(waveRest, line.waveRestAngstrom - 5 * sigmaA); i < n && waveRest[i] <= b; i++) {
    out[i] += peak * unitGaussian((waveRest[i] - line.waveRestAngstrom) * inverseSigma);
  }
}

export function lowerBound(sorted: Float64Array, x: number): number {
  let lo = 0, hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export function fromClassSpec(spec: LineTemplateSpec): Template {
  const lines = spec.lines.map((l) => ({
    id: l.id,
    waveRestAngstrom: restLine(l.id).waveVacuumAngstrom,
    strength: l.strength,
    sigmaKmS: l.sigmaKmS ?? spec.sigmaKmS,
  }));
  return lineTemplate(spec.name, spec.templateClass, spec.zMin, spec.zMax, lines);
}

/** Default σ of user lines, km/s (common practice, no source). */
const USER_LINE_SIGMA_KMS = 150;

export function fromUserLines(t: UserLineTemplate): Template {
  if (t.lines.length === 0) throw new Error(`line list ${t.name}: no lines`);
  const lines = t.lines.map((l) => ({
    id: l.id,
    waveRestAngstrom: l.waveVacuumAngstrom,
    strength: (l.kind === 'absorption' ? -1 : 1) * Math.abs(l.strength ?? 1),
    sigmaKmS: t.sigmaKmS ?? USER_LINE_SIGMA_KMS,
  }));
  return lineTemplate(t.name, 'user', t.zMin ?? 0, t.zMax ?? 1.5, lines);
}

/**
 * A rest-frame spectrum as a template: continuum removed the same robust way as for observed
 * spectra, then linearly interpolated. The instrument width is taken as already in the data.
 */
export function fromUserSpectrum(t: UserSpectrumTemplate): Template {
  const n = t.waveRestAngstrom.length;
  const good = new Uint8Array(n);
  for (let i = 0; i < n; i++) good[i] = Number.isFinite(t.flux[i]) && Number.isFinite(t.waveRestAngstrom[i]) ? 1 : 0;
  const cont = robustContinuum(t.flux, good, Math.max(16, Math.floor(n / 20)));
  const resid = new Float64Array(n);
  let scale = 0;
  for (let i = 0; i < n; i++) {
    resid[i] = good[i] ? t.flux[i] - cont[i] : 0;
    scale = Math.max(scale, Math.abs(resid[i]));
  }
  if (scale > 0) for (let i = 0; i < n; i++) resid[i] /= scale;
  const wave = t.waveRestAngstrom;
  return {
    name: t.name,
    templateClass: 'user',
    zMin: t.zMin ?? 0,
    zMax: t.zMax ?? 1.5,
    restRangeAngstrom: [wave[0], wave[n - 1]],
    lines: [],
    absorptionOnly: true,
    evaluate(waveRest, _inst, out) {
      for (let i = 0; i < waveRest.length; i++) {
        const x = waveRest[i];
        if (x < wave[0] || x > wave[n - 1]) continue;
        const j = Math.min(n - 2, Math.max(0, lowerBound(wave, x) - 1));
        const f = (x - wave[j]) / (wave[j + 1] - wave[j]);
        out[i] += resid[j] + f * (resid[j + 1] - resid[j]);
      }
    },
  };
}

let builtIn: Template[] | null = null;

/** The class templates, built once per process. */
export function builtInTemplates(): Template[] {
  return (builtIn ??= LINE_TEMPLATES.map(fromClassSpec));
}
