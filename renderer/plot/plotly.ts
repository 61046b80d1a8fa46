/**
 * plotly.js is the locally bundled plotly.min.js, loaded as its own script so app.js stays small:
 * the app starts its first host calls while the browser is still parsing plotly's 4.8 MB.
 */
import type * as PlotlyModule from 'plotly.js';

export type PlotlyApi = typeof PlotlyModule;

let loading: Promise<PlotlyApi> | null = null;

/** Loads plotly.min.js (once) from beside the page. */
export function loadPlotly(): Promise<PlotlyApi> {
  loading ??= new Promise((done, fail) => {
    const script = document.createElement('script');
    script.src = 'plotly.min.js';
    script.onload = () => {
      performance.mark('zvet:plotly-ready');
      done(plotly());
    };
    script.onerror = () => fail(new Error('plotly.min.js could not be loaded'));
    document.head.append(script);
  });
  return loading;
}

/** plotly, once loadPlotly() has resolved. */
export function plotly(): PlotlyApi {
  const p = (window as unknown as { Plotly?: PlotlyApi }).Plotly;
  if (!p) throw new Error('plotly.min.js did not load');
  return p;
}

/** Plot element with plotly's event API. */
export type PlotElement = HTMLElement & { on(event: string, handler: (e: any) => void): void };

export const PLOT_CONFIG: Partial<PlotlyModule.Config> = {
  displaylogo: false,
  responsive: true,
  scrollZoom: true,
  doubleClick: 'reset',
  showTips: false,
  modeBarButtonsToRemove: ['toImage', 'lasso2d', 'select2d', 'autoScale2d'],
};
