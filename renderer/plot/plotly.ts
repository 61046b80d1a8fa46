/**
 * plotly.js is loaded once as a classic script (the locally bundled plotly.min.js) before the
 * app; this gives it its types. Kept out of app.js so the app bundle stays small and quick to parse.
 */
import type * as PlotlyModule from 'plotly.js';

export type PlotlyApi = typeof PlotlyModule;

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
  modeBarButtonsToRemove: ['toImage', 'lasso2d', 'select2d', 'autoScale2d'],
};
