/** The form for measuring a spectrum again: z range, which templates, which masks, and the medium of the file's wavelengths. */
import type { RemeasureOptions, SpectrumMetaView } from '../../core/api/host-api.js';
import { el, fill } from '../ui/dom.js';

/** What the form starts from: the options the spectrum in view was measured with, and how its wavelengths were read. */
export interface RemeasureStart {
  templates: readonly string[];
  options: RemeasureOptions;
  meta: SpectrumMetaView | null;
}

export function renderRemeasure(box: HTMLElement, start: RemeasureStart, onSubmit: (o: RemeasureOptions) => void, onCancel: () => void): void {
  const { templates, options: now } = start;
  const zmin = el('input', { type: 'text', inputmode: 'decimal', id: 'remeasure-zmin', placeholder: 'template default', 'aria-label': 'lowest z', value: now.zmin === undefined ? '' : String(now.zmin) });
  const zmax = el('input', { type: 'text', inputmode: 'decimal', id: 'remeasure-zmax', placeholder: 'template default', 'aria-label': 'highest z', value: now.zmax === undefined ? '' : String(now.zmax) });
  const boxes = templates.map((t) => ({ t, input: el('input', { type: 'checkbox', checked: true, value: t }) }));
  const telluric = el('input', { type: 'checkbox', checked: now.maskTelluric ?? true });
  const sky = el('input', { type: 'checkbox', checked: now.maskSky ?? true });
  const medium = el('select', { id: 'remeasure-medium', 'aria-label': "medium of the file's wavelengths" },
    el('option', { value: '' }, 'as the file says'),
    el('option', { value: 'air' }, 'air'),
    el('option', { value: 'vacuum' }, 'vacuum'));
  medium.value = now.medium ?? '';
  const problem = el('p', { class: 'caveat' });
  const submit = () => {
    const opts: RemeasureOptions = { maskTelluric: telluric.checked, maskSky: sky.checked };
    if (medium.value === 'air' || medium.value === 'vacuum') opts.medium = medium.value;
    for (const [input, key] of [[zmin, 'zmin'], [zmax, 'zmax']] as const) {
      if (input.value.trim() === '') continue;
      const v = Number(input.value);
      if (!Number.isFinite(v)) return fill(problem, `"${input.value}" is not a redshift`);
      opts[key] = v;
    }
    const chosen = boxes.filter((b) => b.input.checked).map((b) => b.t);
    if (chosen.length === 0) return fill(problem, 'choose at least one template');
    if (chosen.length < templates.length) opts.templates = chosen;
    onSubmit(opts);
  };
  const card = el('div', { class: 'card', role: 'dialog', 'aria-label': 'Measure again', id: 'remeasure-card' },
    el('h2', {}, 'Measure this spectrum again'),
    el('div', { class: 'row' }, el('span', { class: 'label' }, 'z from'), zmin, el('span', {}, 'to'), zmax),
    el('div', { class: 'row' }, el('span', { class: 'label' }, 'templates'), ...boxes.map((b) => el('label', {}, b.input, b.t))),
    el('div', { class: 'row' }, el('span', { class: 'label' }, 'masks'), el('label', {}, telluric, 'telluric O₂ A and B bands'), el('label', {}, sky, 'night-sky lines')),
    el('div', { class: 'row' }, el('span', { class: 'label' }, 'medium'), medium, el('span', { class: 'muted' }, "of the file's wavelengths")),
    el('p', { class: 'muted', id: 'remeasure-medium-now' }, mediumNow(start.meta)),
    problem,
    el('div', { class: 'row' }, el('button', { type: 'button', id: 'remeasure-go', onclick: submit }, 'Measure again', el('kbd', {}, 'Enter')), el('button', { type: 'button', onclick: onCancel }, 'Cancel', el('kbd', {}, 'Esc'))));
  card.addEventListener('keydown', (e) => {
    if (e.key === 'Enter') submit();
    else if (e.key === 'Escape') onCancel();
    else return;
    e.preventDefault();
    e.stopPropagation();
  });
  fill(box, card);
  zmin.focus();
}

/** How the wavelengths are read now; a wrong medium shifts z by about 83 km/s (Hα: 6562.80 Å air, 6564.61 Å vacuum). */
function mediumNow(meta: SpectrumMetaView | null): string {
  if (!meta) return '';
  return `Read now as ${meta.mediumInFile}: ${meta.mediumReason}. The wrong medium shifts z by about 83 km/s.`;
}
