/** The worklist column: filters, one row per spectrum (status, z, confidence, class), progress. */
import type { SpectrumListItem, WorklistState } from '../../core/api/host-api.js';
import type { AppState } from '../app/state.js';
import { PLAIN_SPECTRUM_EXTENSIONS } from '../../core/spectrum/file-extensions.js';
import { el, fill } from '../ui/dom.js';
import { confidenceText, fmtZ } from '../ui/format.js';
import { FILTERS, passesFilter, progress, type WorklistFilter } from '../state/worklist-view.js';

const STATUS_GLYPH: Record<string, { glyph: string; word: string }> = {
  accepted: { glyph: '✓', word: 'accepted' },
  revised: { glyph: '✎', word: 'revised' },
  'no-redshift': { glyph: '∅', word: 'no redshift' },
  pending: { glyph: '·', word: 'pending' },
};

export function confidenceBadge(c: Parameters<typeof confidenceText>[0]): HTMLElement {
  const look = confidenceText(c);
  return el('span', { class: 'conf', style: `color:${look.colour}` }, el('span', { class: 'shape', 'aria-hidden': 'true' }, look.shape), look.text);
}

function row(item: SpectrumListItem, current: boolean, saving: Map<string, string>, onPick: (id: string) => void): HTMLElement {
  const v = item.verdict && item.verdict.status !== 'pending' ? item.verdict : null;
  const status = item.error ? { glyph: '⚠', word: 'unreadable' } : STATUS_GLYPH[v?.status ?? 'pending'];
  const zText = v ? (v.status === 'no-redshift' ? 'no z' : fmtZ(v.z, 4)) : item.suggestion ? `${fmtZ(item.suggestion.z, 4)}?` : '';
  // A note (kept even on a spectrum not vetted) is marked, its text in the row's tooltip.
  const note = item.verdict?.note ? ' · note' : '';
  const sub = item.error
    ? el('span', { class: 'problem' }, item.error)
    : v
      ? [confidenceBadge(v.status === 'no-redshift' ? null : v.confidence), el('span', {}, `${v.objectClass}${note}`)]
      : el('span', {}, `${item.suggestion ? `suggested: ${item.suggestion.confidence}, not vetted` : 'measuring…'}${note}`);
  return el('li', {
    'data-id': item.id, 'aria-current': current ? 'true' : 'false', tabindex: '-1', title: `${item.id}: ${status.word}${item.verdict?.note ? `; note: ${item.verdict.note}` : ''}`,
    onclick: () => onPick(item.id),
  },
  el('span', { class: 'status', 'aria-label': status.word }, status.glyph),
  el('span', { class: 'name' }, item.id),
  el('span', { class: v ? 'z' : 'z muted' }, zText),
  el('span', { class: 'sub' }, ...(Array.isArray(sub) ? sub : [sub]), saving.has(item.id) ? el('span', { class: saving.get(item.id) === 'failed' ? 'problem' : 'muted' }, saving.get(item.id) === 'failed' ? 'NOT SAVED' : 'saving…') : null));
}

/** With no worklist open: a folder to type, or one of the recent ones. Drawn once, so typing survives redraws. */
function openForm(state: AppState, items: HTMLElement, onOpen: (path: string) => void): void {
  if (items.querySelector('#open-path')) return;
  const input = el('input', { id: 'open-path', type: 'text', placeholder: 'folder of spectra (absolute path)', 'aria-label': 'worklist folder' });
  input.addEventListener('keydown', (e) => {
    if (e.key === 'Enter') onOpen(input.value);
    e.stopPropagation();
  });
  fill(items, el('li', { class: 'empty' },
    el('p', {}, 'Open a worklist: the folder of one night\'s spectra.'), input,
    el('p', {}, el('button', { type: 'button', onclick: () => onOpen(input.value) }, 'Open')),
    ...(state.settings?.recentWorklists ?? []).map((p) => el('p', {}, el('button', { type: 'button', class: 'ghost', title: p, onclick: () => onOpen(p) }, `recent: ${p}`)))));
}

export function renderWorklist(state: AppState, parts: { filters: HTMLElement; items: HTMLElement; progress: HTMLElement; name: HTMLElement; warnings: HTMLElement }, on: { filter(f: WorklistFilter): void; pick(id: string): void; open(path: string): void }): void {
  const wl = state.worklist;
  fill(parts.name, wl ? `· ${wl.name}` : '');
  const counts = new Map<WorklistFilter, number>(FILTERS.map((f) => [f, wl ? wl.items.filter((it) => passesFilter(it, f)).length : 0]));
  fill(parts.filters, ...FILTERS.map((f) => el('button', { type: 'button', 'aria-pressed': state.filter === f ? 'true' : 'false', onclick: () => on.filter(f) }, `${f} ${counts.get(f)}`)));
  const { vetted, total } = progress(wl?.items ?? []);
  fill(parts.progress, el('span', { class: 'bar', 'aria-hidden': 'true' }, el('span', { style: `width:${total ? (100 * vetted) / total : 0}%` })), `${vetted} of ${total} vetted`);
  const saving = new Map(state.saves.map((q) => [q.input.id, q.state]));
  if (!wl) return openForm(state, parts.items, on.open);
  const shown = wl.items.filter((it) => passesFilter(it, state.filter));
  // The spectrum in view stays in view when the filter leaves it out, and the list says so.
  const hidden = state.currentId !== null && !shown.some((it) => it.id === state.currentId);
  fill(parts.items,
    hidden ? el('li', { class: 'empty', id: 'hidden-current' }, `${state.currentId}, in view, is not ${state.filter}: n and p move among the ${state.filter} ones`) : null,
    ...(shown.length ? shown.map((it) => row(it, it.id === state.currentId, saving, on.pick)) : [el('li', { class: 'empty', id: 'empty-list' }, emptyListText(wl, state.filter))]));
  parts.items.querySelector('[aria-current="true"]')?.scrollIntoView({ block: 'nearest' });
  fill(parts.warnings, ...wl.warnings.map((w) => el('p', {}, `⚠ ${w}`)));
}

function emptyListText(wl: WorklistState, filter: WorklistFilter): string {
  if (wl.items.length === 0) return `no spectrum files in ${wl.root}: zvet lists the files ending in ${PLAIN_SPECTRUM_EXTENSIONS.join(' ')} (each also with .gz) in the folder and its subfolders`;
  return `no spectra are ${filter}`;
}
