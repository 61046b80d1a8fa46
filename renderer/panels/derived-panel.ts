/**
 * Derived quantities at the trial z: the frame-corrected redshift with the correction applied
 * and why, recession velocities, and ΛCDM distances. Follows z live (the controller debounces).
 */
import type { FrameResult } from '../../core/astro/frames.js';
import { SPEED_OF_LIGHT_KMS } from '../../core/astro/constants.js';
import { COSMOLOGY_PRESETS } from '../../core/astro/cosmology.js';
import { el, fill } from '../ui/dom.js';
import { fmtNum, fmtZ } from '../ui/format.js';

export interface LiveResult<T> {
  result: T | null;
  error: string | null;
  /** True when the result is for an older trial z than the one shown. */
  stale: boolean;
}

function dl(rows: [string, string][]): HTMLElement {
  return el('dl', {}, ...rows.flatMap(([k, v]) => [el('dt', {}, k), el('dd', {}, v)]));
}

/** The result to draw, or null after saying in the box why there is none. */
export function usableResult<T>(box: HTMLElement, live: LiveResult<T> | null, what: string): T | null {
  if (!live) fill(box, el('p', { class: 'muted' }, 'no trial z yet'));
  else if (live.error) fill(box, el('p', { class: 'caveat' }, `${what} not available: ${live.error}`));
  else if (!live.result) fill(box, el('p', { class: 'muted' }, `${what}: updating…`));
  return live?.error ? null : (live?.result ?? null);
}

/** The preset picker, with the source of the one in use. */
function cosmologyPicker(current: string, onChange: (preset: string) => void): HTMLElement {
  const known = Object.values(COSMOLOGY_PRESETS);
  const select = el('select', { id: 'cosmology', 'aria-label': 'cosmology', onchange: (e) => onChange((e.target as HTMLSelectElement).value) },
    ...known.map((m) => el('option', { value: m.name, selected: m.name === current }, `${m.name}: H0 = ${m.h0} km/s/Mpc, Ωm = ${m.omegaM}, ΩΛ = ${m.omegaL.toFixed(4).replace(/0+$/, '')}`)),
    current === 'custom' ? el('option', { value: 'custom', selected: true }, 'custom (from the settings)') : null);
  return el('div', {}, select, el('p', { class: 'why' }, COSMOLOGY_PRESETS[current]?.source ?? 'user values from the settings'));
}

export function renderDerived(box: HTMLElement, live: LiveResult<FrameResult> | null, cosmology: string, onCosmology: (preset: string) => void): void {
  const f = usableResult(box, live, 'derived quantities');
  if (!f || !live) return;
  const cosmologyName = cosmology;
  const frameZ = f.zBary ?? f.zHelio ?? f.zObs;
  const d = f.distances;
  fill(box,
    live.stale ? el('p', { class: 'muted' }, 'updating…') : null,
    el('h2', {}, 'Redshift frames'),
    dl([
      ['z, as measured', fmtZ(f.zObs)],
      [`z, ${f.frame}`, `${fmtZ(frameZ)}${f.zErr !== null ? ` ± ${f.zErr.toPrecision(2)}` : ''}`],
      ['z, CMB frame', fmtZ(f.zCmb)],
      [`cz, ${f.frame}`, fmtNum(SPEED_OF_LIGHT_KMS * frameZ, 1, 'km/s')],
      ['cz, CMB frame', f.zCmb === null ? '—' : fmtNum(SPEED_OF_LIGHT_KMS * f.zCmb, 1, 'km/s')],
      ['barycentric corr.', fmtNum(f.vCorrKmS, 3, 'km/s')],
      ['heliocentric corr.', fmtNum(f.vHelioKmS, 3, 'km/s')],
      ['mid-exposure', f.midExposureUtc ? `${f.midExposureUtc.replace('T', ' ').slice(0, 19)} UTC` : '—'],
    ]),
    el('p', { class: 'why', id: 'frame-reason' }, `Correction applied: ${f.correction}. ${f.reason}`),
    el('h2', {}, `Distances (${cosmologyName}${f.distancesFrom ? `, from the ${f.distancesFrom} z` : ''})`),
    cosmologyPicker(cosmology, onCosmology),
    d ? dl([
      ['comoving', fmtNum(d.comovingMpc, 1, 'Mpc')],
      ['transverse comoving', fmtNum(d.transverseMpc, 1, 'Mpc')],
      ['luminosity', fmtNum(d.luminosityMpc, 1, 'Mpc')],
      ['angular diameter', fmtNum(d.angularMpc, 1, 'Mpc')],
      ['distance modulus', fmtNum(d.distanceModulusMag, 3, 'mag')],
      ['lookback time', fmtNum(d.lookbackGyr, 3, 'Gyr')],
      ['age at z', fmtNum(d.ageGyr, 3, 'Gyr')],
      ['scale', fmtNum(d.kpcPerArcsec, 3, 'kpc/″')],
    ]) : el('p', { class: 'muted' }, 'no distances for this z (negative, or no cosmology set)'));
}
