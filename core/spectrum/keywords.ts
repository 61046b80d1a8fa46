/**
 * Header keywords looked up through several headers in turn (an extension's own header first,
 * then the primary header it inherits from), so that metadata can sit in either.
 */
import { boolOf, numberOf, stringOf, type CardValue, type FitsHeader } from '../fits/header.js';

export interface Keywords {
  has(key: string): boolean;
  value(key: string): CardValue | undefined;
  string(key: string): string | undefined;
  number(key: string): number | undefined;
  bool(key: string): boolean | undefined;
  comment(key: string): string | undefined;
}

export function stackKeywords(...headers: FitsHeader[]): Keywords {
  // The card of the first header that has the key: one look-up per header visited.
  const cardOf = (key: string) => {
    for (const h of headers) {
      const card = h.card(key);
      if (card) return card;
    }
    return undefined;
  };
  return {
    has: (key) => cardOf(key) !== undefined,
    value: (key) => cardOf(key)?.value,
    string: (key) => stringOf(cardOf(key)?.value),
    number: (key) => numberOf(cardOf(key)?.value),
    bool: (key) => boolOf(cardOf(key)?.value),
    comment: (key) => cardOf(key)?.comment,
  };
}

/** The first of the keys present, with its number value. */
export function firstNumber(k: Keywords, keys: string[]): { key: string; value: number } | undefined {
  for (const key of keys) {
    const value = k.number(key);
    if (value !== undefined) return { key, value };
  }
  return undefined;
}

/** The first of the keys present with a non-blank string value. */
export function firstString(k: Keywords, keys: string[]): { key: string; value: string } | undefined {
  for (const key of keys) {
    const value = k.string(key)?.trim();
    if (value) return { key, value };
  }
  return undefined;
}
