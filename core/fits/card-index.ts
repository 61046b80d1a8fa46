/**
 * Where each keyword's first card sits in a header, found from the raw card bytes without
 * making a string per card: keys are compared as FITS readers see them (FITS 4.0 §4.1.2.1:
 * bytes 1–8, trailing blanks dropped), upper-cased, bytes outside printable ASCII as blanks.
 * Commentary (COMMENT, HISTORY, blank) and CONTINUE cards are not indexed; HIERARCH cards
 * (the word in capitals, as the card parser requires) are indexed by the key it gives them.
 */
import { CARD_LENGTH } from './header.js';

/** A key as two 32-bit words of its 8 blank-padded bytes. */
type KeyWords = [number, number];

/** Key bytes as compared: printable ASCII upper-cased, anything else a blank. */
const NORMALISED = Uint8Array.from({ length: 256 }, (_, b) => (b < 0x20 || b > 0x7e ? 0x20 : b >= 0x61 && b <= 0x7a ? b - 0x20 : b));

const UNINDEXED = ['COMMENT', 'HISTORY', '', 'CONTINUE'].map((k) => keyWords(k)!);

/** Look-ups answered by scanning the cards before the table is built (most headers see few). */
const SCANNED_LOOKUPS = 12;

export class CardIndex {
  /** Card number + 1 per slot (0: empty), open addressing with linear probing. */
  private slots?: Int32Array;
  private words?: Int32Array;
  private hierarch?: Map<string, number>;
  private lookups = 0;
  private readonly count: number;

  /** `hierarchKey(i)`: the key of card i, a HIERARCH card. */
  constructor(
    private readonly bytes: Uint8Array,
    private readonly hierarchKey: (card: number) => string,
  ) {
    this.count = Math.floor(bytes.length / CARD_LENGTH);
  }

  /** Number of the first card of the keyword (upper-cased as given), or undefined. */
  find(upperKey: string): number | undefined {
    const h = this.hierarchCards().get(upperKey);
    const key = keyWords(upperKey);
    if (!key || isUnindexed(key[0], key[1])) return h;
    const card = ++this.lookups <= SCANNED_LOOKUPS ? this.scan(key[0], key[1]) : this.slots![this.slotOf(key[0], key[1])] - 1;
    if (card < 0) return h;
    return h !== undefined && h < card ? h : card;
  }

  /** First card (not HIERARCH) with the key, by looking at every card in turn; -1 when none. */
  private scan(w0: number, w1: number): number {
    if (this.lookups === SCANNED_LOOKUPS) this.build();
    // Most cards differ in their first byte: that one byte is looked at before the words are worked out.
    const first = w0 >>> 24;
    for (let i = 0; i < this.count; i++) {
      const at = i * CARD_LENGTH;
      if (NORMALISED[this.bytes[at]] !== first) continue;
      if (word(this.bytes, at) === w0 && word(this.bytes, at + 4) === w1 && !isHierarchCard(this.bytes, at)) return i;
    }
    return -1;
  }

  private hierarchCards(): Map<string, number> {
    if (!this.hierarch) {
      this.hierarch = new Map();
      for (let i = 0; i < this.count; i++) {
        if (!isHierarchCard(this.bytes, i * CARD_LENGTH)) continue;
        const k = this.hierarchKey(i).toUpperCase();
        if (!this.hierarch.has(k)) this.hierarch.set(k, i);
      }
    }
    return this.hierarch;
  }

  private build(): void {
    let size = 16;
    while (size < 2 * this.count) size *= 2;
    this.slots = new Int32Array(size);
    this.words = new Int32Array(2 * this.count);
    for (let i = 0; i < this.count; i++) {
      const at = i * CARD_LENGTH;
      const w0 = word(this.bytes, at);
      const w1 = word(this.bytes, at + 4);
      this.words[2 * i] = w0;
      this.words[2 * i + 1] = w1;
      if (isHierarchCard(this.bytes, at) || isUnindexed(w0, w1)) continue;
      const slot = this.slotOf(w0, w1);
      if (this.slots[slot] === 0) this.slots[slot] = i + 1;
    }
  }

  /** The slot holding the key, or the empty slot where it would go. */
  private slotOf(w0: number, w1: number): number {
    const slots = this.slots!;
    const words = this.words!;
    const mask = slots.length - 1;
    // Multiplicative hashing (Knuth, TAOCP vol. 3, §6.4) of the two words.
    let slot = (Math.imul(w0, 0x9e3779b1) ^ Math.imul(w1, 0x85ebca6b)) >>> 7;
    for (;;) {
      slot &= mask;
      const card = slots[slot] - 1;
      if (card < 0 || (words[2 * card] === w0 && words[2 * card + 1] === w1)) return slot;
      slot++;
    }
  }
}

function isUnindexed(w0: number, w1: number): boolean {
  const first = w0 >>> 24;
  if (first !== 0x43 && first !== 0x48 && first !== 0x20) return false; // not C(OMMENT, ONTINUE), H(ISTORY) or blank
  for (let u = 0; u < UNINDEXED.length; u++) if (UNINDEXED[u][0] === w0 && UNINDEXED[u][1] === w1) return true;
  return false;
}

/** Four key bytes as one word (see NORMALISED). */
function word(bytes: Uint8Array, at: number): number {
  const n = NORMALISED;
  return (n[bytes[at]] << 24) | (n[bytes[at + 1]] << 16) | (n[bytes[at + 2]] << 8) | n[bytes[at + 3]];
}

/** The word HIERARCH in capitals, as the card parser requires. */
function isHierarchCard(bytes: Uint8Array, at: number): boolean {
  for (let j = 0; j < 8; j++) if (bytes[at + j] !== 'HIERARCH'.charCodeAt(j)) return false;
  return true;
}

/** An upper-cased key as words; undefined when no card key can equal it. */
function keyWords(key: string): KeyWords | undefined {
  if (key.length > 8 || key.endsWith(' ')) return undefined;
  const words: KeyWords = [0, 0];
  for (let j = 0; j < 8; j++) {
    const c = j < key.length ? key.charCodeAt(j) : 0x20;
    if (c < 0x20 || c > 0x7e || (c >= 0x61 && c <= 0x7a)) return undefined;
    words[j >> 2] |= c << (24 - 8 * (j & 3));
  }
  return words;
}
