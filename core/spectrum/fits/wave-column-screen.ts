/**
 * A quick look at a table's raw header for a wavelength column by name, so that tables which
 * cannot hold a spectrum (survey metadata with hundreds of columns, line fits) are passed over
 * without parsing their column keywords.
 */
import { CARD_LENGTH, isContinue, type FitsHeader } from '../../fits/header.js';
import { COLUMN_NAMES } from '../columns.js';

/**
 * False only when no TTYPEn can name a wavelength column, from one pass over the raw cards.
 * Whether quoted or not, such a name is a whole word ([A-Za-z0-9_]+) of the value of a card
 * keyed TTYPE… in any case (or of a HIERARCH card); a name continued onto CONTINUE cards may be
 * split, so a CONTINUE card after one of those counts as maybe.
 */
export function mayNameWavelength(header: FitsHeader): boolean {
  const bytes = header.rawCards();
  if (bytes === undefined) return true;
  for (let at = 0; at < bytes.length; at += CARD_LENGTH) {
    const first = bytes[at] & 0xdf;
    if (first !== TTYPE[0] && first !== HIERARCH[0]) continue;
    const hierarch = startsWithWord(bytes, at, HIERARCH);
    if (!hierarch && !startsWithWord(bytes, at, TTYPE)) continue;
    if (at + CARD_LENGTH < bytes.length && isContinue(bytes, at + CARD_LENGTH)) return true;
    const [from, to] = hierarch ? [at + 8, at + CARD_LENGTH] : valueSpan(bytes, at);
    if (hasWordOf(bytes, from, to)) return true;
  }
  return false;
}

/** Bytes read as blanks: the blank, and anything outside printable ASCII. */
const isBlank = (b: number) => b <= 0x20 || b > 0x7e;

/**
 * Where a card's value can lie (FITS 4.0 §4.2.1): inside its quotes (up to the first quote
 * within, or the card's end), or up to the comment's '/'; empty when the card has no '= '.
 */
function valueSpan(bytes: Uint8Array, at: number): [number, number] {
  const end = at + CARD_LENGTH;
  if (bytes[at + 8] !== 0x3d || !isBlank(bytes[at + 9])) return [at, at];
  let i = at + 10;
  while (i < end && isBlank(bytes[i])) i++;
  const quoted = bytes[i] === 0x27 && i < end;
  const from = quoted ? i + 1 : i;
  let to = from;
  while (to < end && bytes[to] !== (quoted ? 0x27 : 0x2f)) to++;
  return [from, to];
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

/** Bytes from..to-1 hold a word whose lower-case hash is a wavelength name's (or collides with one). */
function hasWordOf(bytes: Uint8Array, from: number, to: number): boolean {
  let hash = FNV_START;
  let length = 0;
  for (let i = from; i <= to; i++) {
    const b = i < to ? bytes[i] : 0;
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
