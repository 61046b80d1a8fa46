/** The two overlays: the help list of every key (drawn from the keymap itself) and the rest-line pick. */
import type { LineChoice } from '../science/line-pick.js';
import { el, fill } from '../ui/dom.js';
import { KEYMAP, keyLabel, type Binding } from '../ui/keymap.js';
import { MARKER_STYLE } from '../plot/markers.js';

export function renderHelp(box: HTMLElement): void {
  const groups = new Map<Binding['group'], Binding[]>();
  for (const b of KEYMAP) groups.set(b.group, [...(groups.get(b.group) ?? []), b]);
  const titles: Record<Binding['group'], string> = { Decide: 'Decide', Grade: 'Grade the verdict', Move: 'Move through the worklist', View: 'Look at the spectrum', Panels: 'Panels' };
  fill(box, el('div', { class: 'card', role: 'dialog', 'aria-label': 'Keys', id: 'help-card' },
    el('h2', {}, 'Keys  ', el('span', { class: 'muted' }, 'Esc or ? closes · every key also has a button or a click')),
    el('div', { class: 'help-grid' }, ...[...groups].map(([g, bs]) => el('section', {},
      el('h3', {}, titles[g]),
      ...bs.map((b) => el('div', { class: 'key' }, el('span', {}, ...b.keys.map((k) => el('kbd', {}, keyLabel(k)))), el('span', {}, b.label)))))),
    el('p', { class: 'muted' },
      `Line markers: ${MARKER_STYLE.emission.glyph} emission, solid line, label on top · ${MARKER_STYLE.absorption.glyph} absorption, dashed line, label at the bottom · ${MARKER_STYLE.both.glyph} Balmer (emission or absorption), dash-dot. `,
      'Grey bands: masked pixels; labelled bands: telluric O₂. Mouse: drag to zoom, wheel to zoom, double-click to reset, click a feature to identify it.')));
}

export function renderLinePick(box: HTMLElement, at: { waveAngstrom: number; clickAngstrom: number }, choices: readonly LineChoice[], onChoose: (i: number) => void): void {
  const items = choices.map((c, i) => el('li', { tabindex: '0', 'data-index': String(i), onclick: () => onChoose(i) },
    el('kbd', {}, String(i + 1)),
    el('span', {}, `${c.line.label} ${c.line.waveVacuumAngstrom.toFixed(2)} Å`),
    el('span', { class: 'hint' }, c.hint),
    el('span', { class: 'num' }, `z = ${c.z.toFixed(5)}`)));
  fill(box, el('div', { class: 'card', role: 'dialog', 'aria-label': 'Which line is this?', id: 'line-pick' },
    el('h2', {}, `Which line is the feature at ${at.waveAngstrom.toFixed(1)} Å?`),
    el('p', { class: 'muted' }, `Observed, vacuum: the centre (green) of the feature nearest your click at ${at.clickAngstrom.toFixed(1)} Å (dotted). z = λ / λ_rest − 1. Press a number or click; Esc cancels. Then check the markers, nudge, Enter saves.`),
    choices.length ? el('ol', { class: 'pick-list' }, ...items) : el('p', {}, 'No line in the list gives a redshift between 0 and 7 here.')));
}
