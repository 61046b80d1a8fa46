/**
 * How each demo spectrum is written: the observatory's equispec multispec image (flux, sky and
 * sigma bands), a quick-look 1-D image with an error extension, a per-pixel binary table, and
 * a collaborator's CSV export in vacuum wavelengths. Headers carry the metadata later steps
 * need (site, time, pointing, frame, medium).
 */
import { real, writeFits, type Card } from '../../core/fits/write.js';
import { airToVacuum } from '../../core/spectrum/air-vacuum.js';
import { decSexagesimal, raSexagesimal, SITE } from './night.js';
import { GRID_PIXELS, GRID_START_AIR_ANGSTROM, GRID_STEP_ANGSTROM } from './physics.js';

export const FLUX_UNIT = '1e-17 erg/s/cm2/Angstrom';

/** One finished exposure, ready to be written. */
export interface ExposureRecord {
  object: string;
  raDeg: number;
  decDeg: number;
  dateObs: string;
  mjdObs: number;
  exptimeS: number;
  airmass: number;
  grid: Float64Array;
  flux: Float64Array;
  sigma: Float64Array;
  sky: Float64Array;
  /** 1 = bad pixel (used by the table layout). */
  mask: Uint8Array;
}

function observationCards(r: ExposureRecord, sexagesimal: boolean): Card[] {
  return [
    { key: 'OBJECT', value: r.object, comment: 'target name' },
    { key: 'OBSERVAT', value: SITE.name, comment: 'observatory (fictional)' },
    { key: 'TELESCOP', value: 'Kestrel Ridge 2.4m', comment: 'telescope' },
    { key: 'INSTRUME', value: 'KLRS', comment: 'Kestrel low-resolution spectrograph' },
    { key: 'OBSGEO-B', value: real(SITE.latitudeDeg), comment: '[deg] site latitude' },
    { key: 'OBSGEO-L', value: real(SITE.longitudeDeg), comment: '[deg] site longitude, east positive' },
    { key: 'OBSGEO-H', value: real(SITE.heightM), comment: '[m] site height above the ellipsoid' },
    { key: 'DATE-OBS', value: r.dateObs, comment: 'UTC start of exposure' },
    { key: 'MJD-OBS', value: real(r.mjdObs), comment: '[d] MJD (UTC) start of exposure' },
    { key: 'EXPTIME', value: real(r.exptimeS), comment: '[s] exposure time' },
    { key: 'AIRMASS', value: real(Number(r.airmass.toFixed(3))), comment: 'airmass at mid-exposure' },
    sexagesimal
      ? { key: 'RA', value: raSexagesimal(r.raDeg), comment: 'right ascension (hours)' }
      : { key: 'RA', value: real(Number(r.raDeg.toFixed(6))), comment: '[deg] right ascension' },
    sexagesimal
      ? { key: 'DEC', value: decSexagesimal(r.decDeg), comment: 'declination (degrees)' }
      : { key: 'DEC', value: real(Number(r.decDeg.toFixed(6))), comment: '[deg] declination' },
    { key: 'EQUINOX', value: real(2000), comment: 'equinox of RA and DEC' },
    { key: 'RADESYS', value: 'FK5', comment: 'frame of RA and DEC' },
    { key: 'SPECSYS', value: 'TOPOCENT', comment: 'wavelengths not corrected for Earth motion' },
    { key: 'AIRORVAC', value: 'air', comment: 'wavelengths in standard air' },
    { key: 'BUNIT', value: FLUX_UNIT, comment: 'flux density unit' },
    { key: 'DATE', value: '2026-03-14T13:05:00', comment: 'UTC date the file was written' },
    { key: 'ORIGIN', value: 'Kestrel Ridge pipeline', comment: 'reduction software (fictional)' },
  ];
}

function linearAxisCards(axis: number, ctype: string, crval: number, cdelt: number): Card[] {
  return [
    { key: `CTYPE${axis}`, value: ctype },
    { key: `CRPIX${axis}`, value: real(1) },
    { key: `CRVAL${axis}`, value: real(crval) },
    { key: `CDELT${axis}`, value: real(cdelt) },
    { key: `CD${axis}_${axis}`, value: real(cdelt) },
  ];
}

/** IRAF-style equispec multispec: NAXIS1 pixels × 1 aperture × 3 bands, linear air wavelengths. */
export function writeMultispec(r: ExposureRecord): Uint8Array {
  const data = new Float32Array(GRID_PIXELS * 3);
  data.set(r.flux, 0);
  data.set(r.sky, GRID_PIXELS);
  data.set(r.sigma, 2 * GRID_PIXELS);
  const cards: Card[] = [
    ...observationCards(r, true),
    { key: 'WCSDIM', value: 3 },
    ...linearAxisCards(1, 'LINEAR', GRID_START_AIR_ANGSTROM, GRID_STEP_ANGSTROM),
    ...linearAxisCards(2, 'LINEAR', 1, 1),
    ...linearAxisCards(3, 'LINEAR', 1, 1),
    { key: 'LTM1_1', value: real(1) },
    { key: 'DC-FLAG', value: 0, comment: 'linear dispersion' },
    { key: 'WAT0_001', value: 'system=equispec' },
    { key: 'WAT1_001', value: 'wtype=linear label=Wavelength units=angstroms' },
    { key: 'WAT2_001', value: 'wtype=linear' },
    { key: 'WAT3_001', value: 'wtype=linear' },
    { key: 'APNUM1', value: '1 1 248.31 259.47' },
    { key: 'BANDID1', value: 'spectrum - sky subtracted, variance weighted' },
    { key: 'BANDID2', value: 'sky - background fit' },
    { key: 'BANDID3', value: 'sigma - from the variance' },
  ];
  return writeFits([{ type: 'image', bitpix: -32, axes: [GRID_PIXELS, 1, 3], data, cards }]);
}

/** Quick-look layout: 1-D flux in the primary HDU (BITPIX −64), 1σ in an ERROR extension. */
export function writeImageWithError(r: ExposureRecord): Uint8Array {
  const wcs: Card[] = [
    { key: 'CTYPE1', value: 'AWAV', comment: 'air wavelength' },
    { key: 'CUNIT1', value: 'Angstrom' },
    { key: 'CRPIX1', value: real(1) },
    { key: 'CRVAL1', value: real(GRID_START_AIR_ANGSTROM) },
    { key: 'CDELT1', value: real(GRID_STEP_ANGSTROM) },
  ];
  return writeFits([
    { type: 'image', bitpix: -64, axes: [GRID_PIXELS], data: r.flux, cards: [...observationCards(r, false), ...wcs, { key: 'EXTNAME', value: 'FLUX' }] },
    { type: 'image', bitpix: -64, axes: [GRID_PIXELS], data: r.sigma, cards: [...wcs, { key: 'BUNIT', value: FLUX_UNIT }, { key: 'EXTNAME', value: 'ERROR' }, { key: 'COMMENT', comment: '1-sigma uncertainty of FLUX' }] },
  ]);
}

/** One row per pixel: WAVE (air Å), FLUX, ERR, SKY, MASK; observation metadata in the primary. */
export function writePixelTable(r: ExposureRecord): Uint8Array {
  return writeFits([
    { type: 'image', axes: [], cards: observationCards(r, false) },
    {
      type: 'bintable',
      cards: [
        { key: 'EXTNAME', value: 'SPECTRUM' },
        { key: 'AIRORVAC', value: 'air', comment: 'WAVE in standard air' },
        { key: 'SPECSYS', value: 'TOPOCENT' },
      ],
      columns: [
        { name: 'WAVE', format: 'D', unit: 'Angstrom', values: r.grid },
        { name: 'FLUX', format: 'E', unit: FLUX_UNIT, values: r.flux },
        { name: 'ERR', format: 'E', unit: FLUX_UNIT, values: r.sigma },
        { name: 'SKY', format: 'E', unit: FLUX_UNIT, values: r.sky },
        { name: 'MASK', format: 'J', values: r.mask },
      ],
    },
  ]);
}

/** A collaborator's export: comment lines, a header row with units, vacuum wavelengths. */
export function writeCsv(r: ExposureRecord): Uint8Array {
  const lines = [
    `# ${r.object} re-reduced by a collaborator; wavelengths converted from air to vacuum`,
    `# OBJECT: ${r.object}`,
    `# RA: ${r.raDeg.toFixed(6)}`,
    `# DEC: ${r.decDeg.toFixed(6)}`,
    `# DATE-OBS: ${r.dateObs}`,
    `# EXPTIME: ${r.exptimeS}`,
    `# OBSERVAT: ${SITE.name}`,
    `# SPECSYS: TOPOCENT`,
    `# AIRORVAC: vacuum`,
    `wavelength (Angstrom),flux (${FLUX_UNIT}),error (${FLUX_UNIT})`,
  ];
  for (let i = 0; i < r.grid.length; i++) {
    lines.push(`${airToVacuum(r.grid[i]).toFixed(3)},${r.flux[i].toPrecision(6)},${r.sigma[i].toPrecision(6)}`);
  }
  return new TextEncoder().encode(`${lines.join('\n')}\n`);
}
