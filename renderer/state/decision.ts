/**
 * The decision being made on the spectrum in view: a trial z (from a candidate, typed, from an
 * identified line, or nudged) and the grade (confidence, class, note); and the verdict each
 * decision key turns it into. Pure.
 */
import type { SpectrumView, VerdictInput } from '../../core/api/host-api.js';
import type { Confidence, ObjectClass, Verdict } from '../../core/catalogue/verdict.js';
import type { Candidate, TemplateClass } from '../../core/redshift/types.js';
import { parseDecimal } from '../../core/util/decimal.js';
import { nudgeZ } from '../science/z-math.js';

export type TrialSource = 'candidate' | 'typed' | 'line' | 'nudged' | 'saved' | 'none';

export interface Trial {
  z: number | null;
  zErr: number | null;
  template: string | null;
  /** Index into the candidates when the trial z is a candidate's, else null. */
  candidateIndex: number | null;
  source: TrialSource;
  /** Shown beside the trial z: e.g. "Hα at 8123.4 Å" or "+20 km/s from candidate 1". */
  detail: string;
  /** Sum of the velocity nudges since the last non-nudge choice, km/s. */
  nudgedKmS: number;
}

/** What the observer chose; null where nothing was chosen and the suggestion will be saved. */
export interface Grade {
  confidence: Confidence | null;
  objectClass: ObjectClass | null;
  note: string;
}

/**
 * The class suggested with a template. A narrow-line AGN template fitting best says that strong
 * [O III] and the other narrow lines are there, not what excites them: a metal-poor star-forming
 * dwarf fits it too. So it suggests 'galaxy', never false for a narrow-line emitter; 'agn' is
 * the observer's choice, from the host panel's diagnostic diagram.
 */
export const CLASS_OF_TEMPLATE: Record<TemplateClass, ObjectClass> = {
  'star-forming': 'galaxy',
  passive: 'galaxy',
  agn: 'galaxy',
  qso: 'qso',
  star: 'star',
  user: 'unknown',
};

/**
 * The candidates as the window shows and saves them: the first one refined (z and σz from the
 * fit) where there was a refinement, so the z on the screen is the z that "accept" saves.
 */
export function candidates(view: SpectrumView | null): Candidate[] {
  const m = view?.measurement;
  if (!m) return [];
  return m.best && m.candidates.length > 0 ? [m.best, ...m.candidates.slice(1)] : m.candidates;
}

/** The trial z as a spectrum opens: its saved verdict if any, otherwise the best candidate. */
export function openingTrial(view: SpectrumView | null): Trial {
  const v = view?.verdict;
  if (v?.status === 'no-redshift') return noRedshiftTrial();
  if (v && v.status !== 'pending') {
    const idx = v.z === null ? -1 : candidates(view).findIndex((c) => c.z === v.z);
    return { z: v.z, zErr: v.zErr, template: v.template, candidateIndex: idx >= 0 ? idx : null, source: 'saved', detail: `saved as ${v.status}`, nudgedKmS: 0 };
  }
  return candidateTrial(view, 0);
}

export function candidateTrial(view: SpectrumView | null, index: number): Trial {
  const c = candidates(view)[index];
  if (!c) return { z: null, zErr: null, template: null, candidateIndex: null, source: 'none', detail: 'no candidate', nudgedKmS: 0 };
  return { z: c.z, zErr: c.zErr, template: c.template, candidateIndex: index, source: 'candidate', detail: `candidate ${index + 1}, ${c.template}`, nudgedKmS: 0 };
}

/** After "no redshift": nothing to mark on the spectrum or to derive distances from. */
export function noRedshiftTrial(): Trial {
  return { z: null, zErr: null, template: null, candidateIndex: null, source: 'saved', detail: 'saved as no redshift', nudgedKmS: 0 };
}

/** Redshifts a person may type. */
const TYPED_Z_MIN = -0.01;
const TYPED_Z_MAX = 12;

/** A typed redshift, or why the text is not one. */
export function parseTypedZ(text: string): number | { refused: string } {
  const z = parseDecimal(text.trim().replace(/^−/, '-'));
  if (z === null || z < TYPED_Z_MIN || z > TYPED_Z_MAX) return { refused: `"${text.trim()}" is not a redshift between −0.01 and 12` };
  return z;
}

export function typedTrial(z: number): Trial {
  return { z, zErr: null, template: null, candidateIndex: null, source: 'typed', detail: 'typed', nudgedKmS: 0 };
}

export function lineTrial(z: number, lineLabel: string, observedWaveAngstrom: number, restWaveAngstrom: number): Trial {
  return { z, zErr: null, template: null, candidateIndex: null, source: 'line', detail: `${lineLabel} ${restWaveAngstrom.toFixed(2)} Å at ${observedWaveAngstrom.toFixed(1)} Å`, nudgedKmS: 0 };
}

export function nudgedTrial(trial: Trial, velocityKmS: number): Trial {
  if (trial.z === null) return trial;
  const total = trial.nudgedKmS + velocityKmS;
  const from = trial.source === 'nudged' ? trial.detail.replace(/^[+−-]?\d+ km\/s from /, '') : trial.detail;
  const sign = total >= 0 ? '+' : '−';
  // The fit's σz belongs to the fitted z; the nudged z is the observer's, saved without a σ.
  return { ...trial, z: nudgeZ(trial.z, velocityKmS), zErr: null, candidateIndex: null, source: 'nudged', detail: `${sign}${Math.abs(total)} km/s from ${from}`, nudgedKmS: total };
}

/** The grade as a spectrum opens: the saved one, else nothing chosen yet. */
export function openingGrade(view: SpectrumView | null): Grade {
  const v = view?.verdict;
  if (v && v.status !== 'pending') return { confidence: v.confidence, objectClass: v.objectClass, note: v.note };
  return { confidence: null, objectClass: null, note: v?.note ?? '' };
}

/**
 * The confidence and class saved when none was chosen: the automatic suggestion belongs to the
 * best candidate as measured, so only that z gets it; any other trial z is "tentative". The class
 * follows the trial's template (the best's for a typed or identified z).
 */
export function suggestedGrade(view: SpectrumView | null, trial: Trial): { confidence: Confidence | null; objectClass: ObjectClass } {
  const list = candidates(view);
  const m = view?.measurement;
  const ofTrial = list.find((c) => c.template === trial.template) ?? list[0];
  const objectClass = ofTrial ? CLASS_OF_TEMPLATE[ofTrial.templateClass] : 'unknown';
  if (trial.z === null) return { confidence: null, objectClass };
  const isBest = trial.source === 'candidate' && trial.candidateIndex === 0;
  if (!isBest || !m) return { confidence: 'tentative', objectClass };
  // "None credible" suggests nothing: the observer must choose a confidence or say no redshift.
  return { confidence: m.confidence === 'none' ? null : m.confidence, objectClass };
}

/** The grade as it will be saved: what was chosen, the suggestion elsewhere (null: neither). */
export function gradeToSave(view: SpectrumView | null, trial: Trial, grade: Grade): { confidence: Confidence | null; objectClass: ObjectClass; note: string } {
  const suggested = suggestedGrade(view, trial);
  return { confidence: grade.confidence ?? suggested.confidence, objectClass: grade.objectClass ?? suggested.objectClass, note: grade.note };
}

const NO_CONFIDENCE = 'the automatic measurement found nothing credible: choose a confidence first (s, l or t), or x for no redshift';

/** `note`: a note kept on a spectrum not vetted yet (saved as a pending verdict, so that it is not lost). */
export type Decision = { kind: 'accept-best' } | { kind: 'candidate'; index: number } | { kind: 'trial' } | { kind: 'no-redshift' } | { kind: 'regrade'; verdict: Verdict } | { kind: 'note' };

/** The verdict to save for a decision, or a one-line reason why it cannot be made. */
export function verdictFor(view: SpectrumView, decision: Decision, trial: Trial, grade: Grade): VerdictInput | { refused: string } {
  const trialOf = (d: Decision): Trial => (d.kind === 'accept-best' ? candidateTrial(view, 0) : d.kind === 'candidate' ? candidateTrial(view, d.index) : trial);
  const { confidence, objectClass, note } = gradeToSave(view, trialOf(decision), grade);
  const base = { id: view.id, objectClass, note };
  switch (decision.kind) {
    case 'accept-best': {
      const best = candidates(view)[0];
      if (!best) return { refused: 'there is no automatic candidate to accept' };
      if (confidence === null) return { refused: NO_CONFIDENCE };
      return { ...base, status: 'accepted', z: best.z, zErr: best.zErr, confidence, template: best.template };
    }
    case 'candidate': {
      const c = candidates(view)[decision.index];
      if (!c) return { refused: `there is no candidate ${decision.index + 1}` };
      if (decision.index === 0) return verdictFor(view, { kind: 'accept-best' }, trial, grade);
      return { ...base, status: 'revised', z: c.z, zErr: c.zErr, confidence, template: c.template };
    }
    case 'trial':
      if (trial.z === null) return { refused: 'there is no trial z to save' };
      // Enter on a verdict as it was saved keeps its status (only the grade may have changed).
      if (trial.source === 'saved' && view.verdict) return verdictFor(view, { kind: 'regrade', verdict: view.verdict }, trial, grade);
      if (trial.source === 'candidate' && trial.candidateIndex !== null) return verdictFor(view, { kind: 'candidate', index: trial.candidateIndex }, trial, grade);
      return { ...base, status: 'revised', z: trial.z, zErr: trial.source === 'saved' ? trial.zErr : null, confidence, template: trial.template };
    case 'no-redshift':
      // With no z there is no template to take a class from: unknown unless chosen.
      return { ...base, objectClass: grade.objectClass ?? 'unknown', status: 'no-redshift', z: null, zErr: null, confidence: null, template: null };
    case 'note':
      return { ...base, objectClass: grade.objectClass ?? 'unknown', status: 'pending', z: null, zErr: null, confidence: null, template: null };
    case 'regrade': {
      const v = decision.verdict;
      return { ...base, status: v.status, z: v.z, zErr: v.zErr, confidence: v.status === 'no-redshift' ? null : (confidence ?? v.confidence), template: v.template };
    }
  }
}
