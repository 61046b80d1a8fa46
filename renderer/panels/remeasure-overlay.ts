/** The form for measuring a spectrum again: z range, which templates, which masks. */
import type { RemeasureOptions } from '../../core/api/host-api.js';
import { el, fill } from '../ui/dom.js';

export function renderRemeasure(box: HTMLElement, templates: readonly string[], onSubmit: (o: RemeasureOptions) => void, onCancel: () => void): void {
  const zmin = el('input', { type: 'text', inputmode: 'decimal', id: 'remeasure-zmin', placeholder: 'template default', 'aria-label': 'lowest z' });
  const zmax = el('input', { type: 'text', inputmode: 'decimal', id: 'remeasure-zmax', placeholder: 'template default', 'aria-label': 'highest z' });
  const boxes = templates.map((t) => ({ t, input: el('input', { type: 'checkbox', checked: true, value: t }) }));
  const telluric = el('input', { type: 'checkbox', checked: true });
  const sky = el('input', { type: 'checkbox', checked: true });
  const problem = el('p', { class: 'caveat' });
  const submit = () => {
    const opts: RemeasureOptions = { maskTelluric: telluric.checked, maskSky: sky.checked };
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
