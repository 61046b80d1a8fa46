/**
 * Colours for a dim screen at night: dark grey ground, soft light text (no pure white), and
 * accents from the Okabe–Ito colour-blind-safe palette (Okabe & Ito 2008, "Color Universal
 * Design"). Meaning is never carried by colour alone; shapes, dashes and words carry it too.
 */
import type { Confidence } from '../../core/catalogue/verdict.js';

export const THEME = {
  ground: '#14171c',
  panel: '#1b1f26',
  grid: '#2b313a',
  axis: '#5a6472',
  text: '#d3d8de',
  muted: '#9aa4af',
  flux: '#c8d0da',
  errorBand: 'rgba(120, 150, 190, 0.28)',
  sky: '#a39b73',
  template: '#E69F00',
  emission: '#56B4E9',
  absorption: '#CC79A7',
  both: '#F0E442',
  masked: 'rgba(150, 150, 150, 0.16)',
  telluric: 'rgba(86, 180, 233, 0.10)',
  trialZ: '#009E73',
  font: 'system-ui, -apple-system, "Segoe UI", "Noto Sans", "DejaVu Sans", sans-serif',
  mono: 'ui-monospace, "DejaVu Sans Mono", "Noto Sans Mono", monospace',
} as const;

/** Confidence words with a shape as well as a colour: filled dots out of three. */
export const CONFIDENCE_LOOK: Record<Confidence, { colour: string; shape: string }> = {
  secure: { colour: '#56B4E9', shape: '●●●' },
  likely: { colour: '#CC79A7', shape: '●●○' },
  tentative: { colour: '#E69F00', shape: '●○○' },
};
