/**
 * Derived quantities at the trial z: the frame-corrected redshift with the correction applied
 * and why, recession velocities, and ΛCDM distances. Follows z live (the controller debounces).
 */
import type { FrameResult } from '../../core/astro/frames.js';
import { SPEED_OF_LIGHT_KMS } from '../../core/astro/constants.js';
import { radialVelocityErrKmS, radialVelocityKmS } from '../../core/astro/doppler.js';
import { asDefined, COSMOLOGY_PRESETS } from '../../core/astro/cosmology.js';
import { el, fill } from '../ui/dom.js';
import { fmtNum, fmtNumErr, fmtZ } from '../ui/format.js';

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
  if (!live) fill(box, el('p', { class: 'muted' }, 'no trial z, so nothing to derive: try a candidate or type a z'));
  else if (live.error) fill(box, el('p', { class: 'caveat' }, `${what} not available: ${live.error}`));
  else if (!live.result) fill(box, el('p', { class: 'muted' }, `${what}: updating…`));
  return live?.error ? null : (live?.result ?? null);
}

/** The model in use: a preset's name, or 'custom' with the settings' values. */
export interface CosmologyChoice {
  preset: string;
  custom: { h0: number; omegaM: number; omegaL: number } | null;
}

/** The preset picker, with the parameters and source of the model in use (a full option text would be cut at the panel's width). */
function cosmologyPicker({ preset, custom }: CosmologyChoice, onChange: (preset: string) => void): HTMLElement {
  const known = Object.values(COSMOLOGY_PRESETS);
  const select = el('select', { id: 'cosmology', 'aria-label': 'cosmology', onchange: (e) => onChange((e.target as HTMLSelectElement).value) },
    ...known.map((m) => el('option', { value: m.name, selected: m.name === preset }, m.name)),
    preset === 'custom' ? el('option', { value: 'custom', selected: true }, 'custom (from the settings)') : null);
  const model = COSMOLOGY_PRESETS[preset] ?? (preset === 'custom' && custom ? { ...custom, source: 'values set in the settings' } : null);
  const about = model ? `H0 = ${model.h0} km/s/Mpc, Ωm = ${model.omegaM}, ΩΛ = ${asDefined(model.omegaL)}. ${model.source}` : 'user values from the settings';
  return el('div', {}, select, el('p', { class: 'why', id: 'cosmology-about' }, about));
}

/** Above this z, c·z is far from any speed (common practice, no source): the panel says so. */
const CZ_IS_NOT_A_SPEED_ABOVE_Z = 0.3;

/**
 * With `star`, the z is a line-of-sight velocity (shown as one) and there are no cosmological
 * distances; otherwise cz is shown as the catalogue gives it.
 */
export function renderDerived(box: HTMLElement, live: LiveResult<FrameResult> | null, cosmology: CosmologyChoice, onCosmology: (preset: string) => void, star: boolean): void {
  const f = usableResult(box, live, 'derived quantities');
  if (!f || !live) return;
  const frameZ = f.zBary ?? f.zHelio ?? f.zObs;
  const cz = (z: number | null): string => (z === null ? '—' : fmtNum(SPEED_OF_LIGHT_KMS * z, 1, 'km/s'));
  const velocityRows: [string, string][] = star
    ? [[`radial velocity, ${f.frame}`, fmtNumErr(radialVelocityKmS(frameZ), f.zErr === null ? null : radialVelocityErrKmS(frameZ, f.zErr), 2, 'km/s')]]
    : [[`cz, ${f.frame}`, cz(frameZ)], ['cz, CMB frame', cz(f.zCmb)]];
  fill(box,
    live.stale ? el('p', { class: 'muted' }, 'updating…') : null,
    el('h2', {}, 'Redshift frames'),
    dl([
      ['z, trial (file frame)', fmtZ(f.zObs)],
      [`z, ${f.frame}`, `${fmtZ(frameZ)}${f.zErr !== null ? ` ± ${f.zErr.toPrecision(2)}` : ''}`],
      ...(star ? [] : [['z, CMB frame', fmtZ(f.zCmb)] as [string, string]]),
      ...velocityRows,
      ['barycentric corr.', fmtNum(f.vCorrKmS, 3, 'km/s')],
      ['heliocentric corr.', fmtNum(f.vHelioKmS, 3, 'km/s')],
      ['mid-exposure', f.midExposureUtc ? `${f.midExposureUtc.replace('T', ' ').slice(0, 19)} UTC` : '—'],
    ]),
    !star && frameZ > CZ_IS_NOT_A_SPEED_ABOVE_Z ? el('p', { class: 'why', id: 'cz-note' }, 'cz is c·z, the redshift in km/s: at this z it is far from any speed (above z = 1 it exceeds c).') : null,
    // The reason names the correction applied (or why none was), so it is shown alone.
    el('p', { class: 'why', id: 'frame-reason' }, `${f.reason.charAt(0).toUpperCase()}${f.reason.slice(1)}.`),
    star ? el('p', { class: 'why', id: 'star-note' }, 'Class star: the redshift is a line-of-sight velocity (relativistic Doppler), not a distance, so no cosmological distances are given.') : distances(f, cosmology, onCosmology));
}

function distances(f: FrameResult, cosmology: CosmologyChoice, onCosmology: (preset: string) => void): HTMLElement {
  const d = f.distances, e = f.distanceErrors;
  return el('div', {},
    el('h2', {}, `Distances (${cosmology.preset}${f.distancesFrom ? `, from the ${f.distancesFrom === 'cmb' ? 'CMB-frame' : f.distancesFrom} z` : ''})`),
    cosmologyPicker(cosmology, onCosmology),
    d ? dl([
      ['comoving', fmtNum(d.comovingMpc, 1, 'Mpc')],
      ['transverse comoving', fmtNum(d.transverseMpc, 1, 'Mpc')],
      ['luminosity', fmtNumErr(d.luminosityMpc, e?.luminosityMpc, 1, 'Mpc')],
      ['angular diameter', fmtNum(d.angularMpc, 1, 'Mpc')],
      ['distance modulus', fmtNumErr(d.distanceModulusMag, e?.distanceModulusMag, 3, 'mag')],
      ['lookback time', fmtNum(d.lookbackGyr, 3, 'Gyr')],
      ['age at z', fmtNum(d.ageGyr, 3, 'Gyr')],
      ['scale', fmtNum(d.kpcPerArcsec, 3, 'kpc/″')],
    ]) : el('p', { class: 'muted' }, 'no distances for this z (negative, or no cosmology set)'),
    d && e ? el('p', { class: 'why', id: 'distance-error-note' }, distanceErrorNote(f.zErr !== null, e.peculiarVelocityKmS, e.luminosityMpc / d.luminosityMpc)) : null);
}

function distanceErrorNote(hasZErr: boolean, velocityKmS: number, relativeError: number): string {
  const from = hasZErr ? `σz and a ${velocityKmS} km/s peculiar velocity` : `a ${velocityKmS} km/s peculiar velocity alone (this z has no σz)`;
  return `± propagated from ${from}; that velocity is typical of field galaxies and rules the error at low z: ${(100 * relativeError).toFixed(1)} % of D_L here.`;
}
