/** The line above the plot: which object and file, and what the file says about its wavelengths. */
import type { SpectrumMetaView } from '../../core/api/host-api.js';
import type { AppState } from '../app/state.js';
import { el, fill } from '../ui/dom.js';

export function renderSpectrumTitle(state: AppState, box: HTMLElement, move: (action: 'previous' | 'next' | 'next-pending') => void): void {
  const v = state.view;
  const meta = v?.meta;
  if (!state.currentId) {
    fill(box, el('span', { class: 'muted' }, 'no spectrum selected'));
    return;
  }
  const nav = el('span', { class: 'nav' },
    el('button', { type: 'button', onclick: () => move('previous'), title: 'previous spectrum (p or ↑)' }, '◀ previous'),
    el('button', { type: 'button', onclick: () => move('next'), title: 'next spectrum (n or ↓)' }, 'next ▶'),
    el('button', { type: 'button', onclick: () => move('next-pending'), title: 'next pending spectrum (Shift+N)' }, 'next pending ▶▶'));
  const facts = meta
    ? [
        el('span', {}, `${meta.format}${meta.hdu !== null ? `, HDU ${meta.hdu}` : ''}`),
        meta.waveUnitDoubt ? el('span', { class: 'warn', id: 'wave-unit-doubt', title: meta.waveUnitDoubt }, `⚠ wavelength unit guessed: ${meta.waveUnitDoubt}`) : null,
        mediumFact(meta),
        el('span', { title: meta.velocityFrameReason }, `frame: ${meta.velocityFrame}`),
        meta.dateObsUtc ? el('span', {}, `${readableUtc(meta.dateObsUtc)} UTC${meta.exposureS ? `, ${meta.exposureS} s` : ''}`) : null,
      ].filter((f) => f !== null)
    : [];
  // Warnings first, so that an ellipsis on a narrow window never hides them.
  facts.sort((a, b) => Number(b.classList.contains('warn')) - Number(a.classList.contains('warn')));
  // One line of facts under the name; on a narrow window it ends in an ellipsis, the whole text in its tooltip.
  // Kept (blank) while the file loads, so that the plot below does not move when the facts arrive.
  const factLine = el('span', { class: 'facts' }, ...(facts.length ? facts.flatMap((f, i) => (i === 0 ? [f] : [' · ', f])) : ['\u00a0']));
  factLine.title = facts.map((f) => f.textContent).join(' · ');
  fill(box,
    nav,
    el('span', { class: 'object' }, meta?.object ?? state.currentId),
    el('span', { class: 'meta mono' }, state.currentId),
    state.loading ? el('span', { class: 'meta' }, 'loading…') : null,
    factLine);
}

/**
 * How the wavelengths were read. An assumed medium is flagged: if it is wrong, z is off by about
 * 83 km/s (Hα: 6562.80 Å in air, 6564.61 Å in vacuum), and "measure again" can change it.
 */
function mediumFact(meta: SpectrumMetaView): HTMLElement {
  const shown = meta.mediumInFile === 'air' ? ', shown in vacuum' : '';
  if (meta.mediumSource === 'assumed') {
    return el('span', { class: 'warn', id: 'medium-fact', title: `${meta.mediumReason}. If the file is in the other medium, z is off by about 83 km/s: change it with "measure again" (Shift+M).` }, `⚠ ${meta.mediumInFile} wavelengths assumed${shown}`);
  }
  if (meta.mediumSource === 'user') return el('span', { id: 'medium-fact', title: meta.mediumReason }, `${meta.mediumInFile} wavelengths, as you set${shown}`);
  return el('span', { id: 'medium-fact', title: meta.mediumReason }, `${meta.mediumInFile} wavelengths in the file${shown}`);
}

/** 2026-03-14T02:48:00.000Z → 2026-03-14 02:48:00 */
function readableUtc(iso: string): string {
  return iso.replace('T', ' ').replace(/(\.\d*)?Z$/, '');
}
