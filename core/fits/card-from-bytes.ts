/**
 * The common card forms read straight from the file's bytes, without the intermediate strings
 * of parseCard: KEYWORD = 'string' or a number, T or F, then an optional '/ comment'. Anything
 * else (no '= ', doubled quotes, bytes outside printable ASCII, HIERARCH, CONTINUE, a value
 * that is not one token) returns undefined and goes to parseCard, whose results these equal.
 */
import { parseFitsNumber, type FitsCard } from './header.js';

const BLANK = 0x20;
const QUOTE = 0x27;
const SLASH = 0x2f;

/**
 * The card at byte `at` of `bytes`; `text` is the same bytes as a string. `printable`: the
 * caller has checked that the card holds printable ASCII only.
 */
export function cardFromBytes(bytes: Uint8Array, text: string, at: number, printable = false): FitsCard | undefined {
  const end = at + 80;
  if (!printable) for (let i = at; i < end; i++) if (bytes[i] < BLANK || bytes[i] > 0x7e) return undefined;
  if (bytes[at + 8] !== 0x3d || bytes[at + 9] !== BLANK || text.startsWith('HIERARCH', at) || text.startsWith('CONTINUE', at)) return undefined;
  let i = at + 10;
  while (i < end && bytes[i] === BLANK) i++;
  let value: string | number | boolean | null;
  if (i < end && bytes[i] === QUOTE) {
    const close = text.indexOf("'", i + 1);
    if (close < 0 || close >= end || bytes[close + 1] === QUOTE) return undefined;
    value = text.slice(i + 1, close);
    i = close + 1;
  } else {
    const from = i;
    while (i < end && bytes[i] !== SLASH && bytes[i] !== BLANK) i++;
    const token = text.slice(from, i);
    while (i < end && bytes[i] === BLANK) i++;
    if (i < end && bytes[i] !== SLASH) return undefined;
    value = token === 'T' ? true : token === 'F' ? false : token === '' ? null : (parseFitsNumber(token) ?? token);
  }
  while (i < end && bytes[i] === BLANK) i++;
  const key = text.slice(at, at + 8).trimEnd();
  if (i === end || bytes[i] !== SLASH) return { key, value };
  i++;
  if (bytes[i] === BLANK) i++;
  let last = end;
  while (last > i && bytes[last - 1] === BLANK) last--;
  return last > i ? { key, value, comment: text.slice(i, last) } : { key, value };
}
