/**
 * Plain-text spectra: whitespace-, comma-, semicolon- or tab-separated columns (with ';', as
 * spreadsheets write in locales whose decimal mark is a comma, '6563,2' is 6563.2), '#'
 * comments, an optional header row naming the columns (with units: 'wave_A', 'wavelength[nm]', 'lambda (um)'),
 * columns read as wavelength (or log10 λ/Å in a column named loglam), flux, error (σ, or
 * ivar/variance/S/N when the header says so) and mask: 2–4 by position, any number when named. Comment lines 'KEY = value' or 'KEY: value' are kept as header cards, so that
 * OBJECT, RA, DATE-OBS, AIRORVAC, SPECSYS and the like work as in FITS.
 */
import { FitsHeader, parseFitsNumber, type FitsCard } from '../fits/header.js';
import { COLUMN_NAMES, ERROR_KIND, ERROR_ROLES, findByRole, maskFrom, sigmaFrom, type ColumnRole } from './columns.js';
import type { MediumDecision, SpectrumDraft } from './draft.js';
import { stackKeywords } from './keywords.js';
import { ASSUMED_AIR, mediumFromKeywords, mediumFromName } from './medium.js';
import { metadataOf } from './metadata.js';
import { SpectrumReadError } from './spectrum.js';
import { guessWaveUnit, parseWaveUnit, type WaveUnit } from './units.js';
import { powersOfTen } from './fits/powers-of-ten.js';

interface HeaderColumn {
  role?: ColumnRole;
  name: string;
  unit?: string;
}

/**
 * Text never holds C0 control bytes other than tab, line and page breaks, nor DEL. Checked over
 * the whole file, not just its start: a FITS file with a mangled first card has a long clean
 * header before its binary data, and a reason quoting that data would carry raw control bytes.
 */
function hasControlBytes(bytes: Uint8Array): boolean {
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if ((b < 0x20 && (b < 0x09 || b > 0x0d)) || b === 0x7f) return true;
  }
  return false;
}

export function readTextSpectrum(bytes: Uint8Array, fileName: string): SpectrumDraft {
  const fail = (reason: string): never => {
    throw new SpectrumReadError(fileName, reason);
  };
  if (bytes.length === 0) fail('the file is empty');
  if (hasControlBytes(bytes)) fail('not a spectrum: binary data that is neither FITS nor gzip');
  const text = new TextDecoder('utf-8', { fatal: false }).decode(bytes);
  const cards: FitsCard[] = [];
  let headerRow: string[] | undefined;
  let lastComment: string | undefined;
  const notes: string[] = [];
  let delimiter: RegExp | undefined;
  let ncols = 0;
  const columns: number[][] = [];
  const lines = text.split(/\r\n|\r|\n/);
  for (let ln = 0; ln < lines.length; ln++) {
    const line = lines[ln].trim();
    if (line === '') continue;
    if (line.startsWith('#') || line.startsWith('%') || line.startsWith('!')) {
      const body = line.replace(/^[#%!]+\s*/, '');
      const found = commentCards(body);
      if (found.length) cards.push(...found);
      else {
        lastComment = body;
        notes.push(body);
      }
      continue;
    }
    delimiter ??= line.includes(';') ? SEMICOLON : line.includes(',') ? /\s*,\s*/ : line.includes('\t') ? /\s*\t\s*/ : /\s+/;
    const fields = line.split(delimiter);
    const numbers = fields.map(delimiter === SEMICOLON ? parseDecimalCommaNumber : parseNumber);
    if (ncols === 0) {
      if (numbers.some((v) => v === null)) {
        if (headerRow) fail(`line ${ln + 1}: '${line.slice(0, 40)}' is neither a header row nor numbers`);
        headerRow = fields;
        continue;
      }
      ncols = fields.length;
      // A commented-out header row just above the data ('# wave flux err') names the columns
      // too, when it names a wavelength and a flux column; a column it names in words zvet does
      // not know ('continuum') is then left unread rather than taken by position as the error.
      const commented = lastComment?.split(delimiter);
      const roles = commented?.map((f) => describeColumn(f).role);
      if (!headerRow && commented?.length === ncols && commented.every((f) => parseNumber(f) === null) && (roles!.includes('wave') || roles!.includes('loglam')) && roles!.includes('flux')) {
        headerRow = commented;
      }
      // By position zvet knows four columns; named ones may be any number, the others left unread.
      if (ncols < 2 || (ncols > 4 && !headerRow)) fail(`line ${ln + 1} has ${ncols} columns; without a header row naming them zvet reads 2 to 4 (wavelength, flux, error, mask)`);
      for (let c = 0; c < ncols; c++) columns.push([]);
    }
    if (fields.length !== ncols) fail(`line ${ln + 1} has ${fields.length} columns, but earlier lines have ${ncols}`);
    for (let c = 0; c < ncols; c++) {
      if (numbers[c] === null) fail(`line ${ln + 1}: '${fields[c].slice(0, 20)}' is not a number`);
      columns[c].push(numbers[c]!);
    }
  }
  if (ncols === 0) fail('not a spectrum: no numeric data lines');
  if (headerRow && headerRow.length !== ncols) fail(`the header row names ${headerRow.length} columns but the data has ${ncols}`);
  const named = headerRow ? headerRow.map(describeColumn) : undefined;
  const roleIndex = (role: ColumnRole, position: number): number => {
    if (!named) return position < ncols ? position : -1;
    return named.findIndex((c) => c.role === role);
  };
  const linearAt = roleIndex('wave', 0);
  const waveAt = named && linearAt < 0 ? roleIndex('loglam', 0) : linearAt;
  // A loglam column holds log10 of vacuum-or-air Å (as SDSS's; the medium is decided below).
  const logWave = named?.[waveAt]?.role === 'loglam';
  const fluxAt = named ? roleIndex('flux', 1) : 1;
  if (waveAt < 0 || fluxAt < 0) fail(`the header row '${headerRow!.join(' ')}' names no ${waveAt < 0 ? 'wavelength' : 'flux'} column`);
  const arr = (i: number) => Float64Array.from(columns[i]);
  const wave = logWave ? powersOfTen(arr(waveAt)) : arr(waveAt);
  const flux = arr(fluxAt);
  const n = wave.length;
  const mask = new Uint8Array(n);
  let error: Float64Array | undefined;
  let errorKind: SpectrumDraft['errorKind'] = 'none';
  for (const role of ERROR_ROLES) {
    const at = named ? roleIndex(role, -1) : ncols >= 3 && role === 'sigma' ? 2 : -1;
    if (at >= 0) {
      error = sigmaFrom(role, arr(at), mask, flux);
      errorKind = ERROR_KIND[role];
      break;
    }
  }
  const maskAt = named ? roleIndex('mask', -1) : ncols === 4 ? 3 : -1;
  if (maskAt >= 0) maskFrom(arr(maskAt), mask);
  const skyAt = named ? roleIndex('sky', -1) : -1;
  const header = new FitsHeader(cards);
  const keywords = stackKeywords(header);
  const waveName = named?.[waveAt];
  const waveUnit: WaveUnit = logWave ? { name: 'Å', toAngstrom: 1, assumed: false } : (waveName?.unit && parseWaveUnit(waveName.unit)) || guessWaveUnit(wave);
  const medium = mediumFromKeywords(keywords) ?? (waveName ? mediumFromName(waveName.name) : undefined) ?? mediumFromNotes(notes) ?? ASSUMED_AIR;
  return {
    format: headerRow ? 'text (named columns)' : 'text',
    hdu: null,
    spectrumHdus: [],
    wave,
    waveUnit,
    dispersion: logWave ? 'log10' : 'tabulated',
    flux,
    error,
    errorKind,
    mask: error || maskAt >= 0 ? mask : undefined,
    sky: skyAt >= 0 ? arr(skyAt) : undefined,
    fluxUnit: (fluxAt >= 0 && named?.[fluxAt].unit) || keywords.string('BUNIT') || 'unknown',
    medium,
    meta: metadataOf(keywords),
    header: cards.map((c) => ({ key: c.key, value: c.value })),
  };
}

const SEMICOLON = /\s*;\s*/;

/** A number whose decimal mark may be a comma ('6563,25', '-1,5e-17'), as beside semicolon separators. */
function parseDecimalCommaNumber(field: string): number | null {
  return parseNumber(/^\s*[+-]?\d*,\d+([eE][+-]?\d+)?\s*$|^\s*[+-]?\d+,\s*$/.test(field) ? field.replace(',', '.') : field);
}

function parseNumber(field: string): number | null {
  const f = field.trim();
  if (/^[+-]?(nan|inf|infinity)$/i.test(f)) return /nan/i.test(f) ? NaN : f.startsWith('-') ? -Infinity : Infinity;
  return parseFitsNumber(f);
}

/**
 * 'KEY = value' / 'KEY: value' pairs in a comment line, several per line when separated by two
 * or more blanks ('RA: 161.16 deg  DEC: -1.87 deg'). A trailing unit word after a number or
 * time (deg, s, m, UTC) is dropped; 'FRAME' is read as VELFRAME.
 */
function commentCards(body: string): FitsCard[] {
  if (!/^[A-Za-z][\w-]{0,15}\s*[=:]\s*\S/.test(body)) return [];
  const out: FitsCard[] = [];
  const re = /([A-Za-z][\w-]{0,15})\s*[=:]\s*(.+?)(?=\s{2,}[A-Za-z][\w-]{0,15}\s*[=:]|$)/g;
  for (let m = re.exec(body); m; m = re.exec(body)) {
    const key = m[1].toUpperCase();
    out.push({ key: key === 'FRAME' ? 'VELFRAME' : key, value: cardValue(m[2]) });
  }
  return out;
}

function cardValue(text: string): string | number | boolean {
  let t = text.trim().replace(/^'(.*)'$/, '$1').replace(/^"(.*)"$/, '$1');
  if (t === 'T' || t === 'F') return t === 'T';
  t = t.replace(/^(\S+)\s+(deg|degrees|s|sec|seconds|m|UTC|UT)$/i, '$1');
  return parseFitsNumber(t) ?? t;
}

/** Free-text comments that state the medium ('converted from air to vacuum', 'air wavelengths'). */
function mediumFromNotes(notes: string[]): MediumDecision | undefined {
  for (const note of notes) {
    const quoted = `a comment says '${note.length > 70 ? `${note.slice(0, 70)}…` : note}'`;
    if (/\b(to|in)\s+vacuum\b|\bvacuum\s+wavelengths?\b/i.test(note)) return { medium: 'vacuum', reason: quoted };
    if (/\b(to|in)\s+air\b|\bair\s+wavelengths?\b/i.test(note)) return { medium: 'air', reason: quoted };
  }
  return undefined;
}

/**
 * 'wavelength[nm]', 'wave (um)', 'wave_A', 'flux_err' → role and unit. The name without its
 * unit is matched against the common column names of columns.ts.
 */
export function describeColumn(raw: string): HeaderColumn {
  const text = raw.trim().replace(/^["']|["']$/g, '');
  let name = text;
  let unit: string | undefined;
  const bracket = /^(.*?)\s*[[(]\s*([^\])]*)\s*[\])]$/.exec(text);
  if (bracket) {
    name = bracket[1];
    unit = bracket[2];
  } else {
    const suffix = /^(.*?)[_-](a|aa|ang|angstrom|angstroms|nm|um|micron|microns|m)$/i.exec(text);
    if (suffix && roleOf(suffix[1])) {
      name = suffix[1];
      unit = suffix[2];
    }
  }
  return { role: roleOf(name), name: text, unit };
}

function roleOf(name: string): ColumnRole | undefined {
  const lower = name.toLowerCase();
  for (const role of Object.keys(COLUMN_NAMES) as ColumnRole[]) {
    if (findByRole(role, (n) => (n === lower ? n : undefined))) return role;
  }
  return undefined;
}
