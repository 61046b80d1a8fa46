/** Controls and key under the spectrum: smoothing, overlays, and what the marks mean. */
import type { AppState } from '../app/state.js';
import type { SmoothingKernel } from '../plot/smoothing.js';
import { MARKER_STYLE } from '../plot/markers.js';
import { el, fill } from '../ui/dom.js';
import { THEME } from '../ui/theme.js';

export interface PlotControlHandlers {
  kernel(k: SmoothingKernel): void;
  width(px: number): void;
  template(on: boolean): void;
  sky(on: boolean): void;
}

export function renderPlotControls(state: AppState, box: HTMLElement, on: PlotControlHandlers): void {
  const hasSky = Boolean(state.view?.arrays?.sky);
  const kernel = el('select', { 'aria-label': 'smoothing kernel', onchange: (e) => on.kernel((e.target as HTMLSelectElement).value as SmoothingKernel) },
    ...(['boxcar', 'gaussian'] as const).map((k) => el('option', { value: k, selected: state.smoothing.kernel === k }, k)));
  const width = el('input', { type: 'number', min: '1', max: '51', step: '2', value: String(state.smoothing.widthPx), 'aria-label': 'smoothing width in pixels',
    onchange: (e) => on.width(Number((e.target as HTMLInputElement).value)) });
  width.addEventListener('keydown', (e) => e.stopPropagation());
  const check = (label: string, checked: boolean, disabled: boolean, key: string, f: (on: boolean) => void) =>
    el('label', {}, el('input', { type: 'checkbox', checked, disabled, onchange: (e) => f((e.target as HTMLInputElement).checked) }), label, el('kbd', {}, key));
  fill(box,
    el('label', {}, 'smoothing', kernel, width, 'px', el('kbd', {}, '['), el('kbd', {}, ']'), el('kbd', {}, 'k')),
    check(state.overlayProblem && !state.overlay ? 'template (none from the host)' : 'template', state.showTemplate, !state.view?.measurement, 'o', on.template),
    check(hasSky ? 'sky' : 'sky (none in file)', state.showSky && hasSky, !hasSky, 'y', on.sky),
    el('span', { class: 'key-legend' },
      el('span', { style: `color:${THEME.emission}` }, `${MARKER_STYLE.emission.glyph} emission ─`),
      el('span', { style: `color:${THEME.absorption}` }, `${MARKER_STYLE.absorption.glyph} absorption ╌`),
      el('span', { style: `color:${THEME.both}` }, `${MARKER_STYLE.both.glyph} Balmer ─·`),
      el('span', {}, '▒ masked / O₂ bands')));
}
