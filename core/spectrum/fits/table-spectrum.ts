/**
 * Spectra in FITS tables: one row per pixel (SDSS spec-*.fits COADD and its re-packaged
 * upper-case variant, generic tables), one row holding array columns, and slitless-grism
 * tables (3D-HST: flux density = (flux − contam)/sensitivity, error/sensitivity; Brammer et
 * al. 2012, ApJS 200, 13). SDSS: λ = 10^loglam; σ = 1/√ivar, ivar = 0 bad; and_mask ≠ 0 bad
 * (SDSS data model, spec file HDU 1).
 */
import { openTable, type FitsTable, type TableColumn } from '../../fits/table.js';
import { ERROR_KIND, ERROR_ROLES, findByRole, goodPixelMaskFrom, maskFrom, sdssMaskFrom, sigmaFrom } from '../columns.js';
import { mediumFromName } from '../medium.js';
import { guessWaveUnit, parseWaveUnit, type WaveUnit } from '../units.js';
import { powersOfTen } from './powers-of-ten.js';
import { bunit, headerParts, type HduContext, type LayoutDraft, type LayoutVerdict } from './layout.js';
import { GRISM_DEFAULTS, isPypeIt, PYPEIT_DEFAULTS, sdssDefaults } from './surveys.js';
import { mayNameWavelength } from './wave-column-screen.js';
import { concatArrays } from '../../util/concat-arrays.js';

export function matchTable(ctx: HduContext): LayoutVerdict {
  const { hdu } = ctx;
  if (hdu.kind !== 'bintable' && hdu.kind !== 'ascii-table') return undefined;
  // Tables without a wavelength column by name (survey metadata, line fits) are passed over unopened.
  if (!mayNameWavelength(hdu.header)) return 'table without a wavelength column';
  const table = openTable(hdu);
  const waveCol = findByRole('wave', table.find) ?? findByRole('loglam', table.find);
  const fluxCol = findByRole('flux', table.find);
  if (!waveCol || !fluxCol) return `table without ${waveCol ? 'a flux' : 'a wavelength'} column`;
  if (waveCol.isText || fluxCol.isText) return 'table whose wavelength or flux column holds text';
  if (table.rows === 0) return 'table with no rows';
  const arrays = table.rows === 1 || waveCol.repeat > 1 || waveCol.isVariable;
  const grism = findByRole('contam', table.find) && findByRole('sensitivity', table.find);
  const format = grism ? 'fits-grism-table' : arrays ? 'fits-table-arrays' : 'fits-table-rows';
  return { format, read: () => readTable(ctx, table, format, arrays, waveCol, fluxCol) };
}

function readTable(
  ctx: HduContext,
  table: FitsTable,
  format: string,
  arrays: boolean,
  waveCol: TableColumn,
  fluxCol: TableColumn,
): LayoutDraft {
  // Array tables: each row holds a spectrum or a piece of one; row tables: every row is a pixel.
  const get = arrays ? arrayRows(table, waveCol) : (c: TableColumn) => table.values(c);
  const isLog = findByRole('loglam', table.find) === waveCol;
  const wave = isLog ? powersOfTen(get(waveCol)) : get(waveCol);
  let flux = get(fluxCol);
  const n = flux.length;
  const mask = new Uint8Array(n);
  let error: Float64Array | undefined;
  let errorKind: LayoutDraft['errorKind'] = 'none';
  for (const role of ERROR_ROLES) {
    const col = findByRole(role, table.find);
    if (col && !col.isText) {
      const values = get(col);
      if (values.length === n) {
        error = sigmaFrom(role, values, mask, flux, values);
        errorKind = ERROR_KIND[role];
      } else error = values; // length mismatch is reported by finish
      break;
    }
  }
  const maskCol = findByRole('mask', table.find);
  if (maskCol && !maskCol.isText) {
    const values = get(maskCol);
    if (values.length === n) (maskCol.name.toLowerCase() === 'and_mask' ? sdssMaskFrom : isPypeIt(ctx.keywords) ? goodPixelMaskFrom : maskFrom)(values, mask);
  }
  const skyCol = findByRole('sky', table.find);
  const sky = skyCol && !skyCol.isText ? get(skyCol) : undefined;
  let fluxUnit = fluxCol.unit ?? bunit(ctx.keywords) ?? 'unknown';
  if (format === 'fits-grism-table') {
    const contamCol = findByRole('contam', table.find)!;
    const sensCol = findByRole('sensitivity', table.find)!;
    const contam = get(contamCol);
    const sens = get(sensCol);
    flux = flux.map((f, i) => (sens[i] > 0 ? (f - contam[i]) / sens[i] : NaN));
    if (error) error = error.map((e, i) => (sens[i] > 0 ? e / sens[i] : NaN));
    fluxUnit = grismFluxUnit(sensCol.unit, fluxUnit);
  }
  const defaults = sdssDefaults(ctx.keywords) ?? (isPypeIt(ctx.keywords) ? PYPEIT_DEFAULTS : format === 'fits-grism-table' ? GRISM_DEFAULTS : {});
  const parts = headerParts(ctx, defaults);
  const named = mediumFromName(waveCol.name);
  return {
    format: arrays && table.rows > 1 ? `${format} (${table.rows} rows joined in wavelength order)` : format,
    wave,
    waveUnit: waveUnitOf(waveCol, wave, isLog),
    dispersion: isLog ? 'log10' : 'tabulated',
    flux,
    error,
    errorKind,
    mask: maskCol || errorKind !== 'none' ? mask : undefined,
    sky,
    fluxUnit,
    ...parts,
    medium: parts.medium.reason.startsWith('assumed') && named ? named : parts.medium,
  };
}

/**
 * A column of an array table: its one row, or its rows joined in wavelength order (the segments
 * or orders of one spectrum, as in HST x1d files); without this only the first would be read.
 */
function arrayRows(table: FitsTable, waveCol: TableColumn): (c: TableColumn) => Float64Array {
  if (table.rows === 1) return (c) => table.rowValues(c, 0);
  const rows = Array.from({ length: table.rows }, (_, r) => r);
  const joined = (c: TableColumn) => concatArrays((n) => new Float64Array(n), rows.map((r) => table.rowValues(c, r)));
  const wave = joined(waveCol);
  const key = (i: number) => (Number.isNaN(wave[i]) ? Infinity : wave[i]);
  const order = Array.from(wave.keys()).sort((a, b) => key(a) - key(b) || a - b);
  if (order.every((v, i) => v === i)) return joined;
  return (c) => {
    const v = joined(c);
    return Float64Array.from(order, (i) => v[i]);
  };
}

/** 'E/S / 1E-17 CGS' (3D-HST) → the flux density unit the division gives. */
function grismFluxUnit(sensitivityUnit: string | undefined, countUnit: string): string {
  const m = sensitivityUnit ? /\/\s*(1E-?\d+)\s*CGS/i.exec(sensitivityUnit) : null;
  if (m) return `${m[1].toLowerCase().replace('e', 'e')} erg/s/cm^2/Angstrom`;
  return sensitivityUnit ? `(${countUnit}) / (${sensitivityUnit})` : 'unknown';
}

function waveUnitOf(col: TableColumn, wave: Float64Array, isLog: boolean): WaveUnit {
  const text = col.unit?.replace(/^log\s*\(?\s*|\s*\)$/gi, '');
  const unit = text ? parseWaveUnit(text) : undefined;
  if (unit) return unit;
  // loglam columns of SDSS carry no unit: log10 of Å (SDSS data model).
  if (isLog) return { name: 'Å', toAngstrom: 1, assumed: false };
  return guessWaveUnit(wave);
}
