/** The host-galaxy panel at the trial z: line table, [N II] diagram, class, Balmer decrement, SFR. */
import type { ObjectClass } from '../../core/catalogue/verdict.js';
import type { HostAnalysis } from '../../core/hosts/analyse.js';
import { distanceBasis } from '../../core/hosts/sfr.js';
import { restLine } from '../../core/redshift/line-list.js';
import { buildBptFigure } from '../plot/bpt-figure.js';
import { loadPlotly, PLOT_CONFIG } from '../plot/plotly.js';
import { el, fill } from '../ui/dom.js';
import { fmtNum } from '../ui/format.js';
import { usableResult, type LiveResult } from './derived-panel.js';

function lineLabel(name: string): string {
  const base = name.replace(/_broad$/, '');
  try {
    return `${restLine(base).label}${name.endsWith('_broad') ? ' broad' : ''}`;
  } catch {
    return name;
  }
}

/** Three significant figures, plain where that stays short, else in e-notation. */
function sig(v: number | null): string {
  if (v === null || !Number.isFinite(v)) return '—';
  const a = Math.abs(v);
  return a !== 0 && (a < 0.01 || a >= 1e5) ? v.toExponential(2) : String(Number(v.toPrecision(3)));
}

/** An SFR with its error, or as an upper limit where an AGN contributes to Hα. */
function sfrText(value: number | null, err: number | null, upperLimit: boolean): string {
  if (value === null) return '—';
  return upperLimit ? `< ${value.toPrecision(3)} M☉/yr (AGN)` : `${value.toPrecision(3)} ± ${(err ?? 0).toPrecision(2)} M☉/yr`;
}

/** Whether the z is a saved verdict's, and the class it goes with: the panel says what that means. */
export interface HostContext {
  vetted: boolean;
  objectClass: ObjectClass;
}

export function renderHost(box: HTMLElement, live: LiveResult<HostAnalysis> | null, context: HostContext): void {
  const h = usableResult(box, live, 'host lines');
  if (!h || !live) return;
  const caveats = [
    context.vetted ? null : 'At the trial z, not a vetted one: the lines and the class follow whatever z is tried.',
    context.objectClass === 'star' || context.objectClass === 'qso'
      ? `Class ${context.objectClass}: these diagnostics are meant for the emission lines of galaxies and narrow-line AGN.`
      : null,
  ].filter((c): c is string => c !== null);
  const unit = h.measurement.flux_unit;
  const c = h.classification;
  const plot = el('div', { class: 'bpt-plot', id: 'bpt-plot' });
  const rows = h.lines.filter((l) => l.limit === false || l.component === 'narrow').map((l) => el('tr', {},
    el('td', { class: 'nowrap' }, lineLabel(l.name)),
    el('td', { class: 'num' }, l.rest_wave.toFixed(1)),
    el('td', { class: 'num' }, l.limit ? `< ${sig(l.flux)}` : `${sig(l.flux)} ± ${sig(l.flux_err)}`),
    el('td', { class: 'num' }, l.limit ? '—' : l.ew_rest.toFixed(1)),
    el('td', { class: 'num' }, l.sn.toFixed(1)),
    el('td', { class: 'num' }, l.fwhm_kms === null ? '—' : l.fwhm_kms.toFixed(0))));
  const sfr = h.sfr;
  fill(box,
    live.stale ? el('p', { class: 'muted' }, 'updating…') : null,
    ...caveats.map((text) => el('p', { class: 'caveat host-context' }, text)),
    el('h2', {}, `Class: ${c.bpt}${c.agn_type ? ` (${c.agn_type})` : ''}${c.broad_balmer ? ', broad Balmer lines' : ''}`),
    el('p', { class: 'why' }, `[S II] diagram: ${c.sii} · [O I] diagram: ${c.oi}${c.missing.length ? ` · lacking S/N ≥ 3 (or outside the spectrum): ${c.missing.map(lineLabel).join(', ')}` : ''}`),
    plot,
    el('h2', {}, `Lines at z = ${h.z.toFixed(5)}`),
    el('table', { id: 'host-lines' },
      el('thead', {}, el('tr', {}, ...['line', 'λ rest (Å)', 'flux ± 1σ', 'EW rest (Å)', 'S/N', 'FWHM (km/s)'].map((t) => el('th', {}, t)))),
      el('tbody', {}, ...rows)),
    el('p', { class: 'muted' }, `Fluxes in ${unit} × Å; "<" marks a 3σ upper limit. ${h.measurement.stellar_absorption_method}`),
    el('h2', {}, 'Dust and star formation'),
    el('dl', {},
      el('dt', {}, 'Hα/Hβ'), el('dd', {}, h.balmer.decrement === null ? '—' : `${h.balmer.decrement.toFixed(2)} ± ${(h.balmer.decrement_err ?? 0).toFixed(2)}`),
      el('dt', {}, `E(B−V), ${h.balmer.curve}`), el('dd', {}, fmtNum(h.balmer.ebv, 3, 'mag')),
      el('dt', {}, 'D_L'), el('dd', {}, sfr.luminosity_distance_mpc ? `${sfr.luminosity_distance_mpc.toFixed(1)} Mpc ${distanceBasis(sfr.luminosity_distance_from)}` : '—'),
      el('dt', {}, 'L(Hα)'), el('dd', {}, sfr.l_halpha_erg_s === null ? '—' : `${sig(sfr.l_halpha_erg_s)} erg/s${sfr.dust_corrected ? ' (dust-corr.)' : ''}`),
      el('dt', {}, 'SFR, Kennicutt 98'), el('dd', {}, sfrText(sfr.sfr_kennicutt98_msun_yr, sfr.sfr_kennicutt98_err_msun_yr, sfr.upper_limit)),
      el('dt', {}, 'SFR, Kennicutt & Evans 12'), el('dd', {}, sfrText(sfr.sfr_ke12_msun_yr, sfr.sfr_ke12_err_msun_yr, sfr.upper_limit))),
    el('p', { class: 'muted' }, `IMF: ${sfr.imf.kennicutt98} (K98); ${sfr.imf.ke12} (KE12). ${sfr.note ?? ''}`),
    el('p', { class: 'caveat', id: 'aperture-caveat' }, `⚠ ${sfr.caveat}`));
  const fig = buildBptFigure(c.point);
  void loadPlotly().then((P) => P.react(plot, fig.data, fig.layout, { ...PLOT_CONFIG, displayModeBar: false }));
}
