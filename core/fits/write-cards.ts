/**
 * Header cards as the FITS Standard 4.0 (Pence et al. 2010, A&A 524, A42; IAU FITS Working
 * Group 2016) writes them: 80-character ASCII cards, keyword in columns 1–8, "= " in 9–10,
 * fixed-format values (logical in column 30, numbers right-justified to column 30, strings
 * quoted from column 11 with ' doubled), long strings over CONTINUE cards (§4.2.1.2), and the
 * header closed by END and padded with spaces to a multiple of 2880 bytes.
 */

export const CARD_LENGTH = 80;
export const BLOCK_LENGTH = 2880;

/** A floating-point value that must be written as a real even when it is a whole number. */
export interface RealValue {
  real: number;
}

export type CardValue = string | number | bigint | boolean | RealValue | null;

/**
 * One header card. With `value` undefined the card is commentary: COMMENT/HISTORY/blank
 * keyword followed by `comment` as text. A `null` value writes an undefined value (blank).
 */
export interface Card {
  key: string;
  value?: CardValue;
  comment?: string;
}

/** Marks a number to be written in real (floating-point) form, e.g. CRVAL1 = 3600.0. */
export function real(x: number): RealValue {
  return { real: x };
}

const KEY_PATTERN = /^[A-Z0-9_-]{0,8}$/;
const COMMENTARY_KEYS = new Set(['COMMENT', 'HISTORY', '']);
/** Longest fixed-format number: columns 11–30 (§4.2.3, §4.2.4). */
const NUMBER_WIDTH = 20;

function checkAscii(text: string, what: string): void {
  if (!/^[\x20-\x7e]*$/.test(text)) throw new Error(`FITS ${what} must be printable ASCII: ${JSON.stringify(text)}`);
}

/** Integer in fixed format (§4.2.3). */
function formatInteger(x: number): string {
  if (!Number.isSafeInteger(x)) throw new Error(`FITS integer value out of range: ${x}`);
  return String(x);
}

/**
 * Real in fixed format (§4.2.4): shortest text that reads back to the same double, with a
 * decimal point and an upper-case exponent letter, shortened when it exceeds 20 columns.
 */
export function formatReal(x: number): string {
  if (!Number.isFinite(x)) throw new Error(`FITS cannot hold a non-finite number in a header: ${x}`);
  let s = String(x);
  for (let digits = 16; s.length > NUMBER_WIDTH; digits--) s = x.toExponential(digits);
  const [mantissa, exponent] = s.toUpperCase().split('E');
  const withPoint = mantissa.includes('.') ? mantissa : `${mantissa}.0`;
  return exponent === undefined ? withPoint : `${withPoint}E${exponent}`;
}

function formatNumber(value: number | bigint | RealValue): string {
  if (typeof value === 'bigint') return String(value);
  if (typeof value === 'number') return Number.isInteger(value) ? formatInteger(value) : formatReal(value);
  return formatReal(value.real);
}

/** ' doubled inside a quoted FITS string (§4.2.1.1). */
function quoteBody(text: string): string {
  return text.replace(/'/g, "''");
}

/** Pads a card image to 80 columns, refusing anything longer. */
function pad(image: string): string {
  if (image.length > CARD_LENGTH) throw new Error(`FITS card longer than 80 characters: ${image}`);
  return image.padEnd(CARD_LENGTH, ' ');
}

/** Appends " / comment" where it fits, truncating the comment to the card's end. */
function withComment(image: string, comment: string | undefined): string {
  if (!comment) return pad(image);
  const room = CARD_LENGTH - image.length - 3;
  return pad(room > 0 ? `${image} / ${comment.slice(0, room)}` : image);
}

/**
 * Splits an escaped string into CONTINUE-card pieces of at most `width` characters, each but
 * the last ending in '&', never cutting a doubled quote in half.
 */
function splitLongString(escaped: string, firstWidth: number, nextWidth: number): string[] {
  const pieces: string[] = [];
  let rest = escaped;
  let width = firstWidth;
  while (rest.length > width) {
    let cut = width - 1; // room for '&'
    // Count the quotes before the cut: an odd run ending at the cut would split a ''.
    let run = 0;
    while (run < cut && rest[cut - 1 - run] === "'") run++;
    if (run % 2 === 1) cut--;
    pieces.push(`${rest.slice(0, cut)}&`);
    rest = rest.slice(cut);
    width = nextWidth;
  }
  pieces.push(rest);
  return pieces;
}

/** The 80-column card images for one card (several for a long string). */
export function formatCard(card: Card): string[] {
  const key = card.key.toUpperCase();
  if (!KEY_PATTERN.test(key)) throw new Error(`FITS keyword must be 1–8 characters A–Z 0–9 _ -: ${card.key}`);
  if (card.comment !== undefined) checkAscii(card.comment, `comment of ${key}`);
  if (card.value === undefined) {
    if (!COMMENTARY_KEYS.has(key)) throw new Error(`FITS keyword ${key} needs a value`);
    const text = card.comment ?? '';
    const width = CARD_LENGTH - 8;
    const out: string[] = [];
    for (let i = 0; i === 0 || i < text.length; i += width) out.push(pad(key.padEnd(8) + text.slice(i, i + width)));
    return out;
  }
  const head = `${key.padEnd(8)}= `;
  const value = card.value;
  if (value === null) return [withComment(head.trimEnd(), card.comment)];
  if (typeof value === 'boolean') return [withComment(head + (value ? 'T' : 'F').padStart(NUMBER_WIDTH), card.comment)];
  if (typeof value !== 'string') return [withComment(head + formatNumber(value).padStart(NUMBER_WIDTH), card.comment)];
  checkAscii(value, `value of ${key}`);
  // Fixed format: at least 8 characters between the quotes (§4.2.1.1); trailing blanks are
  // not significant, so padding does not change the value.
  const escaped = quoteBody(value).padEnd(8, ' ');
  const firstWidth = CARD_LENGTH - head.length - 2;
  if (escaped.length <= firstWidth) return [withComment(`${head}'${escaped}'`, card.comment)];
  const continueHead = 'CONTINUE  ';
  const pieces = splitLongString(escaped, firstWidth, CARD_LENGTH - continueHead.length - 2);
  return pieces.map((piece, i) => {
    const image = `${i === 0 ? head : continueHead}'${piece}'`;
    return i === pieces.length - 1 ? withComment(image, card.comment) : pad(image);
  });
}

/** A complete header: the cards, END, and blank padding to whole 2880-byte blocks. */
export function formatHeader(cards: readonly Card[]): string {
  const images = cards.flatMap(formatCard);
  images.push(pad('END'));
  const text = images.join('');
  const padded = Math.ceil(text.length / BLOCK_LENGTH) * BLOCK_LENGTH;
  return text.padEnd(padded, ' ');
}
