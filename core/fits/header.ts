/**
 * FITS header cards (FITS Standard 4.0, §4): 80-character cards in 2880-byte blocks, ended by
 * END. Values: character strings in quotes (doubled quotes inside), logicals T/F, integers and
 * floats (D exponents allowed). Long strings use the CONTINUE convention (FITS 4.0 §4.2.1.2):
 * a string ending in '&' continues in the next CONTINUE card's string.
 */

import { cardFromBytes } from './card-from-bytes.js';
import { CardIndex } from './card-index.js';

export type CardValue = string | number | boolean | null;

export interface FitsCard {
  key: string;
  value: CardValue;
  comment?: string;
}

export const CARD_LENGTH = 80;
export const BLOCK_LENGTH = 2880;

const COMMENTARY = new Set(['COMMENT', 'HISTORY', '']);

/**
 * A parsed header: every card in order, and typed look-ups by keyword (case-insensitive).
 * Built from a header's bytes (fromBytes), a card is parsed only when it is looked up or when
 * all cards are asked for: most of a survey file's cards are never read.
 */
export class FitsHeader {
  private parsed?: FitsCard[];
  private byKey?: Map<string, FitsCard>;
  /** The card bytes of a lazily parsed header (END excluded), their text and key index. */
  private readonly bytes?: Uint8Array;
  private text?: string;
  private index?: CardIndex;

  constructor(cards: FitsCard[]);
  constructor(cards: undefined, bytes: Uint8Array);
  constructor(cards: FitsCard[] | undefined, bytes?: Uint8Array) {
    this.parsed = cards;
    this.bytes = bytes;
  }

  /** A header from the bytes of its cards (80 bytes each, END excluded). */
  static fromBytes(bytes: Uint8Array): FitsHeader {
    return new FitsHeader(undefined, bytes);
  }

  get cards(): readonly FitsCard[] {
    if (!this.parsed) {
      this.text ??= LATIN1.decode(this.bytes);
      // One check of the whole text is far cheaper than one per card.
      const printable = !NOT_PRINTABLE.test(this.text);
      const all: FitsCard[] = [];
      for (let i = 0; i < this.bytes!.length / CARD_LENGTH; i++) all.push(this.parseOne(i, printable));
      this.parsed = joinContinued(all);
    }
    return this.parsed;
  }

  has(key: string): boolean {
    const k = upperCased(key);
    if (this.bytes === undefined || this.parsed || k === 'CONTINUE') return this.card(key) !== undefined;
    return this.cardIndex(this.bytes).find(k) !== undefined;
  }

  /** For quick screening: the raw card bytes (no copy, END excluded); undefined for a header built from parsed cards. */
  rawCards(): Uint8Array | undefined {
    return this.bytes;
  }

  value(key: string): CardValue | undefined {
    return this.card(key)?.value;
  }

  comment(key: string): string | undefined {
    return this.card(key)?.comment;
  }

  string(key: string): string | undefined {
    return stringOf(this.value(key));
  }

  number(key: string): number | undefined {
    return numberOf(this.value(key));
  }

  integer(key: string): number | undefined {
    const n = this.number(key);
    return n !== undefined && Number.isInteger(n) ? n : undefined;
  }

  bool(key: string): boolean | undefined {
    return boolOf(this.value(key));
  }

  /** The first card of a keyword (commentary keywords excepted), CONTINUE cards joined to it. */
  card(key: string): FitsCard | undefined {
    const k = upperCased(key);
    // A CONTINUE card may stand alone or belong to the card before it: the full parse knows.
    if (this.bytes === undefined || this.parsed || k === 'CONTINUE') {
      this.byKey ??= firstByKey(this.cards);
      return this.byKey.get(k);
    }
    const at = this.cardIndex(this.bytes).find(k);
    if (at === undefined) return undefined;
    const end = this.continuedEnd(at);
    if (end === at + 1) return this.parseOne(at);
    return joinContinued(this.cardImages(at, end).map(parseCard))[0];
  }

  /** Number of the first card after card `at` and the CONTINUE cards that follow it. */
  private continuedEnd(at: number): number {
    let end = at + 1;
    while (end * CARD_LENGTH < this.bytes!.length && isContinue(this.bytes!, end * CARD_LENGTH)) end++;
    return end;
  }

  private parseOne(i: number, printable = false): FitsCard {
    const at = i * CARD_LENGTH;
    if (this.text === undefined) {
      // Until all cards are asked for, a look-up decodes just its card: most headers see a few look-ups.
      const card = this.bytes!.subarray(at, at + CARD_LENGTH);
      const text = LATIN1.decode(card);
      return cardFromBytes(card, text, 0) ?? parseCard(printableText(text));
    }
    return cardFromBytes(this.bytes!, this.text, at, printable) ?? parseCard(this.cardImages(i, i + 1)[0]);
  }

  private cardIndex(bytes: Uint8Array): CardIndex {
    this.index ??= new CardIndex(bytes, (i) => parseCard(this.cardImages(i, i + 1)[0]).key);
    return this.index;
  }

  /** Card images from..to-1, bytes outside printable ASCII read as blanks. */
  private cardImages(from: number, to: number): string[] {
    this.text ??= LATIN1.decode(this.bytes);
    const out: string[] = [];
    for (let i = from; i < to; i++) out.push(printableText(this.text.slice(i * CARD_LENGTH, (i + 1) * CARD_LENGTH)));
    return out;
  }
}

/** A string value, trimmed of trailing blanks (FITS 4.0 §4.2.1: they are not significant). */
export function stringOf(v: CardValue | undefined): string | undefined {
  if (typeof v === 'string') return v.trimEnd();
  if (typeof v === 'number') return String(v);
  return undefined;
}

/** A number value; a quoted string holding only a number is accepted too (common in the wild). */
export function numberOf(v: CardValue | undefined): number | undefined {
  if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
  if (typeof v === 'string') {
    const n = parseFitsNumber(v.trim());
    return n === null ? undefined : n;
  }
  return undefined;
}

export const boolOf = (v: CardValue | undefined): boolean | undefined => (typeof v === 'boolean' ? v : undefined);

// windows-1252 (WHATWG 'latin1') maps every byte outside 0x20–0x7e outside that range too.
const LATIN1 = new TextDecoder('latin1');

const NOT_PRINTABLE = /[^\x20-\x7e]/;

/** Text with every character outside printable ASCII replaced by a blank. */
export function printableText(text: string): string {
  return NOT_PRINTABLE.test(text) ? text.replace(/[^\x20-\x7e]/g, ' ') : text;
}

/** The card at byte `at` has the keyword CONTINUE. */
export function isContinue(bytes: Uint8Array, at: number): boolean {
  for (let j = 0; j < 8; j++) if (bytes[at + j] !== 'CONTINUE'.charCodeAt(j)) return false;
  return true;
}

/** key.toUpperCase(), without the call for a key already in capitals (the usual case; it is hot). */
function upperCased(key: string): string {
  for (let i = 0; i < key.length; i++) {
    const c = key.charCodeAt(i);
    if ((c >= 0x61 && c <= 0x7a) || c > 0x7e) return key.toUpperCase();
  }
  return key;
}

/** The first occurrence of a keyword wins, as in most FITS readers. */
function firstByKey(cards: readonly FitsCard[]): Map<string, FitsCard> {
  const byKey = new Map<string, FitsCard>();
  for (const c of cards) {
    const k = upperCased(c.key);
    if (!COMMENTARY.has(k) && !byKey.has(k)) byKey.set(k, c);
  }
  return byKey;
}

/** Parses a FITS integer or float ('1.5D3' allowed); null when the text is not a number. */
export function parseFitsNumber(text: string): number | null {
  const n = scanFitsNumber(text);
  if (n === null || !Number.isNaN(n)) return n;
  const v = Number(text.includes('D') || text.includes('d') ? text.replace(/[Dd]/, 'E') : text);
  return Number.isFinite(v) ? v : null;
}

/** 10^0 … 10^22, every one exact in binary64. */
const EXACT_POWERS = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/**
 * Checks the grammar /^[+-]?(\d+\.?\d*|\.\d+)([EeDd][+-]?\d+)?$/ without a pattern (it is hot)
 * and returns null when the text does not match. A match with at most 15 digits and a decimal
 * exponent within ±22 is worked out here: the digits as an integer and 10^|p| are exact in
 * binary64, so one multiplication or division rounds once, to what Number() gives (Clinger 1990,
 * "How to read floating point numbers accurately", the fast path). Any other match returns NaN:
 * the caller converts it with Number().
 */
function scanFitsNumber(text: string): number | null {
  let i = 0;
  const at = (j: number) => text.charCodeAt(j);
  let digits = 0;
  let significand = 0;
  const digitRun = () => {
    const from = i;
    for (let c = at(i); c >= 0x30 && c <= 0x39; c = at(++i)) significand = significand * 10 + (c - 0x30);
    digits += i - from;
    return i - from;
  };
  const negative = at(i) === 0x2d;
  if (negative || at(i) === 0x2b) i++;
  const whole = digitRun();
  let fraction = 0;
  if (at(i) === 0x2e) {
    i++;
    fraction = digitRun();
  }
  if (whole === 0 && fraction === 0) return null;
  let exponent = 0;
  const e = at(i) | 0x20; // lower-cased letter
  if (e === 0x65 || e === 0x64) {
    i++;
    const minus = at(i) === 0x2d;
    if (minus || at(i) === 0x2b) i++;
    const from = i;
    for (let c = at(i); c >= 0x30 && c <= 0x39; c = at(++i)) exponent = exponent * 10 + (c - 0x30);
    if (i === from) return null;
    if (i - from > 4) exponent = Infinity; // out of the fast path's range either way
    if (minus) exponent = -exponent;
  }
  if (i !== text.length) return null;
  const p = exponent - fraction;
  if (digits > 15 || p > 22 || p < -22) return NaN;
  const magnitude = p >= 0 ? significand * EXACT_POWERS[p] : significand / EXACT_POWERS[-p];
  return negative ? -magnitude : magnitude;
}

/** Parses one 80-character card image. */
export function parseCard(image: string): FitsCard {
  const key = image.slice(0, 8).trimEnd();
  if (key === 'HIERARCH') return parseHierarch(image);
  if (image.slice(8, 10) !== '= ' && key !== 'CONTINUE') {
    return { key, value: null, comment: image.slice(8).trimEnd() || undefined };
  }
  const { value, comment } = parseValueField(image.slice(key === 'CONTINUE' ? 8 : 10));
  return comment === undefined ? { key, value } : { key, value, comment };
}

/** ESO HIERARCH convention: 'HIERARCH ESO TEL GEOLAT = -24.6 / comment'. */
function parseHierarch(image: string): FitsCard {
  const eq = image.indexOf('=');
  if (eq < 0) return { key: image.slice(9).trim(), value: null };
  const { value, comment } = parseValueField(image.slice(eq + 1));
  const key = image.slice(9, eq).trim();
  return comment === undefined ? { key, value } : { key, value, comment };
}

function parseValueField(field: string): { value: CardValue; comment?: string } {
  const s = field.trimStart();
  if (s.startsWith("'")) {
    let out = '';
    let i = 1;
    for (;;) {
      const q = s.indexOf("'", i);
      if (q < 0) {
        out += s.slice(i);
        i = s.length;
        break;
      }
      out += s.slice(i, q);
      if (s[q + 1] === "'") {
        out += "'";
        i = q + 2;
      } else {
        i = q + 1;
        break;
      }
    }
    return withComment(out, s.slice(i));
  }
  const slash = s.indexOf('/');
  const raw = (slash >= 0 ? s.slice(0, slash) : s).trim();
  const rest = slash >= 0 ? s.slice(slash) : '';
  if (raw === 'T' || raw === 'F') return withComment(raw === 'T', rest);
  if (raw === '') return withComment(null, rest);
  const n = parseFitsNumber(raw);
  return withComment(n ?? raw, rest);
}

function withComment(value: CardValue, rest: string): { value: CardValue; comment?: string } {
  // Most value fields end in blanks only; ^\s*\/ on rest is ^\/ once the same blanks are trimmed.
  const tail = rest.trimStart();
  if (tail.charCodeAt(0) !== 0x2f) return { value };
  const m = /^\/\s?(.*)$/.exec(tail);
  const comment = m ? m[1].trimEnd() : '';
  return comment ? { value, comment } : { value };
}

/**
 * Joins CONTINUE cards into the string card before them (FITS 4.0 §4.2.1.2): while the string
 * so far ends in '&', the '&' is dropped and the next CONTINUE card's string appended.
 */
export function joinContinued(cards: FitsCard[]): FitsCard[] {
  const out: FitsCard[] = [];
  for (const card of cards) {
    const prev = out[out.length - 1];
    if (
      card.key === 'CONTINUE' &&
      prev &&
      typeof prev.value === 'string' &&
      prev.value.trimEnd().endsWith('&') &&
      typeof card.value === 'string'
    ) {
      const joined = prev.value.trimEnd().slice(0, -1) + card.value;
      const comment = [prev.comment, card.comment].filter(Boolean).join(' ') || undefined;
      out[out.length - 1] = comment === undefined ? { key: prev.key, value: joined } : { key: prev.key, value: joined, comment };
    } else {
      out.push(card);
    }
  }
  return out;
}
