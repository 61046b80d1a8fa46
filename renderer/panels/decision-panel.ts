/**
 * The decision column: the trial z and where it came from, velocity nudges, typing a z, the
 * decision buttons, the grade (confidence, class, note) and the verdict now in the journal.
 * The two text fields are made once and kept, so typing is never interrupted by a redraw.
 */
import { CONFIDENCES, OBJECT_CLASSES, type Confidence, type ObjectClass } from '../../core/catalogue/verdict.js';
import type { AppState } from '../app/state.js';
import { candidates, suggestedGrade } from '../state/decision.js';
import { velocityBetweenKmS, zStepFor } from '../science/z-math.js';
import { el, fill } from '../ui/dom.js';
import { confidenceText, fmtZErr } from '../ui/format.js';
import { CONFIDENCE_LOOK } from '../ui/theme.js';

export interface DecisionHandlers {
  acceptBest(): void;
  saveTrial(): void;
  noRedshift(): void;
  identify(): void;
  undo(): void;
  nudge(kms: number): void;
  /** False when the text is not a redshift (the field keeps the focus to be corrected). */
  typedZ(text: string): boolean;
  confidence(c: Confidence): void;
  objectClass(c: ObjectClass): void;
  note(text: string): void;
}

export const NUDGE_STEPS_KMS = [-100, -10, 10, 100] as const;
const NUDGE_KEYS: Record<(typeof NUDGE_STEPS_KMS)[number], string> = { [-100]: '<', [-10]: ',', 10: '.', 100: '>' };
const CLASS_KEYS: Record<ObjectClass, string> = { galaxy: 'G', agn: 'A', qso: 'Q', star: 'S', unknown: 'U' };
const CONFIDENCE_KEYS: Record<Confidence, string> = { secure: 's', likely: 'l', tentative: 't' };

export class DecisionPanel {
  readonly zInput: HTMLInputElement;
  readonly noteInput: HTMLTextAreaElement;
  private readonly dynamicTop = el('div', { class: 'trial' });
  private readonly dynamicButtons = el('div', { class: 'decision-body' });
  private readonly typedProblem = el('div', { class: 'typed-problem', id: 'typed-z-problem', role: 'alert' });
  /** The spectrum the typed z belongs to: another one empties the field. */
  private typedFor: string | null = null;

  constructor(box: HTMLElement, private readonly on: DecisionHandlers) {
    this.zInput = el('input', { id: 'typed-z', class: 'typed-z', type: 'text', inputmode: 'decimal', 'aria-label': 'type a redshift', placeholder: 'e.g. 0.1234' });
    this.zInput.addEventListener('keydown', (e) => {
      if (e.key === 'Enter') {
        e.preventDefault();
        if (this.on.typedZ(this.zInput.value)) this.zInput.blur();
        else this.zInput.select();
      } else if (e.key === 'Escape') this.zInput.blur();
      e.stopPropagation();
    });
    this.noteInput = el('textarea', { id: 'note', 'aria-label': 'note', placeholder: 'note (m); Enter keeps it, Shift+Enter for a new line' });
    // Enter, Escape or a click elsewhere leaves the field, and leaving it keeps what was typed.
    this.noteInput.addEventListener('keydown', (e) => {
      if (e.key === 'Enter' && !e.shiftKey) {
        e.preventDefault();
        this.noteInput.blur();
      } else if (e.key === 'Escape') this.noteInput.blur();
      e.stopPropagation();
    });
    this.noteInput.addEventListener('change', () => this.on.note(this.noteInput.value));
    fill(box, this.dynamicTop,
      el('div', { class: 'row' }, el('span', { class: 'label' }, 'type z'), this.zInput, el('kbd', {}, 'z'), el('span', { class: 'muted' }, 'then Enter')),
      this.typedProblem,
      this.dynamicButtons,
      this.noteInput);
  }

  /** Focuses the z field with its text selected, so what is typed replaces it. */
  focusTypedZ(): void {
    this.zInput.focus();
    this.zInput.select();
  }

  render(state: AppState): void {
    const t = state.trial;
    if (state.currentId !== this.typedFor) {
      this.typedFor = state.currentId;
      this.zInput.value = '';
    }
    this.typedProblem.textContent = state.typedZProblem ?? '';
    this.typedProblem.hidden = !state.typedZProblem;
    const best = candidates(state.view)[0] ?? null;
    fill(this.dynamicTop,
      el('span', { class: 'muted' }, 'trial z'),
      el('span', { class: 'value', id: 'trial-z' }, t.z === null ? '—' : t.source === 'typed' ? `${t.z} (no σ)` : fmtZErr(t.z, t.zErr)),
      el('span', { class: 'detail' }, t.detail || ' ', best && t.z !== null ? offsetFromBest(best.z, t.z) : ''));
    const stepInfo = t.z === null ? '' : `10 km/s = Δz ${zStepFor(t.z, 10).toExponential(1)}`;
    const v = state.view?.verdict && state.view.verdict.status !== 'pending' ? state.view.verdict : null;
    const queued = state.saves.find((q) => q.input.id === state.currentId);
    // A chosen grade is pressed; where none is chosen, the one that will be saved is outlined.
    const suggested = suggestedGrade(state.view, t);
    // A file that cannot be read takes only "no redshift", a class, a note and undo.
    // With no spectrum open (an empty worklist) there is nothing to decide on.
    const noSpectrum = state.currentId === null;
    const noData = noSpectrum || (!!state.view && !state.view.arrays);
    const noZ = noData || t.z === null;
    this.zInput.disabled = noData;
    const gradeButton = (look: { chosen: boolean; suggested: boolean; key: string; disabled: boolean }, onclick: () => void, ...label: (string | HTMLElement)[]) =>
      el('button', { type: 'button', 'aria-pressed': look.chosen ? 'true' : 'false', class: look.suggested ? 'suggested' : null, disabled: look.disabled, title: look.suggested ? `${look.key} · suggested: saved with this unless you choose` : look.key, onclick }, ...label);
    const conf = (c: Confidence) => gradeButton({ chosen: state.grade.confidence === c, suggested: state.grade.confidence === null && suggested.confidence === c, key: CONFIDENCE_KEYS[c], disabled: noZ }, () => this.on.confidence(c),
      el('span', { style: `color:${CONFIDENCE_LOOK[c].colour}` }, `${CONFIDENCE_LOOK[c].shape} ${c}`), el('kbd', {}, CONFIDENCE_KEYS[c]));
    const cls = (c: ObjectClass) => gradeButton({ chosen: state.grade.objectClass === c, suggested: state.grade.objectClass === null && suggested.objectClass === c, key: `Shift+${CLASS_KEYS[c]}`, disabled: noSpectrum }, () => this.on.objectClass(c), c);
    fill(this.dynamicButtons,
      el('div', { class: 'row nudge' }, el('span', { class: 'label' }, 'nudge'),
        ...NUDGE_STEPS_KMS.map((s) => el('button', { disabled: noZ, type: 'button', title: `${s > 0 ? '+' : '−'}${Math.abs(s)} km/s (key ${NUDGE_KEYS[s]})${stepInfo ? ` · ${stepInfo}` : ''}`, onclick: () => this.on.nudge(s) }, `${s > 0 ? '+' : '−'}${Math.abs(s)}`)),
        el('span', { class: 'muted', title: 'keys , . for ±10 and < > for ±100 km/s' }, 'km/s')),
      el('div', { class: 'row decide-buttons' },
        el('button', { type: 'button', id: 'btn-accept', disabled: noData || candidates(state.view).length === 0, onclick: () => this.on.acceptBest() }, 'Accept best', el('kbd', {}, 'a')),
        el('button', { type: 'button', id: 'btn-save-trial', disabled: noZ, onclick: () => this.on.saveTrial() }, 'Save trial z', el('kbd', {}, 'Enter'))),
      el('div', { class: 'row' },
        el('button', { type: 'button', id: 'btn-no-z', disabled: noSpectrum, onclick: () => this.on.noRedshift() }, 'No redshift', el('kbd', {}, 'x')),
        el('button', { type: 'button', disabled: noData, 'aria-pressed': state.identifying ? 'true' : 'false', onclick: () => this.on.identify() }, 'Identify a line', el('kbd', {}, 'i')),
        el('button', { type: 'button', onclick: () => this.on.undo() }, 'Undo', el('kbd', {}, 'u'))),
      el('div', { class: 'row stacked' }, el('span', { class: 'label' }, 'confidence · dashed: suggested, saved unless you choose'), ...CONFIDENCES.map(conf)),
      el('div', { class: 'row stacked' }, el('span', { class: 'label' }, 'class (Shift + initial: G A Q S U)'), ...OBJECT_CLASSES.map(cls)),
      el('div', { class: `verdict-now${v ? '' : ' pending'}`, id: 'verdict-now', 'data-z': v ? String(v.z) : null },
        v ? verdictLine(v) : 'pending: not vetted yet',
        queued ? el('div', { class: 'muted' }, queued.state === 'failed' ? `NOT SAVED: ${queued.reason}` : 'saving…') : null),
      // What the last key did or why it was refused, in full beside the buttons (the top bar may cut it).
      state.message ? el('div', { class: 'decision-message', id: 'decision-message', role: 'status' }, state.message) : null);
    if (document.activeElement !== this.noteInput) this.noteInput.value = state.grade.note;
  }
}

/** How far the trial z is from the best: in km/s while that is a small velocity, else in z. */
function offsetFromBest(bestZ: number, z: number): string {
  const dv = velocityBetweenKmS(bestZ, z);
  if (Math.abs(dv) < 0.5) return '';
  if (Math.abs(dv) > LARGEST_OFFSET_KMS) return ` · Δz ${z >= bestZ ? '+' : '−'}${Math.abs(z - bestZ).toFixed(5)} from the best`;
  return ` · ${dv >= 0 ? '+' : '−'}${Math.abs(dv).toFixed(0)} km/s from the best`;
}

/** Offsets beyond this are another redshift, not a velocity nudge (common practice, no source). */
const LARGEST_OFFSET_KMS = 3000;

function verdictLine(v: NonNullable<AppState['view']>['verdict'] & object): HTMLElement {
  const look = confidenceText(v.status === 'no-redshift' ? null : v.confidence);
  return el('div', {},
    el('strong', {}, v.status), ' · ', v.status === 'no-redshift' ? 'no z' : `z = ${fmtZErr(v.z, v.zErr)}`, ' · ',
    el('span', { style: `color:${look.colour}` }, `${look.shape} ${look.text}`), ' · ', v.objectClass,
    el('div', { class: 'muted' }, `saved ${v.time.replace('T', ' ').slice(0, 19)} UTC by ${v.user}`));
}
