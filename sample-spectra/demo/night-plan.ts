/**
 * The observing plan of 2026-03-14 UT: thirteen spectra in the order they were taken. Several
 * are deliberately awkward (lines on sky residuals or in telluric bands, very low S/N, a
 * damaged file), as a real night is. z is in the file's own frame: topocentric (no correction
 * for the Earth's motion), measured on vacuum wavelengths.
 */
import type { Target } from './targets.js';

/** First exposure starts at 02:48 UT, after astronomical twilight at the site. */
export const NIGHT_START_UTC_MS = Date.UTC(2026, 2, 14, 2, 48, 0);
/** Slew, acquisition and readout between exposures. */
export const OVERHEAD_S = 300;

export const NIGHT_PLAN: readonly Target[] = [
  {
    number: 11, hostClass: 'star-forming', z: 0.06817, continuum: 4.0, hbetaFlux: 40, lines: 'solar',
    targetSn: 18, exptimeS: 900, decDeg: 21.482, hourAngleH: -0.6, layout: 'multispec',
    notes: 'star-forming host; all strong lines clear',
  },
  {
    number: 12, hostClass: 'passive', z: 0.13751, continuum: 3.2,
    targetSn: 14, exptimeS: 1200, decDeg: 8.917, hourAngleH: -0.3, layout: 'multispec',
    notes: 'passive host; Mg b falls on the Na D sky lines',
  },
  {
    number: 13, hostClass: 'star-forming', z: 0.21544, continuum: 1.6, hbetaFlux: 14, lines: 'solar',
    targetSn: 9, exptimeS: 1800, decDeg: 33.06, hourAngleH: 0.2, layout: 'multispec',
    notes: 'star-forming host; [O II] to [S II] in range',
  },
  {
    number: 14, hostClass: 'agn', z: 0.08762, continuum: 3.5, hbetaFlux: 22, lines: 'seyfert2',
    targetSn: 16, exptimeS: 900, decDeg: -4.213, hourAngleH: 0.5, layout: 'multispec',
    notes: 'narrow-line AGN (Seyfert 2): [O III]/Hb = 10, [N II]/Ha = 1.1, above the Kewley 2001 line',
  },
  {
    number: 15, hostClass: 'qso', z: 1.52068, continuum: 2.5,
    targetSn: 12, exptimeS: 1200, decDeg: 47.75, hourAngleH: -0.8, layout: 'image-1d+error',
    notes: 'broad-line QSO: C IV, C III], Mg II; no host lines; quick-look 1-D image with an error extension',
  },
  {
    number: 16, hostClass: 'star', z: 0.00012, continuum: 30,
    targetSn: 45, exptimeS: 300, decDeg: 15.33, hourAngleH: -0.1, layout: 'multispec',
    notes: 'Galactic K-type star on the slit instead of the host (36 km/s)',
  },
  {
    number: 17, hostClass: 'passive', z: 0.33183, continuum: 1.8,
    targetSn: 10, exptimeS: 2400, decDeg: 28.604, hourAngleH: 0.4, layout: 'table',
    notes: 'passive host; per-pixel binary table with a mask (two cosmic rays flagged); Mg b in the O2 B band',
  },
  {
    number: 18, hostClass: 'star-forming', z: 0.41271, continuum: 1.0, hbetaFlux: 8, lines: 'solar',
    targetSn: 7, exptimeS: 2400, decDeg: -1.87, hourAngleH: -0.2, layout: 'csv',
    notes: 'star-forming host; text export in VACUUM wavelengths; Hb at the O2 B band head',
  },
  {
    number: 19, hostClass: 'star-forming', z: 0.02968, continuum: 0.6, hbetaFlux: 30, lines: 'dwarf',
    targetSn: 6, exptimeS: 1500, decDeg: 52.11, hourAngleH: 0.1, layout: 'multispec-gz',
    notes: 'low-metallicity dwarf host: strong [O III], weak [N II]; gzip-compressed',
  },
  {
    number: 20, hostClass: 'passive', z: 0.06512, continuum: 12,
    targetSn: 35, exptimeS: 600, decDeg: 12.94, hourAngleH: -0.4, layout: 'multispec',
    notes: 'bright passive host; high S/N',
  },
  {
    number: 21, hostClass: 'star-forming', z: 0.58037, continuum: 0.25, hbetaFlux: 1.2, lines: 'solar',
    targetSn: 0.8, exptimeS: 1800, decDeg: 40.42, hourAngleH: 0.3, layout: 'multispec',
    notes: 'hopeless: S/N below 1, [O II] on the Na D sky lines, Hb in the O2 A band; expect no-redshift',
  },
  {
    number: 22, hostClass: 'star-forming', z: 0.15702, continuum: 2.2, hbetaFlux: 18, lines: 'solar',
    targetSn: 11, exptimeS: 1200, decDeg: 3.55, hourAngleH: 0.6, layout: 'multispec',
    notes: 'star-forming host; Ha and [N II] inside the O2 A band; secure from [O II], Hb, [O III]',
  },
  {
    number: 23, hostClass: 'star-forming', z: 0.07344, continuum: 3.0, hbetaFlux: 20, lines: 'solar',
    targetSn: 10, exptimeS: 900, decDeg: 25.2, hourAngleH: 0.0, layout: 'truncated',
    notes: 'DAMAGED on purpose: the file ends in the middle of its data unit; zvet must refuse it with one clear line',
  },
];
