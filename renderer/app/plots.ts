/**
 * Draws the spectrum and correlation figures with Plotly.react (in place, never newPlot again)
 * and turns plotly's events into the controller's calls: zoom/pan, a click on a feature, a click
 * on a candidate.
 */
import type { AppState } from './state.js';
import { buildSpectrumFigure, FLUX_TRACE, fullWaveRange } from '../plot/spectrum-figure.js';
import { buildCorrelationFigure } from '../plot/correlation-figure.js';
import { loadPlotly, PLOT_CONFIG, type PlotElement } from '../plot/plotly.js';
import { candidates, gradeToSave } from '../state/decision.js';

export interface PlotEvents {
  rangeChanged(range: [number, number] | null): void;
  featureClicked(waveAngstrom: number): void;
  candidateClicked(index: number): void;
}

export class Plots {
  private spectrumWired = false;
  private correlationWired = false;
  private lastRange: [number, number] | null = null;

  constructor(private readonly spectrumEl: PlotElement, private readonly correlationEl: PlotElement, private readonly events: PlotEvents) {}

  /** Redraws the spectrum; resolves when plotly has drawn it. */
  async drawSpectrum(state: AppState): Promise<void> {
    const arrays = state.view?.arrays;
    const P = await loadPlotly();
    if (!arrays) {
      P.purge(this.spectrumEl);
      this.spectrumWired = false;
      return;
    }
    const templateFlux = state.showTemplate && state.trial.z !== null ? state.overlay?.flux ?? null : null;
    const fig = buildSpectrumFigure({
      arrays, fluxUnit: state.view?.meta?.fluxUnit ?? 'file units', z: state.trial.z, smoothing: state.smoothing, showSky: state.showSky,
      templateFlux, templateName: state.trial.template ?? state.view?.templateModel?.template ?? null, xRange: state.xRange,
      widthPx: this.spectrumEl.clientWidth || 900,
      heightPx: this.spectrumEl.clientHeight || 500,
      stellar: gradeToSave(state.view, state.trial, state.grade).objectClass === 'star',
      pick: state.linePick ? { featureAngstrom: state.linePick.waveAngstrom, clickAngstrom: state.linePick.clickAngstrom } : null,
    });
    this.lastRange = state.xRange ?? fig.fullRange;
    await P.react(this.spectrumEl, fig.data, fig.layout, PLOT_CONFIG);
    if (!this.spectrumWired) this.wireSpectrum();
  }

  /** After the layout changed size: fit both plots to their boxes again. */
  async resize(): Promise<void> {
    const P = await loadPlotly();
    for (const gd of [this.spectrumEl, this.correlationEl]) if (gd.querySelector('.main-svg')) await P.Plots.resize(gd);
  }

  fullRange(state: AppState): [number, number] | null {
    return state.view?.arrays ? fullWaveRange(state.view.arrays.waveAngstrom) : null;
  }

  private wireSpectrum(): void {
    this.spectrumWired = true;
    this.spectrumEl.on('plotly_relayout', (e: Record<string, unknown>) => {
      if (e['xaxis.autorange'] === true) return this.events.rangeChanged(null);
      const a = e['xaxis.range[0]'] ?? (e['xaxis.range'] as number[] | undefined)?.[0];
      const b = e['xaxis.range[1]'] ?? (e['xaxis.range'] as number[] | undefined)?.[1];
      if (typeof a === 'number' && typeof b === 'number' && (!this.lastRange || a !== this.lastRange[0] || b !== this.lastRange[1])) this.events.rangeChanged([a, b]);
    });
    this.spectrumEl.on('plotly_click', (e: { points?: { x: number; curveNumber: number }[]; event?: MouseEvent }) => {
      const p = e.points?.find((pt) => pt.curveNumber === FLUX_TRACE);
      if (!p || typeof p.x !== 'number') return;
      // Where the pointer was, not the drawn point plotly snapped to (on a decimated trace
      // that can be several Å away).
      const xa = (this.spectrumEl as unknown as { _fullLayout?: { xaxis?: { _offset: number; p2l(px: number): number } } })._fullLayout?.xaxis;
      const at = xa && e.event ? xa.p2l(e.event.clientX - this.spectrumEl.getBoundingClientRect().left - xa._offset) : NaN;
      this.events.featureClicked(Number.isFinite(at) ? at : p.x);
    });
  }

  async drawCorrelation(state: AppState): Promise<string | null> {
    const curves = state.view?.measurement?.correlations ?? [];
    const curve = curves.find((c) => c.template === state.correlationTemplate) ?? curves[0];
    const P = await loadPlotly();
    if (!curve) {
      P.purge(this.correlationEl);
      this.correlationWired = false;
      return null;
    }
    const fig = buildCorrelationFigure(curve, candidates(state.view), state.trial.z, state.trial.candidateIndex);
    await P.react(this.correlationEl, fig.data, fig.layout, { ...PLOT_CONFIG, displayModeBar: false });
    if (!this.correlationWired) {
      this.correlationWired = true;
      this.correlationEl.on('plotly_click', (e: { points?: { customdata?: unknown }[] }) => {
        const idx = e.points?.find((p) => typeof p.customdata === 'number')?.customdata;
        if (typeof idx === 'number') this.events.candidateClicked(idx);
      });
    }
    return curve.template;
  }
}
