/** The line above the plot: which object and file, and what the file says about its wavelengths. */
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
  fill(box,
    nav,
    el('span', { class: 'object' }, meta?.object ?? state.currentId),
    el('span', { class: 'meta mono' }, state.currentId),
    meta ? el('span', { class: 'meta', title: meta.mediumReason }, `${meta.format}${meta.hdu !== null ? `, HDU ${meta.hdu}` : ''} · wavelengths in ${meta.mediumInFile} in the file, shown in vacuum`) : null,
    meta ? el('span', { class: 'meta', title: meta.velocityFrameReason }, `frame: ${meta.velocityFrame}`) : null,
    meta?.dateObsUtc ? el('span', { class: 'meta' }, `${meta.dateObsUtc} UTC${meta.exposureS ? `, ${meta.exposureS} s` : ''}`) : null,
    state.loading ? el('span', { class: 'meta' }, 'loading…') : null);
}
