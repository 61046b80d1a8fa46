/**
 * measureRedshift: spectrum → redshift candidates with Tonry–Davis r and σz, the best one
 * refined, and a confidence suggestion. Pure (no I/O): runs in Node, a Worker or a browser.
 * The result is a suggestion until a person vets it.
 */
import type { Spectrum } from '../spectrum/spectrum.js';
import { absorptionFeatures, lineChi2Gain } from './absorption-evidence.js';
import { suggestConfidence } from './confidence.js';
import { correlate, type CorrelationCurveData } from './correlate.js';
import { detectLines, DETECTION_SNR, linesInRange } from './line-detection.js';
import { nativeResidual, type NativeResidual } from './native-residual.js';
import { displayCurve } from './correlation-display.js';
import { distinctPeaks } from './distinct-peaks.js';
import type { Peak } from './peaks.js';
import { preprocess, type PreparedSpectrum } from './preprocess.js';
import { fitTemplateChi2 } from './refine-chi2.js';
import { inUnitsOfNoise } from './flux-scale.js';
import { fitEmissionLines } from './refine-lines.js';
import { resolveTemplates } from './template-set.js';
import type { Template } from './templates.js';
import type { Candidate, Measurement, MeasureOptions, Refinement } from './types.js';


export interface StageTimes {
  preprocessMs: number;
  correlateMs: number;
  refineMs: number;
}

interface Scored {
  peak: Peak;
  template: Template;
}

export function measureRedshift(spectrum: Spectrum, options: MeasureOptions = {}, times?: StageTimes): Measurement {
  const t0 = now();
  const templates = resolveTemplates(options);
  const prepared = preprocess(inUnitsOfNoise(spectrum).spectrum, { maskTelluric: options.maskTelluric ?? true, maskSky: options.maskSky ?? true });
  const t1 = now();
  const curves = correlate(prepared, templates);
  const distinct = distinctPeaks(prepared, curves, templates, (options.maxCandidates ?? 5) + 1);
  const t2 = now();
  const m = finish(prepared, distinct, curves, options);
  const t3 = now();
  if (times) {
    times.preprocessMs += t1 - t0;
    times.correlateMs += t2 - t1;
    times.refineMs += t3 - t2;
  }
  return m;
}

function now(): number {
  return globalThis.performance ? globalThis.performance.now() : Date.now();
}

function toCandidate(s: Scored, p: PreparedSpectrum): Candidate {
  const lo = p.native.waveAngstrom[0], hi = p.native.waveAngstrom[p.native.waveAngstrom.length - 1];
  return {
    z: s.peak.z,
    zErr: s.peak.zErr,
    r: s.peak.r,
    template: s.template.name,
    templateClass: s.template.templateClass,
    overlap: s.peak.overlap,
    lines: linesInRange(s.template, s.peak.z, lo, hi),
  };
}

/** Below this observed span a line pattern can hardly be recognised (common practice, no source: low-resolution optical spectra span 3000 Å and more). */
const SHORT_SPAN_ANGSTROM = 1500;

function finish(p: PreparedSpectrum, distinct: Scored[], curves: CorrelationCurveData[], options: MeasureOptions): Measurement {
  const max = options.maxCandidates ?? 5;
  const candidates = distinct.slice(0, max).map((s) => toCandidate(s, p));
  const notes: string[] = [];
  const span = p.native.waveAngstrom[p.native.waveAngstrom.length - 1] - p.native.waveAngstrom[0];
  if (span < SHORT_SPAN_ANGSTROM) notes.push(`the spectrum spans only ${Math.round(span)} Å: few lines fall in it, so a redshift rests on one or two features (for a star, measure with the star template alone)`);
  const correlations = options.withCorrelation ? curves.map(displayCurve) : undefined;
  if (candidates.length === 0) {
    notes.push('no correlation peak: nothing in the spectrum matches a template');
    return { candidates, best: null, refinement: { method: 'none', chi2Red: null, nLinesFitted: 0 }, confidence: 'none', nLines: 0, ...(correlations ? { correlations } : {}), notes };
  }
  const { order, judgedOn, shared } = rankByLineEvidence(p, distinct);
  const top = distinct[order];
  if (order !== 0) {
    candidates.unshift(...candidates.splice(order, 1));
    distinct.unshift(...distinct.splice(order, 1));
  }
  // The chosen candidate is refined on a continuum with only its own lines masked (refitted
  // unless the ranking did); the runner-up's χ² needs only its lines masked, as the ranking's was.
  const ownResidual = (s: Scored) => {
    const judged = judgedOn.get(s);
    return judged && judged !== shared ? judged : nativeResidual(p, [{ template: s.template, z: s.peak.z }]);
  };
  const nr = ownResidual(top);
  let best: Candidate = { ...candidates[0] };
  let refinement: Refinement = { method: 'none', chi2Red: null, nLinesFitted: 0 };
  const fit = top.template.absorptionOnly
    ? fitTemplateChi2(nr, top.template, top.peak.z, Math.max(5 * top.peak.zErr, 3 * p.grid.step * (1 + top.peak.z)))
    : fitEmissionLines(nr, top.template, top.peak.z);
  if (fit) {
    best = { ...best, z: fit.z, zErr: fit.zErr };
    refinement = { method: top.template.absorptionOnly ? 'template-chi2' : 'line-fit', chi2Red: fit.chi2Red, nLinesFitted: fit.nLinesFitted };
  } else {
    notes.push('refinement did not converge: z and σz are from the correlation peak');
  }
  const detections = detectLines(nr, top.template, best.z);
  const nLines = detections.filter((d) => d.snr >= DETECTION_SNR).length;
  const lead = distinct.length > 1 ? top.peak.score / Math.max(distinct[1].peak.score, 1e-300) : Infinity;
  const absorption = top.template.absorptionOnly && top.template.lines.length
    ? {
        features: absorptionFeatures(top.template, detections),
        chi2Lead: lineChi2Gain(nr, top.template, best.z) - (distinct.length > 1 ? lineChi2Gain(judgedOn.get(distinct[1]) ?? ownResidual(distinct[1]), distinct[1].template, distinct[1].peak.z) : 0),
      }
    : undefined;
  const confidence = suggestConfidence({ r: top.peak.r, overlap: top.peak.overlap, nLines, lead, absorption });
  if (confidence === 'none') notes.push('no credible redshift: weak correlation or no lines detected');
  return { candidates, best, refinement, confidence, nLines, ...(correlations ? { correlations } : {}), notes };
}

/** Leading candidates compared by the lines they explain (common practice, no source). */
const EVIDENCE_CANDIDATES = 3;
/** Each line's S/N counts up to this, so the number of lines seen matters more than one line's strength. */
const EVIDENCE_SNR_CAP = 10;

/**
 * Index of the candidate whose template lines, each fitted alone, explain the most of the
 * spectrum: Σ min(S/N, cap)² over lines seen with the right sign. One strong line matched by the
 * wrong line of another template (broad Hα taken for Lyα) explains less than the full pattern.
 */
function rankByLineEvidence(p: PreparedSpectrum, distinct: Scored[]): { order: number; judgedOn: Map<Scored, NativeResidual>; shared: NativeResidual | null } {
  let order = 0, bestEvidence = -Infinity;
  const judgedOn = new Map<Scored, NativeResidual>();
  const compared = distinct.slice(0, EVIDENCE_CANDIDATES);
  // One continuum with every compared candidate's lines masked serves them all, unless that
  // leaves too few pixels: then each gets its own.
  const withLines = compared.filter((s) => s.template.lines.length > 0);
  const shared = withLines.length > 1 ? nativeResidual(p, withLines.map((s) => ({ template: s.template, z: s.peak.z }))) : null;
  compared.forEach((s, i) => {
    if (s.template.lines.length === 0) return;
    const nr = shared?.linesMasked ? shared : nativeResidual(p, [{ template: s.template, z: s.peak.z }]);
    judgedOn.set(s, nr);
    const ev = detectLines(nr, s.template, s.peak.z).reduce((acc, d) => acc + (d.snr >= DETECTION_SNR ? Math.min(d.snr, EVIDENCE_SNR_CAP) ** 2 : 0), 0);
    if (ev > bestEvidence) {
      bestEvidence = ev;
      order = i;
    }
  });
  return { order, judgedOn, shared };
}
