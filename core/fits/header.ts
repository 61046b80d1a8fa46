/**
 * FITS header cards (FITS Standard 4.0, §4): 80-character cards in 2880-byte blocks, ended by
 * END. Values: character strings in quotes (doubled quotes inside), logicals T/F, integers and
 * floats (D exponents allowed). Long strings use the CONTINUE convention (FITS 4.0 §4.2.1.2):
 * a string ending in '&' continues in the next CONTINUE card's string.
 */

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
 * Built from card images (fromImages), a card is parsed only when it is looked up or when
 * all cards are asked for: most of a survey file's cards are never read.
 */
export class FitsHeader {
  private parsed?: FitsCard[];
  private byKey?: Map<string, FitsCard>;
  /** Card images (80 characters each) of a lazily parsed header, and where each key sits. */
  private readonly images?: string;
  private imageIndex?: Map<string, number>;

  constructor(cards: FitsCard[]);
  constructor(cards: undefined, images: string);
  constructor(cards: FitsCard[] | undefined, images?: string) {
    this.parsed = cards;
    this.images = images;
  }

  /** A header of card images (80 characters each, printable ASCII, END excluded). */
  static fromImages(images: string): FitsHeader {
    return new FitsHeader(undefined, images);
  }

  get cards(): readonly FitsCard[] {
    this.parsed ??= joinContinued(this.cardImages(0, this.images!.length / CARD_LENGTH).map(parseCard));
    return this.parsed;
  }

  has(key: string): boolean {
    const k = key.toUpperCase();
    if (this.images === undefined || this.parsed || k === 'CONTINUE') return this.card(key) !== undefined;
    this.imageIndex ??= imageIndex(this.images);
    return this.imageIndex.has(k);
  }

  value(key: string): CardValue | undefined {
    return this.card(key)?.value;
  }

  comment(key: string): string | undefined {
    return this.card(key)?.comment;
  }

  /** String value, trimmed of trailing blanks (FITS 4.0 §4.2.1: they are not significant). */
  string(key: string): string | undefined {
    const v = this.value(key);
    if (typeof v === 'string') return endsInBlank(v) ? v.replace(/\s+$/, '') : v;
    if (typeof v === 'number') return String(v);
    return undefined;
  }

  /** Number value; a quoted string holding only a number is accepted too (common in the wild). */
  number(key: string): number | undefined {
    const v = this.value(key);
    if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
    if (typeof v === 'string') {
      const n = parseFitsNumber(v.trim());
      return n === null ? undefined : n;
    }
    return undefined;
  }

  integer(key: string): number | undefined {
    const n = this.number(key);
    return n !== undefined && Number.isInteger(n) ? n : undefined;
  }

  bool(key: string): boolean | undefined {
    const v = this.value(key);
    return typeof v === 'boolean' ? v : undefined;
  }

  /** The first card of a keyword (commentary keywords excepted), CONTINUE cards joined to it. */
  private card(key: string): FitsCard | undefined {
    const k = key.toUpperCase();
    if (this.images === undefined || this.parsed || k === 'CONTINUE') {
      this.byKey ??= firstByKey(this.cards);
      return this.byKey.get(k);
    }
    this.imageIndex ??= imageIndex(this.images);
    const at = this.imageIndex.get(k);
    if (at === undefined) return undefined;
    let end = at + 1;
    while (end * CARD_LENGTH < this.images.length && this.images.startsWith('CONTINUE', end * CARD_LENGTH)) end++;
    if (end === at + 1) return parseCard(this.images.slice(at * CARD_LENGTH, end * CARD_LENGTH));
    return joinContinued(this.cardImages(at, end).map(parseCard))[0];
  }

  private cardImages(from: number, to: number): string[] {
    const out: string[] = [];
    for (let i = from; i < to; i++) out.push(this.images!.slice(i * CARD_LENGTH, (i + 1) * CARD_LENGTH));
    return out;
  }
}

/** True when the text may end in white space (\s: code ≤ 32, or ≥ 0xA0 for the Unicode blanks). */
function endsInBlank(text: string): boolean {
  const c = text.charCodeAt(text.length - 1);
  return !(c > 32 && c < 127);
}

/** The first occurrence of a keyword wins, as in most FITS readers. */
function firstByKey(cards: readonly FitsCard[]): Map<string, FitsCard> {
  const byKey = new Map<string, FitsCard>();
  for (const c of cards) {
    const k = c.key.toUpperCase();
    if (!COMMENTARY.has(k) && !byKey.has(k)) byKey.set(k, c);
  }
  return byKey;
}

/**
 * Keyword → number of its first card, read from the images alone. CONTINUE cards are left out
 * (looking one up parses the whole header, which knows whether it stands alone).
 */
function imageIndex(images: string): Map<string, number> {
  const index = new Map<string, number>();
  const count = images.length / CARD_LENGTH;
  for (let i = 0; i < count; i++) {
    const at = i * CARD_LENGTH;
    let key = images.slice(at, at + 8).trimEnd();
    if (key === 'CONTINUE') continue;
    if (key === 'HIERARCH') key = parseCard(images.slice(at, at + CARD_LENGTH)).key;
    const k = key.toUpperCase();
    if (!COMMENTARY.has(k) && !index.has(k)) index.set(k, i);
  }
  return index;
}

/** Parses a FITS integer or float ('1.5D3' allowed); null when the text is not a number. */
export function parseFitsNumber(text: string): number | null {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([EeDd][+-]?\d+)?$/.test(text)) return null;
  const n = Number(text.replace(/[Dd]/, 'E'));
  return Number.isFinite(n) ? n : null;
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
  // Most value fields end in blanks only: no comment, and no need for the pattern.
  let i = 0;
  while (i < rest.length && rest.charCodeAt(i) === 32) i++;
  if (i === rest.length) return { value };
  const m = /^\s*\/\s?(.*)$/.exec(rest);
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
