/**
 * A quick look at a table's raw header for a wavelength column by name, so that tables which
 * cannot hold a spectrum (survey metadata with hundreds of columns, line fits) are passed over
 * without parsing their column keywords.
 */
import { CARD_LENGTH, isContinue, type FitsHeader } from '../../fits/header.js';
import { COLUMN_NAMES } from '../columns.js';

/**
 * False only when no TTYPEn can name a wavelength column, from one pass over the raw cards.
 * Whether quoted or not, such a name is a whole word ([A-Za-z0-9_]+) of a card keyed TTYPE…
 * in any case (or of a HIERARCH card); a name continued onto CONTINUE cards may be split, so a
 * CONTINUE card after one of those counts as maybe.
 */
export function mayNameWavelength(header: FitsHeader): boolean {
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
