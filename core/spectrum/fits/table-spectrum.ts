/**
 * Spectra in FITS tables: one row per pixel (SDSS spec-*.fits COADD and its re-packaged
 * upper-case variant, generic tables), one row holding array columns, and slitless-grism
 * tables (3D-HST: flux density = (flux − contam)/sensitivity, error/sensitivity; Brammer et
 * al. 2012, ApJS 200, 13). SDSS: λ = 10^loglam; σ = 1/√ivar, ivar = 0 bad; and_mask ≠ 0 bad
 * (SDSS data model, spec file HDU 1).
 */
import { CARD_LENGTH, isContinue, type FitsHeader } from '../../fits/header.js';
import { columnNames, openTable, type FitsTable, type TableColumn } from '../../fits/table.js';
import { COLUMN_NAMES, ERROR_KIND, ERROR_ROLES, findByRole, type ColumnRole, maskFrom, sdssMaskFrom, sigmaFrom } from '../columns.js';
import { mediumFromName } from '../medium.js';
import { guessWaveUnit, parseWaveUnit, type WaveUnit } from '../units.js';
import { powersOfTen } from './powers-of-ten.js';
import { bunit, headerParts, type HduContext, type LayoutDraft, type LayoutVerdict } from './layout.js';
import { GRISM_DEFAULTS, sdssDefaults } from './surveys.js';

/**
 * False only when no TTYPEn can name a wavelength column, from one pass over the raw cards.
 * Whether quoted or not, such a name is a whole word ([A-Za-z0-9_]+) of a card keyed TTYPE…
 * in any case (or of a HIERARCH card); a name continued onto CONTINUE cards may be split, so a
 * CONTINUE card after one of those counts as maybe.
 */
function mayNameWavelength(header: FitsHeader): boolean {
  const bytes = header.rawCards();
  if (bytes === undefined) return true;
  for (let at = 0; at < bytes.length; at += CARD_LENGTH) {
    if (!startsWithWord(bytes, at, TTYPE) && !startsWithWord(bytes, at, HIERARCH)) continue;
    if (at + CARD_LENGTH < bytes.length && isContinue(bytes, at + CARD_LENGTH)) return true;
    if (hasWordOf(bytes, at)) return true;
  }
  return false;
}

const TTYPE = [...'TTYPE'].map((c) => c.charCodeAt(0));
const HIERARCH = [...'HIERARCH'].map((c) => c.charCodeAt(0));

/** The card begins with the (upper-case) letters, in any case. */
function startsWithWord(bytes: Uint8Array, at: number, letters: number[]): boolean {
  for (let j = 0; j < letters.length; j++) if ((bytes[at + j] & 0xdf) !== letters[j]) return false;
  return true;
}

/** FNV-1a (Fowler, Noll, Vo) of a word's lower-case bytes, folded in as they come. */
const fnv = (h: number, b: number) => Math.imul(h ^ b, 0x01000193);
const FNV_START = 0x811c9dc5;
const WAVE_NAME_HASHES = new Set([...COLUMN_NAMES.wave, ...COLUMN_NAMES.loglam].map((n) => [...n].reduce((h, c) => fnv(h, c.charCodeAt(0)), FNV_START)));

/** Bytes 9–80 of the card hold a word whose lower-case hash is a wavelength name's (or collides with one). */
function hasWordOf(bytes: Uint8Array, at: number): boolean {
  let hash = FNV_START;
  let length = 0;
  for (let i = at + 8; i <= at + CARD_LENGTH; i++) {
    const b = i < at + CARD_LENGTH ? bytes[i] : 0;
    const lower = b >= 0x41 && b <= 0x5a ? b + 0x20 : b;
    if ((lower >= 0x61 && lower <= 0x7a) || (b >= 0x30 && b <= 0x39) || b === 0x5f) {
      hash = fnv(hash, lower);
      length++;
    } else if (length > 0) {
      if (WAVE_NAME_HASHES.has(hash)) return true;
      hash = FNV_START;
      length = 0;
    }
  }
  return false;
}

export function matchTable(ctx: HduContext): LayoutVerdict {
  const { hdu } = ctx;
  if (hdu.kind !== 'bintable' && hdu.kind !== 'ascii-table') return undefined;
  // Tables that lack the columns by name (survey metadata, line fits) are passed over unopened.
  if (!mayNameWavelength(hdu.header)) return 'table without a wavelength column';
  const names = columnNames(hdu);
  if (names) {
    const lower = new Set(names.map((n) => n.toLowerCase()));
    const named = (role: ColumnRole) => findByRole(role, (n) => (lower.has(n) ? n : undefined));
    const wave = named('wave') ?? named('loglam');
    if (!wave || !named('flux')) return `table without ${wave ? 'a flux' : 'a wavelength'} column`;
  }
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
  // Array tables: the first row holds the spectrum; row tables: every row is a pixel.
  const get = (c: TableColumn) => (arrays ? table.rowValues(c, 0) : table.values(c));
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
        error = sigmaFrom(role, values, mask);
        errorKind = ERROR_KIND[role];
      } else error = values; // length mismatch is reported by finish
      break;
    }
  }
  const maskCol = findByRole('mask', table.find);
  if (maskCol && !maskCol.isText) {
    const values = get(maskCol);
    if (values.length === n) (maskCol.name.toLowerCase() === 'and_mask' ? sdssMaskFrom : maskFrom)(values, mask);
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
  const defaults = sdssDefaults(ctx.keywords) ?? (format === 'fits-grism-table' ? GRISM_DEFAULTS : {});
  const parts = headerParts(ctx, defaults);
  const named = mediumFromName(waveCol.name);
  return {
    format,
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
