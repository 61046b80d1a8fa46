/** The candidate table: z ± σz, template, Tonry–Davis r, overlap, and the suggested confidence. */
import type { AppState } from '../app/state.js';
import { candidates } from '../state/decision.js';
import { el, fill } from '../ui/dom.js';
import { fmtZErr } from '../ui/format.js';
import { confidenceBadge } from './worklist-panel.js';

export function renderCandidates(state: AppState, box: HTMLElement, onTry: (index: number) => void, onRemeasure: () => void): void {
  const list = candidates(state.view);
  const m = state.view?.measurement;
  if (!m || list.length === 0) {
    const v = state.view;
    // A file that was read but could not be measured (a flat spectrum) shows why; one that could not be read says so.
    const why = v?.error ? (v.arrays ? `no candidates: ${v.error}` : 'no candidates: the file could not be read') : m ? 'the correlation found no candidate' : 'no measurement yet';
    fill(box, el('p', { class: 'muted', id: 'no-candidates' }, why));
    return;
  }
  const refined = m.refinement.method === 'line-fit' ? 'joint line fit' : m.refinement.method === 'template-chi2' ? 'template χ² fit' : null;
  const head = el('tr', {}, ...['#', 'z ± σz', 'template', 'r (TD)', 'overlap'].map((h) => el('th', {}, h)));
  const rows = list.map((c, i) =>
    el('tr', { class: `clickable${state.trial.candidateIndex === i ? ' chosen' : ''}`, onclick: () => onTry(i), title: 'click to try this z' },
      el('td', {}, el('kbd', {}, String(i + 1))),
      el('td', { class: 'num' }, fmtZErr(c.z, c.zErr)),
      el('td', { class: 'nowrap' }, c.template),
      el('td', { class: 'num' }, c.r.toFixed(1)),
      el('td', { class: 'num' }, `${Math.round(100 * c.overlap)} %`)));
  fill(box,
    el('div', { class: 'panel-head' }, el('h2', {}, 'Candidates'), el('span', { class: 'nowrap' }, 'suggested:'), m.confidence === 'none' ? el('span', {}, 'none credible') : confidenceBadge(m.confidence), el('span', { class: 'nowrap' }, `· ${m.nLines} lines`),
      el('button', { type: 'button', class: 'ghost nowrap', onclick: onRemeasure, title: 'measure this spectrum again with another z range, templates, masks or wavelength medium (Shift+M)' }, 're-measure…')),
    el('table', {}, el('thead', {}, head), el('tbody', {}, ...rows)),
    el('p', { class: 'muted', id: 'candidate-order' }, `1 = best${refined ? ` (z, σz from the ${refined})` : ''} · order: √Δχ², then lines, not r alone`),
    m.notes.length ? el('p', { class: 'muted' }, m.notes.join(' · ')) : null);
}
