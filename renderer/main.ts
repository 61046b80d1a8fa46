/** Starts the window: connects to the host, builds the panels, and routes keys to the controller. */
import { connectHost } from './api/client.js';
import { Controller, keyOf, type LiveSlot, type View } from './app/controller.js';
import { Plots } from './app/plots.js';
import type { AppState } from './app/state.js';
import { renderCandidates } from './panels/candidates-panel.js';
import { gradeToSave } from './state/decision.js';
import { DecisionPanel } from './panels/decision-panel.js';
import { renderDerived, type LiveResult } from './panels/derived-panel.js';
import { renderHost } from './panels/host-panel.js';
import { renderHelp, renderLinePick } from './panels/overlays.js';
import { renderPlotControls } from './panels/plot-controls.js';
import { renderRemeasure } from './panels/remeasure-overlay.js';
import { renderSpectrumTitle } from './panels/spectrum-title.js';
import { renderExport, renderSaveState } from './panels/status-panels.js';
import { renderWorklist } from './panels/worklist-panel.js';
import { loadPlotly, type PlotElement } from './plot/plotly.js';
import { byId, el, fill } from './ui/dom.js';
import { actionFor } from './ui/keymap.js';

// plotly.min.js loads while the first host calls are on their way.
void loadPlotly();
const api = connectHost();
let controller: Controller;

const decision = new DecisionPanel(byId('decision'), {
  acceptBest: () => controller.decide({ kind: 'accept-best' }),
  saveTrial: () => controller.decide({ kind: 'trial' }),
  noRedshift: () => controller.decide({ kind: 'no-redshift' }),
  identify: () => controller.act('identify-line'),
  undo: () => void controller.undo(),
  nudge: (kms) => controller.nudge(kms),
  typedZ: (text) => controller.typedZ(text),
  confidence: (c) => controller.setConfidence(c),
  objectClass: (c) => controller.setClass(c),
  note: (text) => controller.setNote(text),
});

const plots = new Plots(byId<PlotElement>('spectrum-plot'), byId<PlotElement>('correlation-plot'), {
  rangeChanged: (r) => controller.setRange(r),
  featureClicked: (w) => controller.featureClicked(w),
  candidateClicked: (i) => controller.tryCandidate(i),
});

function live<T>(slot: LiveSlot<T> | null, state: AppState): LiveResult<T> | null {
  if (!state.currentId || state.trial.z === null) return null;
  if (!slot) return { result: null, error: null, stale: true };
  return { result: slot.result, error: slot.error, stale: slot.key !== keyOf(state.currentId, state.trial.z) };
}

let lastTab: { tab: string; slot: unknown; stale: boolean; settings: unknown; view: unknown; objectClass: string; vetted: boolean } | null = null;

function renderTab(state: AppState): void {
  // The host panel's table and diagram want room: the side column widens while it is shown.
  const layout = document.querySelector('.layout')!;
  layout.classList.toggle('wide-side', state.tab === 'host');
  byId('tab-derived').setAttribute('aria-selected', String(state.tab === 'derived'));
  byId('tab-host').setAttribute('aria-selected', String(state.tab === 'host'));
  const slot = state.tab === 'derived' ? controller.derived : controller.host;
  const lv = state.tab === 'derived' ? live(controller.derived, state) : live(controller.host, state);
  const objectClass = gradeToSave(state.view, state.trial, state.grade).objectClass;
  const vetted = !!state.view?.verdict && state.view.verdict.status !== 'pending' && state.trial.source === 'saved';
  const now = { tab: state.tab, slot, stale: lv?.stale ?? true, settings: state.settings, view: state.view, objectClass, vetted };
  if (lastTab && (Object.keys(now) as (keyof typeof now)[]).every((k) => lastTab![k] === now[k])) return;
  lastTab = now;
  const body = byId('tab-body');
  if (state.view?.error && !state.view.arrays) fill(body, el('p', { class: 'muted' }, 'nothing to derive: the file could not be read'));
  else if (state.tab === 'derived') renderDerived(body, live(controller.derived, state), { preset: state.settings?.cosmologyPreset ?? 'planck18', custom: state.settings?.customCosmology ?? null }, (p) => void controller.setCosmology(p), objectClass === 'star');
  else renderHost(body, live(controller.host, state), { vetted, objectClass });
}

let overlayShown: AppState['modal'] = 'none';

function renderOverlay(state: AppState): void {
  const box = byId('overlay');
  box.hidden = state.modal === 'none';
  // The line pick sits at the side, so the spectrum and the marked feature stay in view.
  box.classList.toggle('side-dock', state.modal === 'line-pick');
  // The form keeps what is typed in it: drawn once when it opens.
  if (state.modal === 'remeasure' && overlayShown === 'remeasure') return;
  overlayShown = state.modal;
  if (state.modal === 'help') renderHelp(box);
  else if (state.modal === 'remeasure') {
    const templates = (state.view?.measurement?.correlations ?? []).map((c) => c.template);
    renderRemeasure(box, { templates, options: state.view?.measuredWith ?? {}, meta: state.view?.meta ?? null }, (o) => void controller.remeasure(o), () => controller.closeModal());
  }
  else if (state.modal === 'line-pick' && state.linePick) renderLinePick(box, state.linePick, state.linePick.choices, (i) => controller.chooseLine(i));
  else fill(box);
}

function renderProblem(state: AppState): void {
  const box = byId('spectrum-problem');
  const text = state.problem ?? (state.view && !state.view.arrays ? state.view.error : null) ?? (state.loading ? null : null);
  box.hidden = !text;
  if (text) fill(box, el('strong', {}, state.problem ? 'The host says: ' : 'This file cannot be read: '), el('span', { id: 'problem-text' }, text),
    state.problem ? null : el('p', { class: 'muted' }, 'It stays in the worklist; you can mark it "no redshift" (x) or move on (n).'));
}

const view: View = {
  panels(state) {
    renderWorklist(state, { filters: byId('filters'), items: byId('worklist-items'), progress: byId('progress'), name: byId('worklist-name'), warnings: byId('worklist-warnings') }, {
      filter: (f) => controller.setFilter(f),
      pick: (id) => void controller.show(id),
      open: (path) => void controller.openWorklist(path),
    });
    renderSpectrumTitle(state, byId('spectrum-title'), (a) => controller.act(a));
    renderProblem(state);
    renderPlotControls(state, byId('plot-controls'), {
      kernel: (k) => controller.setSmoothing(k, state.smoothing.widthPx),
      width: (px) => controller.setSmoothing(state.smoothing.kernel, px),
      template: (on) => controller.setTemplate(on),
      sky: (on) => controller.setSky(on),
    });
    renderCandidates(state, byId('candidates'), (i) => controller.tryCandidate(i), () => controller.act('remeasure'));
    decision.render(state);
    renderSaveState(state, byId('save-state'), byId('save-failure'), () => controller.retrySaves());
    renderExport(state, byId('export'), controller.unvettedNote(), (f) => void controller.exportAs(f));
    renderTab(state);
    renderOverlay(state);
  },
  async spectrum(state) {
    await plots.drawSpectrum(state);
    // Stamped for tests and the bench: which spectrum is drawn, at which trial z.
    const plot = byId('spectrum-plot');
    plot.dataset.spectrum = state.currentId ?? '';
    plot.dataset.z = String(state.trial.z);
    if (!performance.getEntriesByName('zvet:first-plot').length && state.view?.arrays) performance.mark('zvet:first-plot');
  },
  async correlation(state) {
    const template = await plots.drawCorrelation(state);
    const curves = state.view?.measurement?.correlations ?? [];
    fill(byId('correlation-head'), el('h2', { title: 'click a numbered candidate to try its z' }, 'Correlation'),
      el('span', { class: 'nowrap' }, template ?? 'none for this spectrum'),
      curves.length > 1 ? el('button', { type: 'button', class: 'ghost', title: `next of ${curves.length} templates (c)`, onclick: () => controller.act('cycle-correlation') }, 'other template', el('kbd', {}, 'c')) : null);
    return template;
  },
  fullRange: (state) => plots.fullRange(state),
  focusTypedZ: () => decision.focusTypedZ(),
  focusNote: () => decision.noteInput.focus(),
};

controller = new Controller(api, view);

// In browser mode the tab is all that holds a verdict the host has not written yet (its host may
// have stopped): closing or reloading the tab then asks first. The desktop window's host is its
// own process, so there it is not asked.
if (!window.zvetHost) {
  window.addEventListener('beforeunload', (e) => {
    if (controller.s.saves.length > 0) e.preventDefault();
  });
}

// Plotly keeps the size a plot was drawn at. Whenever a plot's box changes (the side column
// widens, the title wraps to another line, the window is resized) both are fitted again, once
// per frame, and the spectrum is redrawn for its new width.
let refitQueued = false;
const refitPlots = new ResizeObserver(() => {
  if (refitQueued) return;
  refitQueued = true;
  requestAnimationFrame(() => {
    refitQueued = false;
    void plots.resize().then(() => view.spectrum(controller.s));
  });
});
for (const id of ['spectrum-plot', 'correlation-plot']) refitPlots.observe(byId(id));

// A mouse click must not leave a button focused: Enter would then press that button again
// instead of saving the trial z. Tab still focuses buttons for keyboard users.
document.addEventListener('mousedown', (e) => {
  if ((e.target as HTMLElement).closest('button, input[type="checkbox"]')) e.preventDefault();
});

document.addEventListener('keydown', (e) => {
  const target = e.target as HTMLElement;
  if (target.matches('textarea, select, input:not([type="checkbox"])')) return;
  if (target.matches('button, input[type="checkbox"]') && (e.key === 'Enter' || e.key === ' ')) return;
  if (controller.s.modal === 'line-pick' && /^[1-9]$/.test(e.key)) {
    e.preventDefault();
    controller.chooseLine(Number(e.key) - 1);
    return;
  }
  const action = actionFor(e);
  if (!action) return;
  e.preventDefault();
  controller.act(action);
});
byId('help-button').addEventListener('click', () => controller.act('help'));
byId('tab-derived').addEventListener('click', () => controller.setTab('derived'));
byId('tab-host').addEventListener('click', () => controller.setTab('host'));
byId('overlay').addEventListener('click', (e) => {
  if (e.target === e.currentTarget) controller.closeModal();
});

void controller.start();
