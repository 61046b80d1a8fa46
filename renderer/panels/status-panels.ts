/** Save state in the top bar, the loud banner for a failed journal write, and the export box. */
import type { ExportFormat } from '../../core/api/host-api.js';
import type { AppState } from '../app/state.js';
import { el, fill } from '../ui/dom.js';

export function renderSaveState(state: AppState, line: HTMLElement, banner: HTMLElement, onRetry: () => void): void {
  const failed = state.saves.find((q) => q.state === 'failed');
  const busy = state.saves.length > 0 && !failed;
  fill(line,
    busy ? el('span', { class: 'saving' }, `saving ${state.saves.length}…`)
      : failed ? el('span', {}, `${state.saves.length} not saved`)
        : state.lastSaved ? el('span', { class: 'saved' }, `✓ saved ${state.lastSaved.id} at ${state.lastSaved.time}`) : el('span', {}, 'nothing saved yet this session'),
    state.message ? el('span', { class: 'muted' }, ` · ${state.message}`) : null);
  line.title = line.textContent ?? '';
  banner.hidden = !failed;
  if (failed) {
    fill(banner,
      el('span', {}, `⚠ NOT SAVED — ${failed.input.id}: ${failed.reason}. The window keeps ${state.saves.length === 1 ? 'it' : `these ${state.saves.length}`} queued until a write succeeds.`),
      el('button', { type: 'button', onclick: onRetry }, 'Retry now', el('kbd', {}, '⇧R')));
  }
}

export function renderExport(state: AppState, box: HTMLElement, unvetted: string, onExport: (f: ExportFormat) => void): void {
  fill(box,
    el('div', {}, 'Export the catalogue ', el('kbd', {}, '⇧E'), el('span', { class: 'muted' }, ' (all three)')),
    el('div', { class: 'buttons' }, ...(['csv', 'ecsv', 'fits'] as const).map((f) => el('button', { type: 'button', id: `export-${f}`, onclick: () => onExport(f) }, f.toUpperCase()))),
    state.exportResult ? el('div', { class: `result${state.exportResult.ok ? '' : ' bad'}`, id: 'export-result' }, ...breakablePath(state.exportResult.text)) : null,
    state.exportResult?.ok && unvetted ? el('div', { class: 'caveat', id: 'export-unvetted' }, unvetted) : null);
}

/** Text with a line-break opportunity after each "/", so a long path wraps between folders. */
function breakablePath(text: string): (string | HTMLElement)[] {
  return text.split('/').flatMap((part, i) => (i === 0 ? [part] : [el('wbr'), `/${part}`]));
}
